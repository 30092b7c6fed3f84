/**
 * Calendar dates (YYYY-MM-DD) formatted in the browser with Intl, so client bundles carry no
 * date library. The date is read as a wall-calendar day (UTC noon) so no time zone shifts it.
 */
const dayFormat = new Intl.DateTimeFormat("en-US", { weekday: "short", month: "short", day: "numeric", timeZone: "UTC" });

/** A stored value that is not a real day is shown as it is, marked, instead of breaking the board. */
export function formatDay(isoDate: string): string {
  const date = new Date(`${isoDate}T12:00:00Z`);
  if (Number.isNaN(date.getTime()) || date.toISOString().slice(0, 10) !== isoDate) return `${isoDate} (not a real date)`;
  return dayFormat.format(date);
}
