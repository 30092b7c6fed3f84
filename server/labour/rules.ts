import { TZDate } from "@date-fns/tz";
import { format } from "date-fns";
import { shopDateOf, weekOf as mondayOf } from "@/server/shop/business-days";
import type { Stage } from "@/db/schema";

/** A clock entry as the rules read it: instants as ISO strings; an open entry has no end. */
export interface ClockSpan {
  id?: number;
  staffId: string;
  jobId: number;
  startedAt: string;
  endedAt: string | null;
}

const ms = (iso: string) => new Date(iso).getTime();

/** The end of an entry: its own, or now while it is open. */
export function spanEnd(entry: Pick<ClockSpan, "endedAt">, now: Date): number {
  return entry.endedAt ? ms(entry.endedAt) : now.getTime();
}

/**
 * The entries of the same person that a span would overlap (touching ends do not overlap: a switch
 * ends one entry at the instant the next begins). Nobody works two jobs at once.
 */
export function overlapping(candidate: ClockSpan, others: readonly ClockSpan[], now: Date): ClockSpan[] {
  const start = ms(candidate.startedAt);
  const end = spanEnd(candidate, now);
  return others.filter((o) => o.staffId === candidate.staffId && o.id !== candidate.id && ms(o.startedAt) < end && start < spanEnd(o, now));
}

/** The shop's calendar day of an instant. */
export const shopDay = shopDateOf;

export type ClockFlag = { code: "left_on_over_midnight" | "crossed_midnight"; message: string };

/**
 * A clock still on from an earlier shop day was almost surely left on when the tech went home;
 * a closed entry that crossed midnight is shown so the office can check it. Neither is changed
 * here: the office corrects it with a reason.
 */
export function clockFlags(entry: Pick<ClockSpan, "startedAt" | "endedAt">, now: Date, timeZone: string): ClockFlag[] {
  const startDay = shopDay(entry.startedAt, timeZone);
  if (!entry.endedAt) {
    if (startDay < shopDay(now, timeZone)) {
      return [{ code: "left_on_over_midnight", message: `Left on since ${format(new TZDate(new Date(entry.startedAt), timeZone), "EEE d MMM HH:mm")}: clock off, then ask the office to correct the hours.` }];
    }
    return [];
  }
  if (startDay !== shopDay(entry.endedAt, timeZone)) {
    return [{ code: "crossed_midnight", message: "Ran past midnight: check the hours and correct them if the clock was left on." }];
  }
  return [];
}

/** A job's stage over time: each stage event starts its stage at `at`. */
export interface StageChange {
  at: string;
  toStage: Stage;
}

type StagedSpan = Pick<ClockSpan, "startedAt" | "endedAt"> & { stage: string };

/**
 * One entry cut where the job changed stage while the clock ran, in order: the stage of each
 * stretch and how long it lasted. Before the job's first event, the entry's own recorded stage
 * counts. `timeline` is sorted by time.
 */
function stretches(entry: StagedSpan, timeline: readonly StageChange[], now: Date): { stage: string; ms: number }[] {
  let cursor = ms(entry.startedAt);
  const end = spanEnd(entry, now);
  let stage = entry.stage;
  const out: { stage: string; ms: number }[] = [];
  for (const change of timeline) {
    const at = ms(change.at);
    if (at <= cursor) {
      stage = change.toStage;
      continue;
    }
    if (at >= end) break;
    out.push({ stage, ms: at - cursor });
    cursor = at;
    stage = change.toStage;
  }
  out.push({ stage, ms: Math.max(0, end - cursor) });
  return out;
}

const byTime = (changes: readonly StageChange[]) => [...changes].sort((a, b) => ms(a.at) - ms(b.at));

/**
 * Milliseconds per stage for entries on one job, each entry split where the job changed stage
 * while the clock ran (an hour on a job that moved from Install to Wire at half past counts half
 * to each). Before the job's first event, the entry's own recorded stage counts.
 */
export function msByStage(entries: readonly StagedSpan[], changes: readonly StageChange[], now: Date): Map<string, number> {
  const timeline = byTime(changes);
  const out = new Map<string, number>();
  for (const entry of entries) {
    for (const part of stretches(entry, timeline, now)) {
      if (part.ms > 0) out.set(part.stage, (out.get(part.stage) ?? 0) + part.ms);
    }
  }
  return out;
}

/**
 * The stages an entry's hours count under, in order, from the same split as `msByStage`: one
 * stage, or several when the job moved while the clock ran ("Queued → Fabricate"). An entry's
 * label and the job's hours by stage can then never disagree.
 */
export function stagesOfEntry(entry: StagedSpan, changes: readonly StageChange[], now: Date): string[] {
  const parts = stretches(entry, byTime(changes), now);
  const worked = parts.filter((p) => p.ms > 0);
  const stages: string[] = [];
  // An entry of no length (clocked on and straight off) is labelled with the stage it began in.
  for (const p of worked.length ? worked : parts.slice(0, 1)) {
    if (stages[stages.length - 1] !== p.stage) stages.push(p.stage);
  }
  return stages;
}

/** The Monday (shop's calendar) of the ISO week an instant falls in. */
export function weekOf(instant: string, timeZone: string): string {
  return mondayOf(shopDateOf(instant, timeZone));
}

/**
 * Hours per person per week; an entry counts in the week it started (a clock left on over a
 * weekend stays in the week someone forgot it, where the office will look for it).
 */
export function hoursByWeek(entries: readonly (Pick<ClockSpan, "staffId" | "startedAt" | "endedAt">)[], now: Date, timeZone: string): Map<string, Map<string, number>> {
  const out = new Map<string, Map<string, number>>();
  for (const e of entries) {
    const week = weekOf(e.startedAt, timeZone);
    const person = out.get(e.staffId) ?? new Map<string, number>();
    person.set(week, (person.get(week) ?? 0) + (spanEnd(e, now) - ms(e.startedAt)) / 3_600_000);
    out.set(e.staffId, person);
  }
  return out;
}

/** Hours to two decimals, as a time sheet shows them: 1.5 h, not 1 h 30 min. */
export function hoursText(msTotal: number): string {
  const hours = Math.round(msTotal / 36_000) / 100;
  return `${hours.toFixed(2)} h`;
}
