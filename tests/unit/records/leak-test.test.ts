import { unit } from "mathjs";
import { describe, expect, it } from "vitest";
import {
  PRESSURE_ROSE_MESSAGE,
  dropAgainstAllowance,
  evaluateLeakTest,
  expectedEndPressurePsig,
  formatDropPsi,
  pneumaticTestCautions,
  pressureDrop,
  thermometerCaution,
  thermometerSensitivityPsiPerF,
  type LeakTestContext,
} from "@/server/records/leak-test";
import { PUBLISHED_PROCEDURE } from "@/server/records/procedure";
import type { LeakTestInput } from "@/server/records/schemas";

const context: LeakTestContext = { partShape: "round", allowedDropPsi: 0.05, today: "2025-06-02" };

// A clean 4 psig, 20 min decay-and-soap test of a round tank with a 0–10 psi gauge: no warnings.
function leakTest(overrides: Partial<LeakTestInput> = {}): LeakTestInput {
  return {
    method: "both",
    testPressurePsig: 4,
    gaugeFullScalePsi: 10,
    gaugeCalibratedOn: "2025-01-15",
    holdMinutes: 20,
    startPressurePsig: 4,
    endPressurePsig: 4,
    startTempF: 70,
    endTempF: 70,
    barometricPsia: 14.696,
    seams: [
      { location: "Sump to shell, suction end", result: "pass" },
      { location: "Fill neck", result: "pass" },
    ],
    tester: "Wren Castellano",
    ...overrides,
  };
}

const codes = (outcome: { warnings: { code: string }[] }) => outcome.warnings.map((w) => w.code);

// Independent oracle: absolute temperatures from mathjs units (°F → K), pressures as given.
function oracleCorrectedDrop(startPsig: number, endPsig: number, startF: number, endF: number, baro = 14.696) {
  const startK = unit(startF, "degF").toNumber("K");
  const endK = unit(endF, "degF").toNumber("K");
  return startPsig + baro - (endPsig + baro) * (startK / endK);
}

describe("temperature-corrected pressure drop (ideal gas law, constant volume, absolute units)", () => {
  it("shows 1 °F of cooling at 5 psig as about 0.037 psi (trade reference, leak test)", () => {
    const end = expectedEndPressurePsig({ startPressurePsig: 5, startTempF: 70, endTempF: 69, barometricPsia: 14.696 });
    expect(5 - end).toBeCloseTo(0.037, 3);
    // (5 + 14.696) psia / (70 + 459.67) °R per °F, from the gas law directly.
    expect(5 - end).toBeCloseTo(19.696 / 529.67, 10);
  });

  it("reads a drop that is only cooling as no drop at all", () => {
    const end = expectedEndPressurePsig({ startPressurePsig: 5, startTempF: 70, endTempF: 69, barometricPsia: 14.696 });
    const drop = pressureDrop({ startPressurePsig: 5, endPressurePsig: end, startTempF: 70, endTempF: 69, barometricPsia: 14.696 });
    expect(drop.rawDropPsi).toBeCloseTo(0.0372, 4);
    expect(drop.correctedDropPsi).toBe(0);
  });

  it("agrees with a mathjs kelvin oracle for a leak hidden by warming", () => {
    const drop = pressureDrop({ startPressurePsig: 3, endPressurePsig: 3.1, startTempF: 55, endTempF: 85, barometricPsia: 14.696 });
    expect(drop.rawDropPsi).toBeCloseTo(-0.1, 10);
    expect(drop.correctedDropPsi).toBeCloseTo(oracleCorrectedDrop(3, 3.1, 55, 85), 4);
    expect(drop.correctedDropPsi).toBeGreaterThan(0.8);
  });

  it("uses the local barometric pressure: a high-altitude shop sees less cooling drop", () => {
    const sea = expectedEndPressurePsig({ startPressurePsig: 5, startTempF: 70, endTempF: 60, barometricPsia: 14.696 });
    const high = expectedEndPressurePsig({ startPressurePsig: 5, startTempF: 70, endTempF: 60, barometricPsia: 12.0 });
    // Gas law: the drop is P_abs × ΔT / T, so 17.0 psia instead of 19.696 psia.
    expect(5 - high).toBeCloseTo(17.0 * (10 / 529.67), 10);
    expect(5 - sea).toBeCloseTo(19.696 * (10 / 529.67), 10);
  });
});

describe("evaluateLeakTest: pass or fail", () => {
  it("passes a decay test whose drop is only cooling, though the raw drop is over the allowance", () => {
    const end = expectedEndPressurePsig({ startPressurePsig: 4, startTempF: 80, endTempF: 60, barometricPsia: 14.696 });
    const outcome = evaluateLeakTest(leakTest({ method: "decay", seams: [], startTempF: 80, endTempF: 60, endPressurePsig: end }), context);
    // 18.696 psia × 20 °F / 539.67 °R ≈ 0.69 psi of cooling, far over the 0.05 psi allowance.
    expect(outcome.rawDropPsi).toBeCloseTo((18.696 * 20) / 539.67, 4);
    expect(outcome.correctedDropPsi).toBe(0);
    expect(outcome.result).toBe("pass");
  });

  it("fails a decay test with a real drop beyond cooling", () => {
    const end = expectedEndPressurePsig({ startPressurePsig: 4, startTempF: 80, endTempF: 60, barometricPsia: 14.696 }) - 0.2;
    const outcome = evaluateLeakTest(leakTest({ method: "decay", seams: [], startTempF: 80, endTempF: 60, endPressurePsig: end }), context);
    // 0.2 psi lost at 60 °F is 0.2 × 539.67 / 519.67 psi at the start temperature (gas law).
    expect(outcome.correctedDropPsi).toBeCloseTo((0.2 * 539.67) / 519.67, 4);
    expect(outcome.result).toBe("fail");
  });

  it("fails a leak that warming hid from the raw gauge readings", () => {
    const outcome = evaluateLeakTest(
      leakTest({ method: "decay", seams: [], startPressurePsig: 3, endPressurePsig: 3.1, startTempF: 55, endTempF: 85 }),
      context,
    );
    expect(outcome.rawDropPsi).toBeLessThan(0);
    expect(outcome.result).toBe("fail");
  });

  it("passes a drop exactly at the shop's allowance and fails one just over it", () => {
    const at = evaluateLeakTest(leakTest({ method: "decay", seams: [], endPressurePsig: 3.95 }), context);
    expect(at.correctedDropPsi).toBe(0.05);
    expect(at.result).toBe("pass");
    const over = evaluateLeakTest(leakTest({ method: "decay", seams: [], endPressurePsig: 3.9499 }), context);
    expect(over.result).toBe("fail");
  });

  it("fails a soap test when any seam leaked", () => {
    const outcome = evaluateLeakTest(
      leakTest({ method: "soap", seams: [{ location: "Baffle weld", result: "pass" }, { location: "Return port", result: "leak" }] }),
      context,
    );
    expect(outcome.result).toBe("fail");
  });

  it("fails a decay test with a seam seen leaking, even with no pressure drop", () => {
    const outcome = evaluateLeakTest(leakTest({ method: "decay", seams: [{ location: "Drain plug", result: "leak" }] }), context);
    expect(outcome.correctedDropPsi).toBe(0);
    expect(outcome.result).toBe("fail");
  });

  it("lets a soap-only test pass on its seams but flags a corrected drop over the allowance", () => {
    const outcome = evaluateLeakTest(leakTest({ method: "soap", endPressurePsig: 3.5 }), context);
    expect(outcome.result).toBe("pass");
    expect(codes(outcome)).toEqual(["soap_only_drop_exceeds_allowed"]);
  });

  it("fails a 'both' test on the drop alone when every seam passed", () => {
    const outcome = evaluateLeakTest(leakTest({ method: "both", endPressurePsig: 3.5 }), context);
    expect(outcome.result).toBe("fail");
    expect(codes(outcome)).toEqual([]);
  });

  it("refuses a soap test with no seams examined, and a negative allowance", () => {
    expect(() => evaluateLeakTest(leakTest({ method: "soap", seams: [] }), context)).toThrow(RangeError);
    expect(() => evaluateLeakTest(leakTest(), { ...context, allowedDropPsi: -0.1 })).toThrow(RangeError);
  });
});

describe("evaluateLeakTest: warnings", () => {
  it("raises no warning for a test done by the book", () => {
    expect(evaluateLeakTest(leakTest(), context).warnings).toEqual([]);
  });

  it("flags a round tank tested outside 3–5 psig (UL 142 §42.2.1)", () => {
    for (const psig of [3, 5]) {
      const ok = evaluateLeakTest(leakTest({ testPressurePsig: psig, startPressurePsig: psig, endPressurePsig: psig }), context);
      expect(codes(ok)).not.toContain("test_pressure_outside_band");
    }
    for (const psig of [2.9, 5.1]) {
      const outcome = evaluateLeakTest(leakTest({ testPressurePsig: psig, startPressurePsig: psig, endPressurePsig: psig }), context);
      expect(codes(outcome)).toContain("test_pressure_outside_band");
      expect(outcome.warnings[0].message).toContain("UL 142 §42.2.1");
      expect(outcome.warnings[0].message).toContain("3–5 psig");
    }
  });

  it("flags a box tank tested outside 1.5–3 psig (UL 142 §42.2.1)", () => {
    const box = { ...context, partShape: "box" as const };
    const soap = { method: "soap" as const, gaugeFullScalePsi: 5 };
    for (const psig of [1.5, 2, 3]) {
      const ok = evaluateLeakTest(leakTest({ ...soap, testPressurePsig: psig, startPressurePsig: psig, endPressurePsig: psig }), box);
      expect(codes(ok)).not.toContain("test_pressure_outside_band");
    }
    // 4 psig suits a round tank but is over the band for flat walls.
    for (const psig of [1.4, 4]) {
      const outcome = evaluateLeakTest(
        leakTest({ ...soap, gaugeFullScalePsi: 2.5 * psig, testPressurePsig: psig, startPressurePsig: psig, endPressurePsig: psig }),
        box,
      );
      expect(codes(outcome)).toEqual(["test_pressure_outside_band"]);
      expect(outcome.warnings[0].message).toContain("1.5–3 psig");
    }
  });

  it("has no published band for other shapes", () => {
    const outcome = evaluateLeakTest(leakTest({ testPressurePsig: 2, startPressurePsig: 2, endPressurePsig: 2, gaugeFullScalePsi: 5 }), {
      ...context,
      partShape: "other",
    });
    expect(codes(outcome)).not.toContain("test_pressure_outside_band");
  });

  it("flags a hold shorter than 15 minutes (ASME BPVC Section V, Article 10)", () => {
    expect(codes(evaluateLeakTest(leakTest({ holdMinutes: 15 }), context))).not.toContain("hold_too_short");
    const short = evaluateLeakTest(leakTest({ holdMinutes: 14 }), context);
    expect(codes(short)).toEqual(["hold_too_short"]);
    expect(short.warnings[0].message).toContain("ASME BPVC Section V, Article 10");
  });

  it("flags a gauge outside 1.5–4 × the test pressure (ASME BPVC Section V, Article 10)", () => {
    // 4 psig test: the gauge's full scale may run from 6 to 16 psi.
    for (const fullScale of [6, 8, 16]) {
      expect(codes(evaluateLeakTest(leakTest({ gaugeFullScalePsi: fullScale }), context))).not.toContain("gauge_range");
    }
    for (const fullScale of [5.9, 16.1, 30, 100]) {
      const outcome = evaluateLeakTest(leakTest({ gaugeFullScalePsi: fullScale }), context);
      expect(codes(outcome)).toEqual(["gauge_range"]);
      expect(outcome.warnings[0].message).toContain("ASME BPVC Section V, Article 10");
    }
  });

  it("flags a gauge calibrated more than a year ago, as the shop's procedure (no published source sets it)", () => {
    expect(codes(evaluateLeakTest(leakTest({ gaugeCalibratedOn: "2024-06-02" }), context))).toEqual([]);
    const old = evaluateLeakTest(leakTest({ gaugeCalibratedOn: "2024-06-01" }), context);
    expect(codes(old)).toEqual(["gauge_calibration_old"]);
    expect(old.warnings[0].message).toBe("The gauge was last calibrated 2024-06-01, more than a year ago; use a gauge calibrated since then (the shop's procedure).");
  });

  it("flags a calibration date after today", () => {
    expect(codes(evaluateLeakTest(leakTest({ gaugeCalibratedOn: "2025-06-03" }), context))).toEqual(["gauge_calibration_future"]);
  });

  it("flags pressure decay on a box tank, whose flat walls flex (trade reference, leak test)", () => {
    const box = { ...context, partShape: "box" as const };
    const boxTest = { testPressurePsig: 2, startPressurePsig: 2, endPressurePsig: 2, gaugeFullScalePsi: 5 };
    expect(codes(evaluateLeakTest(leakTest({ ...boxTest, method: "decay" }), box))).toEqual(["decay_on_box_tank"]);
    expect(codes(evaluateLeakTest(leakTest({ ...boxTest, method: "both" }), box))).toEqual(["decay_on_box_tank"]);
    expect(codes(evaluateLeakTest(leakTest({ ...boxTest, method: "soap" }), box))).toEqual([]);
    expect(codes(evaluateLeakTest(leakTest({ method: "decay" }), context))).toEqual([]);
  });

  it("makes a test outside the procedure invalid, with every breach as a reason", () => {
    const outcome = evaluateLeakTest(leakTest({ holdMinutes: 5, gaugeFullScalePsi: 100 }), context);
    expect(outcome.result).toBe("invalid");
    expect(codes(outcome)).toEqual(["hold_too_short", "gauge_range"]);
    expect(outcome.invalidReasons.map((r) => r.code)).toEqual(["hold_too_short", "gauge_range"]);
  });

  it("keeps cautions that are not procedure breaches as flags on a pass", () => {
    const box = { ...context, partShape: "box" as const };
    const outcome = evaluateLeakTest(leakTest({ method: "both", testPressurePsig: 2, startPressurePsig: 2, endPressurePsig: 2, gaugeFullScalePsi: 5 }), box);
    expect(outcome.result).toBe("pass");
    expect(outcome.invalidReasons).toEqual([]);
  });

  it("says every caution and reason in the shop's words: a figure names its true source or the shop's procedure, never a bare reference", () => {
    const box = { ...context, partShape: "box" as const };
    const outcomes = [
      evaluateLeakTest(leakTest({ method: "both", testPressurePsig: 2, startPressurePsig: 2, endPressurePsig: 2, gaugeFullScalePsi: 5 }), box),
      evaluateLeakTest(leakTest({ method: "decay", seams: [], testPressurePsig: 2, startPressurePsig: 2, endPressurePsig: 2, gaugeFullScalePsi: 5 }), box),
      evaluateLeakTest(leakTest({ method: "soap", endPressurePsig: 3.5 }), context),
      evaluateLeakTest(leakTest({ holdMinutes: 5, gaugeFullScalePsi: 100, testPressurePsig: 9, startPressurePsig: 9, endPressurePsig: 9, gaugeCalibratedOn: "2023-01-01" }), context),
    ];
    const messages = outcomes.flatMap((o) => [...o.warnings, ...o.invalidReasons].map((w) => w.message));
    expect(new Set(outcomes.flatMap(codes))).toEqual(
      new Set(["decay_on_box_tank", "soap_only_drop_exceeds_allowed", "hold_too_short", "gauge_range", "test_pressure_outside_band", "gauge_calibration_old"]),
    );
    for (const message of messages) expect(message).not.toMatch(/trade reference|common practice|published source|from memory/i);
    expect(outcomes[0].warnings[0].message).toBe(
      "Pressure decay is not a valid leak test for a box tank: its flat walls flex, so the volume changes and the drop cannot be trusted. Check every seam with soap solution.",
    );
    expect(outcomes[2].warnings[0].message).toBe(
      "No seam showed bubbles, but the corrected pressure fell 0.50 psi, more than the shop's allowed 0.05 psi; look again at fittings, plugs and any seam not listed.",
    );
    // The hold names where its 15 minutes come from.
    expect(messages).toContain("Pressure was held 5 min; hold at least 15 min before examining (ASME BPVC Section V, Article 10).");
  });

  it("calls pressure decay alone on a box tank invalid (trade reference, leak test: flat walls flex)", () => {
    const box = { ...context, partShape: "box" as const };
    const outcome = evaluateLeakTest(leakTest({ method: "decay", seams: [], testPressurePsig: 2, startPressurePsig: 2, endPressurePsig: 2, gaugeFullScalePsi: 5 }), box);
    expect(outcome.result).toBe("invalid");
  });
});

describe("a D-shaped tank (flat side on the rail, half round outboard) is tested as flat-walled", () => {
  const d = { ...context, partShape: "d" as const };
  const soapAt = (psig: number, gaugeFullScalePsi = 2.5 * psig) =>
    leakTest({ method: "soap", gaugeFullScalePsi, testPressurePsig: psig, startPressurePsig: psig, endPressurePsig: psig });

  it("takes the box tank's 1.5–3 psig band (UL 142 §42.2.1 rectangular tanks), not the round tank's 3–5", () => {
    for (const psig of [1.5, 2, 3]) expect(codes(evaluateLeakTest(soapAt(psig), d))).toEqual([]);
    for (const psig of [1.4, 3.1, 4, 5]) {
      const outcome = evaluateLeakTest(soapAt(psig), d);
      expect(codes(outcome)).toEqual(["test_pressure_outside_band"]);
      expect(outcome.result).toBe("invalid");
      expect(outcome.warnings[0].message).toContain("1.5–3 psig for a D-shaped tank");
    }
  });

  it("follows the shop's own box band when the owner changes it", () => {
    const procedure = { ...PUBLISHED_PROCEDURE, boxMinPsig: 1, boxMaxPsig: 2 };
    expect(codes(evaluateLeakTest(soapAt(1), { ...d, procedure }))).toEqual([]);
    const outcome = evaluateLeakTest(soapAt(2.5), { ...d, procedure });
    expect(codes(outcome)).toEqual(["test_pressure_outside_band"]);
    expect(outcome.warnings[0].message).toContain("the shop's procedure");
  });

  it("flags pressure decay on it, and calls decay alone invalid", () => {
    const both = evaluateLeakTest(leakTest({ method: "both", testPressurePsig: 2, startPressurePsig: 2, endPressurePsig: 2, gaugeFullScalePsi: 5 }), d);
    expect(codes(both)).toEqual(["decay_on_box_tank"]);
    expect(both.warnings[0].message).toContain("for a D-shaped tank: its flat walls flex");
    // Soap on every seam still decides, so the test counts.
    expect(both.result).toBe("pass");
    const decayOnly = evaluateLeakTest(leakTest({ method: "decay", seams: [], testPressurePsig: 2, startPressurePsig: 2, endPressurePsig: 2, gaugeFullScalePsi: 5 }), d);
    expect(decayOnly.result).toBe("invalid");
    expect(decayOnly.invalidReasons.map((r) => r.code)).toEqual(["decay_on_box_tank"]);
  });
});

describe("a pressure that rose after the temperature correction", () => {
  // Ideal gas law at constant volume: 18.696 psia at 67 °F is 18.696 × 529.67 / 526.67 psia at
  // 70 °F, so an unchanged gauge over 3 °F of cooling reads as a 0.1065 psi rise once corrected.
  const rose = leakTest({ startTempF: 70, endTempF: 67 });

  it("is flagged with the caution, and the readings still decide the result", () => {
    const outcome = evaluateLeakTest(rose, context);
    expect(outcome.correctedDropPsi).toBeCloseTo(18.696 - (18.696 * 529.67) / 526.67, 4);
    expect(outcome.correctedDropPsi).toBeCloseTo(-0.1065, 4);
    expect(outcome.result).toBe("pass");
    expect(codes(outcome)).toEqual(["pressure_rose_after_correction"]);
    expect(outcome.warnings[0].message).toBe(PRESSURE_ROSE_MESSAGE);
    expect(PRESSURE_ROSE_MESSAGE).toBe("Pressure rose after correcting for temperature: check the thermometer and the gauge before trusting this reading.");
    // A result never pairs a pass with "test again".
    expect(PRESSURE_ROSE_MESSAGE).not.toMatch(/test again/);
  });

  it("is flagged whatever the method, since it points at the instruments", () => {
    expect(codes(evaluateLeakTest({ ...rose, method: "soap" }, context))).toEqual(["pressure_rose_after_correction"]);
    expect(codes(evaluateLeakTest({ ...rose, method: "decay", seams: [] }, context))).toEqual(["pressure_rose_after_correction"]);
  });

  it("is not flagged for a rise under the gauge's 0.01 psi, nor for no change", () => {
    // 0.004 psi over what cooling explains: below what a low-range gauge can show.
    const end = expectedEndPressurePsig({ startPressurePsig: 4, startTempF: 70, endTempF: 69, barometricPsia: 14.696 }) + 0.004;
    const small = evaluateLeakTest(leakTest({ endTempF: 69, endPressurePsig: end }), context);
    expect(small.correctedDropPsi).toBeLessThan(0);
    expect(codes(small)).toEqual([]);
    const over = evaluateLeakTest(leakTest({ endTempF: 69, endPressurePsig: end + 0.004 }), context);
    expect(codes(over)).toEqual(["pressure_rose_after_correction"]);
    expect(codes(evaluateLeakTest(leakTest(), context))).toEqual([]);
  });
});

describe("drops as the shop reads them (0.01 psi, a low-range gauge's resolution)", () => {
  it("shows two decimals and never a negative zero", () => {
    expect(formatDropPsi(-0.0957)).toBe("-0.10");
    expect(formatDropPsi(0.0372)).toBe("0.04");
    expect(formatDropPsi(0)).toBe("0.00");
    expect(formatDropPsi(-0.0004)).toBe("0.00");
    expect(formatDropPsi(0.8)).toBe("0.80");
  });

  it("says 'just over' when the drop and the allowance round to the same figure, so the words agree with a fail", () => {
    expect(dropAgainstAllowance(0.0501, 0.05)).toBe("just over the allowed 0.05 psi");
    expect(dropAgainstAllowance(0.12, 0.05)).toBe("over the allowed 0.05 psi");
    expect(dropAgainstAllowance(0.05, 0.05)).toBe("within the allowed 0.05 psi");
    expect(dropAgainstAllowance(-0.1, 0.05)).toBe("within the allowed 0.05 psi");
  });

  it("reports the soap-only drop in the warning to 0.01 psi", () => {
    const outcome = evaluateLeakTest(leakTest({ method: "soap", endPressurePsig: 3.5 }), context);
    expect(outcome.warnings[0].message).toContain("fell 0.50 psi");
  });
});

describe("pneumatic test cautions", () => {
  it("states the force on a flat wall correctly: 3 psi × 20 in × 30 in", () => {
    const text = pneumaticTestCautions.map((c) => c.text).join(" ");
    expect(text).toContain(`${(3 * 20 * 30).toLocaleString("en-US")} lbf`);
    expect(text).toMatch(/oxygen/);
    expect(text).toMatch(/relief valve/);
    expect(text).toMatch(/local codes/);
    expect(new Set(pneumaticTestCautions.map((c) => c.key)).size).toBe(pneumaticTestCautions.length);
  });
});

describe("thermometer error against the allowed drop", () => {
  it("at 5 psig and 70 °F, 1 °F of error moves the corrected drop by 19.696 / 529.67 psi (our own arithmetic, checked with mathjs kelvins)", () => {
    const psiPerF = thermometerSensitivityPsiPerF({ endPressurePsig: 5, startTempF: 70, endTempF: 70, barometricPsia: 14.696 });
    expect(psiPerF).toBeCloseTo(19.696 / 529.67, 12);
    // Independent: the oracle's corrected drop with the end reading 1 °F low, less the true one.
    const shifted = oracleCorrectedDrop(5, 5, 70, 69) - oracleCorrectedDrop(5, 5, 70, 70);
    expect(Math.abs(Math.abs(shifted) - psiPerF)).toBeLessThan(1e-4);
  });

  it("grows with pressure and is the larger of the start and end sensitivities at three points", () => {
    for (const [psig, start, end] of [
      [1.5, 40, 40],
      [3, 70, 60],
      [5, 100, 110],
    ]) {
      const endAbs = psig + 14.696;
      const startR = unit(start, "degF").toNumber("degR");
      const endR = unit(end, "degF").toNumber("degR");
      const expected = Math.max((endAbs * startR) / (endR * endR), endAbs / endR);
      expect(thermometerSensitivityPsiPerF({ endPressurePsig: psig, startTempF: start, endTempF: end, barometricPsia: 14.696 })).toBeCloseTo(expected, 9);
    }
  });

  it("a decay test cautions when 1 °F is half the allowed drop or more; a soap-only test does not", () => {
    const decay = evaluateLeakTest(leakTest(), context);
    // 18.696 / 529.67 = 0.0353 psi per °F against 0.05 allowed: 71 %.
    expect(decay.thermometerPsiPerF).toBeCloseTo(18.696 / 529.67, 9);
    expect(decay.thermometerCaution).toMatch(/0\.035 psi at this pressure \(71 % of the allowed 0\.05 psi\)/);
    expect(evaluateLeakTest(leakTest(), { ...context, allowedDropPsi: 0.1 }).thermometerCaution).toBeNull();
    expect(evaluateLeakTest(leakTest({ method: "soap" }), context).thermometerCaution).toBeNull();
    expect(thermometerCaution(0.025, 0.05)).not.toBeNull();
    expect(thermometerCaution(0.0249, 0.05)).toBeNull();
  });
});
