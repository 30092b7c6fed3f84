import { pressureLineBand, velocityBands, type VelocityBand } from "./bands";
import {
  hydraulicHorsepower,
  lineVelocityFps,
  minInsideDiameterIn,
  pumpShaftRpm,
  pumpTorqueLbFt,
  theoreticalFlowGpm,
} from "./hydraulics";
import {
  DEFAULT_AIR_SPACE_FRACTION,
  OIL_POUNDS_PER_GALLON,
  RESERVOIR_COMMON_RANGE_GAL,
  RESERVOIR_MIN_MINUTES_OF_FLOW,
  SUCTION_LINE_LONG_FT,
  TANK_HEAT_SHED_BTU_PER_HR_SQFT_F,
  kitCalcDefaults,
} from "./practice";
import { kitCalcInputSchema, type KitCalcInput } from "./schema";
import { defaultFillDepthIn, tankFill } from "./tank";
import {
  BTU_PER_HOUR_PER_HORSEPOWER,
  LPM_BAR_PER_KILOWATT,
  barFromPsi,
  gallonsFromCubicInches,
  litresFromGallons,
  squareFeetFromSquareInches,
} from "./units";

export type LineStatus = "low" | "ok" | "high";

export interface LineCheck {
  velocityFps: number;
  bandFps: [min: number, max: number];
  status: LineStatus;
  minInsideDiameterIn: number;
}

export type KitWarningCode =
  | "suction_velocity_high"
  | "suction_line_long"
  | "reservoir_under_one_minute"
  | "reservoir_outside_common_range"
  | "oil_below_trailer_need"
  | "pump_torque_above_pto_rating"
  | "relief_not_above_working"
  | "return_velocity_high"
  | "pressure_velocity_high"
  | "heat_is_estimate";

export interface KitWarning {
  code: KitWarningCode;
  message: string;
}

export interface KitSpec {
  pumpShaftRpm: number;
  theoreticalFlowGpm: number;
  flowGpm: number;
  hydraulicHp: number;
  inputHp: number;
  pumpTorqueLbFt: number;
  tank: {
    totalGal: number;
    oilGal: number;
    airSpacePercent: number;
    wettedAreaSqFt: number;
    oilWeightLb: number;
  };
  reservoirMinutesOfFlow: number;
  lines: { suction: LineCheck; return: LineCheck; pressure?: LineCheck };
  heat: { dissipationBtuPerHr: number; dissipationHp: number };
  metric: { flowLpm: number; pressureBar: number; hydraulicKw: number; tankL: number };
  warnings: KitWarning[];
}

// A line cut to the suggested minimum diameter must read "ok": floating-point rounding can put its velocity a
// few parts in 10¹⁶ over the band, so the edges get a one-in-a-billion allowance.
const BAND_EDGE_ALLOWANCE = 1e-9;

function checkLine(flowGpm: number, insideDiameterIn: number, band: VelocityBand): LineCheck {
  const velocityFps = lineVelocityFps(flowGpm, insideDiameterIn);
  const status: LineStatus =
    velocityFps > band.maxFps * (1 + BAND_EDGE_ALLOWANCE)
      ? "high"
      : velocityFps < band.minFps * (1 - BAND_EDGE_ALLOWANCE)
        ? "low"
        : "ok";
  return {
    velocityFps,
    bandFps: [band.minFps, band.maxFps],
    status,
    minInsideDiameterIn: minInsideDiameterIn(flowGpm, band.maxFps),
  };
}

const oneDecimal = (value: number): string => value.toFixed(1);
const twoDecimals = (value: number): string => value.toFixed(2);

/**
 * The wet-kit calculator. Re-parses its input (throws a ZodError naming the field when it is out of range),
 * so every number it returns is finite.
 */
export function computeKitSpec(rawInput: KitCalcInput): KitSpec {
  const input = kitCalcInputSchema.parse(rawInput);
  const volumetricEfficiency = input.volumetricEfficiency ?? kitCalcDefaults.volumetricEfficiency;
  const mechanicalEfficiency = input.mechanicalEfficiency ?? kitCalcDefaults.mechanicalEfficiency;
  const oilToAirDeltaF = input.oilToAirDeltaF ?? kitCalcDefaults.oilToAirDeltaF;
  const sumpGal = input.sumpGal ?? kitCalcDefaults.sumpGal;

  const shaftRpm = pumpShaftRpm(input.engineRpm, input.ptoRatioPercent);
  const theoreticalGpm = theoreticalFlowGpm(input.pumpDisplacementCuIn, shaftRpm);
  // Fluid-power textbook: actual flow = theoretical × volumetric efficiency.
  const flowGpm = theoreticalGpm * volumetricEfficiency;
  const hydraulicHp = hydraulicHorsepower(flowGpm, input.workingPressurePsi);
  // Fluid-power textbook: input power = hydraulic power / overall efficiency (ηv × ηm); divided in turn so
  // two small efficiencies never multiply down to zero.
  const inputHp = hydraulicHp / volumetricEfficiency / mechanicalEfficiency;
  const torqueLbFt = pumpTorqueLbFt(input.workingPressurePsi, input.pumpDisplacementCuIn, mechanicalEfficiency);

  const fillDepthIn = input.fillDepthIn ?? defaultFillDepthIn(input.tank, DEFAULT_AIR_SPACE_FRACTION);
  const fill = tankFill(input.tank, fillDepthIn);
  // A sump hangs below the tube and is always full: add its own volume to both (trade reference).
  const totalGal = gallonsFromCubicInches(fill.totalCuIn) + sumpGal;
  const oilGal = gallonsFromCubicInches(fill.oilCuIn) + sumpGal;
  const airSpacePercent = ((totalGal - oilGal) / totalGal) * 100;
  // The sump's own wetted metal is left out: its shape is not entered, and leaving it out errs on the cool side.
  const wettedAreaSqFt = squareFeetFromSquareInches(fill.wettedAreaSqIn);
  // From memory: 7.26 lb/gal mineral hydraulic oil (see practice.ts).
  const oilWeightLb = oilGal * OIL_POUNDS_PER_GALLON;
  // Reservoir sizing guidance compares oil held with pump flow per minute.
  const reservoirMinutesOfFlow = oilGal / flowGpm;

  const suction = checkLine(flowGpm, input.suctionLine.insideDiameterIn, velocityBands.suction);
  const returnLine = checkLine(flowGpm, input.returnLine.insideDiameterIn, velocityBands.return);
  const pressureBand = pressureLineBand(input.workingPressurePsi);
  const pressure = input.pressureLine ? checkLine(flowGpm, input.pressureLine.insideDiameterIn, pressureBand) : undefined;

  // Equipment suppliers' rule of thumb: Btu/h = wetted area × 2.0 Btu/h·ft²·°F × (oil − air) °F.
  const dissipationBtuPerHr = wettedAreaSqFt * TANK_HEAT_SHED_BTU_PER_HR_SQFT_F * oilToAirDeltaF;
  // Trade reference: 1 hp = 2544 Btu/h.
  const dissipationHp = dissipationBtuPerHr / BTU_PER_HOUR_PER_HORSEPOWER;

  // NIST Handbook 44, Appendix C: gallons to litres; NIST SP 811, Appendix B (from memory): psi to bar.
  const flowLpm = litresFromGallons(flowGpm);
  const pressureBar = barFromPsi(input.workingPressurePsi);
  // Fluid-power textbook metric form: kW = L/min × bar / 600.
  const hydraulicKw = (flowLpm * pressureBar) / LPM_BAR_PER_KILOWATT;
  const tankL = litresFromGallons(totalGal);

  const warnings: KitWarning[] = [];
  if (suction.status === "high") {
    warnings.push({
      code: "suction_velocity_high",
      message: `Oil moves through the suction line at ${oneDecimal(suction.velocityFps)} ft/s, above the ${suction.bandFps[1]} ft/s guidance: the pump may starve and cavitate (noise, heat, wear). Use a suction line of at least ${twoDecimals(suction.minInsideDiameterIn)} in inside diameter.`,
    });
  }
  if (input.suctionLine.lengthFt > SUCTION_LINE_LONG_FT) {
    warnings.push({
      code: "suction_line_long",
      message: `The suction line is ${oneDecimal(input.suctionLine.lengthFt)} ft long. Keep it under ${SUCTION_LINE_LONG_FT} ft and as straight as the frame allows: only atmospheric pressure pushes oil into the pump, and cold oil makes a long line worse (common practice, no published source).`,
    });
  }
  if (reservoirMinutesOfFlow < RESERVOIR_MIN_MINUTES_OF_FLOW) {
    warnings.push({
      code: "reservoir_under_one_minute",
      message: `The reservoir holds ${twoDecimals(reservoirMinutesOfFlow)} minutes of pump flow. Mobile practice goes no lower than about 1 minute (industrial practice about 3); the oil will have little time to settle and cool.`,
    });
  }
  if (totalGal < RESERVOIR_COMMON_RANGE_GAL.min || totalGal > RESERVOIR_COMMON_RANGE_GAL.max) {
    warnings.push({
      code: "reservoir_outside_common_range",
      message: `The tank holds ${oneDecimal(totalGal)} gal in all. Trailer wet-kit reservoirs commonly hold ${RESERVOIR_COMMON_RANGE_GAL.min} to ${RESERVOIR_COMMON_RANGE_GAL.max} gal (common practice, no published source); check the size against the trailer's needs.`,
    });
  }
  if (input.trailerOilNeedGal !== undefined && oilGal < input.trailerOilNeedGal) {
    warnings.push({
      code: "oil_below_trailer_need",
      message: `The tank holds ${oneDecimal(oilGal)} gal of oil, less than the ${oneDecimal(input.trailerOilNeedGal)} gal the trailer's cylinders draw: the pump would run dry before the trailer finishes its stroke.`,
    });
  }
  if (input.ptoTorqueRatingLbFt !== undefined && torqueLbFt > input.ptoTorqueRatingLbFt) {
    warnings.push({
      code: "pump_torque_above_pto_rating",
      message: `The pump needs ${oneDecimal(torqueLbFt)} lb·ft at ${input.workingPressurePsi} psi, more than the PTO's ${oneDecimal(input.ptoTorqueRatingLbFt)} lb·ft continuous rating. Choose a stronger PTO, a smaller pump or a lower working pressure.`,
    });
  }
  // Relief at or under working pressure means the relief valve opens during normal work and turns the flow into heat.
  if (input.reliefPressurePsi !== undefined && input.reliefPressurePsi <= input.workingPressurePsi) {
    warnings.push({
      code: "relief_not_above_working",
      message: `The relief is set at ${input.reliefPressurePsi} psi, not above the ${input.workingPressurePsi} psi working pressure: the relief valve will open during normal work, the trailer will stall and the oil will heat.`,
    });
  }
  if (returnLine.status === "high") {
    warnings.push({
      code: "return_velocity_high",
      message: `Oil moves through the return line at ${oneDecimal(returnLine.velocityFps)} ft/s, above the ${returnLine.bandFps[1]} ft/s guidance: back pressure and heat. Use at least ${twoDecimals(returnLine.minInsideDiameterIn)} in inside diameter.`,
    });
  }
  if (pressure?.status === "high") {
    warnings.push({
      code: "pressure_velocity_high",
      message: `Oil moves through the pressure line at ${oneDecimal(pressure.velocityFps)} ft/s, above the ${pressure.bandFps[1]} ft/s guidance for ${input.workingPressurePsi} psi: pressure loss and heat. Use at least ${twoDecimals(pressure.minInsideDiameterIn)} in inside diameter.`,
    });
  }
  warnings.push({
    code: "heat_is_estimate",
    message: `The heat figure is an estimate: a rule of thumb of ${TANK_HEAT_SHED_BTU_PER_HR_SQFT_F.toFixed(1)} Btu/h per ft² per °F for a bare tank in free air, at a ${oilToAirDeltaF} °F oil-to-air difference. A shaded tank between the frame rails sheds less; treat it as an upper bound.`,
  });

  return {
    pumpShaftRpm: shaftRpm,
    theoreticalFlowGpm: theoreticalGpm,
    flowGpm,
    hydraulicHp,
    inputHp,
    pumpTorqueLbFt: torqueLbFt,
    tank: { totalGal, oilGal, airSpacePercent, wettedAreaSqFt, oilWeightLb },
    reservoirMinutesOfFlow,
    lines: pressure ? { suction, return: returnLine, pressure } : { suction, return: returnLine },
    heat: { dissipationBtuPerHr, dissipationHp },
    metric: { flowLpm, pressureBar, hydraulicKw, tankL },
    warnings,
  };
}
