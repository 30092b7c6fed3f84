import { TZDate } from "@date-fns/tz";
import { addDays, differenceInBusinessDays, format, isWeekend, startOfISOWeek } from "date-fns";
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

export function isWorkingDay(isoDate: string, holidays: Holidays): boolean {
  return !isWeekend(parseCalendarDate(isoDate), { in: calendarZone }) && !holidays.has(isoDate);
}

/** Working days from `fromDate` up to but not including `toDate`; negative when `toDate` is earlier. */
export function workingDaysBetween(fromDate: string, toDate: string, holidays: Holidays): number {
  if (toDate < fromDate) return -workingDaysBetween(toDate, fromDate, holidays);
  const weekdays = differenceInBusinessDays(parseCalendarDate(toDate), parseCalendarDate(fromDate), { in: calendarZone });
  let closed = 0;
  for (const day of holidays) {
    if (day >= fromDate && day < toDate && !isWeekend(parseCalendarDate(day), { in: calendarZone })) closed += 1;
  }
  return weekdays - closed;
}

/** The date `days` working days after `fromDate` (a Friday plus 1 is the Monday, or the Tuesday when Monday is a holiday). */
export function addWorkingDays(fromDate: string, days: number, holidays: Holidays): string {
  let date = parseCalendarDate(fromDate);
  let left = Math.max(0, Math.round(days));
  // From a closed day, the first working day counts as the first step (as date-fns does from a Saturday).
  while (left > 0) {
    date = addDays(date, 1, { in: calendarZone });
    if (isWorkingDay(formatCalendarDate(date), holidays)) left -= 1;
  }
  return formatCalendarDate(date);
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
