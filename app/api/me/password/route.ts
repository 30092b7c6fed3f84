import { getDb } from "@/db";
import { clientAddress } from "@/server/auth/rate-limit";
import { requireStaffSession } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { changeOwnPassword } from "@/server/staff/account";
import { passwordChangeSchema } from "@/server/staff/schemas";

/** A staff member changes their own password: other signed-in devices are signed out, this one stays. */
export async function POST(req: Request) {
  return respond(async () => {
    const { user, sessionId } = await requireStaffSession(req, { forPasswordChange: true });
    const input = await readJson(req, passwordChangeSchema);
    return json(await changeOwnPassword(getDb(), user, sessionId, input, clientAddress(req)));
  });
}
