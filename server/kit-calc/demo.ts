import type { KitCalcInput } from "./schema";

// Cold Creek Upfit's usual kit for a tandem-axle day cab pulling a hydraulic detachable-gooseneck trailer:
// 20 in round tube between the rails, 3.5 in³ gear pump on a 115 % PTO. Used as the form's starting values.
export const demoKitCalcInput = {
  engineRpm: 1200,
  ptoRatioPercent: 115,
  pumpDisplacementCuIn: 3.5,
  volumetricEfficiency: 0.9,
  mechanicalEfficiency: 0.9,
  workingPressurePsi: 2500,
  reliefPressurePsi: 2750,
  tank: { shape: "round", insideDiameterIn: 20, lengthIn: 30 },
  sumpGal: 1.5,
  suctionLine: { insideDiameterIn: 1.75, lengthFt: 4 },
  returnLine: { insideDiameterIn: 1, lengthFt: 14 },
  pressureLine: { insideDiameterIn: 0.75, lengthFt: 14 },
  oilToAirDeltaF: 40,
  trailerOilNeedGal: 12,
  ptoTorqueRatingLbFt: 250,
} satisfies KitCalcInput;
