import { getDb } from "@/db";
import { lucia } from "@/server/auth/lucia";
import { DEVICE_COOKIE, deviceCookieHeader, deviceCookieValue } from "@/server/auth/device";
import { clientAddress } from "@/server/auth/rate-limit";
import { readCookie, sessionFromRequest } from "@/server/auth/session";
import { signIn } from "@/server/auth/sign-in";
import { auditSignInRefused, auditSignedIn } from "@/server/audit/sign-in";
import { json, readJson, respond, assertSameOrigin } from "@/server/http/respond";
import { signInSchema } from "@/server/staff/schemas";

export async function POST(req: Request) {
  return respond(async () => {
    const input = await readJson(req, signInSchema);
    const device = readCookie(req.headers.get("cookie"), DEVICE_COOKIE);
    const address = clientAddress(req);
    const db = getDb();
    const { session, user } = await signIn(db, input.email, input.password, address, device, req.headers.get("user-agent") ?? "").catch(async (err: unknown) => {
      await auditSignInRefused(db, err, input.email, address);
      throw err;
    });
    await auditSignedIn(db, user, address);
    const cookie = lucia.createSessionCookie(session.id);
    const headers = new Headers();
    headers.append("Set-Cookie", cookie.serialize());
    // This device has now signed in to the account: strangers' failed tries will not lock it out.
    headers.append("Set-Cookie", deviceCookieHeader(deviceCookieValue(user.id, device)));
    return json({ user }, { headers });
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
