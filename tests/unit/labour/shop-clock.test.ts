import { describe, expect, it } from "vitest";
import { instantFromShopWallClock, shopWallClockValue } from "@/server/records/calendar";

// US Central time is UTC−6 in standard time (early November to early March) and UTC−5 in
// daylight time; in 2026 daylight time starts on Sunday 8 March at 02:00 and ends on Sunday
// 1 November at 02:00. Japan keeps UTC+9 all year.
const central = "US/Central";

describe("a clock correction's times on the shop's wall clock", () => {
  it("shows an instant as the shop's clock read it, not the computer's", () => {
    expect(shopWallClockValue("2026-12-02T19:44:00.000Z", central)).toBe("2026-12-02T13:44");
    expect(shopWallClockValue("2026-07-01T13:00:00.000Z", central)).toBe("2026-07-01T08:00");
    // Past midnight UTC is still the evening before at the shop.
    expect(shopWallClockValue("2026-12-03T02:30:00.000Z", central)).toBe("2026-12-02T20:30");
    expect(shopWallClockValue("2026-12-02T19:44:00.000Z", "Asia/Tokyo")).toBe("2026-12-03T04:44");
  });

  it("reads a typed time as the shop's clock, in standard and in daylight time", () => {
    expect(instantFromShopWallClock("2026-12-02T13:44", central)).toBe("2026-12-02T19:44:00.000Z");
    expect(instantFromShopWallClock("2026-07-01T08:00", central)).toBe("2026-07-01T13:00:00.000Z");
    expect(instantFromShopWallClock("2026-12-02T20:30", central)).toBe("2026-12-03T02:30:00.000Z");
    expect(instantFromShopWallClock("2026-12-03T04:44", "Asia/Tokyo")).toBe("2026-12-02T19:44:00.000Z");
  });

  it("the hour skipped when clocks go forward reads as standard time", () => {
    // 02:30 does not exist on 8 March 2026 in Central time; 02:30 standard time is 08:30 UTC.
    expect(instantFromShopWallClock("2026-03-08T02:30", central)).toBe("2026-03-08T08:30:00.000Z");
    expect(instantFromShopWallClock("2026-03-08T03:30", central)).toBe("2026-03-08T08:30:00.000Z");
  });

  it("a value that is not a real date and time gives nothing to send", () => {
    for (const bad of ["", "2026-02-31T10:00", "2026-12-02T24:00", "2026-12-02T13:60", "2026-12-02 13:44", "13:44", "2026-12-02T13:44Z"]) {
      expect(instantFromShopWallClock(bad, central), bad).toBeNull();
    }
  });
});
