import { TZDate } from "@date-fns/tz";
import { addDays, format, startOfISOWeek } from "date-fns";
import { calendarZone, formatCalendarDate, parseCalendarDate } from "@/server/records/calendar";

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

// Days are counted as whole numbers (days since 1 January 1970, a Thursday) rather than through
// date objects: the board works out a likely ready date for hundreds of cards on every read.
const DAY_MS = 86_400_000;
const isoDatePattern = /^(\d{4})-(\d{2})-(\d{2})$/;

function dayNumber(isoDate: string): number {
  const match = isoDatePattern.exec(isoDate);
  if (!match) throw new RangeError(`Expected a date as YYYY-MM-DD, got "${isoDate}"`);
  const n = Date.UTC(Number(match[1]), Number(match[2]) - 1, Number(match[3])) / DAY_MS;
  if (dayString(n) !== isoDate) throw new RangeError(`"${isoDate}" is not a real calendar date`);
  return n;
}

function dayString(n: number): string {
  return new Date(n * DAY_MS).toISOString().slice(0, 10);
}

/** Saturday or Sunday (day 0 was a Thursday). */
function weekend(n: number): boolean {
  const weekday = (((n + 4) % 7) + 7) % 7;
  return weekday === 0 || weekday === 6;
}

/** The holidays that fall on weekdays, as sorted day numbers, worked out once per set. */
const closedDays = new WeakMap<Holidays, { size: number; sorted: number[]; days: Set<number> }>();
function closedOn(holidays: Holidays) {
  let closed = closedDays.get(holidays);
  if (!closed || closed.size !== holidays.size) {
    const sorted: number[] = [];
    for (const day of holidays) {
      if (!isoDatePattern.test(day)) continue;
      const n = Date.UTC(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10))) / DAY_MS;
      if (dayString(n) === day && !weekend(n)) sorted.push(n);
    }
    sorted.sort((a, b) => a - b);
    closed = { size: holidays.size, sorted, days: new Set(sorted) };
    closedDays.set(holidays, closed);
  }
  return closed;
}

/** How many of the sorted numbers are below `n`. */
function countBelow(sorted: readonly number[], n: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (sorted[mid] < n) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

export function isWorkingDay(isoDate: string, holidays: Holidays): boolean {
  return !weekend(dayNumber(isoDate)) && !holidays.has(isoDate);
}

/** Working days from `fromDate` up to but not including `toDate`; negative when `toDate` is earlier. */
export function workingDaysBetween(fromDate: string, toDate: string, holidays: Holidays): number {
  if (toDate < fromDate) return -workingDaysBetween(toDate, fromDate, holidays);
  const from = dayNumber(fromDate);
  const to = dayNumber(toDate);
  // Weekdays in [from, to), as date-fns differenceInBusinessDays counts them: whole weeks of 5, then the rest one by one.
  let weekdays = Math.floor((to - from) / 7) * 5;
  for (let n = from + Math.floor((to - from) / 7) * 7; n < to; n++) if (!weekend(n)) weekdays += 1;
  const { sorted } = closedOn(holidays);
  return weekdays - (countBelow(sorted, to) - countBelow(sorted, from));
}

/** The date `days` working days after `fromDate` (a Friday plus 1 is the Monday, or the Tuesday when Monday is a holiday). */
export function addWorkingDays(fromDate: string, days: number, holidays: Holidays): string {
  let n = dayNumber(fromDate);
  let left = Math.max(0, Math.round(days));
  const { days: closed } = closedOn(holidays);
  // From a closed day, the first working day counts as the first step (as date-fns does from a Saturday).
  while (left > 0) {
    n += 1;
    if (!weekend(n) && !closed.has(n)) left -= 1;
  }
  return dayString(n);
}

/** The shop's calendar date of an instant (ISO timestamp), in the shop's time zone. */
export function shopDateOf(instant: string | Date, timeZone: string): string {
  return format(new TZDate(new Date(instant), timeZone), "yyyy-MM-dd");
}

/** The instant the shop's day `isoDate` begins (midnight on the shop's clock), as an ISO timestamp. */
export function shopDayStart(isoDate: string, timeZone: string): string {
  const d = parseCalendarDate(isoDate);
  // A plain Date's ISO form (UTC, "Z") compares as text with the stored instants.
  return new Date(new TZDate(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate(), timeZone).getTime()).toISOString();
}

/** The Monday that starts the week of `isoDate` (weeks run Monday to Sunday, ISO 8601). */
export function weekOf(isoDate: string): string {
  return formatCalendarDate(startOfISOWeek(parseCalendarDate(isoDate), { in: calendarZone }));
}

/** `isoDate` moved by whole calendar days. */
export function addCalendarDays(isoDate: string, days: number): string {
  return formatCalendarDate(addDays(parseCalendarDate(isoDate), days, { in: calendarZone }));
}
