import { getDb } from "@/db";
import { lucia } from "@/server/auth/lucia";
import { clientAddress } from "@/server/auth/rate-limit";
import { sessionFromRequest } from "@/server/auth/session";
import { signIn } from "@/server/auth/sign-in";
import { auditSignInRefused, auditSignedIn } from "@/server/audit/sign-in";
import { json, readJson, respond, assertSameOrigin } from "@/server/http/respond";
import { signInSchema } from "@/server/staff/schemas";

export async function POST(req: Request) {
  return respond(async () => {
    const input = await readJson(req, signInSchema);
    const address = clientAddress(req);
    const db = getDb();
    const { session, user } = await signIn(db, input.email, input.password, address, req.headers.get("user-agent") ?? "").catch(async (err: unknown) => {
      await auditSignInRefused(db, err, input.email, address);
      throw err;
    });
    await auditSignedIn(db, user, address);
    const cookie = lucia.createSessionCookie(session.id);
    return json({ user }, { headers: { "Set-Cookie": cookie.serialize() } });
  });
}

export async function DELETE(req: Request) {
  return respond(async () => {
    assertSameOrigin(req);
    const found = await sessionFromRequest(req);
    if (found) await lucia.invalidateSession(found.sessionId);
    return json({ ok: true }, { headers: { "Set-Cookie": lucia.createBlankSessionCookie().serialize() } });
  });
}
