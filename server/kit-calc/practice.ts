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

// From memory: gear-pump makers commonly allow about 5 inHg of vacuum at the inlet; the pump's data sheet rules.
export const DEFAULT_PUMP_INLET_LIMIT_IN_HG = 5;

// ISO 3448 (from memory): an ISO VG 46 oil has 46 cSt at 40 °C by definition of the grade. Near freezing the
// same oil is roughly ten times thicker, about 500 cSt (from memory; the oil's data sheet gives the real curve).
export const DEFAULT_OIL_VISCOSITY_CST = { cold: 500, working: 46 } as const;

// From memory: mineral hydraulic oil 0.87 kg/L, the same figure as the oil weight below.
export const DEFAULT_OIL_SPECIFIC_GRAVITY = 0.87;

// From memory: water taken as 1000 kg/m³ when specific gravity turns into density (999–1000 by reference temperature).
export const WATER_KG_PER_M3 = 1000;

// From memory: mineral oil grows about 0.07 % in volume per °C (data sheets 0.065–0.08 %), i.e. 0.0007 × 5/9 per °F.
export const OIL_EXPANSION_PER_F = (0.0007 * 5) / 9;

// Trade reference, reservoir layout: the suction pick-up sits at least 1 in above the bottom.
export const DEFAULT_PICKUP_HEIGHT_IN = 1;

// Common practice, no published source: with no duty cycle given the calculator takes the worst case, the pump
// working at full pressure all the time, and no time over the relief.
export const DEFAULT_DUTY_AT_WORKING_PERCENT = 100;
export const DEFAULT_DUTY_OVER_RELIEF_PERCENT = 0;

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
  reservoirMinutes: sources.mobileReservoirSizing,
  reservoirCommonRange: sources.commonPractice,
  dutyDefault: `blank shares: all the time at working pressure, the worst case (${sources.commonPractice})`,
} as const;
