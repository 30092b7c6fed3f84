import "server-only";
import type { DB } from "@/db";
import type { BoughtPartKind, BoughtPartState } from "@/db/tables/bought-parts";
import { showStoredDate } from "@/server/http/calendar-date";
import { latestKitSpec } from "@/server/kit-spec/queries";
import { type FitFlag, type FitSpec, fitFlags } from "./fit";
import { distinctSuppliers, lineCents, orderTotal } from "./rules";

export interface BoughtPartView {
  id: number;
  jobId: number;
  kind: BoughtPartKind;
  description: string;
  partNumber: string;
  quantity: number;
  supplier: string;
  /** Cost of one, cents; null when unknown or when the reader may not see costs (a tech). */
  costCents: number | null;
  lineCents: number | null;
  state: BoughtPartState;
  purchaseOrder: { id: number; number: string; orderedOn: string } | null;
  expectedOn: string | null;
  receivedQuantity: number;
  receipts: { quantity: number; byName: string; at: string }[];
  installedAt: string | null;
  installedByName: string | null;
  fitsTransmission: string;
  ratioPercent: number | null;
  displacementCuIn: number | null;
  source: "manual" | "kit_spec" | "quote";
  fit: FitFlag[];
}

const PART_COLUMNS = [
  "b.id", "b.job_id", "b.kind", "b.description", "b.part_number", "b.quantity", "b.supplier", "b.unit_cost_cents", "b.state",
  "b.purchase_order_id", "b.expected_on", "b.received_quantity", "b.installed_at", "b.fits_transmission", "b.ratio_percent",
  "b.displacement_cu_in", "b.source", "po.number as po_number", "po.ordered_on as po_ordered_on", "installer.name as installed_by_name",
] as const;

function baseQuery(db: DB) {
  return db
    .selectFrom("bought_part as b")
    .leftJoin("purchase_order as po", "po.id", "b.purchase_order_id")
    .leftJoin("staff as installer", "installer.id", "b.installed_by")
    .select(PART_COLUMNS);
}
type PartRow = Awaited<ReturnType<ReturnType<typeof baseQuery>["execute"]>>[number];

function toView(r: PartRow, receipts: BoughtPartView["receipts"], withCost: boolean, truck: { transmission: string } | null, spec: FitSpec | null): BoughtPartView {
  const cost = withCost ? r.unit_cost_cents : null;
  const line = { kind: r.kind, fitsTransmission: r.fits_transmission, ratioPercent: r.ratio_percent, displacementCuIn: r.displacement_cu_in };
  return {
    id: r.id,
    jobId: r.job_id,
    kind: r.kind,
    description: r.description,
    partNumber: r.part_number,
    quantity: r.quantity,
    supplier: r.supplier,
    costCents: cost,
    lineCents: lineCents(r.quantity, cost),
    state: r.state,
    purchaseOrder: r.purchase_order_id !== null && r.po_number !== null ? { id: r.purchase_order_id, number: r.po_number, orderedOn: r.po_ordered_on! } : null,
    expectedOn: r.expected_on,
    receivedQuantity: r.received_quantity,
    receipts,
    installedAt: r.installed_at,
    installedByName: r.installed_by_name,
    fitsTransmission: r.fits_transmission,
    ratioPercent: r.ratio_percent,
    displacementCuIn: r.displacement_cu_in,
    source: r.source,
    fit: truck ? fitFlags(line, truck, spec) : [],
  };
}

async function receiptsFor(db: DB, ids: readonly number[]) {
  const out = new Map<number, BoughtPartView["receipts"]>();
  if (ids.length === 0) return out;
  const rows = await db
    .selectFrom("bought_part_receipt")
    .select(["bought_part_id", "quantity", "received_by_name", "received_at"])
    .where("bought_part_id", "in", ids)
    .orderBy("id")
    .execute();
  for (const r of rows) {
    const list = out.get(r.bought_part_id) ?? [];
    list.push({ quantity: r.quantity, byName: r.received_by_name, at: r.received_at });
    out.set(r.bought_part_id, list);
  }
  return out;
}

/** What the job's kit spec says a PTO and pump should be, for the fit checks. */
export async function fitSpecFor(db: DB, jobId: number): Promise<FitSpec | null> {
  const spec = await latestKitSpec(db, jobId);
  if (!spec) return null;
  const inputs = spec.inputs as unknown as { ptoRatioPercent?: number; pumpDisplacementCuIn?: number };
  return { ptoRatioPercent: inputs.ptoRatioPercent ?? null, pumpDisplacementCuIn: inputs.pumpDisplacementCuIn ?? null };
}

/** A job's bought-in parts in the order they were listed, each with its fit checks. */
export async function listBoughtParts(db: DB, jobId: number, opts: { withCost: boolean }): Promise<BoughtPartView[]> {
  const [rows, truck, spec] = await Promise.all([
    baseQuery(db).where("b.job_id", "=", jobId).orderBy("b.id").execute(),
    db.selectFrom("job").innerJoin("truck", "truck.id", "job.truck_id").select("truck.transmission").where("job.id", "=", jobId).executeTakeFirst(),
    fitSpecFor(db, jobId),
  ]);
  const receipts = await receiptsFor(db, rows.map((r) => r.id));
  return rows.map((r) => toView(r, receipts.get(r.id) ?? [], opts.withCost, truck ?? { transmission: "" }, spec));
}

export async function findBoughtPart(db: DB, id: number, opts: { withCost: boolean }): Promise<BoughtPartView | null> {
  const row = await db.selectFrom("bought_part").select("job_id").where("id", "=", id).executeTakeFirst();
  if (!row) return null;
  return (await listBoughtParts(db, row.job_id, opts)).find((p) => p.id === id) ?? null;
}

export interface WaitingBoughtPart {
  jobId: number;
  description: string;
  quantity: number;
  receivedQuantity: number;
  state: BoughtPartState;
  purchaseOrder: string | null;
  expectedOn: string | null;
}

/** Bought-in parts not yet received, for many jobs at once (the board and the Install check). */
export async function waitingBoughtParts(db: DB, jobIds: readonly number[]): Promise<WaitingBoughtPart[]> {
  if (jobIds.length === 0) return [];
  const rows = await db
    .selectFrom("bought_part as b")
    .leftJoin("purchase_order as po", "po.id", "b.purchase_order_id")
    .select(["b.job_id", "b.description", "b.quantity", "b.received_quantity", "b.state", "po.number", "b.expected_on"])
    .where("b.job_id", "in", jobIds)
    .where("b.state", "in", ["needed", "ordered"])
    .orderBy("b.job_id")
    .orderBy("b.id")
    .execute();
  return rows.map((r) => ({
    jobId: r.job_id,
    description: r.description,
    quantity: r.quantity,
    receivedQuantity: r.received_quantity,
    state: r.state,
    purchaseOrder: r.number,
    expectedOn: r.expected_on ? showStoredDate(r.expected_on, "EEE d MMM") : null,
  }));
}

export interface PurchaseOrderView {
  id: number;
  number: string;
  supplier: string;
  orderedOn: string;
  expectedOn: string | null;
  notes: string;
  createdByName: string | null;
  lines: (BoughtPartView & { workOrder: string; unitNumber: string })[];
  totalCents: number;
  unpriced: number;
}

export async function findPurchaseOrder(db: DB, id: number): Promise<PurchaseOrderView | null> {
  const po = await db
    .selectFrom("purchase_order as po")
    .leftJoin("staff", "staff.id", "po.created_by")
    .select(["po.id", "po.number", "po.supplier", "po.ordered_on", "po.expected_on", "po.notes", "staff.name"])
    .where("po.id", "=", id)
    .executeTakeFirst();
  if (!po) return null;
  const rows = await baseQuery(db)
    .innerJoin("job", "job.id", "b.job_id")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .select(["job.work_order", "truck.unit_number"])
    .where("b.purchase_order_id", "=", id)
    .orderBy("job.work_order")
    .orderBy("b.id")
    .execute();
  const receipts = await receiptsFor(db, rows.map((r) => r.id));
  const lines = rows.map((r) => ({ ...toView(r, receipts.get(r.id) ?? [], true, null, null), workOrder: r.work_order, unitNumber: r.unit_number }));
  const total = orderTotal(lines.map((l) => ({ quantity: l.quantity, unitCostCents: l.costCents })));
  return {
    id: po.id,
    number: po.number,
    supplier: po.supplier,
    orderedOn: po.ordered_on,
    expectedOn: po.expected_on,
    notes: po.notes,
    createdByName: po.name,
    lines,
    totalCents: total.totalCents,
    unpriced: total.unpriced,
  };
}

/**
 * The suppliers the shop already uses, one name each as first written (see supplierKey): those of
 * its purchase orders, then those of lines still to order or on order. Read by the state index,
 * so the shop's delivered history is not read.
 */
export async function knownSuppliers(db: DB): Promise<string[]> {
  const [orders, open] = await Promise.all([
    db.selectFrom("purchase_order").select("supplier").distinct().orderBy("supplier").limit(200).execute(),
    db
      .selectFrom("bought_part")
      .select((eb) => ["supplier", eb.fn.min("id").as("first")])
      .where("state", "in", ["needed", "ordered"])
      .where("supplier", "<>", "")
      .groupBy("supplier")
      .orderBy("first")
      .limit(200)
      .execute(),
  ]);
  return distinctSuppliers([...orders.map((o) => o.supplier), ...open.map((o) => o.supplier)]);
}
