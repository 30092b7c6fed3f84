import { getDb } from "@/db";
import { lucia } from "@/server/auth/lucia";
import { verifyPassword } from "@/server/auth/password";
import { requireStaff } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import { json, readJson, respond } from "@/server/http/respond";
import { updateStaff } from "@/server/staff/mutations";
import { passwordChangeSchema } from "@/server/staff/schemas";

/** Changing one's own password ends every session of theirs, then opens a new one here. */
export async function PUT(req: Request) {
  return respond(async () => {
    const user = await requireStaff(req);
    const input = await readJson(req, passwordChangeSchema);
    const db = getDb();
    const row = await db.selectFrom("staff").select("password_hash").where("id", "=", user.id).executeTakeFirstOrThrow();
    if (!(await verifyPassword(row.password_hash, input.currentPassword))) {
      throw new ApiError("validation", "The current password is not right.", { fields: { currentPassword: ["The current password is not right."] } });
    }
    await updateStaff(db, user, user.id, { password: input.newPassword });
    const session = await lucia.createSession(user.id, {});
    return json({ ok: true }, { headers: { "Set-Cookie": lucia.createSessionCookie(session.id).serialize() } });
  });
}
