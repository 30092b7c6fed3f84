/**
 * Calendar dates (YYYY-MM-DD) formatted in the browser with Intl, so client bundles carry no
 * date library. The date is read as a wall-calendar day (UTC noon) so no time zone shifts it.
 */
const dayFormat = new Intl.DateTimeFormat("en-US", { weekday: "short", month: "short", day: "numeric", timeZone: "UTC" });

export function formatDay(isoDate: string): string {
  return dayFormat.format(new Date(`${isoDate}T12:00:00Z`));
}
