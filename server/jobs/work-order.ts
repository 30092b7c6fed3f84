/** Readable, unique work order numbers: prefix, two-digit year, four-digit sequence (WO-26-0042). */
export function formatWorkOrder(prefix: string, year: number, seq: number) {
  return `${prefix}-${String(year % 100).padStart(2, "0")}-${String(seq).padStart(4, "0")}`;
}
