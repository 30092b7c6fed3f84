import { getDb } from "@/db";
import { requireStaffSession } from "@/server/auth/session";
import { assertSameOrigin, json, respond } from "@/server/http/respond";
import { listDevices, signOutOtherDevices } from "@/server/staff/account";

/** The signed-in staff member's own signed-in devices, this one first. */
export async function GET(req: Request) {
  return respond(async () => {
    const { user, sessionId } = await requireStaffSession(req, { forPasswordChange: true });
    return json({ devices: await listDevices(getDb(), user.id, sessionId) });
  });
}

/** Signs out every other device of the signed-in staff member; this one stays signed in. */
export async function DELETE(req: Request) {
  return respond(async () => {
    assertSameOrigin(req);
    const { user, sessionId } = await requireStaffSession(req, { forPasswordChange: true });
    return json({ signedOut: await signOutOtherDevices(getDb(), user.id, sessionId) });
  });
}
