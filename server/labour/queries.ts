import "server-only";
import type { DB } from "@/db";
import type { Stage } from "@/db/schema";
import { formatShopTime } from "@/server/records/calendar";
import { type ClockFlag, clockFlags, msByStage, shopDay, type StageChange, stagesOfEntry } from "./rules";

export interface OpenClock {
  entryId: number;
  jobId: number;
  workOrder: string;
  unitNumber: string;
  stage: string;
  startedAt: string;
  /** When it started, on the shop's clock ("07:02", or "Mon 2 Mar 16:02" from an earlier day). */
  since: string;
  flags: ClockFlag[];
}

/** The signed-in person's running clock, if any. */
export async function openClockOf(db: DB, staffId: string, timeZone: string, now = new Date()): Promise<OpenClock | null> {
  const row = await db
    .selectFrom("clock_entry as c")
    .innerJoin("job", "job.id", "c.job_id")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .select(["c.id", "c.job_id", "job.work_order", "truck.unit_number", "c.stage", "c.started_at"])
    .where("c.staff_id", "=", staffId)
    .where("c.ended_at", "is", null)
    .executeTakeFirst();
  if (!row) return null;
  const flags = clockFlags({ startedAt: row.started_at, endedAt: null }, now, timeZone);
  const since = formatShopTime(row.started_at, timeZone, shopDay(row.started_at, timeZone) === shopDay(now, timeZone) ? "HH:mm" : "EEE d MMM HH:mm");
  return { entryId: row.id, jobId: row.job_id, workOrder: row.work_order, unitNumber: row.unit_number, stage: row.stage, startedAt: row.started_at, since, flags };
}

export interface ClockEntryView {
  id: number;
  staffId: string;
  staffName: string;
  jobId: number;
  workOrder: string;
  stage: string;
  startedAt: string;
  endedAt: string | null;
  hours: number;
  flags: ClockFlag[];
  correction: { reason: string; byName: string | null; at: string; originalStartedAt: string | null; originalEndedAt: string | null } | null;
}

function entryQuery(db: DB) {
  return db
    .selectFrom("clock_entry as c")
    .innerJoin("staff as s", "s.id", "c.staff_id")
    .innerJoin("job", "job.id", "c.job_id")
    .leftJoin("staff as fixer", "fixer.id", "c.corrected_by")
    .select([
      "c.id", "c.staff_id", "s.name as staff_name", "c.job_id", "job.work_order", "c.stage", "c.started_at", "c.ended_at",
      "c.correction_reason", "fixer.name as fixer_name", "c.corrected_at", "c.original_started_at", "c.original_ended_at",
    ]);
}
type EntryRow = Awaited<ReturnType<ReturnType<typeof entryQuery>["execute"]>>[number];

function toView(r: EntryRow, now: Date, timeZone: string): ClockEntryView {
  const end = r.ended_at ? new Date(r.ended_at).getTime() : now.getTime();
  return {
    id: r.id,
    staffId: r.staff_id,
    staffName: r.staff_name,
    jobId: r.job_id,
    workOrder: r.work_order,
    stage: r.stage,
    startedAt: r.started_at,
    endedAt: r.ended_at,
    hours: Math.max(0, end - new Date(r.started_at).getTime()) / 3_600_000,
    flags: clockFlags({ startedAt: r.started_at, endedAt: r.ended_at }, now, timeZone),
    correction: r.correction_reason ? { reason: r.correction_reason, byName: r.fixer_name, at: r.corrected_at!, originalStartedAt: r.original_started_at, originalEndedAt: r.original_ended_at } : null,
  };
}

async function stageChangesOf(db: DB, jobId: number): Promise<StageChange[]> {
  const events = await db.selectFrom("stage_event").select(["at", "to_stage"]).where("job_id", "=", jobId).orderBy("id").execute();
  return events.map((e) => ({ at: e.at, toStage: e.to_stage as Stage }));
}

/**
 * A job's clock entries, newest first, each with the stages its hours count under (split at the
 * job's moves exactly as the hours by stage are).
 */
export async function jobClockEntries(db: DB, jobId: number, timeZone: string, now = new Date()): Promise<(ClockEntryView & { stages: string[] })[]> {
  const [rows, changes] = await Promise.all([entryQuery(db).where("c.job_id", "=", jobId).orderBy("c.started_at", "desc").execute(), stageChangesOf(db, jobId)]);
  return rows.map((r) => ({ ...toView(r, now, timeZone), stages: stagesOfEntry({ startedAt: r.started_at, endedAt: r.ended_at, stage: r.stage }, changes, now) }));
}

/** Entries started on or after an instant, across the shop, newest first (the hours page). */
export async function clockEntriesSince(db: DB, since: string, timeZone: string, now = new Date(), limit = 2000) {
  const rows = await entryQuery(db).where("c.started_at", ">=", since).orderBy("c.started_at", "desc").limit(limit).execute();
  return rows.map((r) => toView(r, now, timeZone));
}

/** Clocks still running, with the ones left on over midnight flagged. */
export async function openClocks(db: DB, timeZone: string, now = new Date()) {
  const rows = await entryQuery(db).where("c.ended_at", "is", null).orderBy("c.started_at").execute();
  return rows.map((r) => toView(r, now, timeZone));
}

/** A job's hours by stage (split at its stage changes) and by person. */
export async function jobHours(db: DB, jobId: number, now = new Date()) {
  const [entries, changes] = await Promise.all([
    db.selectFrom("clock_entry as c").innerJoin("staff as s", "s.id", "c.staff_id").select(["c.staff_id", "s.name", "c.stage", "c.started_at", "c.ended_at"]).where("c.job_id", "=", jobId).execute(),
    stageChangesOf(db, jobId),
  ]);
  const byStage = msByStage(entries.map((e) => ({ startedAt: e.started_at, endedAt: e.ended_at, stage: e.stage })), changes, now);
  const byPerson = new Map<string, { name: string; ms: number }>();
  for (const e of entries) {
    const end = e.ended_at ? new Date(e.ended_at).getTime() : now.getTime();
    const p = byPerson.get(e.staff_id) ?? { name: e.name, ms: 0 };
    p.ms += Math.max(0, end - new Date(e.started_at).getTime());
    byPerson.set(e.staff_id, p);
  }
  const totalMs = [...byStage.values()].reduce((a, b) => a + b, 0);
  return {
    totalHours: totalMs / 3_600_000,
    byStage: [...byStage.entries()].map(([stage, ms]) => ({ stage, hours: ms / 3_600_000 })),
    byPerson: [...byPerson.values()].map((p) => ({ name: p.name, hours: p.ms / 3_600_000 })).sort((a, b) => b.hours - a.hours),
  };
}
