import type { Stage } from "@/db/schema";
import { STAGE_LABELS, STAGES } from "@/server/jobs/stages";
import { addCalendarDays, type Holidays, shopDateOf, weekOf, workingDaysBetween } from "@/server/shop/business-days";
import { median, percentile } from "./stats";

/*
 * The arithmetic of the shop's reports, on rows already read from the database. Pure, so the
 * tests build event histories by hand. Every figure is in business days on the shop's calendar
 * (weekends and shop holidays skipped) and dates are days on the shop's clock.
 */

/** First and last day of a report, inclusive (YYYY-MM-DD on the shop's calendar). */
export interface Period {
  from: string;
  to: string;
}

export interface StageEventRow {
  jobId: number;
  fromStage: Stage | null;
  toStage: Stage;
  /** ISO instant. */
  at: string;
  actorId?: string | null;
}

export interface StageVisit {
  jobId: number;
  stage: Stage;
  enteredAt: string;
  leftAt: string | null;
  /** Business days from the day it entered to the day it left; null while the job is still there. */
  businessDays: number | null;
}

/**
 * Each stay of a job in a stage, from its events (in the order they happened). A job that went
 * back to Fabricate twice has three Fabricate visits. A reorder inside a column (from = to) is not
 * a visit.
 */
export function stageVisits(events: readonly StageEventRow[], timeZone: string, holidays: Holidays): StageVisit[] {
  const byJob = new Map<number, StageEventRow[]>();
  for (const e of events) {
    const list = byJob.get(e.jobId);
    if (list) list.push(e);
    else byJob.set(e.jobId, [e]);
  }
  const visits: StageVisit[] = [];
  for (const [jobId, list] of byJob) {
    let open: { stage: Stage; at: string } | null = null;
    for (const e of list) {
      if (open && e.toStage === open.stage) continue;
      if (open) {
        visits.push({ jobId, stage: open.stage, enteredAt: open.at, leftAt: e.at, businessDays: workingDaysBetween(shopDateOf(open.at, timeZone), shopDateOf(e.at, timeZone), holidays) });
      }
      open = { stage: e.toStage, at: e.at };
    }
    if (open) visits.push({ jobId, stage: open.stage, enteredAt: open.at, leftAt: null, businessDays: null });
  }
  return visits;
}

export interface StageTimeRow {
  stage: Stage;
  label: string;
  /** Visits that ended within the period. */
  visits: number;
  medianDays: number | null;
  p90Days: number | null;
}

/** Time in each stage (Delivered is an end, not a stage to wait in) over visits that ended within the period. */
export function stageTimes(events: readonly StageEventRow[], period: Period, timeZone: string, holidays: Holidays): StageTimeRow[] {
  const days = new Map<Stage, number[]>();
  for (const v of stageVisits(events, timeZone, holidays)) {
    if (v.leftAt === null || v.businessDays === null) continue;
    const left = shopDateOf(v.leftAt, timeZone);
    if (left < period.from || left > period.to) continue;
    const list = days.get(v.stage) ?? [];
    list.push(v.businessDays);
    days.set(v.stage, list);
  }
  return STAGES.filter((s) => s !== "delivered").map((stage) => {
    const list = days.get(stage) ?? [];
    return { stage, label: STAGE_LABELS[stage], visits: list.length, medianDays: median(list), p90Days: percentile(list, 90) };
  });
}

/** The Mondays of every week that touches the period, oldest first. */
export function weeksOf(period: Period): string[] {
  const weeks: string[] = [];
  for (let w = weekOf(period.from); w <= period.to; w = addCalendarDays(w, 7)) weeks.push(w);
  return weeks;
}

export interface Delivery {
  jobId: number;
  /** ISO instant of the move into Delivered. */
  at: string;
  dueOn: string | null;
}

export interface ThroughputWeek {
  week: string;
  delivered: number;
  onTime: number;
  late: number;
  noDueDate: number;
}

export interface Throughput {
  weeks: ThroughputWeek[];
  delivered: number;
  onTime: number;
  late: number;
  noDueDate: number;
  /** onTime / (onTime + late); null when no delivered job had a due date. */
  onTimeShare: number | null;
}

/**
 * Jobs delivered per week (Monday to Sunday) and whether each went out on or before its due date.
 * A job delivered, brought back and delivered again counts once, on its last delivery in the period.
 */
export function throughput(deliveries: readonly Delivery[], period: Period, timeZone: string): Throughput {
  const last = new Map<number, { day: string; dueOn: string | null }>();
  for (const d of deliveries) {
    const day = shopDateOf(d.at, timeZone);
    if (day < period.from || day > period.to) continue;
    const seen = last.get(d.jobId);
    if (!seen || seen.day <= day) last.set(d.jobId, { day, dueOn: d.dueOn });
  }
  const weeks = new Map(weeksOf(period).map((week) => [week, { week, delivered: 0, onTime: 0, late: 0, noDueDate: 0 }]));
  for (const { day, dueOn } of last.values()) {
    const row = weeks.get(weekOf(day))!;
    row.delivered += 1;
    if (dueOn === null) row.noDueDate += 1;
    else if (day <= dueOn) row.onTime += 1;
    else row.late += 1;
  }
  const rows = [...weeks.values()];
  const sum = (k: keyof Omit<ThroughputWeek, "week">) => rows.reduce((n, r) => n + r[k], 0);
  const onTime = sum("onTime");
  const late = sum("late");
  return { weeks: rows, delivered: sum("delivered"), onTime, late, noDueDate: sum("noDueDate"), onTimeShare: onTime + late === 0 ? null : onTime / (onTime + late) };
}

export interface RunRow {
  vendorId: number;
  vendorName: string;
  sentOn: string;
  promisedOn: string;
  receivedOn: string | null;
}

export interface CoaterRow {
  vendorId: number;
  vendorName: string;
  /** Runs sent within the period. */
  runs: number;
  received: number;
  onTime: number;
  /** Received after the promise, or still out past it. */
  late: number;
  /** Still out past the promise today. */
  overdue: number;
  /** Median business days the coater promised (sent → promised). */
  medianPromisedDays: number | null;
  /** Turnaround of the runs back (sent → received), business days. */
  medianTurnaroundDays: number | null;
  p90TurnaroundDays: number | null;
  onTimeShare: number | null;
}

/** Each coater's turnaround against its promise, over runs sent within the period. */
export function coaterRecords(runs: readonly RunRow[], period: Period, today: string, holidays: Holidays): CoaterRow[] {
  const byVendor = new Map<number, RunRow[]>();
  for (const r of runs) {
    if (r.sentOn < period.from || r.sentOn > period.to) continue;
    byVendor.set(r.vendorId, [...(byVendor.get(r.vendorId) ?? []), r]);
  }
  const rows: CoaterRow[] = [];
  for (const [vendorId, list] of byVendor) {
    const turnaround: number[] = [];
    const promised: number[] = [];
    let onTime = 0;
    let late = 0;
    let overdue = 0;
    for (const r of list) {
      promised.push(workingDaysBetween(r.sentOn, r.promisedOn, holidays));
      if (r.receivedOn) {
        turnaround.push(workingDaysBetween(r.sentOn, r.receivedOn, holidays));
        if (r.receivedOn <= r.promisedOn) onTime += 1;
        else late += 1;
      } else if (r.promisedOn < today) {
        overdue += 1;
        late += 1;
      }
    }
    rows.push({
      vendorId,
      vendorName: list[0].vendorName,
      runs: list.length,
      received: turnaround.length,
      onTime,
      late,
      overdue,
      medianPromisedDays: median(promised),
      medianTurnaroundDays: median(turnaround),
      p90TurnaroundDays: percentile(turnaround, 90),
      onTimeShare: onTime + late === 0 ? null : onTime / (onTime + late),
    });
  }
  return rows.sort((a, b) => a.vendorName.localeCompare(b.vendorName) || a.vendorId - b.vendorId);
}

export interface TechRow {
  id: string;
  name: string;
  /** Jobs assigned to the tech and not yet delivered, now. */
  openJobs: number;
}

export interface Workload {
  weeks: string[];
  techs: (TechRow & { moves: number; movesByWeek: number[] })[];
}

/** Open jobs per tech now, and the stage moves each made per week (reorders inside a column do not count). */
export function workload(techs: readonly TechRow[], events: readonly StageEventRow[], period: Period, timeZone: string): Workload {
  const weeks = weeksOf(period);
  const index = new Map(weeks.map((w, i) => [w, i]));
  const rows = new Map(techs.map((t) => [t.id, { ...t, moves: 0, movesByWeek: weeks.map(() => 0) }]));
  for (const e of events) {
    if (!e.actorId || e.fromStage === e.toStage) continue;
    const row = rows.get(e.actorId);
    if (!row) continue;
    const day = shopDateOf(e.at, timeZone);
    if (day < period.from || day > period.to) continue;
    row.moves += 1;
    row.movesByWeek[index.get(weekOf(day))!] += 1;
  }
  return { weeks, techs: [...rows.values()] };
}
