import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { notFound } from "@/server/http/errors";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { COST_ROLES, setPurchaseOrderExpected } from "@/server/parts/mutations";
import { findPurchaseOrder } from "@/server/parts/queries";
import { purchaseOrderPatchSchema } from "@/server/parts/schemas";

type Ctx = { params: Promise<{ id: string }> };

export async function GET(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req, COST_ROLES);
    const id = parseId((await ctx.params).id, "Purchase order");
    const po = await findPurchaseOrder(getDb(), id);
    if (!po) throw notFound("That purchase order");
    return json({ purchaseOrder: po });
  });
}

/** The supplier gives a new delivery date: every line still outstanding on the order takes it. */
export async function PATCH(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req, COST_ROLES);
    const id = parseId((await ctx.params).id, "Purchase order");
    const { expectedOn } = await readJson(req, purchaseOrderPatchSchema);
    const db = getDb();
    await setPurchaseOrderExpected(db, id, expectedOn);
    return json({ purchaseOrder: await findPurchaseOrder(db, id) });
  });
}
