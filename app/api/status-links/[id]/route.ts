import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { assertSameOrigin, json, parseId, respond } from "@/server/http/respond";
import { revokeStatusLink } from "@/server/status/links";

/** Turns a status link off for good; the customer's page then says so and how to reach the shop. */
export async function DELETE(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id, "Status link");
    return json({ link: await revokeStatusLink(getDb(), actor, id) });
  });
}
