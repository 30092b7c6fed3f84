import { afterEach, describe, expect, it } from "vitest";
import {
  addBusinessDaysTo,
  businessDaysBetween,
  businessDaysOut,
  businessDaysOverdue,
  isOverdue,
  shopToday,
  turnaroundBusinessDays,
  vendorRecord,
  type CoatingRunDates,
} from "@/server/records/turnaround";

const central = "US/Central";
const at = (iso: string) => ({ now: new Date(iso), timeZone: central });

// Calendar used below: 2025-03-07 is a Friday, 2025-03-10 a Monday.
describe("businessDaysBetween (weekends excluded, holidays not modeled)", () => {
  it.each([
    ["Fri → Mon", "2025-03-07", "2025-03-10", 1],
    ["Mon → Fri", "2025-03-03", "2025-03-07", 4],
    ["Fri → next Fri", "2025-03-07", "2025-03-14", 5],
    ["Mon → Mon two weeks on", "2025-03-03", "2025-03-17", 10],
    ["same day", "2025-03-05", "2025-03-05", 0],
    ["Sat → Mon", "2025-03-08", "2025-03-10", 0],
    ["Fri → Sat", "2025-03-07", "2025-03-08", 1],
    ["Tue → Tue across a month end", "2025-04-29", "2025-05-06", 5],
    ["Wed → Fri across a year end", "2025-12-31", "2026-01-02", 2],
  ])("%s = %i", (_, from, to, expected) => {
    expect(businessDaysBetween(from, to)).toBe(expected);
  });

  it("counts a holiday as a business day (holidays are not modeled)", () => {
    // Thu 2025-12-25 → Fri 2025-12-26: the Thursday counts.
    expect(businessDaysBetween("2025-12-25", "2025-12-26")).toBe(1);
  });

  describe("whatever zone the server runs in", () => {
    const original = process.env.TZ;
    afterEach(() => {
      if (original === undefined) delete process.env.TZ;
      else process.env.TZ = original;
    });
    it.each(["US/Central", "Etc/GMT-12", "UTC"])("gives Fri → Mon = 1 with TZ=%s", (zone) => {
      process.env.TZ = zone;
      // Spans the US spring-forward weekend.
      expect(businessDaysBetween("2025-03-07", "2025-03-10")).toBe(1);
      expect(businessDaysBetween("2025-03-03", "2025-03-17")).toBe(10);
    });
  });

  it("refuses a malformed or impossible date", () => {
    expect(() => businessDaysBetween("2025-02-30", "2025-03-03")).toThrow(RangeError);
    expect(() => businessDaysBetween("2025-3-3", "2025-03-03")).toThrow(RangeError);
  });
});

describe("turnaroundBusinessDays", () => {
  it("counts sent → received, and is null while the run is out", () => {
    expect(turnaroundBusinessDays({ sentOn: "2025-03-07", promisedOn: "2025-03-14", receivedOn: "2025-03-17" })).toBe(6);
    expect(turnaroundBusinessDays({ sentOn: "2025-03-07", promisedOn: "2025-03-14", receivedOn: null })).toBeNull();
    expect(turnaroundBusinessDays({ sentOn: "2025-03-07", promisedOn: "2025-03-14" })).toBeNull();
  });
});

describe("shopToday and overdue at the shop's midnight", () => {
  const run: CoatingRunDates = { sentOn: "2025-03-03", promisedOn: "2025-03-07" };

  it("is still the promised day at 23:59 local though UTC is already the next day", () => {
    const clock = at("2025-03-08T05:59:00Z"); // 23:59 CST on Fri 7 March
    expect(clock.now.toISOString().slice(0, 10)).toBe("2025-03-08");
    expect(shopToday(clock)).toBe("2025-03-07");
    expect(isOverdue(run, clock)).toBe(false);
    expect(businessDaysOverdue(run, clock)).toBe(0);
  });

  it("turns overdue at 00:01 local", () => {
    const clock = at("2025-03-08T06:01:00Z"); // 00:01 CST on Sat 8 March
    expect(shopToday(clock)).toBe("2025-03-08");
    expect(isOverdue(run, clock)).toBe(true);
  });

  it("flips at local midnight on the day daylight time starts (UTC−5 from then on)", () => {
    const sundayPromise: CoatingRunDates = { sentOn: "2025-03-03", promisedOn: "2025-03-09" };
    expect(isOverdue(sundayPromise, at("2025-03-10T04:59:00Z"))).toBe(false); // 23:59 CDT Sunday
    expect(isOverdue(sundayPromise, at("2025-03-10T05:01:00Z"))).toBe(true); // 00:01 CDT Monday
  });

  it("uses the shop's zone, not the server's: the same instant is a different day in another zone", () => {
    const instant = "2025-03-08T05:59:00Z";
    expect(shopToday({ now: new Date(instant), timeZone: "US/Mountain" })).toBe("2025-03-07");
    expect(shopToday({ now: new Date(instant), timeZone: "UTC" })).toBe("2025-03-08");
  });

  it("never calls a received run overdue", () => {
    expect(isOverdue({ ...run, receivedOn: "2025-03-12" }, at("2025-03-20T18:00:00Z"))).toBe(false);
  });

  it("counts business days overdue", () => {
    const thursday: CoatingRunDates = { sentOn: "2025-02-24", promisedOn: "2025-03-06" };
    // Thu 6 March promise, shop's today Mon 10 March: Thursday and Friday have passed.
    expect(businessDaysOverdue(thursday, at("2025-03-10T15:00:00Z"))).toBe(2);
    expect(businessDaysOverdue(thursday, at("2025-03-06T15:00:00Z"))).toBe(0);
  });

  it("refuses an unknown time zone", () => {
    expect(() => shopToday({ now: new Date(), timeZone: "Nowhere/Cold_Creek" })).toThrow(RangeError);
  });
});

describe("vendorRecord over the last 90 days", () => {
  // Shop's today is Mon 30 June 2025; the 90-day window starts Wed 2 April.
  const clock = at("2025-06-30T17:00:00Z");
  const runs: CoatingRunDates[] = [
    { sentOn: "2025-06-02", promisedOn: "2025-06-09", receivedOn: "2025-06-09" }, // 5 days, on time
    { sentOn: "2025-06-04", promisedOn: "2025-06-11", receivedOn: "2025-06-13" }, // 7 days, late
    { sentOn: "2025-06-16", promisedOn: "2025-06-20", receivedOn: "2025-06-18" }, // 2 days, early
    { sentOn: "2025-06-20", promisedOn: "2025-06-27" }, // out past its promise: late
    { sentOn: "2025-06-25", promisedOn: "2025-07-03" }, // out, not yet due
    { sentOn: "2025-04-01", promisedOn: "2025-04-08", receivedOn: "2025-04-30" }, // before the window
  ];

  it("counts runs, median turnaround of received runs and the on-time share", () => {
    expect(vendorRecord(runs, clock)).toEqual({
      windowStart: "2025-04-02",
      windowEnd: "2025-06-30",
      runs: 5,
      received: 3,
      overdue: 1,
      onTime: 2,
      late: 2,
      medianTurnaroundBusinessDays: 5,
      onTimeShare: 0.5,
    });
  });

  it("takes the mean of the middle two for an even count, and includes the window's first day", () => {
    const more = [...runs, { sentOn: "2025-04-02", promisedOn: "2025-04-11", receivedOn: "2025-04-07" }]; // Wed → Mon: 3
    const record = vendorRecord(more, clock);
    expect(record.runs).toBe(6);
    // Turnarounds 2, 3, 5, 7.
    expect(record.medianTurnaroundBusinessDays).toBe(4);
    expect(record.onTimeShare).toBeCloseTo(3 / 5, 12);
  });

  it("counts a run received on its promised day as on time", () => {
    const record = vendorRecord([{ sentOn: "2025-06-23", promisedOn: "2025-06-27", receivedOn: "2025-06-27" }], clock);
    expect(record.onTimeShare).toBe(1);
  });

  it("has no median or share before any run is back or due", () => {
    const record = vendorRecord([{ sentOn: "2025-06-25", promisedOn: "2025-07-03" }], clock);
    expect(record.runs).toBe(1);
    expect(record.medianTurnaroundBusinessDays).toBeNull();
    expect(record.onTimeShare).toBeNull();
    expect(vendorRecord([], clock).runs).toBe(0);
  });
});

describe("addBusinessDaysTo (the coater's usual promise)", () => {
  it.each([
    ["Fri + 1 = Mon", "2025-03-07", 1, "2025-03-10"],
    ["Mon + 5 = next Mon", "2025-03-03", 5, "2025-03-10"],
    ["Thu + 8 = Tue week after next", "2025-03-06", 8, "2025-03-18"],
    ["Wed − 4 = Thu before", "2025-03-12", -4, "2025-03-06"],
    ["Sat + 1 = Mon", "2025-03-08", 1, "2025-03-10"],
  ])("%s", (_, from, n, expected) => {
    expect(addBusinessDaysTo(from, n)).toBe(expected);
  });

  it("is undone by businessDaysBetween from a weekday", () => {
    for (const from of ["2025-03-03", "2025-03-05", "2025-03-07"]) {
      for (const n of [1, 5, 8, 13]) expect(businessDaysBetween(from, addBusinessDaysTo(from, n))).toBe(n);
    }
  });
});

describe("businessDaysOut", () => {
  it("counts to the received date once back, and to the shop's today while out", () => {
    const run = { sentOn: "2025-03-07", promisedOn: "2025-03-14" };
    expect(businessDaysOut({ ...run, receivedOn: "2025-03-12" }, at("2025-03-20T18:00:00Z"))).toBe(3);
    // 23:30 CDT Monday 10 March is already Tuesday in UTC: still one business day out.
    expect(businessDaysOut(run, at("2025-03-11T04:30:00Z"))).toBe(1);
    expect(businessDaysOut(run, at("2025-03-11T05:30:00Z"))).toBe(2);
  });
});
