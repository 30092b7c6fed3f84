import { describe, expect, it } from "vitest";
import type { Stage } from "@/db/schema";
import { type DatedStageEvent, finishedVisits, historyStart, likelyMissesDue, predictReady, remainingStages, type StageHistory, stageHistory } from "@/server/jobs/prediction";
import { NO_HOLIDAYS } from "@/server/shop/business-days";

/*
 * Calendar facts used below (checked on a printed 2026 calendar): 1 March 2026 is a Sunday, so
 * Mon 2, Tue 3, Wed 4, Thu 5, Fri 6, Mon 9 … Mon 16, Mon 23, Mon 30 March are the weekdays named.
 * In some tests the shop is closed on Thursday 12 March.
 *
 * Business days count the working days from the day a stay began up to, not including, the day
 * it ended (Fri → Mon = 1, the same day = 0). Every expected figure is worked out by hand in the
 * comments. Median: the middle value of the sorted list, or the mean of the two middle values.
 * 90th percentile: nearest rank, the value at rank ⌈0.9 × n⌉ of the sorted list (1-based).
 */
const CLOSED_12_MARCH = new Set(["2026-03-12"]);
const FULL_ROUTE: Stage[] = ["queued", "fabricate", "pressure_test", "coating", "install", "wire", "ready", "delivered"];

function job(jobId: number, moves: [Stage | null, Stage, string][]): DatedStageEvent[] {
  return moves.map(([fromStage, toStage, day]) => ({ jobId, fromStage, toStage, day }));
}

describe("finished visits from a job's stage events", () => {
  it("a job that went back to Fabricate twice has three Fabricate visits; a reorder is not a visit", () => {
    const events = job(1, [
      [null, "queued", "2026-03-02"],
      ["queued", "fabricate", "2026-03-03"], // queued Mon 2 → Tue 3: 1
      ["fabricate", "pressure_test", "2026-03-05"], // fabricate Tue 3 → Thu 5: 2
      ["pressure_test", "fabricate", "2026-03-06"], // pressure test Thu 5 → Fri 6: 1 (failed, back)
      ["fabricate", "pressure_test", "2026-03-09"], // fabricate Fri 6 → Mon 9: 1
      ["pressure_test", "fabricate", "2026-03-10"], // pressure test Mon 9 → Tue 10: 1 (failed again)
      ["fabricate", "fabricate", "2026-03-10"], // a reorder in the column
      ["fabricate", "pressure_test", "2026-03-16"], // fabricate Tue 10 → Mon 16: Tue, Wed, (Thu closed), Fri = 3
    ]);
    const visits = finishedVisits(events, CLOSED_12_MARCH);
    expect(visits.map((v) => [v.stage, v.days])).toEqual([
      ["queued", 1],
      ["fabricate", 2],
      ["pressure_test", 1],
      ["fabricate", 1],
      ["pressure_test", 1],
      ["fabricate", 3],
    ]);
    // The stay in Pressure test since Mon 16 is not finished, so it is not history.
    expect(visits.some((v) => v.enteredOn === "2026-03-16")).toBe(false);
  });

  it("a stage entered the day before a holiday counts the holiday out", () => {
    const events = job(2, [
      [null, "install", "2026-03-11"], // Wed 11
      ["install", "wire", "2026-03-13"], // Fri 13: Wed, (Thu closed) = 1; an open shop would count Wed and Thu = 2
    ]);
    expect(finishedVisits(events, CLOSED_12_MARCH).map((v) => v.days)).toEqual([1]);
    expect(finishedVisits(events, NO_HOLIDAYS).map((v) => v.days)).toEqual([2]);
  });

  it("parts sent to the coater on a Friday and back on the Monday spent 1 business day in Outside coating", () => {
    // The coater promised Friday 6 March and the run came back Monday 9 March.
    const events = job(3, [
      [null, "pressure_test", "2026-03-04"],
      ["pressure_test", "coating", "2026-03-06"], // sent Fri 6
      ["coating", "install", "2026-03-09"], // received Mon 9: Fri only = 1 (not the 3 calendar days)
    ]);
    expect(finishedVisits(events, NO_HOLIDAYS).filter((v) => v.stage === "coating").map((v) => v.days)).toEqual([1]);
  });

  it("history keeps the visits that ended in the last 12 months, shortest first", () => {
    expect(historyStart("2026-03-04")).toBe("2025-03-04");
    const events = [
      ...job(4, [[null, "wire", "2025-02-24"], ["wire", "ready", "2025-02-27"]]), // ended before 4 March 2025: left out
      ...job(5, [[null, "wire", "2025-03-03"], ["wire", "ready", "2025-03-04"]]), // ended on the first day of the window: 1
      ...job(6, [[null, "wire", "2026-02-02"], ["wire", "ready", "2026-02-06"]]), // Mon 2 → Fri 6 Feb: 4
      ...job(7, [[null, "ready", "2026-02-09"], ["ready", "delivered", "2026-02-10"]]), // Ready for pickup is a stage; Delivered is not
    ];
    const history = stageHistory(finishedVisits(events, NO_HOLIDAYS), historyStart("2026-03-04"));
    expect(history.wire).toEqual([1, 4]);
    expect(history.ready).toEqual([1]);
    expect(history.delivered).toBeUndefined();
  });
});

describe("the likely ready date", () => {
  // Install: 1, 2, 2, 3, 8 (5 visits): median 2 (3rd); 90th percentile rank ⌈4.5⌉ = 5 → 8.
  // Wire & verify: 1, 1, 2, 4, 5, 6 (6 visits): median (2 + 4) / 2 = 3; 90th rank ⌈5.4⌉ = 6 → 6.
  const history: StageHistory = { install: [1, 2, 2, 3, 8], wire: [1, 1, 2, 4, 5, 6] };

  it("is the median path through the rest of the route, the late date the 90th percentile path, holidays skipped", () => {
    const p = predictReady({ stage: "install", route: FULL_ROUTE, enteredOn: "2026-03-04", today: "2026-03-04" }, history, CLOSED_12_MARCH);
    // Likely: 2 + 3 = 5 working days after Wed 4: Thu 5, Fri 6, Mon 9, Tue 10, Wed 11.
    // Late: 8 + 6 = 14: Thu 5 (1), Fri 6, Mon 9, Tue 10, Wed 11 (5), (Thu 12 closed), Fri 13 (6),
    // Mon 16 … Fri 20 (11), Mon 23 (12), Tue 24 (13), Wed 25 (14).
    expect(p).toMatchObject({ kind: "estimate", likelyDays: 5, lateDays: 14, likelyOn: "2026-03-11", lateOn: "2026-03-25", overstayed: false });
  });

  it("counts the days already spent in the current stage against the visits that lasted at least as long", () => {
    // Install: 1, 2, 2, 3, 4, 6, 8, 9. Entered Mon 2, today Wed 4: 2 business days in so far.
    // Visits of 2 days or more: 2, 2, 3, 4, 6, 8, 9 (7), less the 2 spent: 0, 0, 1, 2, 4, 6, 7.
    // Median: the 4th of 7 = 2; 90th rank ⌈6.3⌉ = 7 → 7. Then Wire & verify: median 3, 90th 6.
    const spent: StageHistory = { install: [1, 2, 2, 3, 4, 6, 8, 9], wire: history.wire };
    const p = predictReady({ stage: "install", route: FULL_ROUTE, enteredOn: "2026-03-02", today: "2026-03-04" }, spent, NO_HOLIDAYS);
    // Likely 2 + 3 = 5 after Wed 4 → Wed 11; late 7 + 6 = 13 after Wed 4 → Mon 23 (5 a week: Wed 11 is 5, Wed 18 is 10, Mon 23 is 13).
    expect(p).toMatchObject({ kind: "estimate", daysInStage: 2, likelyDays: 5, lateDays: 13, likelyOn: "2026-03-11", lateOn: "2026-03-23" });
  });

  it("a job in its stage longer than all but a few past visits counts that stage as ending today, and says so", () => {
    // Entered Mon 2 Feb, today Wed 4 Mar: 22 business days (20 in February, Mon 2 and Tue 3 March), more than every Install visit above.
    const p = predictReady({ stage: "install", route: FULL_ROUTE, enteredOn: "2026-02-02", today: "2026-03-04" }, history, NO_HOLIDAYS);
    // Only Wire & verify is left: median 3 → Mon 9; 90th 6 → Thu 12.
    expect(p).toMatchObject({ kind: "estimate", overstayed: true, daysInStage: 22, likelyDays: 3, lateDays: 6, likelyOn: "2026-03-09", lateOn: "2026-03-12" });
  });

  it("an even count's half-day median is rounded up to a whole day", () => {
    // Wire & verify 1, 1, 2, 3, 3, 4: median (2 + 3) / 2 = 2.5 → 3 days; 90th rank ⌈5.4⌉ = 6 → 4.
    const p = predictReady({ stage: "wire", route: FULL_ROUTE, enteredOn: "2026-03-06", today: "2026-03-06" }, { wire: [1, 1, 2, 3, 3, 4] }, NO_HOLIDAYS);
    // From Fri 6: 3 → Wed 11; 4 → Thu 12.
    expect(p).toMatchObject({ likelyDays: 3, lateDays: 4, likelyOn: "2026-03-11", lateOn: "2026-03-12" });
  });

  it("with fewer than 5 finished visits of a stage still ahead it says not enough history yet, never a date", () => {
    const thin: StageHistory = { install: history.install, wire: [1, 2, 3, 4] };
    const p = predictReady({ stage: "install", route: FULL_ROUTE, enteredOn: "2026-03-04", today: "2026-03-04" }, thin, NO_HOLIDAYS);
    expect(p).toEqual({ kind: "not_enough_history", stages: [{ stage: "wire", visits: 4 }] });
    expect(likelyMissesDue(p, "2026-03-05")).toBe(false);
    // Stages already behind the job do not need history: one in Wire & verify is fine without Install's.
    expect(predictReady({ stage: "wire", route: FULL_ROUTE, enteredOn: "2026-03-04", today: "2026-03-04" }, { wire: history.wire }, NO_HOLIDAYS).kind).toBe("estimate");
  });

  it("follows the job's own route: install-only work skips the fabrication stages", () => {
    const installOnly: Stage[] = ["queued", "install", "wire", "ready", "delivered"];
    expect(remainingStages("queued", installOnly)).toEqual(["queued", "install", "wire"]);
    expect(remainingStages("fabricate", FULL_ROUTE)).toEqual(["fabricate", "pressure_test", "coating", "install", "wire"]);
    // A job sent back to Fabricate goes through Pressure test and Outside coating again.
    expect(remainingStages("fabricate", ["queued", "fabricate", "pressure_test", "install", "wire", "ready", "delivered"])).toEqual(["fabricate", "pressure_test", "install", "wire"]);
    expect(predictReady({ stage: "ready", route: FULL_ROUTE, enteredOn: "2026-03-04", today: "2026-03-04" }, {}, NO_HOLIDAYS)).toEqual({ kind: "ready" });
  });

  it("while parts are at the coater, coating does not end before the promised day", () => {
    // Coating 0, 1, 1, 1, 2: median 1, 90th rank ⌈4.5⌉ = 5 → 2. Sent Wed 4, today Wed 4, promised Mon 9:
    // Wed 4 → Mon 9 is 3 business days (Wed, Thu, Fri), more than both, so coating takes 3 either way.
    const h: StageHistory = { coating: [0, 1, 1, 1, 2], install: history.install, wire: history.wire };
    const p = predictReady({ stage: "coating", route: FULL_ROUTE, enteredOn: "2026-03-04", today: "2026-03-04", coatingPromisedOn: "2026-03-09" }, h, NO_HOLIDAYS);
    // Likely 3 + 2 + 3 = 8 after Wed 4 → Mon 16; late 3 + 8 + 6 = 17 after Wed 4 → Fri 27 (Wed 25 is 15, Thu 26 is 16).
    expect(p).toMatchObject({ likelyDays: 8, lateDays: 17, likelyOn: "2026-03-16", lateOn: "2026-03-27" });
  });

  it("on a day the shop is closed, counting starts at the next working day", () => {
    // Moved into Wire & verify on Saturday 7 March (0 business days in so far): median 3 counted
    // from Mon 9 → Tue 10, Wed 11, (Thu 12 closed), Fri 13.
    const p = predictReady({ stage: "wire", route: FULL_ROUTE, enteredOn: "2026-03-07", today: "2026-03-07" }, { wire: history.wire }, CLOSED_12_MARCH);
    expect(p).toMatchObject({ likelyOn: "2026-03-13" });
  });

  it("a job is likely late when its likely date is after its due date", () => {
    const p = predictReady({ stage: "install", route: FULL_ROUTE, enteredOn: "2026-03-04", today: "2026-03-04" }, history, CLOSED_12_MARCH);
    expect(likelyMissesDue(p, "2026-03-10")).toBe(true); // likely Wed 11
    expect(likelyMissesDue(p, "2026-03-11")).toBe(false);
    expect(likelyMissesDue(p, null)).toBe(false);
  });
});
