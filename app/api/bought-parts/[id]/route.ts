import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { notFound } from "@/server/http/errors";
import { assertSameOrigin, json, parseId, readJson, respond } from "@/server/http/respond";
import { canSeeCosts, deleteBoughtPart, patchBoughtPart } from "@/server/parts/mutations";
import { findBoughtPart } from "@/server/parts/queries";
import { boughtPartPatchSchema } from "@/server/parts/schemas";

type Ctx = { params: Promise<{ id: string }> };

export async function GET(req: Request, ctx: Ctx) {
  return respond(async () => {
    const user = await requireStaff(req);
    const id = parseId((await ctx.params).id, "Bought-in part");
    const part = await findBoughtPart(getDb(), id, { withCost: canSeeCosts(user) });
    if (!part) throw notFound("That bought-in part");
    return json({ part });
  });
}

/** Any staff member corrects a line or marks it installed; the cost is the office's and the owner's. */
export async function PATCH(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const id = parseId((await ctx.params).id, "Bought-in part");
    const patch = await readJson(req, boughtPartPatchSchema);
    return json({ part: await patchBoughtPart(getDb(), actor, id, patch) });
  });
}

export async function DELETE(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id, "Bought-in part");
    await deleteBoughtPart(getDb(), actor, id);
    return new Response(null, { status: 204 });
  });
}
