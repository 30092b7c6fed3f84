import { pumpShaftRpm, pumpTorqueLbFt } from "./hydraulics";
import {
  BTU_PER_HOUR_PER_HORSEPOWER,
  CUBIC_INCHES_PER_GALLON,
  CUBIC_METRES_PER_GALLON,
  GPM_PSI_PER_HORSEPOWER,
  METRES_PER_FOOT,
  METRES_PER_INCH,
  PASCALS_PER_IN_HG,
  PASCALS_PER_PSI,
  SECONDS_PER_MINUTE,
  SQUARE_METRES_PER_SECOND_PER_CST,
} from "./units";
import { WATER_KG_PER_M3 } from "./practice";
import { oilBelowDepthCuIn, type TankGeometry } from "./tank";

// Pure checks behind the calculator's heat, limit, suction, usable-oil and cylinder figures. Each names its source.

// ---------------------------------------------------------------- suction inlet

// Fluid-mechanics textbooks (from memory): flow in a pipe is laminar below a Reynolds number of about 2000 and
// turbulent above about 4000; between them it may be either.
export const LAMINAR_BELOW_RE = 2000;
export const TURBULENT_ABOVE_RE = 4000;
export type FlowRegime = "laminar" | "transitional" | "turbulent";

export interface SuctionFriction {
  reynolds: number;
  regime: FlowRegime;
  frictionFactor: number;
  /** Friction loss along the line and its fittings, psi. */
  pressureDropPsi: number;
  /** Vacuum at the pump inlet, inches of mercury: friction plus the velocity head, oil level with the inlet. */
  inletInHg: number;
}

export interface SuctionLineInput {
  flowGpm: number;
  insideDiameterIn: number;
  lengthFt: number;
  fittingsEquivalentFt: number;
  viscosityCst: number;
  specificGravity: number;
}

export function flowRegime(reynolds: number): FlowRegime {
  return reynolds < LAMINAR_BELOW_RE ? "laminar" : reynolds > TURBULENT_ABOVE_RE ? "turbulent" : "transitional";
}

/**
 * Darcy friction factor. Laminar: f = 64/Re (Hagen–Poiseuille). Otherwise the Blasius smooth-pipe fit,
 * f = 0.316/Re^0.25 (hose and drawn tube are hydraulically smooth). The larger of the two is taken at every Re,
 * so between Re ≈ 1190 and 2000 the turbulent value stands in for a flow that may already be unsteady; this keeps
 * the loss rising smoothly with viscosity instead of dropping at an arbitrary line (common practice, no published
 * source for taking the larger).
 */
export function darcyFrictionFactor(reynolds: number): number {
  return Math.max(64 / reynolds, 0.316 / reynolds ** 0.25);
}

/** Suction line friction by Darcy–Weisbach, Δp = f (L/d) ρ v²/2, with fittings and strainer as equivalent length. */
export function suctionFriction(line: SuctionLineInput): SuctionFriction {
  const diameterM = line.insideDiameterIn * METRES_PER_INCH;
  const areaM2 = (Math.PI / 4) * diameterM * diameterM;
  const flowM3PerS = (line.flowGpm * CUBIC_METRES_PER_GALLON) / SECONDS_PER_MINUTE;
  const velocity = flowM3PerS / areaM2;
  const nu = line.viscosityCst * SQUARE_METRES_PER_SECOND_PER_CST;
  const density = line.specificGravity * WATER_KG_PER_M3;
  const reynolds = (velocity * diameterM) / nu;
  const frictionFactor = darcyFrictionFactor(reynolds);
  const lengthM = (line.lengthFt + line.fittingsEquivalentFt) * METRES_PER_FOOT;
  const velocityHeadPa = (density * velocity * velocity) / 2;
  const frictionPa = frictionFactor * (lengthM / diameterM) * velocityHeadPa;
  return {
    reynolds,
    regime: flowRegime(reynolds),
    frictionFactor,
    pressureDropPsi: frictionPa / PASCALS_PER_PSI,
    // Bernoulli: the oil leaves the tank at rest, so the inlet also gives up its velocity head.
    inletInHg: (frictionPa + velocityHeadPa) / PASCALS_PER_IN_HG,
  };
}

// ---------------------------------------------------------------- heat

export interface HeatInput {
  flowGpm: number;
  workingPressurePsi: number;
  /** The relief setting; without one, the working pressure stands in. */
  reliefPressurePsi: number;
  volumetricEfficiency: number;
  mechanicalEfficiency: number;
  dutyAtWorkingFraction: number;
  dutyOverReliefFraction: number;
  shedBtuPerHr: number;
}

export interface HeatBalance {
  generatedBtuPerHr: number;
  shedBtuPerHr: number;
  /** How much more heat the kit makes than the tank sheds; 0 when the tank keeps up. */
  coolerBtuPerHr: number;
  coolerAdvised: boolean;
  /** shed − generated, Btu/h: positive is room to spare. */
  marginBtuPerHr: number;
}

/**
 * Heat made, averaged over the duty cycle. At working pressure the pump's own losses become heat: input power
 * less hydraulic power (fluid-power textbook energy balance). Over the relief every horsepower going into the
 * pump becomes heat: the flow drops the whole relief pressure through the valve, plus the pump's losses.
 */
export function heatBalance(input: HeatInput): HeatBalance {
  const overall = input.volumetricEfficiency * input.mechanicalEfficiency;
  const hydraulicAtWorking = (input.flowGpm * input.workingPressurePsi) / GPM_PSI_PER_HORSEPOWER;
  const lossAtWorking = hydraulicAtWorking / overall - hydraulicAtWorking;
  const inputAtRelief = (input.flowGpm * input.reliefPressurePsi) / GPM_PSI_PER_HORSEPOWER / overall;
  const generatedHp = input.dutyAtWorkingFraction * lossAtWorking + input.dutyOverReliefFraction * inputAtRelief;
  const generatedBtuPerHr = generatedHp * BTU_PER_HOUR_PER_HORSEPOWER;
  const marginBtuPerHr = input.shedBtuPerHr - generatedBtuPerHr;
  return {
    generatedBtuPerHr,
    shedBtuPerHr: input.shedBtuPerHr,
    coolerBtuPerHr: Math.max(0, -marginBtuPerHr),
    coolerAdvised: marginBtuPerHr < 0,
    marginBtuPerHr,
  };
}

// ---------------------------------------------------------------- relief against ratings

export interface RatingMargin {
  ratedPsi: number;
  /** rated − relief, psi: negative means the relief lets the pressure go past the rating. */
  marginPsi: number;
  /** margin as a share of the rating, %. */
  marginPercent: number;
}

export function ratingMargin(reliefPsi: number, ratedPsi: number): RatingMargin {
  const marginPsi = ratedPsi - reliefPsi;
  return { ratedPsi, marginPsi, marginPercent: (marginPsi / ratedPsi) * 100 };
}

// ---------------------------------------------------------------- PTO and pump limits

/** Torque the PTO sees when the relief opens: the pump at relief pressure (fluid-power textbook T = p D / 2π ηm). */
export function torqueAtReliefLbFt(reliefPsi: number, displacementCuIn: number, mechanicalEfficiency: number): number {
  return pumpTorqueLbFt(reliefPsi, displacementCuIn, mechanicalEfficiency);
}

/** Pump shaft speed when the engine runs up to its governed speed with the PTO engaged. */
export function pumpRpmAtGovernedEngine(governedEngineRpm: number, ptoRatioPercent: number): number {
  return pumpShaftRpm(governedEngineRpm, ptoRatioPercent);
}

/** Engine speed that gives a target flow: the pump-flow formula turned round, N = Q × 231 / (D ηv), ÷ PTO ratio. */
export function engineRpmForFlow(targetGpm: number, displacementCuIn: number, volumetricEfficiency: number, ptoRatioPercent: number): number {
  const shaftRpm = (targetGpm * CUBIC_INCHES_PER_GALLON) / (displacementCuIn * volumetricEfficiency);
  return (shaftRpm * 100) / ptoRatioPercent;
}

// ---------------------------------------------------------------- cylinders

export interface CylinderFill {
  extendGal: number;
  retractGal: number;
  extendSeconds: number;
  retractSeconds: number;
}

/** Oil to stroke a cylinder (elementary geometry: bore area × stroke; rod side less the rod) and the time at pump flow. */
export function cylinderFill(cylinder: { boreIn: number; rodIn: number; strokeIn: number; count: number }, flowGpm: number): CylinderFill {
  const boreArea = (Math.PI / 4) * cylinder.boreIn ** 2;
  const rodArea = (Math.PI / 4) * cylinder.rodIn ** 2;
  const extendGal = (boreArea * cylinder.strokeIn * cylinder.count) / CUBIC_INCHES_PER_GALLON;
  const retractGal = ((boreArea - rodArea) * cylinder.strokeIn * cylinder.count) / CUBIC_INCHES_PER_GALLON;
  return {
    extendGal,
    retractGal,
    extendSeconds: (extendGal / flowGpm) * SECONDS_PER_MINUTE,
    retractSeconds: (retractGal / flowGpm) * SECONDS_PER_MINUTE,
  };
}

// ---------------------------------------------------------------- usable oil

export interface UsableOilInput {
  tank: TankGeometry;
  fillDepthIn: number;
  pickupHeightIn: number;
  sumpGal: number;
  /** Oil in tank and sump, gal, and the tank's whole capacity with the sump. */
  oilGal: number;
  totalGal: number;
  /** How far the oil warms from filling to working, °F. */
  warmingF: number;
  expansionPerF: number;
}

export interface UsableOil {
  /** Oil above the pick-up: what the pump can draw before it draws air. */
  usableGal: number;
  /** How much the oil grows as it warms from filling to working. */
  expansionGal: number;
  /** Room above the oil when filled. */
  airGal: number;
}

/**
 * Oil above the pick-up by the same exact geometry as the tank's volume: oil at the fill depth less oil below the
 * pick-up. With a sump the pick-up sits in the sump, so all the tank's oil counts and the sump's own oil (whose
 * shape is not entered) is left out: the figure errs on the short side.
 */
export function usableOil(input: UsableOilInput): UsableOil {
  const inTank = oilBelowDepthCuIn(input.tank, input.fillDepthIn);
  const belowPickup = input.sumpGal > 0 ? 0 : oilBelowDepthCuIn(input.tank, input.pickupHeightIn);
  const usableGal = Math.max(0, inTank - belowPickup) / CUBIC_INCHES_PER_GALLON;
  return {
    usableGal,
    expansionGal: input.oilGal * input.expansionPerF * input.warmingF,
    airGal: input.totalGal - input.oilGal,
  };
}
