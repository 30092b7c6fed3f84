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
    tank: z.discriminatedUnion("shape", [roundTankSchema, boxTankSchema], {
      error: "Tank shape must be round or box.",
    }),
    fillDepthIn: measure("Fill depth", kitCalcLimits.fillDepthIn).optional(),
    sumpGal: measure("Sump volume", kitCalcLimits.sumpGal).optional(),
    suctionLine: line("Suction line"),
    returnLine: line("Return line"),
    pressureLine: line("Pressure line").optional(),
    oilToAirDeltaF: measure("Oil-to-air temperature difference", kitCalcLimits.oilToAirDeltaF).optional(),
    trailerOilNeedGal: measure("Trailer oil need", kitCalcLimits.trailerOilNeedGal).optional(),
    ptoTorqueRatingLbFt: measure("PTO torque rating", kitCalcLimits.ptoTorqueRatingLbFt).optional(),
  })
  .superRefine((input, ctx) => {
    if (input.fillDepthIn === undefined) return;
    const tank = input.tank;
    const height = tank.shape === "round" ? tank.insideDiameterIn : tank.heightIn;
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
