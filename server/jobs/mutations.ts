import "server-only";
import { sql, type Transaction } from "kysely";
import type { DB } from "@/db";
import type { Database, Stage } from "@/db/schema";
import type { StaffUser } from "@/server/auth/session";
import { recordAudit } from "@/server/audit/record";
import { queueStageMessage } from "@/server/email/outbox";
import { ApiError } from "@/server/http/errors";
import { issueInvoice } from "@/server/money/invoices";
import { loadGateRecords } from "./gate-records";
import { checkMove, GATED_STAGES, NO_RECORDS } from "./gates";
import { findJob } from "./queries";
import type { JobPatch, MoveInput, NewJobInput } from "./schemas";
import { STAGE_LABELS, stageIndex, stagesFor } from "./stages";
import { formatWorkOrder, workOrderYear } from "./work-order";
import { DEFAULT_SHOP_TIME_ZONE } from "@/server/records/settings";

type Trx = Transaction<Database>;

function fieldError(field: string, message: string) {
  return new ApiError("validation", message, { fields: { [field]: [message] } });
}

async function assertTruckOfCustomer(trx: Trx, truckId: number, customerId: number) {
  const truck = await trx.selectFrom("truck").select(["id", "customer_id"]).where("id", "=", truckId).executeTakeFirst();
  if (!truck) throw fieldError("truckId", "That truck is not on file.");
  if (truck.customer_id !== customerId) throw fieldError("truckId", "That truck belongs to another customer.");
}

async function assertTech(trx: Trx, staffId: string | null | undefined) {
  if (!staffId) return;
  const staff = await trx.selectFrom("staff").select("id").where("id", "=", staffId).where("active", "=", 1).executeTakeFirst();
  if (!staff) throw fieldError("assignedTechId", "Choose an active staff member.");
}

/**
 * Columns are kept dense (0, 1, 2…) so no two cards share a place and none is lost. A move shifts
 * only the cards after the two places it touches, in one statement, whatever the column's length:
 * the card leaves position `from.position` of `from.stage` (the cards after it close the gap) and
 * enters position `at` of `toStage` (counted with the card already gone; the cards from there on
 * make room). Same column or two columns, the one expression below does both; `(a > b)` is 0 or 1.
 */
async function shiftColumns(trx: Trx, cardId: number, from: { stage: Stage; position: number }, toStage: Stage, at: number) {
  await sql`update job set position = position
      - (stage = ${from.stage} and position > ${from.position})
      + (stage = ${toStage} and position - (stage = ${from.stage} and position > ${from.position}) >= ${at})
    where id != ${cardId} and ((stage = ${from.stage} and position > ${from.position}) or (stage = ${toStage} and position >= ${at}))`.execute(trx);
}

/** Where the card lands in `toStage`, counted as if it had already left its own column. */
async function landingPosition(trx: Trx, card: { id: number; stage: Stage; position: number }, toStage: Stage, beforeJobId: number | null | undefined) {
  const closesGap = (p: number) => (card.stage === toStage && p > card.position ? 1 : 0);
  if (beforeJobId) {
    const before = await trx.selectFrom("job").select(["stage", "position"]).where("id", "=", beforeJobId).executeTakeFirst();
    if (!before || before.stage !== toStage || beforeJobId === card.id) {
      throw new ApiError("validation", "beforeJobId must be a card in the stage the card moves to.", { fields: { beforeJobId: ["Not a card in that stage."] } });
    }
    return before.position - closesGap(before.position);
  }
  const last = await trx.selectFrom("job").select((eb) => eb.fn.max("position").as("p")).where("stage", "=", toStage).where("id", "!=", card.id).executeTakeFirst();
  if (last?.p === null || last?.p === undefined) return 0;
  return Number(last.p) - closesGap(Number(last.p)) + 1;
}

async function columnIds(trx: Trx, stage: Stage, exceptId?: number) {
  let q = trx.selectFrom("job").select("id").where("stage", "=", stage);
  if (exceptId) q = q.where("id", "!=", exceptId);
  return (await q.orderBy("position").orderBy("id").execute()).map((r) => r.id);
}

export async function createJob(db: DB, actor: StaffUser, input: NewJobInput, now = new Date()) {
  const id = await db.transaction().execute(async (trx) => {
    const customer = await trx.selectFrom("customer").select("id").where("id", "=", input.customerId).executeTakeFirst();
    if (!customer) throw fieldError("customerId", "That customer is not on file.");
    await assertTruckOfCustomer(trx, input.truckId, input.customerId);
    await assertTech(trx, input.assignedTechId);
    const shop = await trx.selectFrom("shop").select(["work_order_prefix", "next_work_order", "time_zone"]).where("id", "=", 1).executeTakeFirst();
    const seq = shop?.next_work_order ?? 1;
    const at = now.toISOString();
    const position = (await columnIds(trx, "queued")).length;
    const job = await trx
      .insertInto("job")
      .values({
        work_order: formatWorkOrder(shop?.work_order_prefix ?? "WO", workOrderYear(now, shop?.time_zone ?? DEFAULT_SHOP_TIME_ZONE), seq),
        customer_id: input.customerId, truck_id: input.truckId, scope: input.scope, description: input.description,
        stage: "queued", position, due_on: input.dueOn ?? null, assigned_tech_id: input.assignedTechId ?? null,
        priority: input.priority, notes: input.notes, version: 1, created_at: at, updated_at: at,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    if (shop) await trx.updateTable("shop").set({ next_work_order: seq + 1 }).where("id", "=", 1).execute();
    else await trx.insertInto("shop").values({ id: 1, name: "Your shop", next_work_order: seq + 1 }).execute();
    await trx.insertInto("stage_event").values({ job_id: job.id, from_stage: null, to_stage: "queued", actor_id: actor.id, at, note: "Work order opened.", override_reason: null }).execute();
    return job.id;
  });
  return (await findJob(db, id))!;
}

export async function patchJob(db: DB, actor: StaffUser, id: number, patch: JobPatch) {
  if (actor.role === "tech") {
    const other = Object.keys(patch).filter((k) => k !== "version" && k !== "notes");
    if (other.length) throw new ApiError("forbidden", `A tech can change a job's notes only; ask the office to change ${other.join(", ")}.`);
  }
  await db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select(["id", "version", "customer_id", "stage"]).where("id", "=", id).executeTakeFirst();
    if (!job) throw new ApiError("not_found", "That job was not found.");
    if (job.version !== patch.version) throw new ApiError("stale", "Someone else changed this job first. Here is the current job; make your change again.", { job: await findJob(trx, id) });
    if (patch.truckId) await assertTruckOfCustomer(trx, patch.truckId, job.customer_id);
    await assertTech(trx, patch.assignedTechId);
    if (patch.scope === "install_only") {
      if (!stagesFor("install_only").includes(job.stage)) {
        throw fieldError("scope", `The job is in ${STAGE_LABELS[job.stage]}; move it out of the fabrication stages before making it install only.`);
      }
      // Install-only jobs skip the leak-test and coating gates, so they may not carry parts that need them.
      const gated = await trx.selectFrom("part").select("name").where("job_id", "=", id).where((eb) => eb.or([eb("needs_leak_test", "=", 1), eb("needs_coating", "=", 1)])).execute();
      if (gated.length) {
        throw fieldError("scope", `${gated.map((p) => p.name).join(", ")} ${gated.length === 1 ? "needs" : "need"} a leak test or outside coating; an install-only job skips those. Change or remove ${gated.length === 1 ? "that part" : "those parts"} first.`);
      }
    }
    const { version, truckId, dueOn, assignedTechId, ...rest } = patch;
    await trx
      .updateTable("job")
      .set({
        ...rest,
        ...(truckId !== undefined ? { truck_id: truckId } : {}),
        ...(dueOn !== undefined ? { due_on: dueOn } : {}),
        ...(assignedTechId !== undefined ? { assigned_tech_id: assignedTechId } : {}),
        version: version + 1,
        updated_at: new Date().toISOString(),
      })
      .where("id", "=", id)
      .where("version", "=", version)
      .execute();
  });
  return (await findJob(db, id))!;
}

export interface MoveResult {
  job: NonNullable<Awaited<ReturnType<typeof findJob>>>;
  eventId: number;
}

/**
 * Moves a card: checks the version (someone may have moved it first), the gates it crosses, and
 * an owner's override; then places it, keeps both columns dense, and writes the stage event and
 * the customer's outbox row in the same transaction.
 */
async function auditOverride(trx: DB, actor: StaffUser, jobId: number, from: Stage, to: Stage, unmet: string[], reason: string, at: string) {
  const { work_order } = await trx.selectFrom("job").select("work_order").where("id", "=", jobId).executeTakeFirstOrThrow();
  await recordAudit(trx, {
    kind: "override",
    actor,
    at,
    subject: `work order ${work_order}`,
    summary: `${actor.name} moved work order ${work_order} from ${STAGE_LABELS[from]} to ${STAGE_LABELS[to]} without: ${unmet.join("; ")}. Reason: ${reason}`,
    details: { jobId, from, to, unmet, reason },
  });
}

export async function moveJob(db: DB, actor: StaffUser, id: number, move: MoveInput): Promise<MoveResult> {
  const eventId = await db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select(["id", "stage", "scope", "version", "position"]).where("id", "=", id).executeTakeFirst();
    if (!job) throw new ApiError("not_found", "That job was not found.");
    if (job.version !== move.version) {
      throw new ApiError("stale", "Someone else moved or changed this card first. The board now shows where it is.", { job: await findJob(trx, id) });
    }
    // Only a forward move into or past a gated stage reads the records (once, in this transaction).
    const gatesAhead = stageIndex(move.toStage) > stageIndex(job.stage) && GATED_STAGES.some((g) => stageIndex(g) <= stageIndex(move.toStage));
    const records = gatesAhead ? (await loadGateRecords(trx, [id])).get(id)! : NO_RECORDS;
    const check = checkMove(job.stage, move.toStage, job.scope, records);
    if (check.unmet.length) {
      if (check.impossible) throw new ApiError("gate_unmet", check.unmet[0], { unmet: check.unmet, canOverride: false });
      if (!move.override) {
        throw new ApiError("gate_unmet", `Not moved to ${STAGE_LABELS[move.toStage]}: ${check.unmet.length === 1 ? check.unmet[0] : `${check.unmet.length} things are missing.`}`, { unmet: check.unmet, canOverride: actor.role === "owner" });
      }
      if (actor.role !== "owner") throw new ApiError("forbidden", "Only the owner can override what a stage needs. Ask the owner, or record what is missing first.");
    }
    const overrideReason = check.unmet.length && move.override ? move.override.reason : null;

    const position = await landingPosition(trx, job, move.toStage, move.beforeJobId);
    const at = new Date().toISOString();
    await shiftColumns(trx, id, job, move.toStage, position);
    const updated = await trx
      .updateTable("job")
      .set({ stage: move.toStage, position, version: job.version + 1, updated_at: at })
      .where("id", "=", id)
      .where("version", "=", move.version)
      .executeTakeFirst();
    if (Number(updated.numUpdatedRows) !== 1) throw new ApiError("stale", "Someone else moved this card first.");

    const event = await trx
      .insertInto("stage_event")
      .values({ job_id: id, from_stage: job.stage, to_stage: move.toStage, actor_id: actor.id, at, note: move.note ?? "", override_reason: overrideReason })
      .returning("id")
      .executeTakeFirstOrThrow();
    // The customer hears about stage changes only, after the quiet period (server/email/outbox.ts).
    await queueStageMessage(trx, { jobId: id, from: job.stage, to: move.toStage, at });
    // Reaching Ready for pickup (or past it) makes the job's invoice; the office sends it from the job page.
    if (stageIndex(move.toStage) >= stageIndex("ready") && stageIndex(job.stage) < stageIndex("ready")) await issueInvoice(trx, id, at, actor.id);
    if (overrideReason) await auditOverride(trx, actor, id, job.stage, move.toStage, check.unmet, overrideReason, at);
    return event.id;
  });
  return { job: (await findJob(db, id))!, eventId };
}
