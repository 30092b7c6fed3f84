import { toCsv } from "@/server/audit/csv";
import type { CoaterRow, Period, StageTimeRow, Throughput, Workload } from "./compute";

/** Shares as whole percent, figures as they are; empty for "no figure yet". */
const pct = (share: number | null) => (share === null ? "" : Math.round(share * 100));

export function stageTimesCsv(r: { stages: StageTimeRow[] }) {
  return toCsv(
    ["stage", "jobs_through", "median_business_days", "p90_business_days"],
    r.stages.map((s) => [s.label, s.visits, s.medianDays, s.p90Days]),
  );
}

export function throughputCsv(r: Throughput) {
  return toCsv(
    ["week_starting", "delivered", "on_time", "late", "no_due_date"],
    r.weeks.map((w) => [w.week, w.delivered, w.onTime, w.late, w.noDueDate]),
  );
}

export function coatersCsv(r: { coaters: CoaterRow[] }) {
  return toCsv(
    ["coater", "runs_sent", "received", "on_time", "late", "overdue_now", "median_promised_business_days", "median_turnaround_business_days", "p90_turnaround_business_days", "on_time_percent"],
    r.coaters.map((c) => [c.vendorName, c.runs, c.received, c.onTime, c.late, c.overdue, c.medianPromisedDays, c.medianTurnaroundDays, c.p90TurnaroundDays, pct(c.onTimeShare)]),
  );
}

export function workloadCsv(r: Workload) {
  return toCsv(
    ["tech", "open_jobs_now", "moves_in_period", ...r.weeks.map((w) => `moves_week_of_${w}`)],
    r.techs.map((t) => [t.name, t.openJobs, t.moves, ...t.movesByWeek]),
  );
}

export function csvFilename(report: string, period: Period) {
  return `baywright-${report}-${period.from}-to-${period.to}.csv`;
}
