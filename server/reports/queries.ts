import "server-only";
import type { DB } from "@/db";
import { cachedUntilWrite } from "@/db/read-cache";
import { BOARD_STAGES } from "@/server/jobs/stages";
import { shopToday } from "@/server/records/turnaround";
import { addCalendarDays, shopDayStart } from "@/server/shop/business-days";
import { shopHolidays, shopSettings } from "@/server/shop/queries";
import { coaterRecords, type Period, type StageEventRow, stageTimes, throughput, workload } from "./compute";

/** The shop's clock and calendar every report needs. */
export async function reportCalendar(db: DB, now = new Date()) {
  const [shop, holidays] = await Promise.all([shopSettings(db), shopHolidays(db)]);
  return { timeZone: shop.timeZone, holidays, today: shopToday({ now, timeZone: shop.timeZone }) };
}
export type ReportCalendar = Awaited<ReturnType<typeof reportCalendar>>;

/** The instants the period's first day starts and the day after its last day starts. */
function instants(period: Period, timeZone: string) {
  return { start: shopDayStart(period.from, timeZone), end: shopDayStart(addCalendarDays(period.to, 1), timeZone) };
}

export function stageTimesReport(db: DB, period: Period, cal: ReportCalendar) {
  return cachedUntilWrite(db, `stageTimesReport|${period.from}|${period.to}|${cal.today}`, () => buildStageTimesReport(db, period, cal));
}

async function buildStageTimesReport(db: DB, period: Period, cal: ReportCalendar) {
  const { start, end } = instants(period, cal.timeZone);
  // Every event, up to the period's end, of the jobs that moved within it: a visit that ended in
  // the period may have begun long before.
  const rows = await db
    .selectFrom("stage_event")
    .select(["job_id", "from_stage", "to_stage", "at"])
    .where("job_id", "in", (eb) => eb.selectFrom("stage_event").select("job_id").where("at", ">=", start).where("at", "<", end))
    .where("at", "<", end)
    .orderBy("job_id")
    .orderBy("at")
    .orderBy("id")
    .execute();
  const events: StageEventRow[] = rows.map((r) => ({ jobId: r.job_id, fromStage: r.from_stage, toStage: r.to_stage, at: r.at }));
  return { period, stages: stageTimes(events, period, cal.timeZone, cal.holidays) };
}

export function throughputReport(db: DB, period: Period, cal: ReportCalendar) {
  return cachedUntilWrite(db, `throughputReport|${period.from}|${period.to}|${cal.today}`, () => buildThroughputReport(db, period, cal));
}

async function buildThroughputReport(db: DB, period: Period, cal: ReportCalendar) {
  const { start, end } = instants(period, cal.timeZone);
  const rows = await db
    .selectFrom("stage_event")
    .innerJoin("job", "job.id", "stage_event.job_id")
    .select(["stage_event.job_id", "stage_event.at", "job.due_on"])
    .where("stage_event.at", ">=", start)
    .where("stage_event.at", "<", end)
    .where("stage_event.to_stage", "=", "delivered")
    .where((eb) => eb.or([eb("stage_event.from_stage", "is", null), eb("stage_event.from_stage", "!=", "delivered")]))
    .execute();
  return { period, ...throughput(rows.map((r) => ({ jobId: r.job_id, at: r.at, dueOn: r.due_on })), period, cal.timeZone) };
}

export function coatersReport(db: DB, period: Period, cal: ReportCalendar) {
  return cachedUntilWrite(db, `coatersReport|${period.from}|${period.to}|${cal.today}`, () => buildCoatersReport(db, period, cal));
}

async function buildCoatersReport(db: DB, period: Period, cal: ReportCalendar) {
  const rows = await db
    .selectFrom("coating_run")
    .innerJoin("vendor", "vendor.id", "coating_run.vendor_id")
    .select(["coating_run.vendor_id", "vendor.name", "coating_run.sent_on", "coating_run.promised_on", "coating_run.received_on"])
    .where("coating_run.sent_on", ">=", period.from)
    .where("coating_run.sent_on", "<=", period.to)
    .execute();
  const runs = rows.map((r) => ({ vendorId: r.vendor_id, vendorName: r.name, sentOn: r.sent_on, promisedOn: r.promised_on, receivedOn: r.received_on }));
  return { period, today: cal.today, coaters: coaterRecords(runs, period, cal.today, cal.holidays) };
}

/** Active techs with the jobs assigned to them that are still on the board. */
export async function techOpenJobs(db: DB) {
  const rows = await db
    .selectFrom("staff")
    .leftJoin("job", (join) => join.onRef("job.assigned_tech_id", "=", "staff.id").on("job.stage", "in", BOARD_STAGES))
    .select(["staff.id", "staff.name", (eb) => eb.fn.count<number>("job.id").as("open")])
    .where("staff.role", "=", "tech")
    .where("staff.active", "=", 1)
    .groupBy("staff.id")
    .orderBy("staff.name")
    .execute();
  return rows.map((r) => ({ id: r.id, name: r.name, openJobs: Number(r.open) }));
}

export function workloadReport(db: DB, period: Period, cal: ReportCalendar) {
  return cachedUntilWrite(db, `workloadReport|${period.from}|${period.to}|${cal.today}`, () => buildWorkloadReport(db, period, cal));
}

async function buildWorkloadReport(db: DB, period: Period, cal: ReportCalendar) {
  const { start, end } = instants(period, cal.timeZone);
  const techs = await techOpenJobs(db);
  const rows = techs.length
    ? await db
        .selectFrom("stage_event")
        .select(["job_id", "from_stage", "to_stage", "at", "actor_id"])
        .where("at", ">=", start)
        .where("at", "<", end)
        .where("actor_id", "in", techs.map((t) => t.id))
        .execute()
    : [];
  const events: StageEventRow[] = rows.map((r) => ({ jobId: r.job_id, fromStage: r.from_stage, toStage: r.to_stage, at: r.at, actorId: r.actor_id }));
  return { period, ...workload(techs, events, period, cal.timeZone) };
}
