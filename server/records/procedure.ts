import { addMonths } from "date-fns";
import { formatCalendarDate, parseCalendarDate } from "./calendar";

/**
 * The shop's leak-test procedure: the minimums a test must meet to count at all. A test outside
 * them is neither a pass nor a fail but invalid, and is done again. The owner may tighten or
 * loosen them; the defaults are the published figures below.
 */
export interface LeakTestProcedure {
  /** Shortest hold before the seams are examined, minutes. */
  minHoldMinutes: number;
  /** Gauge full scale against the test pressure: lowest and highest ratio allowed. */
  gaugeRatioMin: number;
  gaugeRatioMax: number;
  /** Test-pressure band for a round (horizontal cylindrical) tank, psig. */
  roundMinPsig: number;
  roundMaxPsig: number;
  /** Test-pressure band for a box (rectangular) tank, psig. */
  boxMinPsig: number;
  boxMaxPsig: number;
  /** Oldest gauge calibration still accepted, months. */
  calibrationMonths: number;
}

// ASME BPVC Section V, Article 10 (direct-pressure bubble test): hold at least 15 minutes; gauge
// full scale about twice the test pressure, never under 1.5× nor over 4×. UL 142 §42.2.1: air test
// at 3–5 psig for horizontal cylindrical tanks, 1.5–3 psig for rectangular ones. Yearly gauge
// calibration is common practice, no published source.
export const PUBLISHED_PROCEDURE: LeakTestProcedure = {
  minHoldMinutes: 15,
  gaugeRatioMin: 1.5,
  gaugeRatioMax: 4,
  roundMinPsig: 3,
  roundMaxPsig: 5,
  boxMinPsig: 1.5,
  boxMaxPsig: 3,
  calibrationMonths: 12,
};

export type ProcedureBreachCode =
  | "hold_too_short"
  | "gauge_range"
  | "test_pressure_outside_band"
  | "gauge_calibration_old"
  | "gauge_calibration_future"
  | "decay_on_box_tank";

export const PROCEDURE_BREACH_CODES: readonly ProcedureBreachCode[] = [
  "hold_too_short",
  "gauge_range",
  "test_pressure_outside_band",
  "gauge_calibration_old",
  "gauge_calibration_future",
  "decay_on_box_tank",
];

export interface ProcedureBreach {
  code: ProcedureBreachCode;
  /** The form field the breach belongs beside. */
  field: "holdMinutes" | "gaugeFullScalePsi" | "testPressurePsig" | "gaugeCalibratedOn" | "method";
  message: string;
}

/** What the form has so far; any number may still be missing while it is being typed. */
export interface ProcedureReadings {
  method?: "soap" | "decay" | "both";
  testPressurePsig?: number;
  holdMinutes?: number;
  gaugeFullScalePsi?: number;
  gaugeCalibratedOn?: string;
}

const show = (value: number) => String(Number(value.toFixed(3)));
const finite = (value: number | undefined): value is number => value !== undefined && Number.isFinite(value);

/** Where a figure comes from: the published source while the shop keeps it, the shop's own procedure once changed. */
function source(same: boolean, published: string) {
  return same ? published : "the shop's procedure";
}

/** A tank's shape as the part record keeps it: "d" is a D-shaped tank (flat side against the rail, half round outboard). */
export type TankShape = "round" | "box" | "d" | "other";

/**
 * Flat walls flex under pressure, so the tank's volume changes and a decay reading cannot be
 * trusted (trade reference, leak test). A D-shaped tank has a flat side the height of the tank
 * against the rail and flat top and bottom, so it is tested as a flat-walled tank: the box tank's
 * band and soap on every seam (common practice, no published source: UL 142 names only
 * cylindrical and rectangular tanks).
 */
export function flatWalled(shape: TankShape): shape is "box" | "d" {
  return shape === "box" || shape === "d";
}

/** How a flat-walled tank is named in a caution: "a box tank", "a D-shaped tank". */
export const flatTankWords = (shape: "box" | "d") => (shape === "d" ? "a D-shaped tank" : "a box tank");

export function pressureBand(procedure: LeakTestProcedure, shape: TankShape) {
  if (shape === "round") return { min: procedure.roundMinPsig, max: procedure.roundMaxPsig, tank: "a round (horizontal cylindrical) tank" };
  if (shape === "box") return { min: procedure.boxMinPsig, max: procedure.boxMaxPsig, tank: "a box (rectangular) tank" };
  if (shape === "d") return { min: procedure.boxMinPsig, max: procedure.boxMaxPsig, tank: "a D-shaped tank (flat walls: the box tank's band)" };
  return null;
}

export function bandSource(procedure: LeakTestProcedure, shape: "round" | "box" | "d") {
  const p = PUBLISHED_PROCEDURE;
  const same = shape === "round" ? procedure.roundMinPsig === p.roundMinPsig && procedure.roundMaxPsig === p.roundMaxPsig : procedure.boxMinPsig === p.boxMinPsig && procedure.boxMaxPsig === p.boxMaxPsig;
  return source(same, "UL 142 §42.2.1");
}

export function holdSource(procedure: LeakTestProcedure) {
  return source(procedure.minHoldMinutes === PUBLISHED_PROCEDURE.minHoldMinutes, "ASME BPVC Section V, Article 10");
}

export function gaugeSource(procedure: LeakTestProcedure) {
  const same = procedure.gaugeRatioMin === PUBLISHED_PROCEDURE.gaugeRatioMin && procedure.gaugeRatioMax === PUBLISHED_PROCEDURE.gaugeRatioMax;
  return source(same, "ASME BPVC Section V, Article 10");
}

const monthsText = (months: number) => (months % 12 === 0 ? (months === 12 ? "a year" : `${months / 12} years`) : months === 1 ? "1 month" : `${months} months`);

/**
 * Every way the readings so far break the shop's procedure. Pure and tolerant of missing numbers,
 * so the form shows each flag as it is typed and the server decides with the same words.
 */
export function procedureBreaches(
  readings: ProcedureReadings,
  context: { partShape: TankShape; procedure: LeakTestProcedure; today: string },
): ProcedureBreach[] {
  const { procedure } = context;
  const breaches: ProcedureBreach[] = [];

  const band = pressureBand(procedure, context.partShape);
  if (band && finite(readings.testPressurePsig) && (readings.testPressurePsig < band.min || readings.testPressurePsig > band.max)) {
    breaches.push({
      code: "test_pressure_outside_band",
      field: "testPressurePsig",
      message: `Test pressure ${show(readings.testPressurePsig)} psig is outside ${band.min}–${band.max} psig for ${band.tank} (${bandSource(procedure, context.partShape as "round" | "box" | "d")}).`,
    });
  }

  if (finite(readings.holdMinutes) && readings.holdMinutes < procedure.minHoldMinutes) {
    breaches.push({
      code: "hold_too_short",
      field: "holdMinutes",
      message: `Pressure was held ${show(readings.holdMinutes)} min; hold at least ${show(procedure.minHoldMinutes)} min before examining (${holdSource(procedure)}).`,
    });
  }

  if (finite(readings.gaugeFullScalePsi) && finite(readings.testPressurePsig) && readings.testPressurePsig > 0) {
    const lowest = procedure.gaugeRatioMin * readings.testPressurePsig;
    const highest = procedure.gaugeRatioMax * readings.testPressurePsig;
    // Compared at 0.0001 psi so 1.5 × 3 is 4.5 and not 4.500000000000001.
    const gauge = Math.round(readings.gaugeFullScalePsi * 10_000);
    if (gauge < Math.round(lowest * 10_000) || gauge > Math.round(highest * 10_000)) {
      breaches.push({
        code: "gauge_range",
        field: "gaugeFullScalePsi",
        message: `A ${show(readings.gaugeFullScalePsi)} psi gauge is the wrong range for ${show(readings.testPressurePsig)} psig: use a full scale between ${show(lowest)} and ${show(highest)} psi (${show(procedure.gaugeRatioMin)}–${show(procedure.gaugeRatioMax)}× the test pressure, ${gaugeSource(procedure)}).`,
      });
    }
  }

  // No published source sets how old a gauge's calibration may be (yearly is common
  // practice), so the tech is told the figure is the shop's procedure, which it is.
  if (readings.gaugeCalibratedOn && /^\d{4}-\d{2}-\d{2}$/.test(readings.gaugeCalibratedOn)) {
    const calibratedOn = parseCalendarDate(readings.gaugeCalibratedOn);
    if (readings.gaugeCalibratedOn > context.today) {
      breaches.push({
        code: "gauge_calibration_future",
        field: "gaugeCalibratedOn",
        message: `The gauge calibration date ${readings.gaugeCalibratedOn} is after today (${context.today}); check the date on the gauge's tag.`,
      });
    } else if (formatCalendarDate(addMonths(calibratedOn, procedure.calibrationMonths)) < context.today) {
      breaches.push({
        code: "gauge_calibration_old",
        field: "gaugeCalibratedOn",
        message: `The gauge was last calibrated ${readings.gaugeCalibratedOn}, more than ${monthsText(procedure.calibrationMonths)} ago; use a gauge calibrated since then (the shop's procedure).`,
      });
    }
  }

  // Trade reference, leak test: flat walls flex with pressure, so a decay reading on a box or
  // D-shaped tank cannot be trusted; with no seams examined nothing valid was tested.
  if (readings.method === "decay" && flatWalled(context.partShape)) {
    breaches.push({
      code: "decay_on_box_tank",
      field: "method",
      message: `Pressure decay alone is not a valid leak test for ${flatTankWords(context.partShape)}: its flat walls flex, so the drop cannot be trusted. Check every seam with soap solution.`,
    });
  }

  return breaches;
}

/** The owner's limits on the procedure settings themselves: a slip of the finger is refused, not saved. */
export const PROCEDURE_LIMITS = {
  minHoldMinutes: { min: 1, max: 240 },
  gaugeRatio: { min: 1, max: 10 },
  testPsig: { min: 0.5, max: 15 },
  calibrationMonths: { min: 1, max: 60 },
} as const;
