import { describe, expect, it } from "vitest";
import { formatWorkOrder, workOrderYear } from "@/server/jobs/work-order";

// US/Central is UTC−6 in winter; Etc/GMT-12 is UTC+12 (IANA names its offsets with the sign reversed).
describe("work-order year follows the shop's calendar, not the server's clock", () => {
  it("New Year's Eve 21:00 in a UTC−6 shop is 03:00 UTC on 1 January: the work order still carries the old year", () => {
    expect(workOrderYear(new Date("2026-01-01T03:00:00Z"), "US/Central")).toBe(2025);
    expect(formatWorkOrder("WO", workOrderYear(new Date("2026-01-01T03:00:00Z"), "US/Central"), 42)).toBe("WO-25-0042");
  });

  it("once local midnight has passed in the shop the new year starts", () => {
    expect(workOrderYear(new Date("2026-01-01T06:00:00Z"), "US/Central")).toBe(2026);
  });

  it("a shop east of UTC is already in the new year while UTC is still on 31 December", () => {
    expect(workOrderYear(new Date("2025-12-31T13:00:00Z"), "Etc/GMT-12")).toBe(2026);
    expect(workOrderYear(new Date("2025-12-31T11:59:59Z"), "Etc/GMT-12")).toBe(2025);
  });
});
