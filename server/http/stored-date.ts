import { format, parseISO } from "date-fns";

/**
 * Calendar dates (YYYY-MM-DD) are checked as real days: 2026-02-31 and 2026-13-01 are refused.
 * `Date.parse` is not enough: it rolls 2026-02-31 over to 3 March.
 */
export function isCalendarDate(raw: unknown): raw is string {
  if (typeof raw !== "string") return false;
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(raw);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const date = new Date(Date.UTC(y, mo - 1, d));
  return date.getUTCFullYear() === y && date.getUTCMonth() === mo - 1 && date.getUTCDate() === d;
}

/**
 * A stored day or time for a page. A value that is not a real date (written by hand into the
 * database, or by an older version) is shown as it is, marked, instead of breaking the page.
 */
export function showStoredDate(raw: string, pattern: string): string {
  const date = /^\d{4}-\d{2}-\d{2}$/.test(raw) ? (isCalendarDate(raw) ? parseISO(raw) : null) : parseISO(raw);
  if (!date || Number.isNaN(date.getTime())) return `${raw} (not a real date: correct it)`;
  return format(date, pattern);
}
