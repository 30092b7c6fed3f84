import fc from "fast-check";
import { unit, type Unit } from "mathjs";
import { describe, expect, it } from "vitest";
import { computeKitSpec, kitCalcLimits, velocityBands, type KitCalcInput } from "@/server/kit-calc";
import { minInsideDiameterIn, theoreticalFlowGpm } from "@/server/kit-calc/hydraulics";
import { tankFill, type TankGeometry } from "@/server/kit-calc/tank";

const within = (limit: { min: number; max: number }) =>
  fc.double({ min: limit.min, max: limit.max, noNaN: true, noDefaultInfinity: true });
const closeRelative = (actual: number, expected: number, relative: number) =>
  Math.abs(actual - expected) <= Math.abs(expected) * relative;

const tankArbitrary: fc.Arbitrary<TankGeometry> = fc.oneof(
  fc.record({
    shape: fc.constant("round" as const),
    insideDiameterIn: within(kitCalcLimits.tankDimensionIn),
    lengthIn: within(kitCalcLimits.tankDimensionIn),
  }),
  fc.record({
    shape: fc.constant("box" as const),
    lengthIn: within(kitCalcLimits.tankDimensionIn),
    widthIn: within(kitCalcLimits.tankDimensionIn),
    heightIn: within(kitCalcLimits.tankDimensionIn),
  }),
  // A D is at least half as wide as it is high (the width runs from the rail to the crown of the curve).
  fc
    .record({
      lengthIn: within(kitCalcLimits.tankDimensionIn),
      heightIn: within(kitCalcLimits.tankDimensionIn),
      extra: fc.double({ min: 0, max: 1, noNaN: true }),
    })
    .map(({ lengthIn, heightIn, extra }) => ({
      shape: "d" as const,
      lengthIn,
      heightIn,
      widthIn: Math.max(kitCalcLimits.tankDimensionIn.min, Math.min(kitCalcLimits.tankDimensionIn.max, heightIn / 2 + extra * (kitCalcLimits.tankDimensionIn.max - heightIn / 2))),
    })),
);
const heightOf = (tank: TankGeometry) => (tank.shape === "round" ? tank.insideDiameterIn : tank.heightIn);
const lineArbitrary = fc.record({
  insideDiameterIn: within(kitCalcLimits.lineInsideDiameterIn),
  lengthFt: within(kitCalcLimits.lineLengthFt),
});

// Any input the schema accepts, optional fields present or absent.
const validInputArbitrary: fc.Arbitrary<KitCalcInput> = fc
  .record(
    {
      engineRpm: within(kitCalcLimits.engineRpm),
      ptoRatioPercent: within(kitCalcLimits.ptoRatioPercent),
      pumpDisplacementCuIn: within(kitCalcLimits.pumpDisplacementCuIn),
      volumetricEfficiency: within(kitCalcLimits.efficiency),
      mechanicalEfficiency: within(kitCalcLimits.efficiency),
      workingPressurePsi: within(kitCalcLimits.pressurePsi),
      reliefPressurePsi: within(kitCalcLimits.pressurePsi),
      tank: tankArbitrary,
      fillFraction: fc.double({ min: 0.001, max: 1, noNaN: true }),
      sumpGal: within(kitCalcLimits.sumpGal),
      suctionLine: lineArbitrary,
      returnLine: lineArbitrary,
      pressureLine: lineArbitrary,
      oilToAirDeltaF: within(kitCalcLimits.oilToAirDeltaF),
      trailerOilNeedGal: within(kitCalcLimits.trailerOilNeedGal),
      ptoTorqueRatingLbFt: within(kitCalcLimits.ptoTorqueRatingLbFt),
      dutyAtWorkingPercent: fc.double({ min: 0, max: 50, noNaN: true }),
      dutyOverReliefPercent: fc.double({ min: 0, max: 50, noNaN: true }),
      ptoIntermittentTorqueLbFt: within(kitCalcLimits.ptoTorqueRatingLbFt),
      ptoHpRating: within(kitCalcLimits.ptoHpRating),
      pumpMaxRpm: within(kitCalcLimits.pumpMaxRpm),
      governedEngineRpm: within(kitCalcLimits.engineRpm),
      pumpRatedPsi: within(kitCalcLimits.pressurePsi),
      hoseRatedPsi: within(kitCalcLimits.pressurePsi),
      trailerRatedPsi: within(kitCalcLimits.pressurePsi),
      oilViscosityCst: fc
        .tuple(within(kitCalcLimits.viscosityCst), within(kitCalcLimits.viscosityCst))
        .map(([a, b]) => ({ cold: Math.max(a, b), working: Math.min(a, b) })),
      oilSpecificGravity: within(kitCalcLimits.specificGravity),
      suctionFittingsEquivalentFt: within(kitCalcLimits.equivalentLengthFt),
      pumpInletLimitInHg: within(kitCalcLimits.inletLimitInHg),
      pickupShare: fc.double({ min: 0, max: 0.99, noNaN: true }),
      targetFlowGpm: within(kitCalcLimits.targetFlowGpm),
      cylinder: fc
        .record({ boreIn: fc.double({ min: 0.2, max: 600, noNaN: true }), rodShare: fc.double({ min: 0.01, max: 0.99, noNaN: true }), strokeIn: within(kitCalcLimits.cylinderIn), count: fc.integer({ min: 1, max: 20 }) })
        .map(({ boreIn, rodShare, strokeIn, count }) => ({ boreIn, rodIn: Math.max(0.1, boreIn * rodShare), strokeIn, count })),
    },
    {
      requiredKeys: ["engineRpm", "ptoRatioPercent", "pumpDisplacementCuIn", "workingPressurePsi", "tank", "suctionLine", "returnLine"],
    },
  )
  .map(({ fillFraction, pickupShare, ...input }) => ({
    ...input,
    ...(fillFraction === undefined ? {} : { fillDepthIn: Math.max(kitCalcLimits.fillDepthIn.min, fillFraction * heightOf(input.tank)) }),
    ...(pickupShare === undefined ? {} : { pickupHeightIn: pickupShare * heightOf(input.tank) }),
  }));

const numbersIn = (value: unknown): number[] => {
  if (typeof value === "number") return [value];
  if (value === null || typeof value !== "object") return [];
  return Object.values(value).flatMap(numbersIn);
};

describe("properties of the tank geometry (geometry handbook)", () => {
  it("oil volume grows with fill depth and never exceeds the tank's capacity", () => {
    fc.assert(
      fc.property(tankArbitrary, fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (tank, a, b) => {
        const [shallow, deep] = a <= b ? [a, b] : [b, a];
        const height = heightOf(tank);
        const lower = tankFill(tank, shallow * height);
        const upper = tankFill(tank, deep * height);
        // Growth may wobble by a rounding step between two depths a hair apart: 1e-12 of the capacity allows for it.
        const slack = upper.totalCuIn * 1e-12;
        expect(lower.oilCuIn).toBeLessThanOrEqual(upper.oilCuIn + slack);
        expect(lower.wettedAreaSqIn).toBeLessThanOrEqual(upper.wettedAreaSqIn * (1 + 1e-12));
        // Never more than the capacity, with no allowance at all.
        expect(upper.oilCuIn).toBeLessThanOrEqual(upper.totalCuIn);
        expect(lower.oilCuIn).toBeGreaterThanOrEqual(0);
      }),
      { numRuns: 500 },
    );
  });
});

describe("properties of the D-shaped tank and of usable oil", () => {
  const dTank = tankArbitrary.filter((tank) => tank.shape === "d");

  it("a D's volume lies between the inscribed box (W − h/2) × h × L and the enclosing box W × h × L, at any fill", () => {
    fc.assert(
      fc.property(dTank, fc.double({ min: 0, max: 1, noNaN: true }), (tank, share) => {
        if (tank.shape !== "d") return;
        const depth = share * tank.heightIn;
        const fill = tankFill(tank, depth);
        const slack = 1 + 1e-12;
        expect(fill.totalCuIn).toBeGreaterThanOrEqual(((tank.widthIn - tank.heightIn / 2) * tank.heightIn * tank.lengthIn) / slack);
        expect(fill.totalCuIn).toBeLessThanOrEqual(tank.widthIn * tank.heightIn * tank.lengthIn * slack);
        expect(fill.oilCuIn).toBeGreaterThanOrEqual(((tank.widthIn - tank.heightIn / 2) * depth * tank.lengthIn) / slack);
        expect(fill.oilCuIn).toBeLessThanOrEqual(tank.widthIn * depth * tank.lengthIn * slack);
      }),
      { numRuns: 500 },
    );
  });

  it("usable oil never exceeds the oil in the tank, and what is left after the trailer is usable less its need", () => {
    fc.assert(
      fc.property(validInputArbitrary, (input) => {
        const spec = computeKitSpec(input);
        expect(spec.tank.usableGal).toBeGreaterThanOrEqual(0);
        expect(spec.tank.usableGal).toBeLessThanOrEqual(spec.tank.oilGal * (1 + 1e-12));
        if (input.trailerOilNeedGal !== undefined) expect(spec.tank.leftAfterTrailerGal).toBeCloseTo(spec.tank.usableGal - input.trailerOilNeedGal, 9);
      }),
      { numRuns: 300 },
    );
  }, 30_000);
});

describe("properties of pump flow (Q = D × N / 231, fluid-power textbook)", () => {
  const displacement = within(kitCalcLimits.pumpDisplacementCuIn);
  const speed = fc.double({ min: 10, max: 15_000, noNaN: true });
  const factor = fc.double({ min: 0.01, max: 100, noNaN: true });

  it("flow is linear in displacement: Q(kD) = k Q(D) and Q(D₁ + D₂) = Q(D₁) + Q(D₂)", () => {
    fc.assert(
      fc.property(displacement, displacement, speed, factor, (d1, d2, rpm, k) => {
        expect(closeRelative(theoreticalFlowGpm(k * d1, rpm), k * theoreticalFlowGpm(d1, rpm), 1e-12)).toBe(true);
        expect(closeRelative(theoreticalFlowGpm(d1 + d2, rpm), theoreticalFlowGpm(d1, rpm) + theoreticalFlowGpm(d2, rpm), 1e-12)).toBe(true);
      }),
    );
  });

  it("flow is linear in shaft speed: Q(kN) = k Q(N) and Q(N₁ + N₂) = Q(N₁) + Q(N₂)", () => {
    fc.assert(
      fc.property(displacement, speed, speed, factor, (d, n1, n2, k) => {
        expect(closeRelative(theoreticalFlowGpm(d, k * n1), k * theoreticalFlowGpm(d, n1), 1e-12)).toBe(true);
        expect(closeRelative(theoreticalFlowGpm(d, n1 + n2), theoreticalFlowGpm(d, n1) + theoreticalFlowGpm(d, n2), 1e-12)).toBe(true);
      }),
    );
  });

  it("the whole calculator keeps it: doubling engine speed or displacement doubles the delivered flow", () => {
    fc.assert(
      fc.property(validInputArbitrary, (input) => {
        const base = computeKitSpec(input).flowGpm;
        if (input.engineRpm * 2 <= kitCalcLimits.engineRpm.max) {
          expect(closeRelative(computeKitSpec({ ...input, engineRpm: input.engineRpm * 2 }).flowGpm, 2 * base, 1e-12)).toBe(true);
        }
        if (input.pumpDisplacementCuIn * 2 <= kitCalcLimits.pumpDisplacementCuIn.max) {
          const doubled = { ...input, pumpDisplacementCuIn: input.pumpDisplacementCuIn * 2 };
          expect(closeRelative(computeKitSpec(doubled).flowGpm, 2 * base, 1e-12)).toBe(true);
        }
      }),
      { numRuns: 200 },
    );
  }, 30_000);
});

describe("properties of line sizing (d = √(0.4085 × gpm / v), fluid-power textbook)", () => {
  it("the minimum diameter is the one whose area carries the flow at the band's maximum (mathjs oracle)", () => {
    const bandArbitrary = fc.constantFrom(...Object.values(velocityBands));
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 5000, noNaN: true }), bandArbitrary, (gpm, band) => {
        const areaSqIn = (unit(gpm, "gallon/minute").divide(unit(band.maxFps, "ft/s")) as Unit).toNumber("inch^2");
        expect(closeRelative(minInsideDiameterIn(gpm, band.maxFps), Math.sqrt((4 * areaSqIn) / Math.PI), 1e-9)).toBe(true);
      }),
    );
  });

  it("in every computed kit, each line's minimum diameter matches mathjs for its band's top speed", () => {
    fc.assert(
      fc.property(validInputArbitrary, (input) => {
        const spec = computeKitSpec(input);
        for (const line of [spec.lines.suction, spec.lines.return, spec.lines.pressure]) {
          if (!line) continue;
          const areaSqIn = (unit(spec.flowGpm, "gallon/minute").divide(unit(line.bandFps[1], "ft/s")) as Unit).toNumber("inch^2");
          expect(closeRelative(line.minInsideDiameterIn, Math.sqrt((4 * areaSqIn) / Math.PI), 1e-9)).toBe(true);
          // A line is high exactly when it is narrower than the minimum (away from the rounding edge).
          expect(line.status === "high").toBe(line.velocityFps > line.bandFps[1] * (1 + 1e-9));
        }
      }),
      { numRuns: 300 },
    );
  }, 30_000);
});

describe("every valid input gives finite numbers", () => {
  it("no NaN or Infinity anywhere, so JSON never turns a number into null", () => {
    fc.assert(
      fc.property(validInputArbitrary, (input) => {
        const spec = computeKitSpec(input);
        expect(numbersIn(spec).filter((value) => !Number.isFinite(value))).toEqual([]);
        expect(JSON.stringify(spec)).not.toContain("null");
      }),
      { numRuns: 600 },
    );
  }, 60_000);
});
