import type { KitCalcInput } from "./schema";

// Cold Creek Upfit's usual kit for a tandem-axle day cab pulling a hydraulic detachable-gooseneck trailer:
// 20 in round tube between the rails, 3.5 in³ gear pump on a 115 % PTO. Used as the form's starting values.
// The pump works at pressure about 4 % of the time (raising and lowering the deck), holds the relief for a moment at the end of each stroke (0.25 %), and otherwise idles.
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
  dutyAtWorkingPercent: 4,
  dutyOverReliefPercent: 0.25,
  ptoIntermittentTorqueLbFt: 350,
  ptoHpRating: 45,
  pumpMaxRpm: 2500,
  governedEngineRpm: 2100,
  pumpRatedPsi: 3000,
  hoseRatedPsi: 3000,
  trailerRatedPsi: 3000,
  suctionFittingsEquivalentFt: 3,
  pumpInletLimitInHg: 5,
  pickupHeightIn: 1,
  targetFlowGpm: 20,
  cylinder: { boreIn: 4, rodIn: 2, strokeIn: 14, count: 2 },
} satisfies KitCalcInput;
