import { TZDate } from "@date-fns/tz";
import { addDays, differenceInBusinessDays, format, startOfISOWeek } from "date-fns";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { addCalendarDays, addWorkingDays, NO_HOLIDAYS, shopDateOf, shopDayStart, weekOf, workingDaysBetween } from "@/server/shop/business-days";
import { median, percentile } from "@/server/reports/stats";

// Calendar facts used below: 1 January 2027 is a Friday; 3 July 2026 is a Friday; 8 March 2026
// is when US clocks go forward; 1 November 2026 is when they go back.
describe("the shop's working days", () => {
  it("counts weekdays from the first day up to, not including, the last", () => {
    expect(workingDaysBetween("2027-01-01", "2027-01-04", NO_HOLIDAYS)).toBe(1); // Fri → Mon
    expect(workingDaysBetween("2027-01-04", "2027-01-08", NO_HOLIDAYS)).toBe(4); // Mon → Fri
    expect(workingDaysBetween("2027-01-02", "2027-01-04", NO_HOLIDAYS)).toBe(0); // Sat → Mon
    expect(workingDaysBetween("2027-01-04", "2027-01-04", NO_HOLIDAYS)).toBe(0);
    expect(workingDaysBetween("2027-01-08", "2027-01-04", NO_HOLIDAYS)).toBe(-4);
  });

  it("skips the shop's holidays, but a holiday on a weekend costs nothing", () => {
    const closed = new Set(["2026-07-03", "2026-07-04"]); // Friday and the Saturday after
    expect(workingDaysBetween("2026-07-01", "2026-07-06", NO_HOLIDAYS)).toBe(3); // Wed, Thu, Fri
    expect(workingDaysBetween("2026-07-01", "2026-07-06", closed)).toBe(2); // Wed, Thu
    expect(workingDaysBetween("2026-07-03", "2026-07-07", closed)).toBe(1); // (Fri closed) Mon
  });

  it("adds working days past weekends and holidays", () => {
    expect(addWorkingDays("2027-01-01", 1, NO_HOLIDAYS)).toBe("2027-01-04");
    expect(addWorkingDays("2027-01-01", 1, new Set(["2027-01-04"]))).toBe("2027-01-05");
    expect(addWorkingDays("2026-07-02", 2, new Set(["2026-07-03"]))).toBe("2026-07-07");
    expect(addWorkingDays("2026-07-02", 0, NO_HOLIDAYS)).toBe("2026-07-02");
  });

  it("reads an instant as a day on the shop's clock, across the clock changes", () => {
    expect(shopDateOf("2026-03-04T03:00:00.000Z", "US/Central")).toBe("2026-03-03"); // 21:00 CST
    expect(shopDateOf("2026-03-04T06:00:00.000Z", "US/Central")).toBe("2026-03-04"); // 00:00 CST
    expect(shopDayStart("2026-03-02", "US/Central")).toBe("2026-03-02T06:00:00.000Z"); // CST, UTC−6
    expect(shopDayStart("2026-03-09", "US/Central")).toBe("2026-03-09T05:00:00.000Z"); // CDT, UTC−5
    expect(shopDayStart("2026-11-02", "US/Central")).toBe("2026-11-02T06:00:00.000Z");
  });

  it("starts weeks on Monday (ISO 8601)", () => {
    expect(weekOf("2026-03-01")).toBe("2026-02-23"); // a Sunday belongs to the week before
    expect(weekOf("2026-03-02")).toBe("2026-03-02");
    expect(weekOf("2026-03-08")).toBe("2026-03-02");
  });
});

describe("median and percentile", () => {
  it("takes the middle value, or the mean of the two middle values", () => {
    expect(median([])).toBeNull();
    expect(median([7, 1, 7])).toBe(7);
    expect(median([3, 1, 2, 1])).toBe(1.5);
  });

  it("uses the nearest rank: the value at rank ceil(p/100 × n)", () => {
    // 20 values 1..20: the 90th percentile is rank 18; of 10 values rank 9; of 4 values rank 4.
    expect(percentile(Array.from({ length: 20 }, (_, i) => 20 - i), 90)).toBe(18);
    expect(percentile([10, 20, 30, 40, 50, 60, 70, 80, 90, 100], 90)).toBe(90);
    expect(percentile([1, 1, 2, 5], 90)).toBe(5);
    expect(percentile([4], 90)).toBe(4);
    expect(percentile([], 90)).toBeNull();
    expect(() => percentile([1], 0)).toThrow(RangeError);
  });
});

describe("the shop's calendar agrees with date-fns, its first definition, everywhere", () => {
  // date-fns (a registry library) is the oracle: the whole-day arithmetic must give what its
  // differenceInBusinessDays, startOfISOWeek and addDays give, and TZDate for the shop's clock.
  const day = fc.integer({ min: Date.UTC(1999, 0, 1) / 86_400_000, max: Date.UTC(2040, 11, 31) / 86_400_000 }).map((n) => new Date(n * 86_400_000).toISOString().slice(0, 10));
  const utc = (iso: string) => new TZDate(`${iso}T00:00:00Z`, "UTC");

  it("working days without holidays are date-fns business days", () => {
    fc.assert(
      fc.property(day, day, (a, b) => {
        const expected = a <= b ? differenceInBusinessDays(utc(b), utc(a)) : -differenceInBusinessDays(utc(a), utc(b));
        expect(workingDaysBetween(a, b, NO_HOLIDAYS)).toBe(expected);
      }),
      { numRuns: 500 },
    );
  });

  it("weeks start on date-fns' ISO Monday, and adding days matches addDays", () => {
    fc.assert(
      fc.property(day, fc.integer({ min: -800, max: 800 }), (a, n) => {
        expect(weekOf(a)).toBe(format(startOfISOWeek(utc(a)), "yyyy-MM-dd"));
        expect(addCalendarDays(a, n)).toBe(format(addDays(utc(a), n), "yyyy-MM-dd"));
      }),
      { numRuns: 500 },
    );
  });

  it("an instant's shop date is the date TZDate gives in that zone, in zones with half and quarter hours", () => {
    const instant = fc.integer({ min: Date.UTC(2000, 0, 1), max: Date.UTC(2040, 0, 1) });
    const zone = fc.constantFrom("US/Central", "America/Denver", "America/St_Johns", "Asia/Kathmandu", "Pacific/Chatham", "UTC");
    fc.assert(
      fc.property(instant, zone, (ms, tz) => {
        expect(shopDateOf(new Date(ms).toISOString(), tz)).toBe(format(new TZDate(ms, tz), "yyyy-MM-dd"));
      }),
      { numRuns: 1000 },
    );
  });

  it("refuses a date that is not on the calendar", () => {
    expect(() => workingDaysBetween("2026-02-31", "2026-03-02", NO_HOLIDAYS)).toThrow(RangeError);
    expect(() => weekOf("2026-13-01")).toThrow(RangeError);
  });
});
