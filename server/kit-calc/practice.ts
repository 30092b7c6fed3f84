import { sources } from "./sources";

// Shop rules of thumb and rounded physical values the calculator leans on, each with its standing.

// Trade reference gives 2.0–2.5 Btu/h·ft²·°F for a bare tank in free air. The lower value is used: a tank
// between the frame rails is shaded from moving air and usually powder coated, so even 2.0 likely flatters it,
// and overstating cooling is the mistake that cooks a kit.
export const TANK_HEAT_SHED_BTU_PER_HR_SQFT_F = 2.0;

// From memory: 0.87 kg/L mineral oil (data sheets 0.86–0.88) → 0.87 × 3.785411784 / 0.45359237 = 7.26 lb/gal.
export const OIL_POUNDS_PER_GALLON = 7.26;

// From memory: leave about 10 % air space above the oil for foam, expansion and the returning trailer oil.
export const DEFAULT_AIR_SPACE_FRACTION = 0.1;

// Common practice, no published source: a suction line past 6 ft adds enough friction (worse with cold oil)
// that atmospheric pressure struggles to fill a gear pump.
export const SUCTION_LINE_LONG_FT = 6;

// Mobile-equipment reservoir sizing goes down to about 1 minute of pump flow (industrial practice about 3).
export const RESERVOIR_MIN_MINUTES_OF_FLOW = 1;

// Common practice, no published source: trailer wet-kit reservoirs carry 35–50 US gal.
export const RESERVOIR_COMMON_RANGE_GAL = { min: 35, max: 50 } as const;

// Common practice, no published source: 0.90 volumetric and mechanical efficiency is a fair guess for a
// gear pump in good order when its data sheet is not at hand.
export const kitCalcDefaults = {
  volumetricEfficiency: 0.9,
  mechanicalEfficiency: 0.9,
  oilToAirDeltaF: 40,
  sumpGal: 0,
} as const;

export const practiceSources = {
  heatShed: sources.tankHeatRule,
  oilWeight: sources.oilDensity,
  airSpace: sources.airSpace,
  suctionLineLong: sources.commonPractice,
  reservoirMinutes: sources.mobileReservoirSizing,
  reservoirCommonRange: sources.commonPractice,
} as const;
