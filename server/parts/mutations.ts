import "server-only";
import type { DB } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import { recordAudit } from "@/server/audit/record";
import { ApiError, notFound } from "@/server/http/errors";
import { formatWorkOrder } from "@/server/jobs/work-order";
import { latestKitSpec } from "@/server/kit-spec/queries";
import { shopToday } from "@/server/records/turnaround";
import { shopSettings } from "@/server/shop/queries";
import { type BoughtPartView, findBoughtPart } from "./queries";
import { applyReceipt, boughtPartState, countOf, linesFromQuote, supplierKey } from "./rules";
import type { BoughtPartInput, BoughtPartPatch, PurchaseOrderInput } from "./schemas";

/** Who sees and sets what bought-in parts cost, and orders them. */
export const COST_ROLES: readonly StaffUser["role"][] = ["office", "owner"];
export const canSeeCosts = (user: Pick<StaffUser, "role">) => COST_ROLES.includes(user.role);

function fieldError(field: string, message: string) {
  return new ApiError("validation", message, { fields: { [field]: [message] } });
}

function refuseCostsForTech(actor: StaffUser, costCents: unknown) {
  if (costCents !== undefined && !canSeeCosts(actor)) {
    throw new ApiError("forbidden", "Only the office or the owner records what a part costs; leave the cost out, and they will add it.");
  }
}

/** Any staff member lists what a job needs; only the office or owner gives its cost. */
export async function createBoughtPart(db: DB, actor: StaffUser, jobId: number, input: BoughtPartInput, source: "manual" | "kit_spec" = "manual"): Promise<BoughtPartView> {
  refuseCostsForTech(actor, input.costCents);
  const id = await db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select("id").where("id", "=", jobId).executeTakeFirst();
    if (!job) throw notFound("That job");
    const at = new Date().toISOString();
    const row = await trx
      .insertInto("bought_part")
      .values({
        job_id: jobId, kind: input.kind, description: input.description, part_number: input.partNumber, quantity: input.quantity,
        supplier: input.supplier, unit_cost_cents: input.costCents ?? null, state: "needed", purchase_order_id: null, expected_on: null,
        installed_at: null, installed_by: null, fits_transmission: input.fitsTransmission, ratio_percent: input.ratioPercent,
        displacement_cu_in: input.displacementCuIn, source, created_by: actor.id, created_at: at, updated_at: at,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    return row.id;
  });
  return (await findBoughtPart(db, id, { withCost: canSeeCosts(actor) }))!;
}

/**
 * The PTO and pump the job's kit spec calls for, as lines to order (with the ratio and
 * displacement the fit checks compare). A kind already listed on the job is not added twice.
 */
export async function boughtPartsFromKitSpec(db: DB, actor: StaffUser, jobId: number): Promise<BoughtPartView[]> {
  const job = await db.selectFrom("job").innerJoin("truck", "truck.id", "job.truck_id").select(["job.id", "truck.transmission"]).where("job.id", "=", jobId).executeTakeFirst();
  if (!job) throw notFound("That job");
  const spec = await latestKitSpec(db, jobId);
  if (!spec) throw new ApiError("conflict", "This job has no kit spec yet: save one from the calculator first, or add the parts by hand.");
  const inputs = spec.inputs as unknown as { ptoRatioPercent?: number; pumpDisplacementCuIn?: number };
  const listed = new Set((await db.selectFrom("bought_part").select("kind").where("job_id", "=", jobId).execute()).map((r) => r.kind));
  const made: BoughtPartView[] = [];
  if (!listed.has("pto")) {
    made.push(await createBoughtPart(db, actor, jobId, {
      kind: "pto", description: `PTO, ${inputs.ptoRatioPercent ?? "?"} % of engine speed`, quantity: 1, partNumber: "", supplier: "",
      fitsTransmission: job.transmission, ratioPercent: inputs.ptoRatioPercent ?? null, displacementCuIn: null,
    }, "kit_spec"));
  }
  if (!listed.has("pump")) {
    made.push(await createBoughtPart(db, actor, jobId, {
      kind: "pump", description: `Gear pump, ${inputs.pumpDisplacementCuIn ?? "?"} cu in/rev`, quantity: 1, partNumber: "", supplier: "",
      fitsTransmission: "", ratioPercent: null, displacementCuIn: inputs.pumpDisplacementCuIn ?? null,
    }, "kit_spec"));
  }
  if (made.length === 0) throw new ApiError("conflict", "A PTO and a pump are already listed on this job; edit them instead.");
  return made;
}

/**
 * A bought-in line for each part line of the job's approved quote and change orders not already
 * listed (see `linesFromQuote`): quantity and description as quoted, no cost (the office fills in
 * what the supplier charges, not what the customer pays). All lines or none are added.
 */
export async function boughtPartsFromQuote(db: DB, actor: StaffUser, jobId: number): Promise<BoughtPartView[]> {
  const ids = await db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select("id").where("id", "=", jobId).executeTakeFirst();
    if (!job) throw notFound("That job");
    const approved = await trx.selectFrom("quote").select("id").where("job_id", "=", jobId).where("status", "=", "approved").execute();
    if (approved.length === 0) {
      throw new ApiError("conflict", "This job has no approved quote yet: the parts are listed from it once the customer approves it. Add them by hand meanwhile.");
    }
    const quoteLines = await trx
      .selectFrom("quote_line as l")
      .innerJoin("quote as q", "q.id", "l.quote_id")
      .leftJoin("price_item as i", "i.id", "l.price_item_id")
      .select(["l.description", "l.quantity_milli", "i.kit_use"])
      .where("q.job_id", "=", jobId)
      .where("q.status", "=", "approved")
      .where("l.kind", "=", "part")
      // Versions number quotes and change orders together, so this is the order they were written in.
      .orderBy("q.version", "asc")
      .orderBy("l.position", "asc")
      .execute();
    if (quoteLines.length === 0) throw new ApiError("conflict", "The approved quote has no part lines; add the bought-in parts by hand.");
    const listed = await trx.selectFrom("bought_part").select(["kind", "description"]).where("job_id", "=", jobId).execute();
    const lines = linesFromQuote(
      quoteLines.map((l) => ({ description: l.description, quantityMilli: l.quantity_milli, kitUse: l.kit_use })),
      listed,
    );
    if (lines.length === 0) throw new ApiError("conflict", "Every part on the approved quote is already listed on this job; edit those lines instead.");
    const at = new Date().toISOString();
    const rows = await trx
      .insertInto("bought_part")
      .values(
        lines.map((line) => ({
          job_id: jobId, kind: line.kind, description: line.description, part_number: "", quantity: line.quantity, supplier: "",
          unit_cost_cents: null, state: "needed" as const, purchase_order_id: null, expected_on: null, installed_at: null, installed_by: null,
          fits_transmission: "", ratio_percent: null, displacement_cu_in: null, source: "quote" as const, created_by: actor.id, created_at: at, updated_at: at,
        })),
      )
      .returning("id")
      .execute();
    return rows.map((r) => r.id);
  });
  const views = await Promise.all(ids.map((id) => findBoughtPart(db, id, { withCost: canSeeCosts(actor) })));
  return views.map((v) => v!);
}

export async function patchBoughtPart(db: DB, actor: StaffUser, id: number, patch: BoughtPartPatch): Promise<BoughtPartView> {
  refuseCostsForTech(actor, patch.costCents);
  await db.transaction().execute(async (trx) => {
    const part = await trx.selectFrom("bought_part").selectAll().where("id", "=", id).executeTakeFirst();
    if (!part) throw notFound("That bought-in part");
    const quantity = patch.quantity ?? part.quantity;
    if (quantity < part.received_quantity) {
      throw fieldError("quantity", `${part.received_quantity} are already received; the quantity cannot be less than that.`);
    }
    if (patch.supplier !== undefined && part.purchase_order_id !== null && patch.supplier !== part.supplier) {
      throw fieldError("supplier", "This part is on a purchase order; its supplier is the order's.");
    }
    let installed = part.installed_at !== null;
    if (patch.installed === true && !installed) {
      if (part.received_quantity < quantity) {
        throw fieldError("installed", `Receive it first: ${part.received_quantity} of ${quantity} received.`);
      }
      installed = true;
    }
    if (patch.installed === false) installed = false;
    const state = boughtPartState({ quantity, receivedQuantity: part.received_quantity, ordered: part.purchase_order_id !== null, installed });
    const at = new Date().toISOString();
    await trx
      .updateTable("bought_part")
      .set({
        kind: patch.kind ?? part.kind,
        description: patch.description ?? part.description,
        part_number: patch.partNumber ?? part.part_number,
        quantity,
        supplier: patch.supplier ?? part.supplier,
        unit_cost_cents: patch.costCents !== undefined ? patch.costCents : part.unit_cost_cents,
        fits_transmission: patch.fitsTransmission ?? part.fits_transmission,
        ratio_percent: patch.ratioPercent !== undefined ? patch.ratioPercent : part.ratio_percent,
        displacement_cu_in: patch.displacementCuIn !== undefined ? patch.displacementCuIn : part.displacement_cu_in,
        state,
        installed_at: installed ? (part.installed_at ?? at) : null,
        installed_by: installed ? (part.installed_by ?? actor.id) : null,
        updated_at: at,
      })
      .where("id", "=", id)
      .execute();
  });
  return (await findBoughtPart(db, id, { withCost: canSeeCosts(actor) }))!;
}

/** The office or owner removes a line listed by mistake, while nothing of it has been received. */
export async function deleteBoughtPart(db: DB, actor: StaffUser, id: number): Promise<void> {
  if (!canSeeCosts(actor)) throw new ApiError("forbidden", "Only the office or the owner can remove a bought-in part from a job.");
  await db.transaction().execute(async (trx) => {
    const part = await trx
      .selectFrom("bought_part as b")
      .innerJoin("job", "job.id", "b.job_id")
      .leftJoin("purchase_order as po", "po.id", "b.purchase_order_id")
      .select(["b.id", "b.description", "b.job_id", "b.received_quantity", "job.work_order", "po.number"])
      .where("b.id", "=", id)
      .executeTakeFirst();
    if (!part) throw notFound("That bought-in part");
    if (part.received_quantity > 0) throw new ApiError("conflict", "Some of this part has been received, and receipts are kept. Change its quantity instead.");
    await trx.deleteFrom("bought_part").where("id", "=", id).execute();
    await recordAudit(trx, {
      kind: "bought_part_deleted",
      actor,
      subject: `work order ${part.work_order}`,
      summary: `${actor.name} deleted the bought-in part "${part.description}" from work order ${part.work_order}${part.number ? ` (it was on ${part.number})` : ""}.`,
      details: { boughtPartId: id, jobId: part.job_id, description: part.description, purchaseOrder: part.number },
    });
  });
}

/** Records parts arriving: who, when, how many. A short receipt keeps the rest on order. */
export async function receiveBoughtPart(db: DB, actor: StaffUser, id: number, quantity: number): Promise<BoughtPartView> {
  await db.transaction().execute(async (trx) => {
    const part = await trx.selectFrom("bought_part").selectAll().where("id", "=", id).executeTakeFirst();
    if (!part) throw notFound("That bought-in part");
    const check = applyReceipt({ quantity: part.quantity, receivedQuantity: part.received_quantity, ordered: part.purchase_order_id !== null, installed: part.installed_at !== null }, quantity);
    if (!check.ok) throw fieldError("quantity", check.message);
    const at = new Date().toISOString();
    await trx.insertInto("bought_part_receipt").values({ bought_part_id: id, quantity, received_by: actor.id, received_by_name: actor.name, received_at: at }).execute();
    await trx.updateTable("bought_part").set({ received_quantity: check.receivedQuantity, state: check.state, updated_at: at }).where("id", "=", id).execute();
  });
  return (await findBoughtPart(db, id, { withCost: canSeeCosts(actor) }))!;
}

/**
 * One purchase order to one supplier for lines of any number of jobs. Each line must still be
 * to order; a line with no supplier takes the order's, one listed with another supplier is refused.
 */
export async function createPurchaseOrder(db: DB, actor: StaffUser, input: PurchaseOrderInput): Promise<{ id: number; number: string }> {
  const shop = await shopSettings(db);
  return db.transaction().execute(async (trx) => {
    const parts = await trx
      .selectFrom("bought_part as b")
      .innerJoin("job", "job.id", "b.job_id")
      .select(["b.id", "b.description", "b.supplier", "b.state", "b.purchase_order_id", "job.work_order"])
      .where("b.id", "in", input.partIds)
      .execute();
    if (parts.length !== input.partIds.length) throw fieldError("partIds", "One of those bought-in parts is no longer on file; reload the parts desk and choose again.");
    const taken = parts.filter((p) => p.purchase_order_id !== null || p.state !== "needed");
    if (taken.length) throw fieldError("partIds", `Already ordered: ${taken.map((p) => `${p.description} (${p.work_order})`).join(", ")}. Choose lines still to order.`);
    // The same supplier however its name was capitalized or spaced (supplierKey).
    const other = parts.filter((p) => supplierKey(p.supplier) !== "" && supplierKey(p.supplier) !== supplierKey(input.supplier));
    if (other.length) throw fieldError("partIds", `${other.map((p) => `${p.description} (${p.work_order}) is listed with ${p.supplier}`).join("; ")}. Order it on that supplier's purchase order, or change its supplier first.`);
    const seqRow = await trx.selectFrom("shop").select("next_purchase_order").where("id", "=", 1).executeTakeFirst();
    const seq = seqRow?.next_purchase_order ?? 1;
    const year = Number(shopToday({ now: new Date(), timeZone: shop.timeZone }).slice(0, 4));
    const number = formatWorkOrder("PO", year, seq);
    const at = new Date().toISOString();
    const po = await trx
      .insertInto("purchase_order")
      .values({ number, supplier: input.supplier, ordered_on: input.orderedOn, expected_on: input.expectedOn, notes: input.notes, created_by: actor.id, created_at: at })
      .returning("id")
      .executeTakeFirstOrThrow();
    if (seqRow) await trx.updateTable("shop").set({ next_purchase_order: seq + 1 }).where("id", "=", 1).execute();
    await trx
      .updateTable("bought_part")
      .set({ purchase_order_id: po.id, supplier: input.supplier, expected_on: input.expectedOn, state: "ordered", updated_at: at })
      .where("id", "in", input.partIds)
      .execute();
    return { id: po.id, number };
  });
}

/** A new expected date from the supplier moves every line of the order still outstanding. */
export async function setPurchaseOrderExpected(db: DB, id: number, expectedOn: string | null): Promise<void> {
  await db.transaction().execute(async (trx) => {
    const po = await trx.selectFrom("purchase_order").select(["id", "ordered_on"]).where("id", "=", id).executeTakeFirst();
    if (!po) throw notFound("That purchase order");
    if (expectedOn !== null && expectedOn < po.ordered_on) throw fieldError("expectedOn", "The expected date cannot be before the order date.");
    await trx.updateTable("purchase_order").set({ expected_on: expectedOn }).where("id", "=", id).execute();
    await trx.updateTable("bought_part").set({ expected_on: expectedOn, updated_at: new Date().toISOString() }).where("purchase_order_id", "=", id).where("state", "=", "ordered").execute();
  });
}

export { countOf };
