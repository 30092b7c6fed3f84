import { getDb } from "@/db";
import { lucia } from "@/server/auth/lucia";
import { clientAddress } from "@/server/auth/rate-limit";
import { sessionFromRequest } from "@/server/auth/session";
import { signIn } from "@/server/auth/sign-in";
import { json, readJson, respond, assertSameOrigin } from "@/server/http/respond";
import { signInSchema } from "@/server/staff/schemas";

export async function POST(req: Request) {
  return respond(async () => {
    const input = await readJson(req, signInSchema);
    const { session, user } = await signIn(getDb(), input.email, input.password, clientAddress(req), req.headers.get("user-agent") ?? "");
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
