import { evaluate, fraction, unit, type Unit } from "mathjs";
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

// Expected values here are our own arithmetic, written out as exact fractions (checked with mathjs fractions),
// or mathjs units as an independent oracle built from SI definitions. No textbook example is claimed.
const ORACLE_RELATIVE = 1e-9; // mathjs units agree with exact values to about 1e-10
const expectRelative = (actual: number, expected: number, relative: number) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * relative);
const exact = (text: string) => fraction(text).valueOf() as number;

describe("pump shaft speed (fluid-power textbook: engine rpm × PTO ratio)", () => {
  it("a 100 % PTO turns the pump at engine speed and a 50 % PTO at half of it", () => {
    expect(pumpShaftRpm(1500, 100)).toBe(1500);
    expect(pumpShaftRpm(1500, 50)).toBe(750);
  });

  it("a 115 % PTO at 1200 rpm turns the pump at 1380 rpm (our own arithmetic: 1200 × 23/20)", () => {
    expectRelative(pumpShaftRpm(1200, 115), 1380, 1e-15);
  });
});

describe("theoretical pump flow Q = D × N / 231 (fluid-power textbook; 231 in³ per gallon, NIST HB 44 App. C)", () => {
  it("0.55 in³ at 3400 rpm → 1870/231 = 170/21 gpm (our own arithmetic, checked with mathjs)", () => {
    expectRelative(theoreticalFlowGpm(0.55, 3400), exact("170/21"), 1e-15);
    expectRelative(exact("170/21"), unit(0.55 * 3400, "cuin/minute").toNumber("gallon/minute"), ORACLE_RELATIVE);
  });

  it("matches mathjs: in³/rev × rev/min converted to gallon/minute, smallest to largest", () => {
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
  it("20 gpm at 1500 psi → 20 × 1500 × 231 / 396,000 = 17.5 hp exactly (our own arithmetic, checked with mathjs)", () => {
    expectRelative(hydraulicHorsepower(20, 1500), 17.5, 1e-15);
    expectRelative(17.5, unit(20, "gallon/minute").multiply(unit(1500, "psi")).toNumber("hp"), ORACLE_RELATIVE);
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
  it("2000 psi × 0.5 in³ / 2π = 500/π lb·in (our own arithmetic, checked with mathjs)", () => {
    expectRelative(pumpTorqueLbFt(2000, 0.5, 1) * 12, 500 / Math.PI, 1e-15);
    expectRelative(500 / Math.PI, evaluate("2000 psi * 0.5 cuin / (2 pi)").toNumber("lbf inch"), ORACLE_RELATIVE);
  });

  it("matches mathjs at the smallest, a working and the largest pump, each through its mechanical efficiency", () => {
    for (const [psi, displacement, efficiency] of [
      [1, 0.01, 0.01],
      [2500, 3.5, 0.85],
      [10_000, 20, 1],
    ]) {
      const oracle = evaluate(`${psi} psi * ${displacement} cuin / (2 pi)`).toNumber("lbf ft") / efficiency;
      expectRelative(pumpTorqueLbFt(psi, displacement, efficiency), oracle, ORACLE_RELATIVE);
    }
  });

  it("equals input power over shaft speed, computed by mathjs alone (hp → lbf·ft at rev/min)", () => {
    // 3.5 in³ at 1380 rpm and 2500 psi, ηm 0.9: power in = flow × pressure / ηm, torque = power / (2π × speed).
    const torque = evaluate("(3.5 cuin * 1380 / minute) * 2500 psi / 0.9 / (2 pi * 1380 / minute)").toNumber("lbf ft");
    expectRelative(pumpTorqueLbFt(2500, 3.5, 0.9), torque, ORACLE_RELATIVE);
  });
});

describe("line velocity v = 0.4085 × gpm / d² (fluid-power textbook)", () => {
  it("the factor is (231/720)/(π/4) = 77/(60π) (our own arithmetic); the printed 0.4085 agrees within 2e-5 relative", () => {
    expectRelative(LINE_VELOCITY_FACTOR, 77 / (60 * Math.PI), 1e-15);
    expectRelative(LINE_VELOCITY_FACTOR, 0.4085, 2e-5);
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
  it("16 gpm at 20 ft/s → d² = 77 × 16 / (60π × 20) = 1.02666…/π, d ≈ 0.5717 in (our own arithmetic, checked with mathjs)", () => {
    const diameter = Math.sqrt((77 * 16) / (60 * Math.PI * 20));
    expectRelative(minInsideDiameterIn(16, 20), diameter, 1e-15);
    const areaSqIn = (unit(16, "gallon/minute").divide(unit(20, "ft/s")) as Unit).toNumber("inch^2");
    expectRelative(diameter, Math.sqrt((4 * areaSqIn) / Math.PI), ORACLE_RELATIVE);
  });

  it("matches mathjs: the diameter whose area carries the flow at the limit velocity", () => {
    for (const [gpm, fps] of [
      [0.5, 2],
      [30, 20],
      [1300, 15],
    ]) {
      const areaSqIn = (unit(gpm, "gallon/minute").divide(unit(fps, "ft/s")) as Unit).toNumber("inch^2");
      expectRelative(minInsideDiameterIn(gpm, fps), Math.sqrt((4 * areaSqIn) / Math.PI), ORACLE_RELATIVE);
    }
  });
});
