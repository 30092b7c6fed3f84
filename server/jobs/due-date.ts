/**
 * A due date already past when a job is entered. The shop enters jobs late, and such a job may
 * truly be due already, so the date is not refused; the person is told before saving that the job
 * will show as late. Pure: the caller passes the shop's today (shopToday, in the shop's time zone).
 */
export const PAST_DUE_WARNING = "That date has passed: the job will show as late.";

/** The warning for a typed due date (YYYY-MM-DD) before the shop's today; null for today, later or empty. */
export function pastDueWarning(dueOn: string, today: string): string | null {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(dueOn) || !/^\d{4}-\d{2}-\d{2}$/.test(today)) return null;
  return dueOn < today ? PAST_DUE_WARNING : null;
}
