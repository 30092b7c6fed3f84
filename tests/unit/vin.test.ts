import { describe, expect, it } from "vitest";
import { vinCheckDigit, vinProblem } from "@/server/vehicles/vin";

// Check-digit rule of 49 CFR Part 565 (transliteration table and position weights 8,7,6,5,4,3,2,10,0,9…2).
// Expected check digits are worked by hand below, never by the function under test.
const WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];
const handSum = (values: number[]) => values.reduce((sum, value, i) => sum + value * WEIGHTS[i], 0);

describe("VIN check digit", () => {
  it("a widely reprinted sample, 1M8GDM9AXKP042788, has check digit X (from memory; the arithmetic is re-done here)", () => {
    // 1 M=4 8 G=7 D=4 M=4 9 A=1 X(check, weight 0) K=2 P=7 0 4 2 7 8 8 → 351; 351 mod 11 = 10 → "X".
    const values = [1, 4, 8, 7, 4, 4, 9, 1, 0, 2, 7, 0, 4, 2, 7, 8, 8];
    expect(handSum(values)).toBe(351);
    expect(vinCheckDigit("1M8GDM9AXKP042788")).toBe("X");
    expect(vinProblem("1M8GDM9AXKP042788")).toBeNull();
  });

  it("an invented VIN, 4CW7T3X22RK418825, worked by hand: sum 398, 398 mod 11 = 2", () => {
    // 4 C=3 W=6 7 T=3 3 X=7 2 (check) R=9 K=2 4 1 8 8 2 5.
    const values = [4, 3, 6, 7, 3, 3, 7, 2, 0, 9, 2, 4, 1, 8, 8, 2, 5];
    expect(handSum(values)).toBe(398);
    expect(vinCheckDigit("4CW7T3X22RK418825")).toBe("2");
    expect(vinProblem("4CW7T3X22RK418825")).toBeNull();
    expect(vinProblem("4CW7T3X21RK418825")).toBe("check_digit");
    expect(vinProblem("4CW7T3X23RK418825")).toBe("check_digit");
  });

  it("refuses the letters I, O and Q and the wrong length", () => {
    expect(vinProblem("4CW7T3X2OIK41882Q")).toBe("characters");
    expect(vinProblem("4CW7T3X20RK41882")).toBe("length");
  });

  it("refuses U, Z and 0 as the 10th character (model year) and accepts the year letters and digits 1–9", () => {
    for (const year of ["U", "Z", "0"]) expect(vinProblem(`4CW7T3X22${year}K418825`)).toBe("model_year");
    // With the 10th character changed the check digit changes too; only the model-year refusal is looked at here.
    for (const year of ["A", "R", "S", "T", "V", "Y", "1", "9"]) expect(vinProblem(`4CW7T3X22${year}K418825`)).not.toBe("model_year");
  });
});
