import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, respond, assertSameOrigin } from "@/server/http/respond";
import { resetStaffPassword } from "@/server/staff/account";

/**
 * The owner resets someone else's password. The temporary password is in this answer only (it is
 * stored hashed); its holder chooses their own at next sign-in.
 */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    assertSameOrigin(req);
    const owner = await requireStaff(req, ["owner"]);
    const { id } = await ctx.params;
    return json(await resetStaffPassword(getDb(), owner, id), { headers: { "Cache-Control": "no-store" } });
  });
}
