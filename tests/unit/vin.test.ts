import { describe, expect, it } from "vitest";
import { vinCheckDigit, vinProblem, withCheckDigit } from "@/server/vehicles/vin";

// Check-digit rule of 49 CFR Part 565 (transliteration table and position weights 8,7,6,5,4,3,2,10,0,9…2).
describe("VIN check digit", () => {
  it("matches the worked example in 49 CFR 565 style: 1M8GDM9A_KP042788 has check digit X", () => {
    // A widely reprinted sample VIN whose weighted sum is 351 → 351 mod 11 = 10 → "X" (from memory; the arithmetic is re-done below).
    expect(vinCheckDigit("1M8GDM9A0KP042788")).toBe("X");
    const values = [1, 4, 8, 7, 4, 4, 9, 1, 0, 2, 7, 0, 4, 2, 7, 8, 8];
    const weights = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];
    const sum = values.reduce((s, v, i) => s + v * weights[i], 0);
    expect(sum % 11).toBe(10);
  });

  it("accepts a VIN whose 9th character is right and refuses one that is off by one", () => {
    const good = withCheckDigit("4CW7T3X20RK418825");
    expect(vinProblem(good)).toBeNull();
    const wrong = good.slice(0, 8) + (good[8] === "1" ? "2" : "1") + good.slice(9);
    expect(vinProblem(wrong)).toBe("check_digit");
  });

  it("refuses the letters I, O and Q and the wrong length", () => {
    expect(vinProblem("4CW7T3X2OIK41882Q")).toBe("characters");
    expect(vinProblem("4CW7T3X20RK41882")).toBe("length");
  });
});
