import { evaluate, unit, type Unit } from "mathjs";
import { describe, expect, it } from "vitest";
import {
  LINE_VELOCITY_FACTOR,
  hydraulicHorsepower,
  lineVelocityFps,
  minInsideDiameterIn,
  pumpShaftRpm,
  pumpTorqueLbFt,
  theoreticalFlowGpm,
} from "@/server/kit-calc/hydraulics";

const ORACLE_RELATIVE = 1e-9; // mathjs units agree with exact values to about 1e-10
const expectRelative = (actual: number, expected: number, relative: number) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * relative);

describe("pump shaft speed (fluid-power textbook: engine rpm × PTO ratio)", () => {
  it("a 100 % PTO turns the pump at engine speed and a 50 % PTO at half of it", () => {
    expect(pumpShaftRpm(1500, 100)).toBe(1500);
    expect(pumpShaftRpm(1500, 50)).toBe(750);
  });

  it("a 115 % PTO at 1200 rpm turns the pump 15 % faster than the engine", () => {
    expectRelative(pumpShaftRpm(1200, 115), 1200 + 0.15 * 1200, 1e-15);
  });
});

describe("theoretical pump flow Q = D × N / 231 (Fluid Power with Applications, ch. 5)", () => {
  it("Fluid Power: Theory and Applications, 4th ed., Example 9.3: 0.55 in³ at 3400 rpm → 8.095 gpm (printed to 0.001)", () => {
    expect(Math.abs(theoreticalFlowGpm(0.55, 3400) - 8.095)).toBeLessThanOrEqual(0.0005);
  });

  it("matches mathjs: in³/rev × rev/min converted to gallon/minute (NIST HB 44 App. C oracle)", () => {
    for (const [displacement, rpm] of [
      [0.01, 10],
      [3.5, 1380],
      [20, 15_000],
    ]) {
      const oracle = unit(displacement * rpm, "cuin/minute").toNumber("gallon/minute");
      expectRelative(theoreticalFlowGpm(displacement, rpm), oracle, ORACLE_RELATIVE);
    }
  });
});

describe("hydraulic horsepower HP = gpm × psi / 1714 (fluid-power textbook)", () => {
  it("published worked example: 20 gpm at 1500 psi → 17.5 HP (printed to 0.1 HP, so ±0.05)", () => {
    expect(Math.abs(hydraulicHorsepower(20, 1500) - 17.5)).toBeLessThanOrEqual(0.05);
  });

  it("the rounded 1714 differs from the exact 1714.2857 by 0.017 %: same answer within 2e-4 relative", () => {
    expectRelative(hydraulicHorsepower(20, 1500), (20 * 1500) / 1714, 2e-4);
  });

  it("matches mathjs: gallon/minute × psi converted to hp", () => {
    for (const [gpm, psi] of [
      [1, 1],
      [18.8, 2500],
      [1300, 10_000],
    ]) {
      const oracle = unit(gpm, "gallon/minute").multiply(unit(psi, "psi")).toNumber("hp");
      expectRelative(hydraulicHorsepower(gpm, psi), oracle, ORACLE_RELATIVE);
    }
  });
});

describe("pump torque T = psi × D / (2π) / ηm (fluid-power textbook)", () => {
  it("Fluid Power: Theory and Applications, 4th ed., Example 9.1: 2000 psi × 0.5 in³ × 0.16 = 160 lb·in (the book rounds 1/2π to 0.16, 0.53 % high, so within 0.6 %)", () => {
    expectRelative(pumpTorqueLbFt(2000, 0.5, 1) * 12, 160, 0.006);
  });

  it("agrees with T [lb·ft] = HP × 5252 / rpm (5252 vs 33,000/2π = 5252.11: within 3e-5 relative)", () => {
    const displacement = 3.5;
    const rpm = 1380;
    const psi = 2500;
    const efficiency = 0.9;
    const inputHp = hydraulicHorsepower(theoreticalFlowGpm(displacement, rpm), psi) / efficiency;
    expectRelative(pumpTorqueLbFt(psi, displacement, efficiency), (inputHp * 5252) / rpm, 3e-5);
  });

  it("matches mathjs: psi × in³ / 2π converted to lbf·ft, then divided by mechanical efficiency", () => {
    const oracle = evaluate("2500 psi * 3.5 cuin / (2 pi)").toNumber("lbf ft") / 0.85;
    expectRelative(pumpTorqueLbFt(2500, 3.5, 0.85), oracle, ORACLE_RELATIVE);
  });
});

describe("line velocity v = 0.4085 × gpm / d² (Fluid Power with Applications, ch. 10)", () => {
  it("the factor is (231/720)/(π/4); the printed 0.4085 agrees within 2e-5 relative (rounded to 4 figures)", () => {
    expectRelative(LINE_VELOCITY_FACTOR, 0.4085, 2e-5);
  });

  it("the area form 0.3208 × gpm / A agrees within 2e-4 relative (0.3208 vs 231/720 = 0.320833)", () => {
    const gpm = 18.8;
    const insideDiameter = 1.25;
    const area = (Math.PI / 4) * insideDiameter ** 2;
    expectRelative(lineVelocityFps(gpm, insideDiameter), (0.3208 * gpm) / area, 2e-4);
  });

  it("matches mathjs: gallon/minute through a circle of inside diameter d, converted to ft/s", () => {
    for (const [gpm, insideDiameter] of [
      [1, 6],
      [16, 0.5],
      [18.8, 1.75],
      [1300, 0.1],
    ]) {
      const area = unit((Math.PI / 4) * insideDiameter ** 2, "inch^2");
      const oracle = (unit(gpm, "gallon/minute").divide(area) as Unit).toNumber("ft/s");
      expectRelative(lineVelocityFps(gpm, insideDiameter), oracle, ORACLE_RELATIVE);
    }
  });
});

describe("smallest inside diameter d = √(0.4085 × gpm / v) (fluid-power textbook)", () => {
  it("published worked example: 16 gpm at 20 ft/s → d ≥ 0.572 in (printed to 0.001 in, so ±0.0005)", () => {
    expect(Math.abs(minInsideDiameterIn(16, 20) - 0.572)).toBeLessThanOrEqual(0.0005);
  });

  it("Fluid Power with Applications, 6th ed., Example 10-1: 30 gpm at 20 ft/s, worked the book's way (449 gpm per ft³/s, 0.04 % rounding → within 0.001 in)", () => {
    const cubicFeetPerSecond = 30 / 449;
    const areaSqIn = (cubicFeetPerSecond / 20) * 144;
    const bookDiameter = Math.sqrt((4 * areaSqIn) / Math.PI);
    expect(Math.abs(minInsideDiameterIn(30, 20) - bookDiameter)).toBeLessThanOrEqual(0.001);
  });

  it("matches mathjs: the diameter whose area carries the flow at the limit velocity", () => {
    const areaSqIn = (unit(30, "gallon/minute").divide(unit(20, "ft/s")) as Unit).toNumber("inch^2");
    expectRelative(minInsideDiameterIn(30, 20), Math.sqrt((4 * areaSqIn) / Math.PI), ORACLE_RELATIVE);
  });
});
