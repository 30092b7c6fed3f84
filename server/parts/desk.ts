import "server-only";
import { addDays, formatISO, startOfISOWeek } from "date-fns";
import { sql } from "kysely";
import type { DB } from "@/db";
import { cachedUntilWrite } from "@/db/read-cache";
import type { BoughtPartKind, BoughtPartState } from "@/db/tables/bought-parts";
import { shopToday } from "@/server/records/turnaround";
import { shopSettings } from "@/server/shop/queries";
import { distinctSuppliers, groupBySupplier, lineCents } from "./rules";

export interface DeskLine {
  id: number;
  jobId: number;
  workOrder: string;
  unitNumber: string;
  stage: string;
  kind: BoughtPartKind;
  description: string;
  partNumber: string;
  quantity: number;
  receivedQuantity: number;
  supplier: string;
  costCents: number | null;
  lineCents: number | null;
  state: BoughtPartState;
  purchaseOrder: { id: number; number: string; orderedOn: string } | null;
  expectedOn: string | null;
  overdue: boolean;
}

export interface PartsDesk {
  today: string;
  /** The shop's time zone, for showing when things were received. */
  timeZone: string;
  weekStart: string;
  /** Lines still to order, grouped by supplier ("" = none chosen yet), suppliers A–Z. */
  toOrder: { supplier: string; lines: DeskLine[] }[];
  /** Lines on order, by supplier, soonest expected first. */
  onOrder: { supplier: string; lines: DeskLine[] }[];
  overdue: DeskLine[];
  receivedThisWeek: { id: number; at: string; quantity: number; byName: string; description: string; workOrder: string; jobId: number }[];
  orders: { id: number; number: string; supplier: string; orderedOn: string; expectedOn: string | null; lines: number; open: number }[];
  suppliers: string[];
}

// Suppliers are told apart without capitals or stray spaces (supplierKey): one group, one order.
const bySupplier = (lines: DeskLine[]) => groupBySupplier(lines);

/**
 * The shop's parts desk, kept until the shop writes anything (the reports' rule): the office opens
 * it far more often than a part changes.
 */
export async function loadPartsDesk(db: DB, now = new Date()): Promise<PartsDesk> {
  const shop = await shopSettings(db);
  const today = shopToday({ now, timeZone: shop.timeZone });
  return cachedUntilWrite(db, `partsDesk|${today}`, () => buildPartsDesk(db, today, shop.timeZone));
}

/**
 * The shop's parts desk: what to order, what is on order (and overdue), what came this week, and
 * the newest purchase orders. Reads by state (indexed), so the shop's delivered history is not read.
 */
export async function buildPartsDesk(db: DB, today: string, timeZone: string): Promise<PartsDesk> {
  // The shop's week starts on Monday (ISO 8601 weeks).
  const weekStart = formatISO(startOfISOWeek(new Date(`${today}T12:00:00Z`)), { representation: "date" });
  const rows = await db
    .selectFrom("bought_part as b")
    .innerJoin("job", "job.id", "b.job_id")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .leftJoin("purchase_order as po", "po.id", "b.purchase_order_id")
    .select([
      "b.id", "b.job_id", "job.work_order", "truck.unit_number", "job.stage", "b.kind", "b.description", "b.part_number", "b.quantity",
      "b.received_quantity", "b.supplier", "b.unit_cost_cents", "b.state", "b.purchase_order_id", "po.number", "po.ordered_on", "b.expected_on",
    ])
    .where("b.state", "in", ["needed", "ordered"])
    .orderBy("b.supplier")
    .orderBy("b.id")
    .execute();
  const lines: DeskLine[] = rows.map((r) => ({
    id: r.id,
    jobId: r.job_id,
    workOrder: r.work_order,
    unitNumber: r.unit_number,
    stage: r.stage,
    kind: r.kind,
    description: r.description,
    partNumber: r.part_number,
    quantity: r.quantity,
    receivedQuantity: r.received_quantity,
    supplier: r.supplier,
    costCents: r.unit_cost_cents,
    lineCents: lineCents(r.quantity, r.unit_cost_cents),
    state: r.state,
    purchaseOrder: r.purchase_order_id !== null && r.number !== null ? { id: r.purchase_order_id, number: r.number, orderedOn: r.ordered_on! } : null,
    expectedOn: r.expected_on,
    overdue: r.state === "ordered" && r.expected_on !== null && r.expected_on < today,
  }));
  const ordered = lines.filter((l) => l.state === "ordered").sort((a, b) => (a.expectedOn ?? "9999").localeCompare(b.expectedOn ?? "9999") || a.id - b.id);
  const weekStartInstant = new Date(`${weekStart}T00:00:00Z`);
  // A day's margin either side of midnight UTC; the shop's own day decides below.
  const receipts = await db
    .selectFrom("bought_part_receipt as r")
    .innerJoin("bought_part as b", "b.id", "r.bought_part_id")
    .innerJoin("job", "job.id", "b.job_id")
    .select(["r.id", "r.received_at", "r.quantity", "r.received_by_name", "b.description", "job.work_order", "job.id as job_id"])
    .where("r.received_at", ">=", addDays(weekStartInstant, -1).toISOString())
    .orderBy("r.received_at", "desc")
    .limit(500)
    .execute();
  const receivedThisWeek = receipts
    .filter((r) => shopToday({ now: new Date(r.received_at), timeZone }) >= weekStart)
    .map((r) => ({ id: r.id, at: r.received_at, quantity: r.quantity, byName: r.received_by_name, description: r.description, workOrder: r.work_order, jobId: r.job_id }));
  const orders = await db
    .selectFrom("purchase_order as po")
    .select((eb) => [
      "po.id", "po.number", "po.supplier", "po.ordered_on", "po.expected_on",
      eb.selectFrom("bought_part").select((e) => e.fn.countAll<number>().as("n")).whereRef("bought_part.purchase_order_id", "=", "po.id").as("lines"),
      eb.selectFrom("bought_part").select((e) => e.fn.countAll<number>().as("n")).whereRef("bought_part.purchase_order_id", "=", "po.id").where("bought_part.state", "=", "ordered").as("open"),
    ])
    .orderBy("po.id", "desc")
    .limit(20)
    .execute();
  const suppliers = await db.selectFrom("purchase_order").select("supplier").distinct().orderBy("supplier").limit(200).execute();
  return {
    today,
    timeZone,
    weekStart,
    toOrder: bySupplier(lines.filter((l) => l.state === "needed")),
    onOrder: bySupplier(ordered).map((g) => ({ supplier: g.supplier, lines: g.lines })),
    overdue: ordered.filter((l) => l.overdue),
    receivedThisWeek,
    orders: orders.map((o) => ({ id: o.id, number: o.number, supplier: o.supplier, orderedOn: o.ordered_on, expectedOn: o.expected_on, lines: Number(o.lines ?? 0), open: Number(o.open ?? 0) })),
    suppliers: distinctSuppliers([...suppliers.map((s) => s.supplier), ...[...lines].sort((a, b) => a.id - b.id).map((l) => l.supplier)]),
  };
}

/** Counts for the overview: lines to order, lines on order, and those past their expected date. */
export async function partsWaitingCounts(db: DB, today: string) {
  const row = await db
    .selectFrom("bought_part")
    .select([
      sql<number>`coalesce(sum(state = 'needed'), 0)`.as("to_order"),
      sql<number>`coalesce(sum(state = 'ordered'), 0)`.as("on_order"),
      sql<number>`coalesce(sum(state = 'ordered' and expected_on < ${today}), 0)`.as("overdue"),
    ])
    .where("state", "in", ["needed", "ordered"])
    .executeTakeFirstOrThrow();
  return { toOrder: Number(row.to_order), onOrder: Number(row.on_order), overdue: Number(row.overdue) };
}
