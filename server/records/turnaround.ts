import { TZDate } from "@date-fns/tz";
import { addBusinessDays, differenceInBusinessDays, format, subDays } from "date-fns";
import { assertTimeZone, calendarZone, formatCalendarDate, parseCalendarDate } from "./calendar";

/** The dates of a coating run that turnaround needs; ISO calendar dates (YYYY-MM-DD). */
export type CoatingRunDates = {
  sentOn: string;
  promisedOn: string;
  receivedOn?: string | null;
};

/** The shop's clock: the instant now and the shop's IANA time zone (a shop setting). */
export type ShopClock = {
  now: Date;
  timeZone: string;
};

export type VendorRecord = {
  /** First and last day of the window, inclusive (ISO dates in the shop's calendar). */
  windowStart: string;
  windowEnd: string;
  /** Runs sent within the window, whether back yet or not. */
  runs: number;
  received: number;
  /** Runs still out past their promised date. */
  overdue: number;
  onTime: number;
  late: number;
  medianTurnaroundBusinessDays: number | null;
  /** onTime / (received + overdue); null when no run has been decided either way. */
  onTimeShare: number | null;
};

export const VENDOR_RECORD_WINDOW_DAYS = 90;

/** Today's date (YYYY-MM-DD) on the shop's wall calendar: flips at local midnight, not UTC midnight. */
export function shopToday(clock: ShopClock): string {
  assertTimeZone(clock.timeZone);
  return format(new TZDate(clock.now, clock.timeZone), "yyyy-MM-dd");
}

/**
 * Business days from one calendar date to a later one, counted as date-fns does: the weekdays
 * from `fromDate` up to but not including `toDate` (Fri→Mon = 1, Mon→Fri = 4, Sat→Mon = 0).
 * Weekends are excluded; shop and vendor holidays are not modeled and count as business days.
 */
export function businessDaysBetween(fromDate: string, toDate: string): number {
  return differenceInBusinessDays(parseCalendarDate(toDate), parseCalendarDate(fromDate), { in: calendarZone });
}

/** The calendar date `businessDays` weekdays after `fromDate` (a Friday plus 1 is the Monday): the coater's usual promise. */
export function addBusinessDaysTo(fromDate: string, businessDays: number): string {
  return formatCalendarDate(addBusinessDays(parseCalendarDate(fromDate), businessDays, { in: calendarZone }));
}

/** Business days a run has been out: sent → received, or sent → the shop's today while it is still out. */
export function businessDaysOut(run: CoatingRunDates, clock: ShopClock): number {
  return businessDaysBetween(run.sentOn, run.receivedOn ?? shopToday(clock));
}

/** Business days the coater kept the run (sent → received); null while the run is still out. */
export function turnaroundBusinessDays(run: CoatingRunDates): number | null {
  return run.receivedOn ? businessDaysBetween(run.sentOn, run.receivedOn) : null;
}

/** A run is overdue when it is not back and its promised date is before the shop's today. */
export function isOverdue(run: CoatingRunDates, clock: ShopClock): boolean {
  if (run.receivedOn) return false;
  parseCalendarDate(run.promisedOn); // throws on a malformed date rather than comparing it as text
  // ISO dates of the same width sort as strings sort.
  return run.promisedOn < shopToday(clock);
}

/** Business days past the promised date for a run still out; 0 when it is not overdue. */
export function businessDaysOverdue(run: CoatingRunDates, clock: ShopClock): number {
  if (!isOverdue(run, clock)) return 0;
  return businessDaysBetween(run.promisedOn, shopToday(clock));
}

/**
 * One vendor's record over the window ending today (pass only that vendor's runs). A run is in
 * the window when it was sent within the last `windowDays` calendar days, today included. A run
 * still out past its promise counts as late; one still out and not yet due is undecided.
 */
export function vendorRecord(
  runs: readonly CoatingRunDates[],
  clock: ShopClock,
  windowDays: number = VENDOR_RECORD_WINDOW_DAYS,
): VendorRecord {
  if (!Number.isInteger(windowDays) || windowDays < 1) {
    throw new RangeError(`windowDays must be a whole number of days, at least 1; got ${windowDays}`);
  }
  const windowEnd = shopToday(clock);
  const windowStart = formatCalendarDate(subDays(parseCalendarDate(windowEnd), windowDays - 1));
  const inWindow = runs.filter((run) => {
    parseCalendarDate(run.sentOn);
    return run.sentOn >= windowStart && run.sentOn <= windowEnd;
  });

  const turnarounds: number[] = [];
  let onTime = 0;
  let late = 0;
  let overdue = 0;
  for (const run of inWindow) {
    if (run.receivedOn) {
      turnarounds.push(businessDaysBetween(run.sentOn, run.receivedOn));
      if (run.receivedOn <= run.promisedOn) onTime += 1;
      else late += 1;
    } else if (isOverdue(run, clock)) {
      overdue += 1;
      late += 1;
    }
  }
  const decided = onTime + late;
  return {
    windowStart,
    windowEnd,
    runs: inWindow.length,
    received: turnarounds.length,
    overdue,
    onTime,
    late,
    medianTurnaroundBusinessDays: median(turnarounds),
    onTimeShare: decided === 0 ? null : onTime / decided,
  };
}

function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}
