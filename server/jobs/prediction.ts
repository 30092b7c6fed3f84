import { subMonths } from "date-fns";
import type { Stage } from "@/db/schema";
import { calendarZone, formatCalendarDate, parseCalendarDate } from "@/server/records/calendar";
import { addWorkingDays, type Holidays, isWorkingDay, workingDaysBetween } from "@/server/shop/business-days";
import { STAGES } from "./stages";

/*
 * The likely ready date of an open job, from the shop's own stage times. Pure: events and dates
 * in, dates out, so the tests build histories by hand.
 *
 * A stage's history is every finished visit of it (entered, then left for another stage) that
 * ended within the last 12 months, in business days on the shop's calendar, counted as the
 * reports count them (entered Friday, left Monday = 1; the same day = 0). A job sent back to
 * Fabricate twice has three Fabricate visits. With fewer than MIN_VISITS of a stage the job
 * still has to go through, the answer is "not enough history yet", never a guess.
 *
 * The likely path is each remaining stage at its median; the late path each at its 90th
 * percentile (nearest rank, ⌈0.9 n⌉-th of the sorted visits, so always a stay that really
 * happened). The median is the middle visit, or the mean of the two middle ones. For the stage
 * the job is in now, only visits that lasted at least as long as this one has so far count, less
 * the days already spent: a job ten days into Fabricate is compared with the visits that took ten
 * days or more, not with the quick ones.
 */

/** Fewer finished visits of a stage than this in the last 12 months is not enough history. */
export const MIN_VISITS = 5;
export const HISTORY_MONTHS = 12;

/** Ready for pickup is where the prediction ends: the job is ready when it gets there. */
const END: Stage = "ready";

export interface DatedStageEvent {
  jobId: number;
  fromStage: Stage | null;
  toStage: Stage;
  /** The day of the move on the shop's clock (YYYY-MM-DD). */
  day: string;
}

export interface FinishedVisit {
  jobId: number;
  stage: Stage;
  enteredOn: string;
  leftOn: string;
  days: number;
}

/**
 * Each finished stay of a job in a stage, from its events in the order they happened. A reorder
 * inside a column (from = to) is not a visit; the stay a job is still in is not finished.
 */
export function finishedVisits(events: readonly DatedStageEvent[], holidays: Holidays): FinishedVisit[] {
  const open = new Map<number, { stage: Stage; day: string }>();
  const visits: FinishedVisit[] = [];
  for (const e of events) {
    const current = open.get(e.jobId);
    if (current && current.stage === e.toStage) continue;
    if (current) visits.push({ jobId: e.jobId, stage: current.stage, enteredOn: current.day, leftOn: e.day, days: Math.max(0, workingDaysBetween(current.day, e.day, holidays)) });
    open.set(e.jobId, { stage: e.toStage, day: e.day });
  }
  return visits;
}

/** The first day of the history window: 12 months before today, on the shop's calendar. */
export function historyStart(today: string): string {
  return formatCalendarDate(subMonths(parseCalendarDate(today), HISTORY_MONTHS, { in: calendarZone }));
}

/** Each stage's finished visits that ended on or after `since`, in business days, shortest first. */
export type StageHistory = Partial<Record<Stage, number[]>>;

export function stageHistory(visits: readonly FinishedVisit[], since: string): StageHistory {
  const history: StageHistory = {};
  for (const v of visits) {
    if (v.leftOn < since || v.stage === "delivered") continue;
    (history[v.stage] ??= []).push(v.days);
  }
  for (const list of Object.values(history)) list.sort((a, b) => a - b);
  return history;
}

/** Median of a sorted list from index `from` on (the middle one, or the mean of the two middle ones). */
function sortedMedian(sorted: readonly number[], from: number): number {
  const n = sorted.length - from;
  const mid = from + Math.floor(n / 2);
  return n % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** Nearest-rank 90th percentile of a sorted list from index `from` on. */
function sortedP90(sorted: readonly number[], from: number): number {
  const n = sorted.length - from;
  return sorted[from + Math.ceil(0.9 * n) - 1];
}

/** First index whose value is at least `min` (the list is sorted). */
function firstAtLeast(sorted: readonly number[], min: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid] < min) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

export interface PredictionInput {
  stage: Stage;
  /** The job's route (server/status/route.ts `jobRoute`), from its work and parts as they are now. */
  route: readonly Stage[];
  /** The day the job entered the stage it is in (shop calendar); null when no move was recorded. */
  enteredOn: string | null;
  today: string;
  /** While parts are out at the coater: the run's promised day. Coating does not end before it. */
  coatingPromisedOn?: string | null;
}

export interface StageStep {
  stage: Stage;
  likelyDays: number;
  lateDays: number;
}

export type Prediction =
  | { kind: "ready" }
  | { kind: "not_enough_history"; stages: { stage: Stage; visits: number }[] }
  | {
      kind: "estimate";
      likelyOn: string;
      lateOn: string;
      likelyDays: number;
      lateDays: number;
      /** Business days the job has been in its stage so far. */
      daysInStage: number;
      /** The job has been in its stage longer than all but a few past visits: that stage is counted as ending today. */
      overstayed: boolean;
      steps: StageStep[];
    };

/** The stages still ahead of a job in `stage`: the one it is in, then the rest of its route before Ready for pickup. */
export function remainingStages(stage: Stage, route: readonly Stage[]): Stage[] {
  const at = STAGES.indexOf(stage);
  const end = STAGES.indexOf(END);
  if (at >= end) return [];
  return [stage, ...route.filter((s) => STAGES.indexOf(s) > at && STAGES.indexOf(s) < end)];
}

/** The first working day on or after `day`. */
function onWorkingDay(day: string, holidays: Holidays): string {
  return isWorkingDay(day, holidays) ? day : addWorkingDays(day, 1, holidays);
}

export function predictReady(input: PredictionInput, history: StageHistory, holidays: Holidays): Prediction {
  const stages = remainingStages(input.stage, input.route);
  if (stages.length === 0) return { kind: "ready" };
  const thin = stages.map((stage) => ({ stage, visits: history[stage]?.length ?? 0 })).filter((s) => s.visits < MIN_VISITS);
  if (thin.length > 0) return { kind: "not_enough_history", stages: thin };

  const entered = input.enteredOn && input.enteredOn <= input.today ? input.enteredOn : input.today;
  const daysInStage = workingDaysBetween(entered, input.today, holidays);
  let overstayed = false;
  const steps: StageStep[] = stages.map((stage, i) => {
    const sorted = history[stage]!;
    if (i > 0) return { stage, likelyDays: sortedMedian(sorted, 0), lateDays: sortedP90(sorted, 0) };
    // The stage it is in now: the visits that lasted at least as long as this one so far.
    const from = firstAtLeast(sorted, daysInStage);
    let likelyDays = 0;
    let lateDays = 0;
    if (sorted.length - from >= MIN_VISITS) {
      likelyDays = sortedMedian(sorted, from) - daysInStage;
      lateDays = sortedP90(sorted, from) - daysInStage;
    } else {
      overstayed = true;
    }
    if (stage === "coating" && input.coatingPromisedOn && input.coatingPromisedOn > input.today) {
      const promised = workingDaysBetween(input.today, input.coatingPromisedOn, holidays);
      likelyDays = Math.max(likelyDays, promised);
      lateDays = Math.max(lateDays, promised);
    }
    return { stage, likelyDays, lateDays };
  });
  // Medians of an even count can end in a half day; the likely total is rounded up to a whole day.
  const likelyDays = Math.ceil(steps.reduce((n, s) => n + s.likelyDays, 0));
  const lateDays = Math.ceil(steps.reduce((n, s) => n + s.lateDays, 0));
  const start = onWorkingDay(input.today, holidays);
  return {
    kind: "estimate",
    likelyOn: addWorkingDays(start, likelyDays, holidays),
    lateOn: addWorkingDays(start, lateDays, holidays),
    likelyDays,
    lateDays,
    daysInStage,
    overstayed,
    steps,
  };
}

/** Whether the likely ready date falls after the job's due date. */
export function likelyMissesDue(prediction: Prediction, dueOn: string | null): boolean {
  return prediction.kind === "estimate" && dueOn !== null && prediction.likelyOn > dueOn;
}
