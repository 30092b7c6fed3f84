import { shopToday } from "@/server/records/turnaround";

/** Readable, unique work order numbers: prefix, two-digit year, four-digit sequence (WO-26-0042). */
export function formatWorkOrder(prefix: string, year: number, seq: number) {
  return `${prefix}-${String(year % 100).padStart(2, "0")}-${String(seq).padStart(4, "0")}`;
}

/** The year a new work order carries: the shop's calendar year (its time zone), not the server's clock. */
export function workOrderYear(now: Date, timeZone: string): number {
  return Number(shopToday({ now, timeZone }).slice(0, 4));
}
