import { TZDate, tz } from "@date-fns/tz";
import { format, isValid } from "date-fns";

// Record dates ("sent on", "calibrated on") are calendar days with no time of day. Doing their
// arithmetic in UTC keeps the answer the same whatever zone the server process runs in.
export const calendarZone = tz("UTC");

const isoDatePattern = /^(\d{4})-(\d{2})-(\d{2})$/;

export function parseCalendarDate(isoDate: string): TZDate {
  const match = isoDatePattern.exec(isoDate);
  if (!match) throw new RangeError(`Expected a date as YYYY-MM-DD, got "${isoDate}"`);
  const [, year, month, day] = match;
  const date = new TZDate(Number(year), Number(month) - 1, Number(day), "UTC");
  if (!isValid(date) || formatCalendarDate(date) !== isoDate) {
    throw new RangeError(`"${isoDate}" is not a real calendar date`);
  }
  return date;
}

export function formatCalendarDate(date: Date): string {
  return format(date, "yyyy-MM-dd", { in: calendarZone });
}

export function assertTimeZone(timeZone: string): void {
  try {
    new Intl.DateTimeFormat("en-US", { timeZone });
  } catch {
    throw new RangeError(`Unknown shop time zone "${timeZone}"; use an IANA name such as US/Central`);
  }
}

/** An instant (ISO timestamp) as the shop's wall clock shows it, the same on the server and in the browser. */
export function formatShopTime(instant: string, timeZone: string, pattern: string): string {
  return format(new Date(instant), pattern, { in: tz(timeZone) });
}

const wallClockPattern = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/;

/** An instant as a date-and-time field shows it on the shop's wall clock ("2026-12-02T13:44"), whatever zone the browser is in. */
export function shopWallClockValue(instant: string, timeZone: string): string {
  return formatShopTime(instant, timeZone, "yyyy-MM-dd'T'HH:mm");
}

/**
 * The instant a date-and-time field's value means on the shop's wall clock, or null when it is
 * not a real date and time. In the hour skipped when clocks go forward, the time is read as
 * standard time (02:30 is 03:30 daylight time).
 */
export function instantFromShopWallClock(value: string, timeZone: string): string | null {
  const match = wallClockPattern.exec(value);
  if (!match) return null;
  const [year, month, day, hour, minute] = match.slice(1).map(Number);
  if (hour > 23 || minute > 59) return null;
  const date = new TZDate(year, month - 1, day, hour, minute, timeZone);
  if (!isValid(date) || format(date, "yyyy-MM-dd") !== value.slice(0, 10)) return null;
  return new Date(date.getTime()).toISOString();
}
