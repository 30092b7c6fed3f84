import { z } from "zod";
import { isCalendarDate } from "./stored-date";

// The checks and the page display need no zod, so client components import them from ./stored-date.
export { isCalendarDate, showStoredDate } from "./stored-date";

/** The one schema for a calendar date in every form and route. */
export function calendarDate(what: string) {
  const shape = `Enter ${what} as a date like 2026-12-24.`;
  const notADay = `${what[0].toUpperCase()}${what.slice(1)} is not a day on the calendar (check the month and day).`;
  return z.string({ error: shape }).refine(isCalendarDate, {
    error: (issue) => (/^\d{4}-\d{2}-\d{2}$/.test(String(issue.input)) ? notADay : shape),
  });
}
