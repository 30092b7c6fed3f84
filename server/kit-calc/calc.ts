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
  DEFAULT_DUTY_AT_WORKING_PERCENT,
  DEFAULT_DUTY_OVER_RELIEF_PERCENT,
  DEFAULT_OIL_SPECIFIC_GRAVITY,
  DEFAULT_OIL_VISCOSITY_CST,
  DEFAULT_PICKUP_HEIGHT_IN,
  DEFAULT_PUMP_INLET_LIMIT_IN_HG,
  OIL_EXPANSION_PER_F,
  OIL_POUNDS_PER_GALLON,
  RESERVOIR_COMMON_RANGE_GAL,
  RESERVOIR_MIN_MINUTES_OF_FLOW,
  TANK_HEAT_SHED_BTU_PER_HR_SQFT_F,
  kitCalcDefaults,
} from "./practice";
import {
  cylinderFill,
  engineRpmForFlow,
  heatBalance,
  pumpRpmAtGovernedEngine,
  ratingMargin,
  suctionFriction,
  torqueAtReliefLbFt,
  usableOil,
  type CylinderFill,
  type FlowRegime,
  type RatingMargin,
} from "./checks";
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
  | "suction_inlet_vacuum_high"
  | "suction_inlet_vacuum_high_cold"
  | "pump_draws_air"
  | "no_room_for_expansion"
  | "cooler_advised"
  | "relief_torque_above_pto_intermittent"
  | "input_power_above_pto_rating"
  | "pump_overspeed"
  | "pump_overspeed_at_governed"
  | "relief_above_pump_rating"
  | "relief_above_hose_rating"
  | "relief_above_trailer_rating"
  | "relief_not_given"
  | "target_flow_above_governed"
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

/** The suction line's inlet condition at one oil temperature. */
export interface SuctionInlet {
  viscosityCst: number;
  reynolds: number;
  regime: FlowRegime;
  pressureDropPsi: number;
  inletInHg: number;
}

export interface SuctionCheck extends LineCheck, SuctionInlet {
  cold: SuctionInlet;
  inletLimitInHg: number;
  equivalentLengthFt: number;
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
    usableGal: number;
    expansionGal: number;
    airGal: number;
    /** Oil left above the pick-up once the trailer's cylinders have drawn theirs; only with a trailer need. */
    leftAfterTrailerGal?: number;
  };
  reservoirMinutesOfFlow: number;
  lines: { suction: SuctionCheck; return: LineCheck; pressure?: LineCheck };
  heat: {
    dissipationBtuPerHr: number;
    dissipationHp: number;
    generatedBtuPerHr: number;
    shedBtuPerHr: number;
    coolerBtuPerHr: number;
    coolerAdvised: boolean;
    /** The balance in words: how much room there is, or the cooler that closes the gap. */
    margin: string;
  };
  limits: {
    /** Only with a relief setting. */
    torqueAtReliefLbFt?: number;
    /** Only with a governed engine speed. */
    pumpRpmAtGovernedEngine?: number;
  };
  /** The relief setting against each rating given. */
  relief: { pump?: RatingMargin; hose?: RatingMargin; trailer?: RatingMargin };
  /** Only with a target flow. */
  engineRpmForTargetFlow?: number;
  /** Only with a cylinder. */
  cylinder?: CylinderFill;
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

  const viscosity = input.oilViscosityCst ?? DEFAULT_OIL_VISCOSITY_CST;
  const specificGravity = input.oilSpecificGravity ?? DEFAULT_OIL_SPECIFIC_GRAVITY;
  const equivalentLengthFt = input.suctionFittingsEquivalentFt ?? 0;
  const inletLimitInHg = input.pumpInletLimitInHg ?? DEFAULT_PUMP_INLET_LIMIT_IN_HG;
  const inletAt = (viscosityCst: number): SuctionInlet => {
    const friction = suctionFriction({
      flowGpm,
      insideDiameterIn: input.suctionLine.insideDiameterIn,
      lengthFt: input.suctionLine.lengthFt,
      fittingsEquivalentFt: equivalentLengthFt,
      viscosityCst,
      specificGravity,
    });
    return { viscosityCst, reynolds: friction.reynolds, regime: friction.regime, pressureDropPsi: friction.pressureDropPsi, inletInHg: friction.inletInHg };
  };
  const suction: SuctionCheck = {
    ...checkLine(flowGpm, input.suctionLine.insideDiameterIn, velocityBands.suction),
    ...inletAt(viscosity.working),
    cold: inletAt(viscosity.cold),
    inletLimitInHg,
    equivalentLengthFt,
  };
  const returnLine = checkLine(flowGpm, input.returnLine.insideDiameterIn, velocityBands.return);
  const pressureBand = pressureLineBand(input.workingPressurePsi);
  const pressure = input.pressureLine ? checkLine(flowGpm, input.pressureLine.insideDiameterIn, pressureBand) : undefined;

  // Equipment suppliers' rule of thumb: Btu/h = wetted area × 2.0 Btu/h·ft²·°F × (oil − air) °F.
  const dissipationBtuPerHr = wettedAreaSqFt * TANK_HEAT_SHED_BTU_PER_HR_SQFT_F * oilToAirDeltaF;
  // Trade reference: 1 hp = 2544 Btu/h.
  const dissipationHp = dissipationBtuPerHr / BTU_PER_HOUR_PER_HORSEPOWER;
  // Left blank, the time at working pressure is the rest of the cycle: all of it when nothing goes over the relief.
  const dutyOverReliefPercent = input.dutyOverReliefPercent ?? DEFAULT_DUTY_OVER_RELIEF_PERCENT;
  const dutyAtWorking = (input.dutyAtWorkingPercent ?? DEFAULT_DUTY_AT_WORKING_PERCENT - dutyOverReliefPercent) / 100;
  const dutyOverRelief = dutyOverReliefPercent / 100;
  const balance = heatBalance({
    flowGpm,
    workingPressurePsi: input.workingPressurePsi,
    reliefPressurePsi: input.reliefPressurePsi ?? input.workingPressurePsi,
    volumetricEfficiency,
    mechanicalEfficiency,
    dutyAtWorkingFraction: dutyAtWorking,
    dutyOverReliefFraction: dutyOverRelief,
    shedBtuPerHr: dissipationBtuPerHr,
  });
  const roundBtu = (btu: number) => (Math.round(btu / 10) * 10).toLocaleString("en-US");
  const heatMargin = balance.coolerAdvised
    ? `The kit makes about ${roundBtu(balance.generatedBtuPerHr)} Btu/h of heat and the tank sheds about ${roundBtu(balance.shedBtuPerHr)} Btu/h: fit a cooler that sheds at least ${roundBtu(balance.coolerBtuPerHr)} Btu/h at a ${oilToAirDeltaF} °F oil-to-air difference.`
    : `The tank sheds about ${roundBtu(balance.shedBtuPerHr)} Btu/h, ${roundBtu(balance.marginBtuPerHr)} Btu/h more than the ${roundBtu(balance.generatedBtuPerHr)} Btu/h the kit makes: no cooler needed at this duty.`;

  const pickupHeightIn = input.pickupHeightIn ?? DEFAULT_PICKUP_HEIGHT_IN;
  const usable = usableOil({
    tank: input.tank,
    fillDepthIn,
    pickupHeightIn,
    sumpGal,
    oilGal,
    totalGal,
    warmingF: oilToAirDeltaF,
    expansionPerF: OIL_EXPANSION_PER_F,
  });
  const leftAfterTrailerGal = input.trailerOilNeedGal === undefined ? undefined : usable.usableGal - input.trailerOilNeedGal;

  const torqueAtRelief =
    input.reliefPressurePsi === undefined ? undefined : torqueAtReliefLbFt(input.reliefPressurePsi, input.pumpDisplacementCuIn, mechanicalEfficiency);
  const pumpRpmAtGoverned = input.governedEngineRpm === undefined ? undefined : pumpRpmAtGovernedEngine(input.governedEngineRpm, input.ptoRatioPercent);
  const relief: KitSpec["relief"] = {};
  if (input.reliefPressurePsi !== undefined) {
    if (input.pumpRatedPsi !== undefined) relief.pump = ratingMargin(input.reliefPressurePsi, input.pumpRatedPsi);
    if (input.hoseRatedPsi !== undefined) relief.hose = ratingMargin(input.reliefPressurePsi, input.hoseRatedPsi);
    if (input.trailerRatedPsi !== undefined) relief.trailer = ratingMargin(input.reliefPressurePsi, input.trailerRatedPsi);
  }
  const engineRpmForTargetFlow =
    input.targetFlowGpm === undefined ? undefined : engineRpmForFlow(input.targetFlowGpm, input.pumpDisplacementCuIn, volumetricEfficiency, input.ptoRatioPercent);
  const cylinder = input.cylinder ? cylinderFill({ ...input.cylinder, count: input.cylinder.count ?? 1 }, flowGpm) : undefined;

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
  const inletWords = (inlet: SuctionInlet) =>
    `${oneDecimal(inlet.inletInHg)} inHg at ${inlet.viscosityCst} cSt (${inlet.regime} flow, Reynolds number ${Math.round(inlet.reynolds)})`;
  if (suction.inletInHg > inletLimitInHg) {
    warnings.push({
      code: "suction_inlet_vacuum_high",
      message: `The pump has to pull ${inletWords(suction)} through the suction line, more than its ${oneDecimal(inletLimitInHg)} inHg limit: it will cavitate even with warm oil. Use a bigger or shorter suction line, fewer fittings, or a coarser strainer.`,
    });
  } else if (suction.cold.inletInHg > inletLimitInHg) {
    warnings.push({
      code: "suction_inlet_vacuum_high_cold",
      message: `With cold oil the pump has to pull ${inletWords(suction.cold)}, more than its ${oneDecimal(inletLimitInHg)} inHg limit: run the engine at idle until the oil warms, or use a bigger or shorter suction line.`,
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
  } else if (input.trailerOilNeedGal !== undefined && usable.usableGal < input.trailerOilNeedGal) {
    warnings.push({
      code: "pump_draws_air",
      message: `Only ${oneDecimal(usable.usableGal)} gal of oil sits above the pick-up, less than the ${oneDecimal(input.trailerOilNeedGal)} gal the trailer's cylinders draw: the pump would draw air before the stroke ends. Fill deeper, use a bigger tank or lower the pick-up (keep it at least 1 in off the bottom).`,
    });
  }
  if (usable.expansionGal > usable.airGal) {
    warnings.push({
      code: "no_room_for_expansion",
      message: `Warming ${oilToAirDeltaF} °F, the oil grows about ${twoDecimals(usable.expansionGal)} gal but only ${twoDecimals(usable.airGal)} gal of room is left above it: it will push out of the breather. Fill less.`,
    });
  }
  if (balance.coolerAdvised) {
    warnings.push({ code: "cooler_advised", message: `${heatMargin} The heat figures are estimates (see the heat note).` });
  }
  if (torqueAtRelief !== undefined && input.ptoIntermittentTorqueLbFt !== undefined && torqueAtRelief > input.ptoIntermittentTorqueLbFt) {
    warnings.push({
      code: "relief_torque_above_pto_intermittent",
      message: `When the relief opens at ${input.reliefPressurePsi} psi the pump needs ${oneDecimal(torqueAtRelief)} lb·ft, more than the PTO's ${oneDecimal(input.ptoIntermittentTorqueLbFt)} lb·ft intermittent rating. Lower the relief setting, use a smaller pump or a stronger PTO.`,
    });
  }
  if (input.ptoHpRating !== undefined && inputHp > input.ptoHpRating) {
    warnings.push({
      code: "input_power_above_pto_rating",
      message: `The pump takes ${oneDecimal(inputHp)} hp, more than the PTO's ${oneDecimal(input.ptoHpRating)} hp rating (check the rating is for the same shaft speed). Choose a stronger PTO, a smaller pump or a lower working pressure.`,
    });
  }
  if (input.pumpMaxRpm !== undefined && shaftRpm > input.pumpMaxRpm) {
    warnings.push({
      code: "pump_overspeed",
      message: `The pump turns ${Math.round(shaftRpm)} rpm at working engine speed, over its ${Math.round(input.pumpMaxRpm)} rpm maximum. Use a slower PTO ratio or work at a lower engine speed.`,
    });
  } else if (pumpRpmAtGoverned !== undefined && input.pumpMaxRpm !== undefined && pumpRpmAtGoverned > input.pumpMaxRpm) {
    warnings.push({
      code: "pump_overspeed_at_governed",
      message: `If the engine runs up to its governed ${Math.round(input.governedEngineRpm ?? 0)} rpm with the PTO engaged, the pump turns ${Math.round(pumpRpmAtGoverned)} rpm, over its ${Math.round(input.pumpMaxRpm)} rpm maximum. Fit an engine-speed limit for PTO work or a slower PTO ratio.`,
    });
  }
  const ratingNames = { pump: "pump's", hose: "hoses'", trailer: "trailer circuit's" } as const;
  const ratingCodes = { pump: "relief_above_pump_rating", hose: "relief_above_hose_rating", trailer: "relief_above_trailer_rating" } as const;
  for (const key of ["pump", "hose", "trailer"] as const) {
    const margin = relief[key];
    if (margin && margin.marginPsi < 0) {
      warnings.push({
        code: ratingCodes[key],
        message: `The relief is set at ${input.reliefPressurePsi} psi, ${Math.round(-margin.marginPsi)} psi over the ${ratingNames[key]} rated ${margin.ratedPsi} psi. Set the relief at or below the lowest rating in the circuit.`,
      });
    }
  }
  if (input.reliefPressurePsi === undefined && (input.pumpRatedPsi !== undefined || input.hoseRatedPsi !== undefined || input.trailerRatedPsi !== undefined)) {
    const lowest = Math.min(...[input.pumpRatedPsi, input.hoseRatedPsi, input.trailerRatedPsi].filter((value): value is number => value !== undefined));
    warnings.push({
      code: "relief_not_given",
      message: `No relief setting is entered, so it cannot be checked against the ratings. The relief must open at or below ${lowest} psi, the lowest rating given.`,
    });
  }
  if (engineRpmForTargetFlow !== undefined && input.governedEngineRpm !== undefined && engineRpmForTargetFlow > input.governedEngineRpm) {
    warnings.push({
      code: "target_flow_above_governed",
      message: `${oneDecimal(input.targetFlowGpm ?? 0)} gpm needs the engine at ${Math.round(engineRpmForTargetFlow)} rpm, above its governed ${Math.round(input.governedEngineRpm)} rpm: use a bigger pump or a faster PTO ratio.`,
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
    message: `The heat figures are estimates: the tank's share comes from a rule of thumb of ${TANK_HEAT_SHED_BTU_PER_HR_SQFT_F.toFixed(1)} Btu/h per ft² per °F for a bare tank in free air, at a ${oilToAirDeltaF} °F oil-to-air difference. A shaded tank between the frame rails sheds less; treat it as an upper bound. The heat made depends on how long the pump works at pressure (${Math.round(dutyAtWorking * 1000) / 10} % here) and over the relief (${Math.round(dutyOverRelief * 1000) / 10} %).`,
  });

  return {
    pumpShaftRpm: shaftRpm,
    theoreticalFlowGpm: theoreticalGpm,
    flowGpm,
    hydraulicHp,
    inputHp,
    pumpTorqueLbFt: torqueLbFt,
    tank: {
      totalGal,
      oilGal,
      airSpacePercent,
      wettedAreaSqFt,
      oilWeightLb,
      usableGal: usable.usableGal,
      expansionGal: usable.expansionGal,
      airGal: usable.airGal,
      ...(leftAfterTrailerGal === undefined ? {} : { leftAfterTrailerGal }),
    },
    reservoirMinutesOfFlow,
    lines: pressure ? { suction, return: returnLine, pressure } : { suction, return: returnLine },
    heat: {
      dissipationBtuPerHr,
      dissipationHp,
      generatedBtuPerHr: balance.generatedBtuPerHr,
      shedBtuPerHr: balance.shedBtuPerHr,
      coolerBtuPerHr: balance.coolerBtuPerHr,
      coolerAdvised: balance.coolerAdvised,
      margin: heatMargin,
    },
    limits: {
      ...(torqueAtRelief === undefined ? {} : { torqueAtReliefLbFt: torqueAtRelief }),
      ...(pumpRpmAtGoverned === undefined ? {} : { pumpRpmAtGovernedEngine: pumpRpmAtGoverned }),
    },
    relief,
    ...(engineRpmForTargetFlow === undefined ? {} : { engineRpmForTargetFlow }),
    ...(cylinder ? { cylinder } : {}),
    metric: { flowLpm, pressureBar, hydraulicKw, tankL },
    warnings,
  };
}
