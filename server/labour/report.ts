import "server-only";
import type { DB } from "@/db";
import { cachedUntilWrite } from "@/db/read-cache";
import type { Stage } from "@/db/schema";
import { toCsv } from "@/server/audit/csv";
import { STAGE_LABELS } from "@/server/jobs/stages";
import type { Period } from "@/server/reports/compute";
import type { ReportCalendar } from "@/server/reports/queries";
import { addCalendarDays, shopDayStart } from "@/server/shop/business-days";
import { jobCost } from "./cost";
import { coatingSharesOf, labourRateCents } from "./job-cost";
import { hoursByWeek, msByStage } from "./rules";

export interface JobCostRow {
  jobId: number;
  workOrder: string;
  customerName: string;
  stage: Stage;
  hours: number;
  labourCents: number;
  partsCents: number;
  unpricedParts: number;
  /** The job's share of its coating runs' prices; runs with no price yet are counted apart. */
  coatingCents: number;
  unpricedCoatingRuns: number;
  totalCents: number;
  byStage: Record<string, number>;
  /** The approved quote and change orders before tax; null when none is approved. */
  quotedCents: number | null;
  quotedHours: number | null;
  /** Cost so far less the quote: above 0 is over the quote. */
  overQuoteCents: number | null;
}

/**
 * Each job's cost from the clock entries started in the period (split by stage at its moves), all
 * its bought-in parts and its share of its coating runs, plus hours by stage across those jobs and hours per person per week.
 * A job with an approved quote is compared with it in total (quote lines carry no stage).
 */
export function jobCostsReport(db: DB, period: Period, cal: ReportCalendar, now = new Date()) {
  // A running clock's hours grow by the minute with nothing written: a kept answer a minute old is
  // still served at once while a fresh one is built behind it.
  return cachedUntilWrite(db, `jobCostsReport|${period.from}|${period.to}`, () => buildJobCostsReport(db, period, cal, now), { refreshAfterMs: 60_000 });
}

async function buildJobCostsReport(db: DB, period: Period, cal: ReportCalendar, now: Date) {
  const start = shopDayStart(period.from, cal.timeZone);
  const end = shopDayStart(addCalendarDays(period.to, 1), cal.timeZone);
  const rate = await labourRateCents(db);
  const entries = await db
    .selectFrom("clock_entry as c")
    .innerJoin("staff as s", "s.id", "c.staff_id")
    .select(["c.job_id", "c.staff_id", "s.name", "c.stage", "c.started_at", "c.ended_at"])
    .where("c.started_at", ">=", start)
    .where("c.started_at", "<", end)
    .execute();
  const jobIds = [...new Set(entries.map((e) => e.job_id))];
  const [jobs, events, lines, quoteLines, coatingOf] = jobIds.length
    ? await Promise.all([
        db.selectFrom("job").innerJoin("customer", "customer.id", "job.customer_id").select(["job.id", "job.work_order", "job.stage", "customer.name"]).where("job.id", "in", jobIds).execute(),
        db.selectFrom("stage_event").select(["job_id", "at", "to_stage"]).where("job_id", "in", jobIds).orderBy("id").execute(),
        db.selectFrom("bought_part").select(["job_id", "quantity", "unit_cost_cents"]).where("job_id", "in", jobIds).execute(),
        db
          .selectFrom("quote_line as l")
          .innerJoin("quote as q", "q.id", "l.quote_id")
          .select(["q.job_id", "l.kind", "l.quantity_milli", "l.amount_cents"])
          .where("q.job_id", "in", jobIds)
          .where("q.status", "=", "approved")
          .execute(),
        coatingSharesOf(db, jobIds),
      ])
    : [[], [], [], [], await coatingSharesOf(db, [])];
  const group = <T extends { job_id: number }>(rows: T[]) => {
    const m = new Map<number, T[]>();
    for (const r of rows) m.set(r.job_id, [...(m.get(r.job_id) ?? []), r]);
    return m;
  };
  const entriesBy = group(entries);
  const eventsBy = group(events);
  const linesBy = group(lines);
  const quotedBy = group(quoteLines);
  const totals = new Map<string, number>();
  const rows: JobCostRow[] = jobs.map((j) => {
    const byStage = msByStage(
      (entriesBy.get(j.id) ?? []).map((e) => ({ startedAt: e.started_at, endedAt: e.ended_at, stage: e.stage })),
      (eventsBy.get(j.id) ?? []).map((e) => ({ at: e.at, toStage: e.to_stage as Stage })),
      now,
    );
    for (const [stage, ms] of byStage) totals.set(stage, (totals.get(stage) ?? 0) + ms);
    const cost = jobCost({
      rateCentsPerHour: rate,
      msByStage: byStage,
      boughtLines: (linesBy.get(j.id) ?? []).map((l) => ({ quantity: l.quantity, unitCostCents: l.unit_cost_cents })),
      coating: coatingOf(j.id),
    });
    const q = quotedBy.get(j.id);
    const quotedCents = q ? q.reduce((n, l) => n + l.amount_cents, 0) : null;
    const quotedHours = q ? q.filter((l) => l.kind === "labour").reduce((n, l) => n + l.quantity_milli, 0) / 1000 : null;
    return {
      quotedCents, quotedHours, overQuoteCents: quotedCents === null ? null : cost.totalCents - quotedCents,
      jobId: j.id, workOrder: j.work_order, customerName: j.name, stage: j.stage, hours: cost.hours, labourCents: cost.labourCents, partsCents: cost.partsCents,
      unpricedParts: cost.unpricedParts, coatingCents: cost.coatingCents, unpricedCoatingRuns: cost.unpricedCoatingRuns, totalCents: cost.totalCents, byStage: Object.fromEntries(cost.stages.map((s) => [s.stage, s.hours])),
    };
  });
  rows.sort((a, b) => b.totalCents - a.totalCents || a.workOrder.localeCompare(b.workOrder));
  const weekly = hoursByWeek(entries.map((e) => ({ staffId: e.staff_id, startedAt: e.started_at, endedAt: e.ended_at })), now, cal.timeZone);
  const names = new Map(entries.map((e) => [e.staff_id, e.name]));
  const weeks = [...new Set([...weekly.values()].flatMap((m) => [...m.keys()]))].sort();
  return {
    period,
    labourRateCents: rate,
    jobs: rows,
    stages: [...totals.entries()].map(([stage, ms]) => ({ stage, label: STAGE_LABELS[stage as Stage] ?? stage, hours: ms / 3_600_000 })).sort((a, b) => b.hours - a.hours),
    people: { weeks, rows: [...weekly.entries()].map(([id, m]) => ({ name: names.get(id) ?? id, hours: weeks.map((w) => m.get(w) ?? 0) })).sort((a, b) => a.name.localeCompare(b.name)) },
  };
}
export type JobCostsReport = Awaited<ReturnType<typeof jobCostsReport>>;

const money = (cents: number) => (cents / 100).toFixed(2);

export function jobCostsCsv(r: JobCostsReport) {
  return toCsv(
    ["work_order", "customer", "stage_now", "hours", "quoted_hours", "labour_dollars", "bought_in_dollars", "unpriced_bought_in_lines", "coating_dollars", "unpriced_coating_runs", "cost_dollars", "quoted_dollars", "over_under_quote_dollars"],
    r.jobs.map((j) => [
      j.workOrder, j.customerName, STAGE_LABELS[j.stage], j.hours.toFixed(2), j.quotedHours === null ? "" : j.quotedHours.toFixed(2), money(j.labourCents), money(j.partsCents), j.unpricedParts,
      money(j.coatingCents), j.unpricedCoatingRuns, money(j.totalCents), j.quotedCents === null ? "" : money(j.quotedCents), j.overQuoteCents === null ? "" : money(j.overQuoteCents),
    ]),
  );
}
