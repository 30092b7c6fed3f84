import { describe, expect, it } from "vitest";
import { PAST_DUE_WARNING, pastDueWarning } from "@/server/jobs/due-date";
import { shopToday } from "@/server/records/turnaround";

describe("a due date already past when the job is entered", () => {
  it("is said, not refused: the job will show as late", () => {
    expect(pastDueWarning("2026-03-06", "2026-03-09")).toBe("That date has passed: the job will show as late.");
    expect(PAST_DUE_WARNING).toBe("That date has passed: the job will show as late.");
  });

  it("today, a later date and an empty or partly typed box say nothing", () => {
    expect(pastDueWarning("2026-03-09", "2026-03-09")).toBeNull();
    expect(pastDueWarning("2026-03-10", "2026-03-09")).toBeNull();
    expect(pastDueWarning("", "2026-03-09")).toBeNull();
    expect(pastDueWarning("2026-03", "2026-03-09")).toBeNull();
  });

  it("counts from the shop's today in its time zone, not the server's UTC date", () => {
    // 03:00 UTC on 10 March 2026 is 22:00 on 9 March in US/Central (CDT, UTC−5, from 8 March 2026).
    const now = new Date("2026-03-10T03:00:00Z");
    const today = shopToday({ now, timeZone: "US/Central" });
    expect(today).toBe("2026-03-09");
    expect(pastDueWarning("2026-03-09", today)).toBeNull();
    expect(pastDueWarning("2026-03-08", today)).toBe(PAST_DUE_WARNING);
  });
});
