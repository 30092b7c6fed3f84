import { describe, expect, it } from "vitest";
import { clockFlags, hoursByWeek, msByStage, overlapping, stagesOfEntry, weekOf } from "@/server/labour/rules";

const H = 3_600_000;
const tz = "US/Central";

describe("overlapping clock entries", () => {
  const mine = [
    { id: 1, staffId: "a", jobId: 1, startedAt: "2026-03-02T14:00:00.000Z", endedAt: "2026-03-02T16:00:00.000Z" },
    { id: 2, staffId: "a", jobId: 2, startedAt: "2026-03-02T16:00:00.000Z", endedAt: "2026-03-02T18:00:00.000Z" },
    { id: 3, staffId: "b", jobId: 1, startedAt: "2026-03-02T14:00:00.000Z", endedAt: "2026-03-02T22:00:00.000Z" },
  ];
  const now = new Date("2026-03-03T00:00:00.000Z");

  it("an entry over another of the same person's is found; one that only touches it is not", () => {
    expect(overlapping({ staffId: "a", jobId: 3, startedAt: "2026-03-02T15:30:00.000Z", endedAt: "2026-03-02T15:45:00.000Z" }, mine, now).map((e) => e.id)).toEqual([1]);
    expect(overlapping({ staffId: "a", jobId: 3, startedAt: "2026-03-02T18:00:00.000Z", endedAt: "2026-03-02T19:00:00.000Z" }, mine, now)).toEqual([]);
  });

  it("another person's hours at the same time are not an overlap, and an entry is not compared with itself", () => {
    expect(overlapping({ staffId: "b", jobId: 2, startedAt: "2026-03-02T23:00:00.000Z", endedAt: null }, mine, now)).toEqual([]);
    expect(overlapping({ ...mine[0], endedAt: "2026-03-02T15:00:00.000Z" }, mine, now)).toEqual([]);
  });

  it("an open entry runs until now", () => {
    const open = [{ id: 9, staffId: "a", jobId: 1, startedAt: "2026-03-02T20:00:00.000Z", endedAt: null }];
    expect(overlapping({ staffId: "a", jobId: 2, startedAt: "2026-03-02T23:00:00.000Z", endedAt: "2026-03-02T23:30:00.000Z" }, open, now).map((e) => e.id)).toEqual([9]);
  });
});

describe("a clock left on over midnight", () => {
  // US/Central is UTC−6 in early March (daylight time starts 8 March 2026): 16:02 local = 22:02 UTC.
  it("an open entry from the shop's yesterday is flagged, with when it started in shop time", () => {
    const flags = clockFlags({ startedAt: "2026-03-02T22:02:00.000Z", endedAt: null }, new Date("2026-03-03T13:30:00.000Z"), tz);
    expect(flags.map((f) => f.code)).toEqual(["left_on_over_midnight"]);
    expect(flags[0].message).toContain("Left on since Mon 2 Mar 16:02");
  });

  it("an open entry started late today in shop time is not flagged, though UTC has passed midnight", () => {
    // 19:00 local on 2 March is 01:00 UTC on 3 March; at 20:00 local it is still the same shop day.
    expect(clockFlags({ startedAt: "2026-03-03T01:00:00.000Z", endedAt: null }, new Date("2026-03-03T02:00:00.000Z"), tz)).toEqual([]);
  });

  it("a closed entry that ran past the shop's midnight is marked for the office to check", () => {
    expect(clockFlags({ startedAt: "2026-03-02T22:00:00.000Z", endedAt: "2026-03-03T14:00:00.000Z" }, new Date("2026-03-03T15:00:00.000Z"), tz).map((f) => f.code)).toEqual(["crossed_midnight"]);
    expect(clockFlags({ startedAt: "2026-03-02T14:00:00.000Z", endedAt: "2026-03-02T22:00:00.000Z" }, new Date("2026-03-03T15:00:00.000Z"), tz)).toEqual([]);
  });
});

describe("hours per stage from entries that cross stage changes", () => {
  const changes = [
    { at: "2026-03-01T12:00:00.000Z", toStage: "fabricate" as const },
    { at: "2026-03-02T15:30:00.000Z", toStage: "install" as const },
    { at: "2026-03-02T17:00:00.000Z", toStage: "wire" as const },
  ];
  const now = new Date("2026-03-03T00:00:00.000Z");

  it("splits an entry at each stage change it spans", () => {
    // 14:00–18:00: 1.5 h Fabricate, 1.5 h Install, 1 h Wire.
    const byStage = msByStage([{ startedAt: "2026-03-02T14:00:00.000Z", endedAt: "2026-03-02T18:00:00.000Z", stage: "fabricate" }], changes, now);
    expect(Object.fromEntries(byStage)).toEqual({ fabricate: 1.5 * H, install: 1.5 * H, wire: 1 * H });
  });

  it("sums several entries and several people, and an open entry up to now", () => {
    const byStage = msByStage(
      [
        { startedAt: "2026-03-02T15:00:00.000Z", endedAt: "2026-03-02T16:00:00.000Z", stage: "fabricate" },
        { startedAt: "2026-03-02T16:00:00.000Z", endedAt: "2026-03-02T16:30:00.000Z", stage: "install" },
        { startedAt: "2026-03-02T23:00:00.000Z", endedAt: null, stage: "wire" },
      ],
      changes,
      now,
    );
    // Fabricate 0.5 h; Install 0.5 h + 0.5 h; Wire 1 h (open, until now).
    expect(Object.fromEntries(byStage)).toEqual({ fabricate: 0.5 * H, install: 1 * H, wire: 1 * H });
  });

  it("before the job's first recorded event, the entry's own stage counts", () => {
    const byStage = msByStage([{ startedAt: "2026-03-01T10:00:00.000Z", endedAt: "2026-03-01T13:00:00.000Z", stage: "queued" }], changes, now);
    expect(Object.fromEntries(byStage)).toEqual({ queued: 2 * H, fabricate: 1 * H });
  });
});

describe("hours per person per week", () => {
  it("counts an entry in the ISO week (Monday) it started in, in the shop's time zone", () => {
    // Sunday 8 March 2026 at 23:00 Central (CDT, UTC−5) is Monday 04:00 UTC: still the week of 2 March.
    expect(weekOf("2026-03-09T04:00:00.000Z", tz)).toBe("2026-03-02");
    const weeks = hoursByWeek(
      [
        { staffId: "a", startedAt: "2026-03-02T14:00:00.000Z", endedAt: "2026-03-02T16:30:00.000Z" },
        { staffId: "a", startedAt: "2026-03-09T14:00:00.000Z", endedAt: "2026-03-09T15:00:00.000Z" },
      ],
      new Date("2026-03-10T00:00:00.000Z"),
      tz,
    );
    expect(Object.fromEntries(weeks.get("a")!)).toEqual({ "2026-03-02": 2.5, "2026-03-09": 1 });
  });
});

describe("job cost in cents", () => {
  it("labour is hours × rate, rounded half-up to the cent, per stage", async () => {
    const { jobCost, labourCents } = await import("@/server/labour/cost");
    // 1 h 20 min at $125.00/h = $166.666… → $166.67; 10 min at $95.00/h = $15.8333… → $15.83.
    expect(labourCents(80 * 60_000, 12_500)).toBe(16_667);
    expect(labourCents(10 * 60_000, 9_500)).toBe(1_583);
    // Exactly half a cent rounds up: 18 s at $1.00/h = 0.5 ¢ → 1 ¢.
    expect(labourCents(18_000, 100)).toBe(1);
    const cost = jobCost({
      rateCentsPerHour: 12_500,
      msByStage: [["install", 2 * H], ["wire", 0.5 * H]],
      boughtLines: [{ quantity: 2, unitCostCents: 9_475 }, { quantity: 1, unitCostCents: 118_500 }, { quantity: 1, unitCostCents: null }],
    });
    // Labour 2.5 h × $125 = $312.50; parts 2 × $94.75 + $1,185.00 = $1,374.50; total $1,687.00.
    expect(cost).toEqual(expect.objectContaining({ hours: 2.5, labourCents: 31_250, partsCents: 137_450, unpricedParts: 1, totalCents: 168_700 }));
  });
});

describe("the stages a clock entry is labelled with", () => {
  const now = new Date("2026-12-03T16:00:00.000Z");
  // The job sat in Queued from 30 November and moved to Fabricate at 15:50 UTC on 3 December.
  const changes = [
    { at: "2026-11-30T14:00:00.000Z", toStage: "queued" as const },
    { at: "2026-12-03T15:50:00.000Z", toStage: "fabricate" as const },
  ];

  it("an entry that ran across a move names both stages, in order, as its hours count them", () => {
    // On at 19:50 UTC on 2 December, still on: 20 h in Queued, then 10 minutes in Fabricate.
    const entry = { startedAt: "2026-12-02T19:50:00.000Z", endedAt: null, stage: "queued" };
    expect(stagesOfEntry(entry, changes, now)).toEqual(["queued", "fabricate"]);
    expect(Object.fromEntries(msByStage([entry], changes, now))).toEqual({ queued: 20 * H, fabricate: H / 6 });
  });

  it("the job's history decides, even when the entry's own stage says otherwise (a start corrected to before a move)", () => {
    const entry = { startedAt: "2026-12-02T19:50:00.000Z", endedAt: "2026-12-02T21:50:00.000Z", stage: "fabricate" };
    expect(stagesOfEntry(entry, changes, now)).toEqual(["queued"]);
    expect([...msByStage([entry], changes, now).keys()]).toEqual(["queued"]);
  });

  it("an entry inside one stage names that stage once; an entry of no length names the stage it began in", () => {
    expect(stagesOfEntry({ startedAt: "2026-12-03T15:55:00.000Z", endedAt: "2026-12-03T15:58:00.000Z", stage: "fabricate" }, changes, now)).toEqual(["fabricate"]);
    expect(stagesOfEntry({ startedAt: "2026-12-03T15:51:00.000Z", endedAt: "2026-12-03T15:51:00.000Z", stage: "fabricate" }, changes, now)).toEqual(["fabricate"]);
    // A reorder within a stage is an event to the same stage: still one name.
    expect(stagesOfEntry({ startedAt: "2026-12-03T15:52:00.000Z", endedAt: "2026-12-03T15:59:00.000Z", stage: "fabricate" }, [...changes, { at: "2026-12-03T15:55:00.000Z", toStage: "fabricate" as const }], now)).toEqual(["fabricate"]);
    // Before the job's first event, the entry's own stage.
    expect(stagesOfEntry({ startedAt: "2026-11-30T12:00:00.000Z", endedAt: "2026-11-30T15:00:00.000Z", stage: "queued" }, changes, now)).toEqual(["queued"]);
  });
});
