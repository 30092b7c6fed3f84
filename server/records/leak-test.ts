import { type LeakTestProcedure, type TankShape, PUBLISHED_PROCEDURE, flatTankWords, flatWalled, procedureBreaches } from "./procedure";
import type { LeakTestInput } from "./schemas";

/** The part's shape, from the part record: the pressure band and the decay method depend on it. */
export type PartShape = TankShape;

/** "invalid": the test broke the shop's procedure (see procedure.ts); it is neither a pass nor a fail. */
export type LeakTestResult = "pass" | "fail" | "invalid";

export type LeakTestWarningCode =
  | "test_pressure_outside_band"
  | "hold_too_short"
  | "gauge_range"
  | "gauge_calibration_old"
  | "gauge_calibration_future"
  | "decay_on_box_tank"
  | "soap_only_drop_exceeds_allowed"
  | "pressure_rose_after_correction";

export type LeakTestWarning = { code: LeakTestWarningCode; message: string };

export type LeakTestContext = {
  partShape: PartShape;
  /** The shop's allowed temperature-corrected drop over the hold, psi (a shop setting). */
  allowedDropPsi: number;
  /** The shop's today, YYYY-MM-DD (see shopToday in turnaround.ts). */
  today: string;
  /** The shop's procedure minimums; the published figures when not given. */
  procedure?: LeakTestProcedure;
};

export type LeakTestOutcome = {
  correctedDropPsi: number;
  rawDropPsi: number;
  result: LeakTestResult;
  warnings: LeakTestWarning[];
  /** Why the test is invalid: the procedure breaches, empty unless the result is "invalid". */
  invalidReasons: LeakTestWarning[];
  /** How far 1 °F of thermometer error moves the corrected drop at this test's pressure, psi. */
  thermometerPsiPerF: number;
  /** Said when that is near the allowed drop; null otherwise. */
  thermometerCaution: string | null;
};

// Rankine = °F + 459.67, exact by the definition of the two scales.
export const RANKINE_OFFSET_F = 459.67;
// Standard atmosphere at sea level, 101.325 kPa = 14.696 psi (NIST SP 811, Appendix B; digits from memory).
export const SEA_LEVEL_PSIA = 14.696;
// The figures below are the published defaults of the shop's procedure (procedure.ts holds the settings).
// UL 142 §42.2.1: air test pressure, horizontal cylindrical tanks 3–5 psig, rectangular 1.5–3 psig.
export const UL142_TEST_PRESSURE_PSIG = {
  round: { min: 3, max: 5, tank: "a round (horizontal cylindrical) tank" },
  box: { min: 1.5, max: 3, tank: "a box (rectangular) tank" },
} as const;
// ASME BPVC Section V, Article 10 (direct-pressure bubble test): hold at least 15 minutes.
export const ASME_MIN_HOLD_MINUTES = 15;
// ASME BPVC Section V, Article 10: gauge full scale about 2× the test pressure, never under 1.5× nor over 4×.
export const ASME_GAUGE_FULL_SCALE_RATIO = { min: 1.5, max: 4 } as const;
// Recalibrate test gauges yearly: common practice, no published source.
export const GAUGE_CALIBRATION_YEARS = 1;

// Drops are stored and compared at 0.0001 psi, far finer than any shop gauge reads, so float
// noise never turns a pure-cooling drop into a failure.
const roundPsi = (psi: number) => Math.round(psi * 10_000) / 10_000 + 0;
const show = (value: number) => String(Number(value.toFixed(3)));

// Drops are shown to 0.01 psi: a low-range test gauge reads no finer (a 0–10 psi gauge of accuracy
// grade 4A, ±0.1 % of span, is ±0.01 psi; ASME B40.100, from memory), so more digits are noise.
export const DROP_DISPLAY_DECIMALS = 2;
export const DROP_PRECISION_NOTE = "Drops are shown to 0.01 psi: a low-range test gauge reads no finer than that.";

/** A pressure drop as the shop reads it: two decimals, and never "-0.00". */
export function formatDropPsi(psi: number): string {
  const scale = 10 ** DROP_DISPLAY_DECIMALS;
  return (Math.round(psi * scale) / scale + 0).toFixed(DROP_DISPLAY_DECIMALS);
}

/**
 * How a drop stands against the shop's allowance, in words that agree with the result even when
 * both round to the same 0.01 psi.
 */
export function dropAgainstAllowance(correctedDropPsi: number, allowedDropPsi: number): string {
  const allowed = `${show(allowedDropPsi)} psi`;
  if (correctedDropPsi > allowedDropPsi) {
    return formatDropPsi(correctedDropPsi) === formatDropPsi(allowedDropPsi) ? `just over the allowed ${allowed}` : `over the allowed ${allowed}`;
  }
  return `within the allowed ${allowed}`;
}

export const PRESSURE_ROSE_MESSAGE = "Pressure rose after correcting for temperature: check the thermometer and the gauge before trusting this reading.";

export type PressureReadings = Pick<
  LeakTestInput,
  "startPressurePsig" | "endPressurePsig" | "startTempF" | "endTempF" | "barometricPsia"
>;

/**
 * Raw and temperature-corrected pressure drop over the hold. At constant volume P/T is constant
 * in absolute units (ideal gas law), so the end pressure is brought back to the start temperature
 * before the drop is read as a leak: 1 °F of cooling at 5 psig alone shows as about 0.037 psi.
 */
export function pressureDrop(readings: PressureReadings): { rawDropPsi: number; correctedDropPsi: number } {
  const startAbs = readings.startPressurePsig + readings.barometricPsia;
  const endAbs = readings.endPressurePsig + readings.barometricPsia;
  const startRankine = readings.startTempF + RANKINE_OFFSET_F;
  const endRankine = readings.endTempF + RANKINE_OFFSET_F;
  // Ideal gas law at constant volume: P_end,corr = P_end × T_start / T_end, all absolute.
  const endCorrectedAbs = endAbs * (startRankine / endRankine);
  return {
    rawDropPsi: roundPsi(readings.startPressurePsig - readings.endPressurePsig),
    correctedDropPsi: roundPsi(startAbs - endCorrectedAbs),
  };
}

/**
 * How much 1 °F of error in a temperature reading moves the corrected drop, psi. The corrected drop is
 * P_start − P_end × T_start / T_end (absolute units), so an error in the end reading moves it by
 * P_end × T_start / T_end² per degree and one in the start reading by P_end / T_end; the larger is given.
 * At 5 psig and 70 °F that is 19.696 / 529.67 ≈ 0.037 psi per °F.
 */
export function thermometerSensitivityPsiPerF(readings: Omit<PressureReadings, "startPressurePsig">): number {
  const endAbs = readings.endPressurePsig + readings.barometricPsia;
  const startRankine = readings.startTempF + RANKINE_OFFSET_F;
  const endRankine = readings.endTempF + RANKINE_OFFSET_F;
  return Math.max((endAbs * startRankine) / (endRankine * endRankine), endAbs / endRankine);
}

// Common practice, no published source: a 1 °F misread worth half the allowed drop or more can make or break
// the result on its own, so the tech is told to read both temperatures the same way.
export const THERMOMETER_NEAR_SHARE_OF_ALLOWED = 0.5;

export function thermometerCaution(psiPerF: number, allowedDropPsi: number): string | null {
  if (psiPerF < THERMOMETER_NEAR_SHARE_OF_ALLOWED * allowedDropPsi) return null;
  const share = allowedDropPsi > 0 ? ` (${Math.round((psiPerF / allowedDropPsi) * 100)} % of the allowed ${show(allowedDropPsi)} psi)` : "";
  return `A thermometer reading off by 1 °F moves the corrected drop by ${psiPerF.toFixed(3)} psi at this pressure${share}: read both temperatures with the same thermometer at the same spot, out of the sun, and call a drop this close a retest rather than a pass or fail.`;
}

/**
 * The pressure the gauge would read at the end of the hold if the tank were tight and only the
 * temperature changed (ideal gas law, absolute units).
 */
export function expectedEndPressurePsig(readings: Omit<PressureReadings, "endPressurePsig">): number {
  const startAbs = readings.startPressurePsig + readings.barometricPsia;
  const ratio = (readings.endTempF + RANKINE_OFFSET_F) / (readings.startTempF + RANKINE_OFFSET_F);
  return startAbs * ratio - readings.barometricPsia;
}

/**
 * Decides a leak test. A seam seen leaking fails the test whatever the method named: a bubble is
 * a leak. The corrected drop decides only for "decay" and "both"; in a soap-only test it is
 * reported and flagged when over the allowed drop, since a leak may be where no seam was looked at.
 * A soap or both test with no seams examined is not a test: the schema refuses it and so does this.
 */
export function evaluateLeakTest(test: LeakTestInput, context: LeakTestContext): LeakTestOutcome {
  if (!Number.isFinite(context.allowedDropPsi) || context.allowedDropPsi < 0) {
    throw new RangeError(`The shop's allowed drop must be 0 psi or more; got ${context.allowedDropPsi}`);
  }
  const usesSoap = test.method === "soap" || test.method === "both";
  const usesDecay = test.method === "decay" || test.method === "both";
  if (usesSoap && test.seams.length === 0) {
    throw new RangeError("A soap test needs at least one seam examined");
  }

  const { rawDropPsi, correctedDropPsi } = pressureDrop(test);
  const seamLeaked = test.seams.some((seam) => seam.result === "leak");
  const dropTooLarge = correctedDropPsi > context.allowedDropPsi;
  const procedure = context.procedure ?? PUBLISHED_PROCEDURE;

  const warnings: LeakTestWarning[] = [];
  const warn = (code: LeakTestWarningCode, message: string) => warnings.push({ code, message });

  const breaches = procedureBreaches(test, { partShape: context.partShape, procedure, today: context.today });
  for (const breach of breaches) warn(breach.code, breach.message);

  // Trade reference, leak test: flat walls flex with pressure, so the volume is not constant and
  // the P/T correction does not hold. With soap on every seam as well the test still counts.
  // A D-shaped tank's flat side and flat top and bottom flex the same way. The tech's screen gives
  // the reason in the shop's words; the source stays here and in DEVELOPERS.md.
  if (test.method === "both" && flatWalled(context.partShape)) {
    warn(
      "decay_on_box_tank",
      `Pressure decay is not a valid leak test for ${flatTankWords(context.partShape)}: its flat walls flex, so the volume changes and the drop cannot be trusted. Check every seam with soap solution.`,
    );
  }

  if (!usesDecay && dropTooLarge) {
    warn(
      "soap_only_drop_exceeds_allowed",
      `No seam showed bubbles, but the corrected pressure fell ${formatDropPsi(correctedDropPsi)} psi, more than the shop's allowed ${show(context.allowedDropPsi)} psi; look again at fittings, plugs and any seam not listed.`,
    );
  }

  // A closed tank cannot gain air, so once the gas law has taken out the temperature change a rise
  // is a misread thermometer or gauge (or a thermometer reading a different spot). Counted only
  // when it shows at the gauge's 0.01 psi, so rounding noise is not flagged.
  if (formatDropPsi(correctedDropPsi).startsWith("-")) warn("pressure_rose_after_correction", PRESSURE_ROSE_MESSAGE);

  // A bubble is a leak however the test was run, so a seen leak fails it. Otherwise a test outside
  // the shop's procedure proves nothing either way: it is invalid and is done again.
  const result: LeakTestResult = seamLeaked ? "fail" : breaches.length > 0 ? "invalid" : usesDecay && dropTooLarge ? "fail" : "pass";
  const invalidReasons = result === "invalid" ? breaches.map(({ code, message }) => ({ code, message })) : [];
  const thermometerPsiPerF = thermometerSensitivityPsiPerF(test);
  return {
    correctedDropPsi,
    rawDropPsi,
    result,
    warnings,
    invalidReasons,
    thermometerPsiPerF,
    thermometerCaution: usesDecay ? thermometerCaution(thermometerPsiPerF, context.allowedDropPsi) : null,
  };
}

/** Shown on the leak-test form before the tank is pressurized. */
export const pneumaticTestCautions: readonly { key: string; text: string }[] = [
  { key: "lowest_pressure", text: "Use the lowest pressure that does the job." },
  {
    key: "regulator_relief",
    text: "Fill through a regulator, with a relief valve on the tank side set just above the test pressure.",
  },
  { key: "low_range_gauge", text: "Read a low-range gauge, about twice the test pressure at full scale." },
  {
    key: "stand_clear",
    text: "Nobody stands in front of flat panels, plugs or caps: 3 psi on a 20 × 30 in wall pushes 1,800 lbf.",
  },
  { key: "air_only", text: "Never use oxygen or a flammable gas: shop air or nitrogen only." },
  { key: "codes", text: "Follow local codes and the makers' instructions for the tank, fittings and gauge." },
];
