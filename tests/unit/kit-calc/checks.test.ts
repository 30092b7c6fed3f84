import fc from "fast-check";
import { evaluate, fraction, unit, type Unit } from "mathjs";
import { describe, expect, it } from "vitest";
import {
  cylinderFill,
  darcyFrictionFactor,
  engineRpmForFlow,
  flowRegime,
  heatBalance,
  pumpRpmAtGovernedEngine,
  ratingMargin,
  suctionFriction,
  torqueAtReliefLbFt,
  usableOil,
} from "@/server/kit-calc/checks";

// Expected values are our own arithmetic written out as exact fractions (checked with mathjs fractions), a closed
// form that is independent of the code's route (Hagen–Poiseuille for laminar friction), or mathjs units. No
// published worked example is claimed for any of them.
const ORACLE_RELATIVE = 1e-9;
const expectRelative = (actual: number, expected: number, relative: number) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * relative);
const exact = (text: string) => fraction(text).valueOf() as number;

// mathjs has no centistokes; 1 cSt = 1 mm²/s by the definition of the stokes.
const nu = (cst: number) => unit(cst, "mm^2/s");
const density = (sg: number) => unit(sg * 1000, "kg/m^3");
// mathjs's mmHg is 133.322 Pa, the conventional 133.322387415 rounded: inHg = 25.4 mmHg within 3e-6.
const IN_HG_RELATIVE = 3e-6;
// A ratio whose units cancel: mathjs answers a plain number.
const plain = (value: unknown) => (typeof value === "number" ? value : (value as Unit).toSI().toNumber());

describe("suction line friction: laminar flow against Hagen–Poiseuille (Δp = 128 μ L Q / (π d⁴), fluid-mechanics textbooks, from memory)", () => {
  // Three laminar points: a trickle of cold oil, the demo kit cold, and warm oil just under the f crossover (Re ≈ 1190).
  const cases = [
    { gpm: 1, d: 0.5, ft: 2, fittings: 0, cst: 2000, sg: 0.87 },
    { gpm: 18.8, d: 1.75, ft: 4, fittings: 3, cst: 500, sg: 0.87 },
    { gpm: 18.8, d: 1.75, ft: 10, fittings: 0, cst: 50, sg: 0.9 },
  ];
  it.each(cases)("$gpm gpm through $d in, $ft ft + $fittings ft of fittings, $cst cSt", ({ gpm, d, ft, fittings, cst, sg }) => {
    const result = suctionFriction({ flowGpm: gpm, insideDiameterIn: d, lengthFt: ft, fittingsEquivalentFt: fittings, viscosityCst: cst, specificGravity: sg });
    const scope = { nu: nu(cst), rho: density(sg), q: unit(gpm, "gallon/minute"), L: unit(ft + fittings, "ft"), d: unit(d, "inch") };
    const dp = evaluate("128 * (nu * rho) * L * q / (pi * d^4)", scope) as Unit;
    expect(result.regime).toBe("laminar");
    expect(result.reynolds).toBeLessThan(1190);
    expectRelative(result.pressureDropPsi, dp.toNumber("psi"), ORACLE_RELATIVE);
    // Reynolds number Re = v d / ν, dimensionless in mathjs.
    const v = evaluate("q / (pi / 4 * d^2)", scope) as Unit;
    expectRelative(result.reynolds, plain(evaluate("v * d / nu", { ...scope, v })), ORACLE_RELATIVE);
    // Inlet vacuum adds the velocity head ρ v²/2 to the friction.
    const head = evaluate("rho * v^2 / 2", { ...scope, v }) as Unit;
    const inHg = (dp.toNumber("Pa") + head.toNumber("Pa")) / unit(25.4, "mmHg").toNumber("Pa");
    expectRelative(result.inletInHg, inHg, IN_HG_RELATIVE);
  });
});

describe("suction line friction: turbulent flow by Darcy–Weisbach with the Blasius factor 0.316/Re^0.25 (from memory), worked in mathjs units", () => {
  const cases = [
    { gpm: 60, d: 1.0, ft: 5, cst: 10, sg: 0.87 },
    { gpm: 150, d: 1.5, ft: 8, cst: 5, sg: 0.85 },
    { gpm: 400, d: 2.0, ft: 3, cst: 3, sg: 0.87 },
  ];
  it.each(cases)("$gpm gpm through $d in, $ft ft, $cst cSt", ({ gpm, d, ft, cst, sg }) => {
    const result = suctionFriction({ flowGpm: gpm, insideDiameterIn: d, lengthFt: ft, fittingsEquivalentFt: 0, viscosityCst: cst, specificGravity: sg });
    const scope = { q: unit(gpm, "gallon/minute"), d: unit(d, "inch"), L: unit(ft, "ft"), nu: nu(cst), rho: density(sg) };
    const v = evaluate("q / (pi / 4 * d^2)", scope) as Unit;
    const re = plain(evaluate("v * d / nu", { ...scope, v }));
    const dp = evaluate(`0.316 / ${re}^0.25 * L / d * rho * v^2 / 2`, { ...scope, v }) as Unit;
    expect(re).toBeGreaterThan(4000);
    expect(result.regime).toBe("turbulent");
    expectRelative(result.reynolds, re, ORACLE_RELATIVE);
    expectRelative(result.pressureDropPsi, dp.toNumber("psi"), ORACLE_RELATIVE);
  });
});

describe("flow regime and friction factor at the edges", () => {
  it("laminar below Re 2000, transitional from 2000 to 4000, turbulent above 4000 (textbook limits, from memory)", () => {
    expect(flowRegime(1999.9)).toBe("laminar");
    expect(flowRegime(2000)).toBe("transitional");
    expect(flowRegime(4000)).toBe("transitional");
    expect(flowRegime(4000.1)).toBe("turbulent");
  });

  it("f is 64/Re up to the crossover (64/0.316)^(4/3) ≈ 1191 and 0.316/Re^0.25 past it: one value at the crossover", () => {
    const crossover = (64 / 0.316) ** (4 / 3);
    expectRelative(darcyFrictionFactor(crossover), 64 / crossover, 1e-12);
    expectRelative(darcyFrictionFactor(100), 0.64, 1e-15);
    // Re = 10,000: 0.316 / 10 = 0.0316 exactly (10,000^0.25 = 10).
    expectRelative(darcyFrictionFactor(10_000), 0.0316, 1e-15);
  });

  const line = fc.record({
    flowGpm: fc.double({ min: 0.1, max: 500, noNaN: true }),
    insideDiameterIn: fc.double({ min: 0.25, max: 6, noNaN: true }),
    lengthFt: fc.double({ min: 0.1, max: 100, noNaN: true }),
    fittingsEquivalentFt: fc.double({ min: 0, max: 50, noNaN: true }),
    viscosityCst: fc.double({ min: 1, max: 5000, noNaN: true }),
    specificGravity: fc.double({ min: 0.8, max: 1, noNaN: true }),
  });
  const factor = fc.double({ min: 1.01, max: 10, noNaN: true });

  it("the drop grows with length and with viscosity (fast-check)", () => {
    fc.assert(
      fc.property(line, factor, (input, k) => {
        const base = suctionFriction(input).pressureDropPsi;
        expect(suctionFriction({ ...input, lengthFt: input.lengthFt * k }).pressureDropPsi).toBeGreaterThan(base);
        expect(suctionFriction({ ...input, viscosityCst: input.viscosityCst * k }).pressureDropPsi).toBeGreaterThanOrEqual(base * (1 - 1e-12));
      }),
      { numRuns: 300 },
    );
  });
});

describe("heat made (energy balance: input less hydraulic power, and all of it over the relief)", () => {
  const base = { flowGpm: 20, workingPressurePsi: 1500, reliefPressurePsi: 3000, volumetricEfficiency: 0.9, mechanicalEfficiency: 0.9, shedBtuPerHr: 2000 };

  it("20 gpm at 1500 psi is 17.5 hp; at ηv = ηm = 0.9 the pump loses 17.5 × 19/81 hp; half the time: 422,940/81 Btu/h (our own arithmetic, checked with mathjs)", () => {
    const heat = heatBalance({ ...base, dutyAtWorkingFraction: 0.5, dutyOverReliefFraction: 0 });
    const expected = exact("1/2") * exact("17.5") * exact("19/81") * 2544;
    expectRelative(expected, exact("422940/81"), 1e-15);
    expectRelative(heat.generatedBtuPerHr, expected, 1e-12);
    // mathjs: the same loss in hp → BTU/h (International Table Btu, 2544.43 per hp: 2544 is 1.7e-4 low).
    const oracle = unit(0.5 * (17.5 / 0.81 - 17.5), "hp").toNumber("BTU/h");
    expectRelative(heat.generatedBtuPerHr, oracle, 2e-4);
  });

  it("10 % of the time over a 3000 psi relief: 20 × 3000 × 231 / 396,000 = 35 hp, ÷ 0.81, × 0.1 → 3.5/0.81 hp of heat", () => {
    const heat = heatBalance({ ...base, dutyAtWorkingFraction: 0, dutyOverReliefFraction: 0.1 });
    expectRelative(heat.generatedBtuPerHr, (exact("3.5") / exact("0.81")) * 2544, 1e-12);
  });

  it("edges: no time at pressure makes no heat; a perfect pump makes none at working pressure; the cooler closes exactly the gap", () => {
    expect(heatBalance({ ...base, dutyAtWorkingFraction: 0, dutyOverReliefFraction: 0 }).generatedBtuPerHr).toBe(0);
    expect(heatBalance({ ...base, volumetricEfficiency: 1, mechanicalEfficiency: 1, dutyAtWorkingFraction: 1, dutyOverReliefFraction: 0 }).generatedBtuPerHr).toBe(0);
    const hot = heatBalance({ ...base, dutyAtWorkingFraction: 1, dutyOverReliefFraction: 0 });
    // 17.5 × 19/81 hp × 2544 = 845,880/81 Btu/h, less 2000 shed.
    expectRelative(hot.coolerBtuPerHr, exact("845880/81") - 2000, 1e-12);
    expect(hot.coolerAdvised).toBe(true);
    const cool = heatBalance({ ...base, dutyAtWorkingFraction: 0.1, dutyOverReliefFraction: 0 });
    expect(cool.coolerAdvised).toBe(false);
    expect(cool.coolerBtuPerHr).toBe(0);
  });
});

describe("relief against ratings, PTO and pump limits", () => {
  it("margins: 3000 rated, 2750 relief → 250 psi, 25/3 %; equal → 0; over → negative", () => {
    expect(ratingMargin(2750, 3000)).toEqual({ ratedPsi: 3000, marginPsi: 250, marginPercent: expect.closeTo(exact("25/3"), 12) });
    expect(ratingMargin(3000, 3000).marginPsi).toBe(0);
    expect(ratingMargin(3100, 3000).marginPsi).toBe(-100);
  });

  it("torque at relief matches mathjs: p × D / 2π / ηm at the smallest, a working and the largest settings", () => {
    for (const [psi, displacement, efficiency] of [
      [1, 0.01, 0.01],
      [2750, 3.5, 0.9],
      [10_000, 20, 1],
    ]) {
      const oracle = evaluate(`${psi} psi * ${displacement} cuin / (2 pi)`).toNumber("lbf ft") / efficiency;
      expectRelative(torqueAtReliefLbFt(psi, displacement, efficiency), oracle, ORACLE_RELATIVE);
    }
  });

  it("pump speed at a 2100 rpm governed engine through a 115 % PTO is 2415 rpm (our own arithmetic: 2100 × 23/20)", () => {
    expectRelative(pumpRpmAtGovernedEngine(2100, 115), 2415, 1e-15);
  });
});

describe("engine speed for a target flow (the pump-flow formula turned round)", () => {
  it("matches mathjs: target flow / (D × ηv) as a speed, then ÷ the PTO ratio", () => {
    for (const [gpm, displacement, efficiency, pto] of [
      [0.1, 20, 1, 300],
      [20, 3.5, 0.9, 115],
      [1000, 0.01, 0.01, 10],
    ]) {
      const shaft = (unit(gpm, "gallon/minute").divide(unit(displacement * efficiency, "cuin")) as Unit).toNumber("minute^-1");
      expectRelative(engineRpmForFlow(gpm, displacement, efficiency, pto), shaft / (pto / 100), ORACLE_RELATIVE);
    }
  });

  it("20 gpm from 3.5 in³ at ηv 0.9 through 115 %: 4620 / 3.6225 = 1275.36 rpm (our own arithmetic)", () => {
    expectRelative(engineRpmForFlow(20, 3.5, 0.9, 115), exact("4620") / exact("3.6225"), 1e-15);
  });
});

describe("cylinder fill (bore area × stroke; rod side less the rod)", () => {
  it("two 4 in bores, 2 in rods, 14 in stroke: 112π in³ = 16π/33 gal out, 84π in³ = 4π/11 gal back (our own arithmetic, checked with mathjs)", () => {
    const fill = cylinderFill({ boreIn: 4, rodIn: 2, strokeIn: 14, count: 2 }, 10);
    expectRelative(fill.extendGal, (16 * Math.PI) / 33, 1e-15);
    expectRelative(fill.retractGal, (4 * Math.PI) / 11, 1e-15);
    expectRelative(fill.extendGal, unit(112 * Math.PI, "cuin").toNumber("gallon"), ORACLE_RELATIVE);
    // At 10 gpm: (16π/33) / 10 × 60 s = 32π/11 s.
    expectRelative(fill.extendSeconds, (32 * Math.PI) / 11, 1e-15);
    expectRelative(fill.retractSeconds, (unit(84 * Math.PI, "cuin").divide(unit(10, "gallon/minute")) as Unit).toNumber("s"), ORACLE_RELATIVE);
  });

  it("the smallest and the largest cylinders match mathjs", () => {
    for (const [bore, rod, stroke, count, gpm] of [
      [0.2, 0.1, 0.1, 1, 1000],
      [600, 599, 600, 20, 0.1],
    ]) {
      const fill = cylinderFill({ boreIn: bore, rodIn: rod, strokeIn: stroke, count }, gpm);
      const volume = unit((Math.PI / 4) * bore * bore * stroke * count, "cuin");
      expectRelative(fill.extendGal, volume.toNumber("gallon"), ORACLE_RELATIVE);
      expectRelative(fill.extendSeconds, (volume.divide(unit(gpm, "gallon/minute")) as Unit).toNumber("s"), ORACLE_RELATIVE);
    }
  });
});

describe("oil the trailer can use: oil above the pick-up", () => {
  const common = { sumpGal: 0, oilGal: 0, totalGal: 0, warmingF: 0, expansionPerF: 0 };

  it("a 36 × 18 in box filled 18 in deep with the pick-up 1 in up: 36 × 18 × 17 / 231 = 11,016/231 gal", () => {
    const box = { shape: "box", lengthIn: 36, widthIn: 18, heightIn: 20 } as const;
    expectRelative(usableOil({ ...common, tank: box, fillDepthIn: 18, pickupHeightIn: 1 }).usableGal, exact("11016/231"), 1e-15);
  });

  it("a 20 in round tube: the handbook segment at the fill depth less the one at the pick-up (independent closed form)", () => {
    const tube = { shape: "round", insideDiameterIn: 20, lengthIn: 30 } as const;
    const segment = (r: number, h: number) => r * r * Math.acos((r - h) / r) - (r - h) * Math.sqrt(2 * r * h - h * h);
    for (const [fill, pickup] of [
      [15, 1],
      [10, 2.5],
      [19, 0.5],
    ]) {
      const expected = ((segment(10, fill) - segment(10, pickup)) * 30) / 231;
      expectRelative(usableOil({ ...common, tank: tube, fillDepthIn: fill, pickupHeightIn: pickup }).usableGal, expected, 1e-12);
    }
  });

  it("edges: a pick-up on the floor leaves all the oil usable, one above the oil leaves none, and a sump keeps all the tank's oil", () => {
    const box = { shape: "box", lengthIn: 10, widthIn: 10, heightIn: 10 } as const;
    expectRelative(usableOil({ ...common, tank: box, fillDepthIn: 9, pickupHeightIn: 0 }).usableGal, exact("900/231"), 1e-15);
    expect(usableOil({ ...common, tank: box, fillDepthIn: 5, pickupHeightIn: 6 }).usableGal).toBe(0);
    expectRelative(usableOil({ ...common, tank: box, fillDepthIn: 9, pickupHeightIn: 3, sumpGal: 2 }).usableGal, exact("900/231"), 1e-15);
  });

  it("expansion: 100 gal warming 90 °F (50 °C) at 0.0007 per °C grows 3.5 gal (our own arithmetic)", () => {
    const box = { shape: "box", lengthIn: 10, widthIn: 10, heightIn: 10 } as const;
    const oil = usableOil({ ...common, tank: box, fillDepthIn: 9, pickupHeightIn: 1, oilGal: 100, totalGal: 110, warmingF: 90, expansionPerF: (0.0007 * 5) / 9 });
    expectRelative(oil.expansionGal, 3.5, 1e-12);
    expect(oil.airGal).toBe(10);
  });
});
