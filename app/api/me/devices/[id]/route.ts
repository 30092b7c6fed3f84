import { getDb } from "@/db";
import { hashSessionId, lucia } from "@/server/auth/lucia";
import { requireStaffSession } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import { assertSameOrigin, json, respond } from "@/server/http/respond";
import { signOutDevice } from "@/server/staff/account";

/** Signs out one of the signed-in staff member's own devices; signing out this one clears its cookie too. */
export async function DELETE(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    assertSameOrigin(req);
    const { user, sessionId } = await requireStaffSession(req, { forPasswordChange: true });
    const { id } = await ctx.params;
    if (!/^[0-9a-f]{64}$/.test(id)) throw new ApiError("validation", "That is not a signed-in device's id; reload the Account page.");
    await signOutDevice(getDb(), user.id, id);
    const here = id === hashSessionId(sessionId);
    return json({ ok: true, signedOutHere: here }, here ? { headers: { "Set-Cookie": lucia.createBlankSessionCookie().serialize() } } : undefined);
  });
}
