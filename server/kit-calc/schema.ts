import { z } from "zod";

// Sane limits for a truck wet kit. They turn typos (an extra zero, rpm typed as a ratio) into field errors and
// keep every product and quotient in the calculator finite. Exported so the form can set min/max on its inputs.
export const kitCalcLimits = {
  engineRpm: { min: 100, max: 5000, unit: "rpm" },
  ptoRatioPercent: { min: 10, max: 300, unit: "% of engine speed" },
  pumpDisplacementCuIn: { min: 0.01, max: 20, unit: "in³/rev" },
  efficiency: { min: 0.01, max: 1, unit: "(a fraction: 0.90 means 90 %)" },
  pressurePsi: { min: 1, max: 10_000, unit: "psi" },
  tankDimensionIn: { min: 1, max: 240, unit: "in" },
  fillDepthIn: { min: 0.01, max: 240, unit: "in" },
  sumpGal: { min: 0, max: 100, unit: "gal" },
  lineInsideDiameterIn: { min: 0.1, max: 6, unit: "in" },
  lineLengthFt: { min: 0.1, max: 200, unit: "ft" },
  oilToAirDeltaF: { min: 1, max: 200, unit: "°F" },
  trailerOilNeedGal: { min: 0.1, max: 500, unit: "gal" },
  ptoTorqueRatingLbFt: { min: 1, max: 10_000, unit: "lb·ft" },
  dutyPercent: { min: 0, max: 100, unit: "% of the time" },
  ptoHpRating: { min: 1, max: 2000, unit: "hp" },
  pumpMaxRpm: { min: 100, max: 10_000, unit: "rpm" },
  viscosityCst: { min: 1, max: 100_000, unit: "cSt" },
  specificGravity: { min: 0.5, max: 1.5, unit: "(water = 1)" },
  equivalentLengthFt: { min: 0, max: 500, unit: "ft" },
  inletLimitInHg: { min: 0.1, max: 29, unit: "inHg" },
  pickupHeightIn: { min: 0, max: 240, unit: "in" },
  targetFlowGpm: { min: 0.1, max: 1000, unit: "gpm" },
  cylinderIn: { min: 0.1, max: 600, unit: "in" },
  cylinderCount: { min: 1, max: 20, unit: "cylinders" },
} as const;

type Limit = (typeof kitCalcLimits)[keyof typeof kitCalcLimits];

// z.number() refuses strings, NaN and ±Infinity; the range check refuses zero, negatives and absurd sizes.
function measure(label: string, limit: Limit) {
  const range = `${label} must be a number from ${limit.min} to ${limit.max} ${limit.unit}.`;
  return z
    .number({ error: (issue) => (issue.input === undefined ? `${label} is required.` : range) })
    .gte(limit.min, { error: range })
    .lte(limit.max, { error: range });
}

function line(name: string) {
  return z.object(
    {
      insideDiameterIn: measure(`${name} inside diameter`, kitCalcLimits.lineInsideDiameterIn),
      lengthFt: measure(`${name} length`, kitCalcLimits.lineLengthFt),
    },
    { error: `${name} needs an inside diameter and a length.` },
  );
}

const roundTankSchema = z.object({
  shape: z.literal("round"),
  insideDiameterIn: measure("Tank inside diameter", kitCalcLimits.tankDimensionIn),
  lengthIn: measure("Tank length", kitCalcLimits.tankDimensionIn),
});

const dTankSchema = z.object({
  shape: z.literal("d"),
  lengthIn: measure("Tank length", kitCalcLimits.tankDimensionIn),
  widthIn: measure("Tank width", kitCalcLimits.tankDimensionIn),
  heightIn: measure("Tank height", kitCalcLimits.tankDimensionIn),
});

const cylinderSchema = z.object(
  {
    boreIn: measure("Cylinder bore", kitCalcLimits.cylinderIn),
    rodIn: measure("Cylinder rod", kitCalcLimits.cylinderIn),
    strokeIn: measure("Cylinder stroke", kitCalcLimits.cylinderIn),
    count: measure("Number of cylinders", kitCalcLimits.cylinderCount).int({ error: "Number of cylinders must be a whole number from 1 to 20." }).optional(),
  },
  { error: "Cylinder needs a bore, a rod and a stroke." },
);

const viscositySchema = z.object(
  {
    cold: measure("Cold oil viscosity", kitCalcLimits.viscosityCst),
    working: measure("Working oil viscosity", kitCalcLimits.viscosityCst),
  },
  { error: "Oil viscosity needs a cold and a working value in cSt." },
);

const boxTankSchema = z.object({
  shape: z.literal("box"),
  lengthIn: measure("Tank length", kitCalcLimits.tankDimensionIn),
  widthIn: measure("Tank width", kitCalcLimits.tankDimensionIn),
  heightIn: measure("Tank height", kitCalcLimits.tankDimensionIn),
});

export const kitCalcInputSchema = z
  .object({
    engineRpm: measure("Engine speed", kitCalcLimits.engineRpm),
    ptoRatioPercent: measure("PTO ratio", kitCalcLimits.ptoRatioPercent),
    pumpDisplacementCuIn: measure("Pump displacement", kitCalcLimits.pumpDisplacementCuIn),
    volumetricEfficiency: measure("Volumetric efficiency", kitCalcLimits.efficiency).optional(),
    mechanicalEfficiency: measure("Mechanical efficiency", kitCalcLimits.efficiency).optional(),
    workingPressurePsi: measure("Working pressure", kitCalcLimits.pressurePsi),
    reliefPressurePsi: measure("Relief pressure", kitCalcLimits.pressurePsi).optional(),
    tank: z.discriminatedUnion("shape", [roundTankSchema, boxTankSchema, dTankSchema], {
      error: "Tank shape must be round, box or d.",
    }),
    fillDepthIn: measure("Fill depth", kitCalcLimits.fillDepthIn).optional(),
    sumpGal: measure("Sump volume", kitCalcLimits.sumpGal).optional(),
    suctionLine: line("Suction line"),
    returnLine: line("Return line"),
    pressureLine: line("Pressure line").optional(),
    oilToAirDeltaF: measure("Oil-to-air temperature difference", kitCalcLimits.oilToAirDeltaF).optional(),
    trailerOilNeedGal: measure("Trailer oil need", kitCalcLimits.trailerOilNeedGal).optional(),
    ptoTorqueRatingLbFt: measure("PTO torque rating", kitCalcLimits.ptoTorqueRatingLbFt).optional(),
    // Added with the heat, limit, suction and usable-oil checks; every one optional.
    dutyAtWorkingPercent: measure("Time at working pressure", kitCalcLimits.dutyPercent).optional(),
    dutyOverReliefPercent: measure("Time over the relief", kitCalcLimits.dutyPercent).optional(),
    ptoIntermittentTorqueLbFt: measure("PTO intermittent torque rating", kitCalcLimits.ptoTorqueRatingLbFt).optional(),
    ptoHpRating: measure("PTO power rating", kitCalcLimits.ptoHpRating).optional(),
    pumpMaxRpm: measure("Pump maximum speed", kitCalcLimits.pumpMaxRpm).optional(),
    governedEngineRpm: measure("Governed engine speed", kitCalcLimits.engineRpm).optional(),
    pumpRatedPsi: measure("Pump rated pressure", kitCalcLimits.pressurePsi).optional(),
    hoseRatedPsi: measure("Hose rated pressure", kitCalcLimits.pressurePsi).optional(),
    trailerRatedPsi: measure("Trailer circuit rated pressure", kitCalcLimits.pressurePsi).optional(),
    oilViscosityCst: viscositySchema.optional(),
    oilSpecificGravity: measure("Oil specific gravity", kitCalcLimits.specificGravity).optional(),
    suctionFittingsEquivalentFt: measure("Suction fittings and strainer", kitCalcLimits.equivalentLengthFt).optional(),
    pumpInletLimitInHg: measure("Pump inlet limit", kitCalcLimits.inletLimitInHg).optional(),
    pickupHeightIn: measure("Pick-up height", kitCalcLimits.pickupHeightIn).optional(),
    targetFlowGpm: measure("Target flow", kitCalcLimits.targetFlowGpm).optional(),
    cylinder: cylinderSchema.optional(),
  })
  .superRefine((input, ctx) => {
    const tank = input.tank;
    const height = tank.shape === "round" ? tank.insideDiameterIn : tank.heightIn;
    if (tank.shape === "d" && tank.widthIn < tank.heightIn / 2) {
      ctx.addIssue({
        code: "custom",
        path: ["tank", "widthIn"],
        message: `A D-shaped tank's width (${tank.widthIn} in) runs from the rail to the crown of the curve, so it is at least half its height (${tank.heightIn / 2} in).`,
      });
    }
    const duty = (input.dutyAtWorkingPercent ?? 0) + (input.dutyOverReliefPercent ?? 0);
    if (input.dutyAtWorkingPercent !== undefined && input.dutyOverReliefPercent !== undefined && duty > 100) {
      ctx.addIssue({
        code: "custom",
        path: ["dutyOverReliefPercent"],
        message: `Time at working pressure (${input.dutyAtWorkingPercent} %) and time over the relief (${input.dutyOverReliefPercent} %) add up to more than 100 %.`,
      });
    }
    if (input.cylinder && input.cylinder.rodIn >= input.cylinder.boreIn) {
      ctx.addIssue({
        code: "custom",
        path: ["cylinder", "rodIn"],
        message: `The cylinder's rod (${input.cylinder.rodIn} in) must be thinner than its bore (${input.cylinder.boreIn} in).`,
      });
    }
    if (input.oilViscosityCst && input.oilViscosityCst.cold < input.oilViscosityCst.working) {
      ctx.addIssue({
        code: "custom",
        path: ["oilViscosityCst", "cold"],
        message: `Cold oil is thicker than warm oil: the cold viscosity (${input.oilViscosityCst.cold} cSt) cannot be less than the working one (${input.oilViscosityCst.working} cSt).`,
      });
    }
    if (input.pickupHeightIn !== undefined && input.pickupHeightIn >= height) {
      ctx.addIssue({
        code: "custom",
        path: ["pickupHeightIn"],
        message: `The pick-up (${input.pickupHeightIn} in above the bottom) must sit below the top of the tank (${height} in).`,
      });
    }
    if (input.fillDepthIn === undefined) return;
    if (input.fillDepthIn > height) {
      const what = tank.shape === "round" ? "inside diameter" : "height";
      ctx.addIssue({
        code: "custom",
        path: ["fillDepthIn"],
        message: `Fill depth (${input.fillDepthIn} in) cannot be more than the tank's ${what} (${height} in).`,
      });
    }
  });

export type KitCalcInput = z.infer<typeof kitCalcInputSchema>;
