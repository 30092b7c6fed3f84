import "server-only";
import type { DB } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import { recordAudit } from "@/server/audit/record";
import { ApiError, notFound } from "@/server/http/errors";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { formatShopTime } from "@/server/records/calendar";
import { shopSettings } from "@/server/shop/queries";
import { overlapping } from "./rules";
import type { ClockCorrection } from "./schemas";

/** Who corrects clock entries: the office and the owner, with a reason that is kept. */
export const CLOCK_CORRECTORS: readonly StaffUser["role"][] = ["office", "owner"];

function fieldError(field: string, message: string) {
  return new ApiError("validation", message, { fields: { [field]: [message] } });
}

export interface ClockAnswer {
  entry: { id: number; jobId: number; stage: string; startedAt: string; endedAt: string | null };
  /** The entry this one closed, when the tap switched jobs. */
  closed: { id: number; jobId: number; endedAt: string } | null;
}

/**
 * Clocks the signed-in person on a job, in one tap from any job they were on: the open entry ends
 * at the instant the new one starts, so nothing overlaps. Clocking on the job already running
 * changes nothing. The job's stage at that moment is recorded with the entry.
 */
export async function clockOn(db: DB, actor: StaffUser, jobId: number, now = new Date()): Promise<ClockAnswer & { unchanged: boolean }> {
  return db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select(["id", "stage", "work_order"]).where("id", "=", jobId).executeTakeFirst();
    if (!job) throw fieldError("jobId", "That job is not on file.");
    if (job.stage === "delivered") throw fieldError("jobId", `Work order ${job.work_order} is delivered; clock on a job still in the shop.`);
    const at = now.toISOString();
    const open = await trx.selectFrom("clock_entry").select(["id", "job_id", "stage", "started_at"]).where("staff_id", "=", actor.id).where("ended_at", "is", null).executeTakeFirst();
    if (open && open.job_id === jobId) {
      return { entry: { id: open.id, jobId, stage: open.stage, startedAt: open.started_at, endedAt: null }, closed: null, unchanged: true };
    }
    let closed: ClockAnswer["closed"] = null;
    if (open) {
      // A clock whose start is later than now (a corrected entry, a clock set wrong) ends where it began.
      const endedAt = open.started_at > at ? open.started_at : at;
      await trx.updateTable("clock_entry").set({ ended_at: endedAt }).where("id", "=", open.id).execute();
      closed = { id: open.id, jobId: open.job_id, endedAt };
    }
    const startedAt = closed && closed.endedAt > at ? closed.endedAt : at;
    const row = await trx.insertInto("clock_entry").values({ staff_id: actor.id, job_id: jobId, stage: job.stage, started_at: startedAt, ended_at: null }).returning("id").executeTakeFirstOrThrow();
    return { entry: { id: row.id, jobId, stage: job.stage, startedAt, endedAt: null }, closed, unchanged: false };
  });
}

/** Clocks the signed-in person off whatever they are on. */
export async function clockOff(db: DB, actor: StaffUser, now = new Date()): Promise<ClockAnswer["entry"]> {
  return db.transaction().execute(async (trx) => {
    const open = await trx.selectFrom("clock_entry").select(["id", "job_id", "stage", "started_at"]).where("staff_id", "=", actor.id).where("ended_at", "is", null).executeTakeFirst();
    if (!open) throw new ApiError("conflict", "You are not clocked on any job.");
    const at = now.toISOString();
    const endedAt = open.started_at > at ? open.started_at : at;
    await trx.updateTable("clock_entry").set({ ended_at: endedAt }).where("id", "=", open.id).execute();
    return { id: open.id, jobId: open.job_id, stage: open.stage, startedAt: open.started_at, endedAt };
  });
}

/**
 * The office corrects an entry's times with a reason. The times as first clocked are kept beside
 * the correction, the audit trail gets a line, and the corrected entry may not overlap another of
 * the same person's (nobody works two jobs at once).
 */
export async function correctClockEntry(db: DB, actor: StaffUser, id: number, input: ClockCorrection, now = new Date()): Promise<void> {
  if (!CLOCK_CORRECTORS.includes(actor.role)) throw new ApiError("forbidden", "Only the office or the owner corrects clock entries; ask them, and say what the hours should be.");
  if (new Date(input.endedAt) > now) throw fieldError("endedAt", "The end is in the future; a correction records hours already worked.");
  await db.transaction().execute(async (trx) => {
    const entry = await trx
      .selectFrom("clock_entry as c")
      .innerJoin("staff as s", "s.id", "c.staff_id")
      .innerJoin("job", "job.id", "c.job_id")
      .select(["c.id", "c.staff_id", "c.job_id", "c.stage", "c.started_at", "c.ended_at", "c.original_started_at", "c.original_ended_at", "s.name", "job.work_order"])
      .where("c.id", "=", id)
      .executeTakeFirst();
    if (!entry) throw notFound("That clock entry");
    const others = await trx.selectFrom("clock_entry").select(["id", "staff_id", "job_id", "started_at", "ended_at"]).where("staff_id", "=", entry.staff_id).where("id", "!=", id).execute();
    const clash = overlapping(
      { id, staffId: entry.staff_id, jobId: entry.job_id, startedAt: input.startedAt, endedAt: input.endedAt },
      others.map((o) => ({ id: o.id, staffId: o.staff_id, jobId: o.job_id, startedAt: o.started_at, endedAt: o.ended_at })),
      now,
    );
    const { timeZone } = await shopSettings(trx);
    const shopTime = (iso: string | null) => (iso ? formatShopTime(iso, timeZone, "EEE d MMM yyyy HH:mm") : "still on");
    if (clash.length) throw fieldError("startedAt", `Those times overlap ${entry.name}'s ${clash.length === 1 ? "entry" : `${clash.length} entries`} from ${shopTime(clash[0].startedAt)} (shop time); nobody works two jobs at once. Correct that entry first or choose other times.`);
    const startedAt = new Date(input.startedAt).toISOString();
    const endedAt = new Date(input.endedAt).toISOString();
    await trx
      .updateTable("clock_entry")
      .set({
        started_at: startedAt,
        ended_at: endedAt,
        original_started_at: entry.original_started_at ?? entry.started_at,
        original_ended_at: entry.original_started_at ? entry.original_ended_at : entry.ended_at,
        correction_reason: input.reason,
        corrected_by: actor.id,
        corrected_at: now.toISOString(),
      })
      .where("id", "=", id)
      .execute();
    await recordAudit(trx, {
      kind: "clock_corrected",
      actor,
      subject: `work order ${entry.work_order}`,
      summary: `${actor.name} corrected ${entry.name}'s clock entry on work order ${entry.work_order} (${STAGE_LABELS[entry.stage as keyof typeof STAGE_LABELS] ?? entry.stage}) from ${shopTime(entry.started_at)} – ${shopTime(entry.ended_at)} to ${shopTime(startedAt)} – ${shopTime(endedAt)} (shop time). Reason: ${input.reason}`,
      details: { entryId: id, before: { startedAt: entry.started_at, endedAt: entry.ended_at }, after: { startedAt, endedAt }, reason: input.reason },
    });
  });
}
