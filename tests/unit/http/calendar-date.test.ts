import { describe, expect, it } from "vitest";
import { formatDay } from "@/components/dates";
import { calendarDate, isCalendarDate, showStoredDate } from "@/server/http/calendar-date";

// Month lengths and leap years by the Gregorian rule: 2024 is a leap year, 2025 and 2100 are not, 2000 is.
describe("a calendar date", () => {
  it.each(["2026-02-31", "2026-04-31", "2026-13-01", "2026-00-10", "2026-01-00", "2025-02-29", "2100-02-29", "2026-1-05", "26-01-05", "2026-01-05T00:00", " 2026-01-05"])("refuses %s", (raw) => {
    expect(isCalendarDate(raw)).toBe(false);
    expect(calendarDate("the due date").safeParse(raw).success).toBe(false);
  });
  it.each(["2024-02-29", "2000-02-29", "2026-12-31", "2026-01-01", "2026-04-30"])("accepts %s", (raw) => {
    expect(calendarDate("the due date").parse(raw)).toBe(raw);
  });
  it("says what to fix", () => {
    const res = calendarDate("the due date").safeParse("2026-02-31");
    expect(res.error?.issues[0].message).toBe("The due date is not a day on the calendar (check the month and day).");
    expect(calendarDate("the due date").safeParse(20260231).error?.issues[0].message).toMatch(/like 2026-12-24/);
  });
});

describe("a stored date on a page", () => {
  it("is shown, or shown as it is and marked when it is not a real day", () => {
    expect(showStoredDate("2026-03-03", "d MMM yyyy")).toBe("3 Mar 2026");
    expect(showStoredDate("2026-02-31", "d MMM yyyy")).toBe("2026-02-31 (not a real date: correct it)");
    expect(showStoredDate("yesterday", "d MMM yyyy")).toBe("yesterday (not a real date: correct it)");
    expect(formatDay("2026-03-03")).toBe("Tue, Mar 3");
    expect(formatDay("2026-02-31")).toBe("2026-02-31 (not a real date)");
  });
});
