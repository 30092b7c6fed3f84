import { describe, expect, it } from "vitest";
import { ZodError } from "zod";
import { computeKitSpec, demoKitCalcInput, kitCalcInputSchema, kitCalcLimits, type KitCalcInput } from "@/server/kit-calc";

const demo: KitCalcInput = demoKitCalcInput;

// Sets one field, by path, on a copy of the demo input; the value may be anything a form or a hostile client sends.
function withField(path: string, value: unknown): unknown {
  const copy = structuredClone(demo) as Record<string, unknown>;
  const keys = path.split(".");
  let node = copy;
  for (const key of keys.slice(0, -1)) node = node[key] as Record<string, unknown>;
  node[keys[keys.length - 1]] = value;
  return copy;
}

function issuesFor(input: unknown) {
  const result = kitCalcInputSchema.safeParse(input);
  expect(result.success).toBe(false);
  return result.error?.issues ?? [];
}

const issuePaths = (input: unknown) => issuesFor(input).map((issue) => issue.path.join("."));

const sizeFields = [
  "engineRpm",
  "ptoRatioPercent",
  "pumpDisplacementCuIn",
  "workingPressurePsi",
  "reliefPressurePsi",
  "tank.insideDiameterIn",
  "tank.lengthIn",
  "fillDepthIn",
  "suctionLine.insideDiameterIn",
  "suctionLine.lengthFt",
  "returnLine.insideDiameterIn",
  "returnLine.lengthFt",
  "pressureLine.insideDiameterIn",
  "pressureLine.lengthFt",
  "oilToAirDeltaF",
  "trailerOilNeedGal",
  "ptoTorqueRatingLbFt",
];

describe("kitCalcInputSchema accepts real kits", () => {
  it("the Cold Creek Upfit demo input parses unchanged", () => {
    expect(kitCalcInputSchema.parse(demo)).toEqual(demo);
  });

  it("a box tank with only the required fields parses", () => {
    const minimal = {
      engineRpm: 1000,
      ptoRatioPercent: 100,
      pumpDisplacementCuIn: 2.5,
      workingPressurePsi: 2000,
      tank: { shape: "box", lengthIn: 30, widthIn: 18, heightIn: 18 },
      suctionLine: { insideDiameterIn: 1.5, lengthFt: 3 },
      returnLine: { insideDiameterIn: 1, lengthFt: 12 },
    };
    expect(kitCalcInputSchema.safeParse(minimal).success).toBe(true);
  });

  it("a fill depth equal to the diameter (a brim-full tube) and efficiency 1 are allowed", () => {
    expect(kitCalcInputSchema.safeParse(withField("fillDepthIn", 20)).success).toBe(true);
    expect(kitCalcInputSchema.safeParse(withField("volumetricEfficiency", 1)).success).toBe(true);
  });
});

describe("kitCalcInputSchema rejects bad numbers and names the field", () => {
  it.each(sizeFields)("zero and negative %s are rejected at that path", (path) => {
    expect(issuePaths(withField(path, 0))).toContain(path);
    expect(issuePaths(withField(path, -5))).toContain(path);
  });

  it("zero and negative box dimensions are rejected at their paths", () => {
    for (const dimension of ["lengthIn", "widthIn", "heightIn"]) {
      const box = { shape: "box", lengthIn: 30, widthIn: 18, heightIn: 18, [dimension]: 0 };
      expect(issuePaths({ ...demo, tank: box, fillDepthIn: undefined })).toContain(`tank.${dimension}`);
    }
  });

  it("a fill depth above the round tank's diameter is rejected at fillDepthIn, and the message gives the diameter", () => {
    const issues = issuesFor(withField("fillDepthIn", 20.5));
    const issue = issues.find((candidate) => candidate.path.join(".") === "fillDepthIn");
    expect(issue?.message).toMatch(/inside diameter \(20 in\)/);
  });

  it("a fill depth above the box's height is rejected at fillDepthIn", () => {
    const input = { ...demo, tank: { shape: "box", lengthIn: 30, widthIn: 18, heightIn: 18 }, fillDepthIn: 19 };
    const issue = issuesFor(input).find((candidate) => candidate.path.join(".") === "fillDepthIn");
    expect(issue?.message).toMatch(/height \(18 in\)/);
  });

  it("an efficiency of 1.5 (or 90 typed for 90 %) is rejected at its path", () => {
    expect(issuePaths(withField("volumetricEfficiency", 1.5))).toEqual(["volumetricEfficiency"]);
    expect(issuePaths(withField("mechanicalEfficiency", 90))).toEqual(["mechanicalEfficiency"]);
    expect(issuePaths(withField("mechanicalEfficiency", 0))).toEqual(["mechanicalEfficiency"]);
  });

  it("a number sent as a string is rejected at its path", () => {
    expect(issuePaths(withField("engineRpm", "1200"))).toEqual(["engineRpm"]);
    expect(issuePaths(withField("suctionLine.insideDiameterIn", "1.75"))).toEqual(["suctionLine.insideDiameterIn"]);
  });

  it.each([
    ["NaN", Number.NaN],
    ["Infinity", Number.POSITIVE_INFINITY],
    ["-Infinity", Number.NEGATIVE_INFINITY],
    ["1e308", 1e308],
  ])("%s is rejected at the field's path", (_name, value) => {
    for (const path of ["engineRpm", "tank.lengthIn", "returnLine.lengthFt", "workingPressurePsi"]) {
      expect(issuePaths(withField(path, value))).toContain(path);
    }
  });

  it("each upper limit is the last accepted value: one step past it is refused", () => {
    const above = (max: number) => max * (1 + 1e-9);
    expect(kitCalcInputSchema.safeParse(withField("engineRpm", kitCalcLimits.engineRpm.max)).success).toBe(true);
    expect(issuePaths(withField("engineRpm", above(kitCalcLimits.engineRpm.max)))).toEqual(["engineRpm"]);
    expect(issuePaths(withField("pumpDisplacementCuIn", above(kitCalcLimits.pumpDisplacementCuIn.max)))).toEqual(["pumpDisplacementCuIn"]);
    expect(issuePaths(withField("workingPressurePsi", above(kitCalcLimits.pressurePsi.max)))).toEqual(["workingPressurePsi"]);
    expect(issuePaths(withField("suctionLine.insideDiameterIn", above(kitCalcLimits.lineInsideDiameterIn.max)))).toEqual([
      "suctionLine.insideDiameterIn",
    ]);
    expect(issuePaths(withField("returnLine.lengthFt", above(kitCalcLimits.lineLengthFt.max)))).toEqual(["returnLine.lengthFt"]);
  });

  it("messages speak the shop's words: the field's name and its allowed range", () => {
    const [issue] = issuesFor(withField("engineRpm", 0));
    expect(issue.message).toBe("Engine speed must be a number from 100 to 5000 rpm.");
    const [missing] = issuesFor(withField("pumpDisplacementCuIn", undefined));
    expect(missing.message).toBe("Pump displacement is required.");
  });

  it("an unknown tank shape is rejected at tank.shape", () => {
    expect(issuePaths({ ...demo, tank: { shape: "oval", insideDiameterIn: 20, lengthIn: 30 } })).toContain("tank.shape");
  });

  it("a missing suction line is rejected at suctionLine", () => {
    const { suctionLine: _line, ...noSuction } = demo;
    expect(issuePaths(noSuction)).toContain("suctionLine");
  });

  it("computeKitSpec re-parses and refuses what the schema refuses", () => {
    expect(() => computeKitSpec(withField("tank.lengthIn", Number.NaN) as KitCalcInput)).toThrow(ZodError);
  });
});

describe("computeKitSpec on extreme but valid inputs", () => {
  const limitsOf = (edge: "min" | "max"): KitCalcInput => {
    const l = kitCalcLimits;
    const line = { insideDiameterIn: l.lineInsideDiameterIn[edge], lengthFt: l.lineLengthFt[edge] };
    return {
      engineRpm: l.engineRpm[edge],
      ptoRatioPercent: l.ptoRatioPercent[edge],
      pumpDisplacementCuIn: l.pumpDisplacementCuIn[edge],
      volumetricEfficiency: l.efficiency[edge],
      mechanicalEfficiency: l.efficiency[edge],
      workingPressurePsi: l.pressurePsi[edge],
      reliefPressurePsi: l.pressurePsi[edge],
      tank: { shape: "round", insideDiameterIn: l.tankDimensionIn[edge], lengthIn: l.tankDimensionIn[edge] },
      fillDepthIn: l.fillDepthIn.min,
      sumpGal: l.sumpGal[edge],
      suctionLine: line,
      returnLine: line,
      pressureLine: line,
      oilToAirDeltaF: l.oilToAirDeltaF[edge],
      trailerOilNeedGal: l.trailerOilNeedGal[edge],
      ptoTorqueRatingLbFt: l.ptoTorqueRatingLbFt[edge],
    };
  };
  const smallest = limitsOf("min");
  const largest = limitsOf("max");
  const extremes: [string, KitCalcInput][] = [
    ["every value at its smallest", smallest],
    ["every value at its largest, film of oil", largest],
    ["every value at its largest, brim full", { ...largest, fillDepthIn: kitCalcLimits.tankDimensionIn.max }],
    ["largest pump into the smallest lines and tank", { ...largest, tank: smallest.tank, fillDepthIn: undefined, sumpGal: 0, suctionLine: smallest.suctionLine, returnLine: smallest.returnLine, pressureLine: smallest.pressureLine }],
    ["smallest pump with the largest box", { ...smallest, tank: { shape: "box", lengthIn: 240, widthIn: 240, heightIn: 240 }, fillDepthIn: undefined }],
    ["smallest box, default fill", { ...smallest, tank: { shape: "box", lengthIn: 1, widthIn: 1, heightIn: 1 }, fillDepthIn: undefined }],
  ];

  it.each(extremes)("%s: every number is finite and JSON keeps them all", (_name, input) => {
    expect(kitCalcInputSchema.safeParse(input).success).toBe(true);
    const spec = computeKitSpec(input);
    const json = JSON.stringify(spec);
    expect(json).not.toContain("null");
    const walk = (value: unknown): void => {
      if (typeof value === "number") expect(Number.isFinite(value)).toBe(true);
      else if (value && typeof value === "object") Object.values(value).forEach(walk);
    };
    walk(spec);
  });
});

describe("the added kit fields: ratings, duty, oil, pick-up, target flow, cylinder, D-shaped tank", () => {
  const positive = [
    "ptoIntermittentTorqueLbFt",
    "ptoHpRating",
    "pumpMaxRpm",
    "governedEngineRpm",
    "pumpRatedPsi",
    "hoseRatedPsi",
    "trailerRatedPsi",
    "oilSpecificGravity",
    "pumpInletLimitInHg",
    "targetFlowGpm",
    "cylinder.boreIn",
    "cylinder.strokeIn",
    "oilViscosityCst.working",
  ];
  const withAll = { ...demo, oilViscosityCst: { cold: 500, working: 46 }, oilSpecificGravity: 0.87 };
  const set = (path: string, value: unknown) => {
    const copy = structuredClone(withAll) as Record<string, unknown>;
    const keys = path.split(".");
    let node = copy;
    for (const key of keys.slice(0, -1)) node = node[key] as Record<string, unknown>;
    node[keys[keys.length - 1]] = value;
    return copy;
  };

  it.each(positive)("zero, negative, text and NaN %s are refused at that path, with a message that names the range", (path) => {
    for (const bad of [0, -5, "12", Number.NaN]) {
      const issues = issuesFor(set(path, bad));
      const issue = issues.find((candidate) => candidate.path.join(".") === path);
      expect(issue, `${path} = ${String(bad)}`).toBeDefined();
      expect(issue?.message).toMatch(/must be a number from|must be a whole number/);
    }
  });

  it("duty shares, fittings and pick-up height may be 0; duty past 100 % in all is refused", () => {
    for (const path of ["dutyAtWorkingPercent", "dutyOverReliefPercent", "suctionFittingsEquivalentFt", "pickupHeightIn"]) {
      expect(kitCalcInputSchema.safeParse(set(path, 0)).success, path).toBe(true);
    }
    expect(issuePaths({ ...withAll, dutyAtWorkingPercent: 90, dutyOverReliefPercent: 20 })).toContain("dutyOverReliefPercent");
  });

  it("a D-shaped tank narrower than half its height, a rod as thick as the bore, cold oil thinner than warm, a pick-up above the tank are refused", () => {
    expect(issuePaths({ ...withAll, tank: { shape: "d", lengthIn: 30, widthIn: 9, heightIn: 20 } })).toContain("tank.widthIn");
    expect(kitCalcInputSchema.safeParse({ ...withAll, tank: { shape: "d", lengthIn: 30, widthIn: 10, heightIn: 20 } }).success).toBe(true);
    expect(issuePaths(set("cylinder.rodIn", 4))).toContain("cylinder.rodIn");
    expect(issuePaths({ ...withAll, oilViscosityCst: { cold: 40, working: 46 } })).toContain("oilViscosityCst.cold");
    expect(issuePaths({ ...withAll, pickupHeightIn: 20 })).toContain("pickupHeightIn");
    expect(issuePaths(set("cylinder.count", 1.5))).toContain("cylinder.count");
  });

  it("the fill depth of a D is checked against its height", () => {
    expect(issuePaths({ ...withAll, tank: { shape: "d", lengthIn: 30, widthIn: 16, heightIn: 20 }, fillDepthIn: 21 })).toContain("fillDepthIn");
  });
});
