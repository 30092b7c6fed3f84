import { evaluate, unit, type Unit } from "mathjs";
import { describe, expect, it } from "vitest";
import {
  computeKitSpec,
  demoKitCalcInput,
  formulaForResult,
  formulaList,
  velocityBandSources,
  velocityBands,
  type KitCalcInput,
  type KitWarningCode,
} from "@/server/kit-calc";

const ORACLE_RELATIVE = 1e-9; // mathjs units agree with exact values to about 1e-10
const expectRelative = (actual: number, expected: number, relative: number) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * relative);

const demo: KitCalcInput = demoKitCalcInput;
const withChanges = (changes: Partial<KitCalcInput>): KitCalcInput => ({ ...demo, ...changes });
const codes = (input: KitCalcInput): KitWarningCode[] => computeKitSpec(input).warnings.map((warning) => warning.code);

describe("pump, power and torque chain (fluid-power textbook formulas; mathjs oracle for units)", () => {
  it("shaft speed, flow and power follow engine rpm × PTO %, D × N / 231 × ηv and gpm × psi / 1714.29", () => {
    const spec = computeKitSpec(demo);
    const shaftRpm = (demo.engineRpm * demo.ptoRatioPercent) / 100;
    const theoretical = unit(demo.pumpDisplacementCuIn * shaftRpm, "cuin/minute").toNumber("gallon/minute");
    expectRelative(spec.pumpShaftRpm, shaftRpm, 1e-15);
    expectRelative(spec.theoreticalFlowGpm, theoretical, ORACLE_RELATIVE);
    expectRelative(spec.flowGpm, theoretical * 0.9, ORACLE_RELATIVE);
    const hydraulicHp = unit(spec.flowGpm, "gallon/minute").multiply(unit(demo.workingPressurePsi, "psi")).toNumber("hp");
    expectRelative(spec.hydraulicHp, hydraulicHp, ORACLE_RELATIVE);
    expectRelative(spec.inputHp, hydraulicHp / (0.9 * 0.9), ORACLE_RELATIVE);
  });

  it("PTO torque is input power over shaft speed, computed by mathjs alone from the demo's inputs", () => {
    const spec = computeKitSpec(demo);
    // 3.5 in³ at 1380 rpm against 2500 psi, ηm 0.9: torque = D × p / (2π ηm), independent of speed.
    const torque = evaluate("3.5 cuin * 2500 psi / (2 pi) / 0.9").toNumber("lbf ft");
    expectRelative(spec.pumpTorqueLbFt, torque, ORACLE_RELATIVE);
    // The trade's shortcut, hp × 5252 / rpm with 5252 rounded from 33,000/2π, lands within 3e-5.
    const inputHp = evaluate("3.5 cuin * 1380 / minute * 0.9 * 2500 psi / 0.81").toNumber("hp");
    expectRelative(spec.pumpTorqueLbFt, (inputHp * 5252) / 1380, 3e-5);
  });

  it("efficiencies default to 0.90 each when left out", () => {
    const { volumetricEfficiency: _v, mechanicalEfficiency: _m, ...withoutEfficiencies } = demo;
    const spec = computeKitSpec({ ...withoutEfficiencies, workingPressurePsi: 2000 });
    expectRelative(spec.flowGpm, spec.theoreticalFlowGpm * 0.9, 1e-15);
    expectRelative(spec.inputHp, spec.hydraulicHp / 0.81, 1e-14);
  });

  it("a worn pump (ηv 0.7) delivers less oil but the same torque; a poor ηm raises torque", () => {
    const worn = computeKitSpec(withChanges({ volumetricEfficiency: 0.7 }));
    const base = computeKitSpec(demo);
    expectRelative(worn.flowGpm / base.flowGpm, 0.7 / 0.9, 1e-14);
    expectRelative(worn.pumpTorqueLbFt, base.pumpTorqueLbFt, 1e-15);
    const stiff = computeKitSpec(withChanges({ mechanicalEfficiency: 0.6 }));
    expectRelative(stiff.pumpTorqueLbFt / base.pumpTorqueLbFt, 0.9 / 0.6, 1e-14);
  });
});

describe("reservoir (geometry handbook; NIST HB 44 App. C for gallons)", () => {
  const tubeGallons = unit(Math.PI * 10 * 10 * 30, "cuin").toNumber("gallon");
  // The demo: 20 × 30 in tube filled to 90 % by the default, plus its 1.5 gal sump; 3.5 in³ at 1200 rpm × 115 %, ηv 0.9.
  const demoOilGal = 0.9 * tubeGallons + 1.5;
  const demoFlowGpm = unit(3.5 * 1380 * 0.9, "cuin/minute").toNumber("gallon/minute");

  it("a round tube with a sump: capacity π r² L / 231 plus the sump; default fill keeps 10 % of the tube as air", () => {
    const spec = computeKitSpec(withChanges({ tank: { shape: "round", insideDiameterIn: 20, lengthIn: 30 }, sumpGal: 1.5 }));
    expectRelative(spec.tank.totalGal, tubeGallons + 1.5, 1e-12);
    expectRelative(spec.tank.oilGal, 0.9 * tubeGallons + 1.5, 1e-12);
    expectRelative(spec.tank.airSpacePercent, ((0.1 * tubeGallons) / (tubeGallons + 1.5)) * 100, 1e-9);
  });

  it("without a sump the default air space is exactly 10 % (from memory: about 10 %)", () => {
    const { sumpGal: _sump, ...noSump } = demo;
    expectRelative(computeKitSpec(noSump).tank.airSpacePercent, 10, 1e-9);
  });

  it("an explicit fill depth is used as given: half a tube holds half its volume", () => {
    const spec = computeKitSpec(withChanges({ tank: { shape: "round", insideDiameterIn: 20, lengthIn: 30 }, sumpGal: 0, fillDepthIn: 10 }));
    expectRelative(spec.tank.oilGal, tubeGallons / 2, 1e-12);
    expectRelative(spec.tank.airSpacePercent, 50, 1e-12);
  });

  it("oil weight of the demo's oil at 0.87 kg/L (from memory) by mathjs, within the 0.1 % that 7.26 lb/gal rounds away", () => {
    const spec = computeKitSpec(demo);
    const fromDensity = unit(demoOilGal, "gallon").multiply(unit(0.87, "kg/L")).toNumber("lbm");
    expectRelative(spec.tank.oilWeightLb, fromDensity, 1e-3);
  });

  it("minutes of flow: the demo's oil over the demo pump's flow, both worked out by mathjs from the inputs", () => {
    const spec = computeKitSpec(demo);
    expectRelative(spec.reservoirMinutesOfFlow, demoOilGal / demoFlowGpm, ORACLE_RELATIVE);
  });
});

describe("heat estimate (vendor rule of thumb, 2.0 Btu/h·ft²·°F, the low end of 2.0–2.5; 1 hp = 2544 Btu/h)", () => {
  const box = { shape: "box", lengthIn: 36, widthIn: 18, heightIn: 20 } as const;
  const wettedSqFt = (36 * 18 + 2 * 15 * (36 + 18)) / 144;

  it("Btu/h = wetted ft² × 2.0 × ΔT and hp = Btu/h / 2544", () => {
    const spec = computeKitSpec(withChanges({ tank: box, fillDepthIn: 15, oilToAirDeltaF: 60 }));
    expectRelative(spec.tank.wettedAreaSqFt, wettedSqFt, 1e-15);
    expectRelative(spec.heat.dissipationBtuPerHr, wettedSqFt * 2.0 * 60, 1e-15);
    expectRelative(spec.heat.dissipationHp, (wettedSqFt * 2.0 * 60) / 2544, 1e-15);
  });

  it("the oil-to-air difference defaults to 40 °F", () => {
    const { oilToAirDeltaF: _delta, ...noDelta } = withChanges({ tank: box, fillDepthIn: 15 });
    expectRelative(computeKitSpec(noDelta).heat.dissipationBtuPerHr, wettedSqFt * 2.0 * 40, 1e-15);
  });
});

describe("metric values beside the US ones (NIST HB 44 App. C for litres, SP 811 App. B for bar, from memory; kW = L/min × bar / 600)", () => {
  it("flow, pressure and capacity match mathjs conversions", () => {
    const spec = computeKitSpec(demo);
    expectRelative(spec.metric.flowLpm, unit(spec.flowGpm, "gallon/minute").toNumber("L/minute"), ORACLE_RELATIVE);
    expectRelative(spec.metric.pressureBar, unit(demo.workingPressurePsi, "psi").toNumber("bar"), ORACLE_RELATIVE);
    expectRelative(spec.metric.tankL, unit(spec.tank.totalGal, "gallon").toNumber("L"), ORACLE_RELATIVE);
  });

  it("hydraulic kW by the metric formula equals hydraulic hp × 0.745699872 kW (two routes, one answer)", () => {
    const spec = computeKitSpec(demo);
    expectRelative(spec.metric.hydraulicKw, spec.hydraulicHp * 0.745699872, 1e-9);
    expectRelative(spec.metric.hydraulicKw, unit(spec.hydraulicHp, "hp").toNumber("kW"), ORACLE_RELATIVE);
  });
});

describe("line checks against the configured velocity bands (guidance, not a standard)", () => {
  it("the bands are the trade reference's 2–4, 10–15 and 15–20 ft/s, and each source says it is guidance from memory", () => {
    expect([velocityBands.suction.minFps, velocityBands.suction.maxFps]).toEqual([2, 4]);
    expect([velocityBands.return.minFps, velocityBands.return.maxFps]).toEqual([10, 15]);
    expect([velocityBands.pressure.minFps, velocityBands.pressure.maxFps]).toEqual([15, 20]);
    expect(velocityBandSources.lowPressure).toMatch(/common practice, no published source/i);
    for (const key of ["suction", "return", "pressure"] as const) {
      expect(velocityBandSources[key]).toMatch(/not a standard/);
      expect(velocityBandSources[key]).toMatch(/from memory/);
    }
    // Only makers' guides give the return-line band; it must not be credited to textbooks.
    expect(velocityBandSources.return).not.toMatch(/textbook/);
  });

  it("status is low, ok or high by where the velocity falls in the band", () => {
    // Diameter for a chosen velocity, by mathjs: area = flow / velocity, d = √(4A/π).
    const flow = unit(3.5 * 1380 * 0.9, "cuin/minute");
    const diameterFor = (fps: number) => Math.sqrt((4 * (flow.divide(unit(fps, "ft/s")) as Unit).toNumber("inch^2")) / Math.PI);
    const at = (fps: number) => computeKitSpec(withChanges({ suctionLine: { insideDiameterIn: diameterFor(fps), lengthFt: 4 } })).lines.suction;
    expect(at(1.5).status).toBe("low");
    expect(at(3).status).toBe("ok");
    expect(at(5).status).toBe("high");
    expectRelative(at(3).velocityFps, 3, ORACLE_RELATIVE);
  });

  it("the pressure line uses 15–20 ft/s from 500 psi up and 10–15 ft/s below (common practice)", () => {
    const bandAt = (psi: number) => computeKitSpec(withChanges({ workingPressurePsi: psi, reliefPressurePsi: undefined })).lines.pressure?.bandFps;
    expect(bandAt(499)).toEqual([10, 15]);
    expect(bandAt(500)).toEqual([15, 20]);
    expect(bandAt(3000)).toEqual([15, 20]);
    expect(bandAt(5000)).toEqual([15, 20]);
  });

  it("without a pressure line there is no pressure check", () => {
    const { pressureLine: _line, ...noPressureLine } = demo;
    expect(computeKitSpec(noPressureLine).lines.pressure).toBeUndefined();
  });

  it("the smallest suction diameter is the one mathjs finds for the demo flow at 4 ft/s, and a line cut to it reads ok", () => {
    const spec = computeKitSpec(demo);
    const areaSqIn = (unit(3.5 * 1380 * 0.9, "cuin/minute").divide(unit(4, "ft/s")) as Unit).toNumber("inch^2");
    expectRelative(spec.lines.suction.minInsideDiameterIn, Math.sqrt((4 * areaSqIn) / Math.PI), ORACLE_RELATIVE);
    const atMinimum = computeKitSpec(withChanges({ suctionLine: { insideDiameterIn: spec.lines.suction.minInsideDiameterIn, lengthFt: 4 } }));
    expect(atMinimum.lines.suction.status).toBe("ok");
  });
});

describe("warnings in plain words", () => {
  it("the demo kit is calm: only the heat-estimate note", () => {
    expect(codes(demo)).toEqual(["heat_is_estimate"]);
  });

  const cases: [string, Partial<KitCalcInput>, KitWarningCode][] = [
    ["a 3/4 in suction line (about 14 ft/s)", { suctionLine: { insideDiameterIn: 0.75, lengthFt: 4 } }, "suction_velocity_high"],
    ["a 1 in suction line 10 ft long (about 23 inHg with working oil)", { suctionLine: { insideDiameterIn: 1, lengthFt: 10 } }, "suction_inlet_vacuum_high"],
    ["a 1.5 in suction line 6 ft long: fine warm, over 5 inHg cold", { suctionLine: { insideDiameterIn: 1.5, lengthFt: 6 } }, "suction_inlet_vacuum_high_cold"],
    ["a trailer that draws 37.5 gal when 36.7 gal sits above the pick-up", { trailerOilNeedGal: 37.5 }, "pump_draws_air"],
    ["a brim-full tube warming 40 °F", { fillDepthIn: 20, sumpGal: 0 }, "no_room_for_expansion"],
    ["a pump at working pressure half the time", { dutyAtWorkingPercent: 50, dutyOverReliefPercent: 0 }, "cooler_advised"],
    ["a PTO rated 120 lb·ft intermittent against about 142 lb·ft at relief", { ptoIntermittentTorqueLbFt: 120 }, "relief_torque_above_pto_intermittent"],
    ["a PTO rated 30 hp against about 34 hp in", { ptoHpRating: 30 }, "input_power_above_pto_rating"],
    ["a pump limited to 1300 rpm turning 1380", { pumpMaxRpm: 1300 }, "pump_overspeed"],
    ["a pump limited to 2200 rpm, 2415 rpm at governed speed", { pumpMaxRpm: 2200 }, "pump_overspeed_at_governed"],
    ["a pump rated 2500 psi under a 2750 psi relief", { pumpRatedPsi: 2500 }, "relief_above_pump_rating"],
    ["hoses rated 2600 psi under a 2750 psi relief", { hoseRatedPsi: 2600 }, "relief_above_hose_rating"],
    ["a trailer rated 2700 psi under a 2750 psi relief", { trailerRatedPsi: 2700 }, "relief_above_trailer_rating"],
    ["ratings given but no relief setting", { reliefPressurePsi: undefined }, "relief_not_given"],
    ["40 gpm wanted from a 3.5 in³ pump governed at 2100 rpm", { targetFlowGpm: 40 }, "target_flow_above_governed"],
    ["a 12 in cube of a tank (7.5 gal against about 19 gpm)", { tank: { shape: "box", lengthIn: 12, widthIn: 12, heightIn: 12 } }, "reservoir_under_one_minute"],
    ["a 24 × 36 in tube (about 70 gal)", { tank: { shape: "round", insideDiameterIn: 24, lengthIn: 36 } }, "reservoir_outside_common_range"],
    ["a trailer that draws 40 gal from 38 gal of oil", { trailerOilNeedGal: 40 }, "oil_below_trailer_need"],
    ["a PTO rated 100 lb·ft against about 129 lb·ft", { ptoTorqueRatingLbFt: 100 }, "pump_torque_above_pto_rating"],
    ["relief set below working pressure", { reliefPressurePsi: 2400 }, "relief_not_above_working"],
    ["relief set at working pressure", { reliefPressurePsi: 2500 }, "relief_not_above_working"],
    ["a 1/2 in return line (about 31 ft/s)", { returnLine: { insideDiameterIn: 0.5, lengthFt: 14 } }, "return_velocity_high"],
    ["a 1/2 in pressure line (about 31 ft/s)", { pressureLine: { insideDiameterIn: 0.5, lengthFt: 14 } }, "pressure_velocity_high"],
  ];

  it.each(cases)("%s raises its warning", (_what, changes, code) => {
    const spec = computeKitSpec(withChanges(changes));
    const warning = spec.warnings.find((candidate) => candidate.code === code);
    expect(warning).toBeDefined();
    expect(warning?.message).not.toMatch(/NaN|undefined|Infinity/);
    expect(new Set(spec.warnings.map((candidate) => candidate.code)).size).toBe(spec.warnings.length);
  });

  it("the tank-size note says it is common practice", () => {
    const spec = computeKitSpec(withChanges({ tank: { shape: "round", insideDiameterIn: 24, lengthIn: 36 } }));
    expect(spec.warnings.find((warning) => warning.code === "reservoir_outside_common_range")?.message).toMatch(/common practice, no published source/);
  });

  it("a long suction line is judged by its inlet vacuum, not its length: 8 ft of 1.75 in line is fine warm, a cold-start caution only", () => {
    expect(codes(withChanges({ suctionLine: { insideDiameterIn: 1.75, lengthFt: 8 } }))).toEqual(["suction_inlet_vacuum_high_cold", "heat_is_estimate"]);
    expect(codes(withChanges({ suctionLine: { insideDiameterIn: 2, lengthFt: 8 } }))).toEqual(["heat_is_estimate"]);
  });

  it("the suction warning names the cavitation risk and the diameter that cures it", () => {
    const spec = computeKitSpec(withChanges({ suctionLine: { insideDiameterIn: 0.75, lengthFt: 4 } }));
    const message = spec.warnings.find((warning) => warning.code === "suction_velocity_high")?.message ?? "";
    expect(message).toMatch(/cavitate/);
    expect(message).toContain(spec.lines.suction.minInsideDiameterIn.toFixed(2));
  });
});

describe("formula and source beside every result", () => {
  const numericPaths = (value: unknown, prefix = ""): string[] => {
    if (typeof value === "number") return [prefix];
    if (value === null || typeof value !== "object") return [];
    return Object.entries(value).flatMap(([key, child]) => numericPaths(child, prefix ? `${prefix}.${key}` : key));
  };

  // A source must state its standing in words a reader can weigh: a named document, a textbook or handbook formula,
  // geometry, a maker's or vendor's guidance, "from memory" or "common practice, no published source".
  const STANDING = /NIST (Handbook 44|SP 811)|textbook|handbook|geometry|makers'|Vendor|from memory|Common practice, no published source/i;

  it("every number computeKitSpec returns has a formula with a label and a source that states its standing", () => {
    const { warnings: _warnings, ...results } = computeKitSpec(demo);
    const paths = numericPaths(results);
    expect(paths.length).toBeGreaterThan(20);
    for (const path of paths) {
      const formula = formulaForResult(path);
      expect(formula, path).toBeDefined();
      expect(formula?.label.length).toBeGreaterThan(0);
      expect(formula?.formula.length).toBeGreaterThan(0);
      expect(formula?.source, path).toMatch(STANDING);
    }
  });

  it("no formula is left over for a result that no longer exists", () => {
    const { warnings: _warnings, ...results } = computeKitSpec(demo);
    const shown = new Set(numericPaths(results).map((path) => formulaForResult(path)?.id));
    shown.add("lines.status");
    expect(formulaList.map((formula) => formula.id).filter((id) => !shown.has(id))).toEqual([]);
  });
});

describe("the whole calculator with the added checks", () => {
  it("a D-shaped tank 16 in wide, 20 in high, 30 in long holds ((16 − 10) × 20 + 50π) × 30 in³ (rectangle plus half circle), by mathjs in gallons", () => {
    const spec = computeKitSpec(withChanges({ tank: { shape: "d", lengthIn: 30, widthIn: 16, heightIn: 20 }, sumpGal: 0 }));
    expectRelative(spec.tank.totalGal, unit((6 * 20 + 50 * Math.PI) * 30, "cuin").toNumber("gallon"), ORACLE_RELATIVE);
    expectRelative(spec.tank.airSpacePercent, 10, 1e-9);
  });

  it("the demo's suction line: laminar both ways, and the cold inlet matches Hagen–Poiseuille plus the velocity head in mathjs", () => {
    const spec = computeKitSpec(demo);
    expect(spec.lines.suction.regime).toBe("laminar");
    expect(spec.lines.suction.cold.regime).toBe("laminar");
    // Defaults: 500 cSt cold, 0.87 specific gravity; 4 ft of line plus 3 ft of fittings.
    const scope = { nu: unit(500, "mm^2/s"), rho: unit(870, "kg/m^3"), q: unit(3.5 * 1380 * 0.9, "cuin/minute"), L: unit(7, "ft"), d: unit(1.75, "inch") };
    const friction = (evaluate("128 * nu * rho * L * q / (pi * d^4)", scope) as Unit).toNumber("Pa");
    const head = (evaluate("rho * (q / (pi / 4 * d^2))^2 / 2", scope) as Unit).toNumber("Pa");
    expectRelative(spec.lines.suction.cold.inletInHg, (friction + head) / unit(25.4, "mmHg").toNumber("Pa"), 3e-6);
  });

  it("the relief margins and target-flow speed come back for the demo; without the optional inputs they are left out", () => {
    const spec = computeKitSpec(demo);
    expect(spec.relief.pump?.marginPsi).toBe(250);
    expect(spec.engineRpmForTargetFlow).toBeDefined();
    const bare = computeKitSpec({
      engineRpm: 1000,
      ptoRatioPercent: 100,
      pumpDisplacementCuIn: 2.5,
      workingPressurePsi: 2000,
      tank: { shape: "box", lengthIn: 30, widthIn: 18, heightIn: 18 },
      suctionLine: { insideDiameterIn: 1.5, lengthFt: 3 },
      returnLine: { insideDiameterIn: 1, lengthFt: 12 },
    });
    expect(bare.relief).toEqual({});
    expect(bare.limits).toEqual({});
    expect(bare.engineRpmForTargetFlow).toBeUndefined();
    expect(bare.cylinder).toBeUndefined();
    expect(bare.tank.leftAfterTrailerGal).toBeUndefined();
  });

  it("every answer field of before is still there, with the same meaning (the answer only grows)", () => {
    const spec = computeKitSpec(demo);
    for (const key of ["pumpShaftRpm", "theoreticalFlowGpm", "flowGpm", "hydraulicHp", "inputHp", "pumpTorqueLbFt", "reservoirMinutesOfFlow"]) expect(spec).toHaveProperty(key);
    for (const key of ["totalGal", "oilGal", "airSpacePercent", "wettedAreaSqFt", "oilWeightLb"]) expect(spec.tank).toHaveProperty(key);
    for (const key of ["velocityFps", "bandFps", "status", "minInsideDiameterIn"]) expect(spec.lines.suction).toHaveProperty(key);
    expect(spec.heat.shedBtuPerHr).toBe(spec.heat.dissipationBtuPerHr);
    for (const key of ["flowLpm", "pressureBar", "hydraulicKw", "tankL"]) expect(spec.metric).toHaveProperty(key);
  });
});
