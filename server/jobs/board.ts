import "server-only";
import { addDays, formatISO } from "date-fns";
import { sql } from "kysely";
import type { DB } from "@/db";
import type { JobScope, Priority, Stage } from "@/db/schema";
import { coatingFlags } from "@/server/records/queries";
import { shopToday } from "@/server/records/turnaround";
import { shopSettings } from "@/server/shop/queries";
import { loadGateRecords } from "./gate-records";
import { nextGateState } from "./gates";
import { moneyWords } from "@/server/money/state";
import { likelyMissesDue } from "./prediction";
import { predictionContext, predictionOf } from "./prediction-queries";
import type { BoardFilter } from "./schemas";
import { BOARD_STAGES, STAGE_LABELS } from "./stages";

/** What a card shows, and no more: the board is fetched often by every open screen. */
export interface BoardCard {
  id: number;
  workOrder: string;
  stage: Stage;
  version: number;
  scope: JobScope;
  priority: Priority;
  customerName: string;
  unitNumber: string;
  vinLast6: string;
  dueOn: string | null;
  overdue: boolean;
  techName: string | null;
  /** The next gate ahead of the card and what it still needs; null when none is ahead. */
  gate: { stage: Stage; label: string; unmet: string[] } | null;
  /** Parts out at the coater: where, when promised, and whether the promise has passed. */
  coating: { overdue: boolean; vendorName: string; promisedOn: string } | null;
  /** Bought-in parts not yet received, by description ("waiting on 2 parts"). */
  waitingParts: string[];
  /** The money state in words ("Quote sent", "Deposit paid", "Balance due $1,234.00"), or null before any quote. */
  money: string | null;
  /** The likely ready date when it falls after the due date ("likely late"), from the shop's stage-time history; null otherwise. */
  likelyLate: { likelyOn: string; lateOn: string } | null;
}

export interface Board {
  today: string;
  columns: { stage: Stage; label: string }[];
  cards: BoardCard[];
  techs: { id: string; name: string }[];
  customers: { id: number; name: string }[];
  /** For an empty, unfiltered board: what the shop has on file, so the board can show the first steps. */
  firstSteps: { customers: number; trucks: number } | null;
}

/** Every job on the board (all stages but delivered), ordered by column position, filtered as asked. */
export async function loadBoard(db: DB, filter: BoardFilter, now = new Date()): Promise<Board> {
  const shop = await shopSettings(db);
  const today = shopToday({ now, timeZone: shop.timeZone });
  let query = db
    .selectFrom("job")
    .innerJoin("customer", "customer.id", "job.customer_id")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .leftJoin("staff", "staff.id", "job.assigned_tech_id")
    .select([
      "job.id", "job.work_order", "job.stage", "job.version", "job.scope", "job.priority",
      "job.due_on", "customer.name as customer_name", "truck.unit_number", "truck.vin", "staff.name as tech_name",
    ])
    // The board's stages by name, not "not delivered": the index finds them without reading the
    // shop's delivered history.
    .where("job.stage", "in", BOARD_STAGES);
  if (filter.tech === "none") query = query.where("job.assigned_tech_id", "is", null);
  else if (filter.tech) query = query.where("job.assigned_tech_id", "=", filter.tech);
  if (filter.customer) query = query.where("job.customer_id", "=", filter.customer);
  if (filter.due === "overdue") query = query.where("job.due_on", "<", today);
  else if (filter.due) {
    const until = formatISO(addDays(new Date(`${today}T12:00:00Z`), filter.due === "week" ? 7 : 14), { representation: "date" });
    query = query.where("job.due_on", "<=", until);
  }
  if (filter.q) {
    // Search by work order, unit number, the last six of the VIN (as the shop reads them off a
    // truck) or a word of the work description.
    const q = `%${filter.q.replace(/[%_\\]/g, (c) => `\\${c}`).toUpperCase()}%`;
    query = query.where((eb) =>
      eb.or([
        eb(sql`upper(job.work_order)`, "like", sql`${q} escape '\\'`),
        eb(sql`upper(truck.unit_number)`, "like", sql`${q} escape '\\'`),
        eb(sql`substr(truck.vin, 12, 6)`, "like", sql`${q} escape '\\'`),
        eb(sql`upper(job.description)`, "like", sql`${q} escape '\\'`),
      ]),
    );
  }
  const rows = await query.orderBy("job.stage").orderBy("job.position").execute();
  const ids = rows.map((r) => r.id);
  const [records, coating, history] = await Promise.all([loadGateRecords(db, ids), coatingFlags(db, ids, now), predictionContext(db, now)]);
  const [techs, customers] = await Promise.all([
    db.selectFrom("staff").select(["id", "name"]).where("active", "=", 1).where("role", "=", "tech").orderBy("name").execute(),
    // Only customers with a job on the board: the filter offers what it can show.
    db.selectFrom("customer").select(["id", "name"]).where("id", "in", db.selectFrom("job").select("customer_id").where("stage", "in", BOARD_STAGES)).orderBy("name").execute(),
  ]);
  const cards: BoardCard[] = rows.map((r) => {
    const jobRecords = records.get(r.id)!;
    const gate = nextGateState(r.stage, r.scope, jobRecords);
    const coatingFlag = coating.get(r.id) ?? null;
    // Only a card with a due date can be late; the route needs only whether parts exist and which lists they are on.
    const prediction = r.due_on === null ? null : predictionOf(history, {
      id: r.id,
      stage: r.stage,
      scope: r.scope,
      parts: jobRecords.partCount > 0 ? [{ needsLeakTest: jobRecords.leakTestParts.length > 0, needsCoating: jobRecords.coatedParts.length > 0 }] : [],
      coatingPromisedOn: coatingFlag?.promisedOn ?? null,
    });
    return {
      id: r.id,
      workOrder: r.work_order,
      stage: r.stage,
      version: r.version,
      scope: r.scope,
      priority: r.priority,
      customerName: r.customer_name,
      unitNumber: r.unit_number,
      vinLast6: r.vin.slice(-6),
      dueOn: r.due_on,
      overdue: r.due_on !== null && r.due_on < today,
      techName: r.tech_name ? r.tech_name.split(" ")[0] : null,
      gate: gate ? { stage: gate.gate, label: STAGE_LABELS[gate.gate], unmet: gate.unmet } : null,
      coating: coatingFlag,
      waitingParts: (jobRecords.waitingBoughtParts ?? []).map((p) => p.description),
      money: jobRecords.money ? moneyWords(jobRecords.money) : null,
      likelyLate: prediction?.kind === "estimate" && likelyMissesDue(prediction, r.due_on) ? { likelyOn: prediction.likelyOn, lateOn: prediction.lateOn } : null,
    };
  });
  const unfiltered = !filter.q && !filter.tech && !filter.customer && !filter.due;
  const firstSteps =
    cards.length === 0 && unfiltered
      ? {
          // Every customer on file (the filter's list holds only those with a job on the board).
          customers: Number((await db.selectFrom("customer").select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow()).n),
          trucks: Number((await db.selectFrom("truck").select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow()).n),
        }
      : null;
  return { today, columns: BOARD_STAGES.map((s) => ({ stage: s, label: STAGE_LABELS[s] })), cards, techs, customers, firstSteps };
}
