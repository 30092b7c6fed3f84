import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { createPurchaseOrder, COST_ROLES } from "@/server/parts/mutations";
import { findPurchaseOrder } from "@/server/parts/queries";
import { purchaseOrderInputSchema } from "@/server/parts/schemas";

/** The office or owner orders several jobs' lines from one supplier as one purchase order. */
export async function POST(req: Request) {
  return respond(async () => {
    const actor = await requireStaff(req, COST_ROLES);
    const input = await readJson(req, purchaseOrderInputSchema);
    const db = getDb();
    const made = await createPurchaseOrder(db, actor, input);
    return json({ purchaseOrder: await findPurchaseOrder(db, made.id) }, { status: 201 });
  });
}
