import { TZDate } from "@date-fns/tz";
import { parseCalendarDate } from "@/server/records/calendar";

/**
 * The shop's working calendar: Monday to Friday, less the shop's holidays (a shop setting). Pure:
 * dates in, numbers out, so tests build calendars by hand.
 *
 * Counting follows date-fns `differenceInBusinessDays`: the working days from the first date up to
 * but not including the second (Fri → Mon = 1; a job that enters and leaves a stage the same day
 * spent 0 business days there). A holiday inside that span is one working day fewer.
 */
export type Holidays = ReadonlySet<string>;

export const NO_HOLIDAYS: Holidays = new Set();

const DAY_MS = 86_400_000;

/**
 * Calendar dates as whole days since 1970-01-01, so counting and stepping days is integer
 * arithmetic. Reports walk tens of thousands of stage events; date objects per call made a
 * 5,000-job shop's stage-time report take seconds. `tests/unit/business-days.test.ts` checks
 * these against date-fns, which the shop's rules were first written with.
 */
const isoDatePattern = /^(\d{4})-(\d{2})-(\d{2})$/;

function dayNumber(isoDate: string): number {
  const match = isoDatePattern.exec(isoDate);
  if (!match) throw new RangeError(`Expected a date as YYYY-MM-DD, got "${isoDate}"`);
  const [year, month, day] = [Number(match[1]), Number(match[2]) - 1, Number(match[3])];
  const date = new Date(0);
  date.setUTCFullYear(year, month, day);
  if (date.getUTCFullYear() !== year || date.getUTCMonth() !== month || date.getUTCDate() !== day) {
    throw new RangeError(`"${isoDate}" is not a real calendar date`);
  }
  return Math.round(date.getTime() / DAY_MS);
}

function dateOfDayNumber(day: number): string {
  return new Date(day * DAY_MS).toISOString().slice(0, 10);
}

/** 0 Monday … 6 Sunday. 1970-01-01 was a Thursday. */
function weekdayIndex(day: number): number {
  return (((day + 3) % 7) + 7) % 7;
}

export function isWorkingDay(isoDate: string, holidays: Holidays): boolean {
  return weekdayIndex(dayNumber(isoDate)) < 5 && !holidays.has(isoDate);
}

/** Weekdays in [from, to) for day numbers with from ≤ to. */
function weekdaysBetween(from: number, to: number): number {
  const span = to - from;
  const weeks = Math.floor(span / 7);
  let count = weeks * 5;
  for (let d = from + weeks * 7; d < to; d++) if (weekdayIndex(d) < 5) count += 1;
  return count;
}

/** Working days from `fromDate` up to but not including `toDate`; negative when `toDate` is earlier. */
export function workingDaysBetween(fromDate: string, toDate: string, holidays: Holidays): number {
  if (toDate < fromDate) return -workingDaysBetween(toDate, fromDate, holidays);
  const weekdays = weekdaysBetween(dayNumber(fromDate), dayNumber(toDate));
  let closed = 0;
  for (const day of holidays) {
    if (day >= fromDate && day < toDate && weekdayIndex(dayNumber(day)) < 5) closed += 1;
  }
  return weekdays - closed;
}

/** The date `days` working days after `fromDate` (a Friday plus 1 is the Monday, or the Tuesday when Monday is a holiday). */
export function addWorkingDays(fromDate: string, days: number, holidays: Holidays): string {
  let day = dayNumber(fromDate);
  let left = Math.max(0, Math.round(days));
  // From a closed day, the first working day counts as the first step (as date-fns does from a Saturday).
  while (left > 0) {
    day += 1;
    if (weekdayIndex(day) < 5 && !holidays.has(dateOfDayNumber(day))) left -= 1;
  }
  return dateOfDayNumber(day);
}

const dateFormats = new Map<string, Intl.DateTimeFormat>();
const shopDates = new Map<string, string>();
const QUARTER_HOUR_MS = 900_000;

/**
 * The shop's calendar date of an instant (ISO timestamp), in the shop's time zone. Every zone's
 * offset from UTC is a whole number of quarter hours (the tz database), so the date is the same
 * throughout a UTC quarter hour and is remembered per quarter hour.
 */
export function shopDateOf(instant: string | Date, timeZone: string): string {
  const ms = new Date(instant).getTime();
  if (Number.isNaN(ms)) throw new RangeError(`Expected an instant, got "${String(instant)}"`);
  const key = `${timeZone}|${Math.floor(ms / QUARTER_HOUR_MS)}`;
  const known = shopDates.get(key);
  if (known) return known;
  let fmt = dateFormats.get(timeZone);
  if (!fmt) {
    fmt = new Intl.DateTimeFormat("en-US", { timeZone, year: "numeric", month: "2-digit", day: "2-digit", hourCycle: "h23" });
    dateFormats.set(timeZone, fmt);
  }
  const parts = Object.fromEntries(fmt.formatToParts(new Date(ms)).map((p) => [p.type, p.value]));
  const date = `${parts.year.padStart(4, "0")}-${parts.month}-${parts.day}`;
  if (shopDates.size > 100_000) shopDates.clear();
  shopDates.set(key, date);
  return date;
}

/** The instant the shop's day `isoDate` begins (midnight on the shop's clock), as an ISO timestamp. */
export function shopDayStart(isoDate: string, timeZone: string): string {
  const d = parseCalendarDate(isoDate);
  // A plain Date's ISO form (UTC, "Z") compares as text with the stored instants.
  return new Date(new TZDate(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate(), timeZone).getTime()).toISOString();
}

/** The Monday that starts the week of `isoDate` (weeks run Monday to Sunday, ISO 8601). */
export function weekOf(isoDate: string): string {
  const day = dayNumber(isoDate);
  return dateOfDayNumber(day - weekdayIndex(day));
}

/** `isoDate` moved by whole calendar days. */
export function addCalendarDays(isoDate: string, days: number): string {
  return dateOfDayNumber(dayNumber(isoDate) + days);
}
