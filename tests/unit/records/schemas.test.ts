import { describe, expect, it } from "vitest";
import type { z } from "zod";
import {
  coatingRunSchema,
  leakTestInputSchema,
  receivingInspectionSchema,
  signOffSaveSchema,
  wiringSignOffSchema,
} from "@/server/records/schemas";

function issuesOf(schema: z.ZodType, input: unknown) {
  const result = schema.safeParse(input);
  expect(result.success).toBe(false);
  return result.error!.issues.map((issue) => ({ path: issue.path, message: issue.message }));
}

const leakTest = {
  method: "both",
  testPressurePsig: 4,
  gaugeFullScalePsi: 10,
  gaugeCalibratedOn: "2025-01-15",
  holdMinutes: 20,
  startPressurePsig: 4,
  endPressurePsig: 3.98,
  startTempF: 68,
  endTempF: 66,
  seams: [{ location: "Sump to shell", result: "pass" }],
  tester: "Wren Castellano",
};

describe("leakTestInputSchema", () => {
  it("accepts a good test and fills in sea-level barometric pressure", () => {
    const parsed = leakTestInputSchema.parse(leakTest);
    expect(parsed.barometricPsia).toBe(14.696);
    expect(parsed.seams).toHaveLength(1);
  });

  it.each(["testPressurePsig", "startPressurePsig", "endPressurePsig"])("refuses a negative %s", (field) => {
    const issues = issuesOf(leakTestInputSchema, { ...leakTest, [field]: -1 });
    expect(issues).toContainEqual({ path: [field], message: expect.stringMatching(/cannot be negative/) });
  });

  it("refuses a test pressure of zero and one above a low-pressure test", () => {
    expect(issuesOf(leakTestInputSchema, { ...leakTest, testPressurePsig: 0 })[0].path).toEqual(["testPressurePsig"]);
    const high = { ...leakTest, testPressurePsig: 30, gaugeFullScalePsi: 60, startPressurePsig: 30, endPressurePsig: 30 };
    const paths = issuesOf(leakTestInputSchema, high).map((issue) => issue.path);
    expect(paths).toEqual([["testPressurePsig"], ["startPressurePsig"], ["endPressurePsig"]]);
  });

  it("refuses a temperature like 293 and says to enter °F", () => {
    const [issue, ...rest] = issuesOf(leakTestInputSchema, { ...leakTest, startTempF: 293 });
    expect(rest).toEqual([]);
    expect(issue.path).toEqual(["startTempF"]);
    expect(issue.message).toContain("°F");
    expect(issue.message).toContain("kelvin");
    expect(issuesOf(leakTestInputSchema, { ...leakTest, endTempF: -41 })[0].path).toEqual(["endTempF"]);
  });

  it("accepts the ends of the shop temperature range", () => {
    expect(leakTestInputSchema.safeParse({ ...leakTest, startTempF: -40, endTempF: 150 }).success).toBe(true);
    expect(leakTestInputSchema.safeParse({ ...leakTest, startTempF: 150, endTempF: -40 }).success).toBe(true);
    expect(issuesOf(leakTestInputSchema, { ...leakTest, endTempF: 150.1 })[0].path).toEqual(["endTempF"]);
  });

  it("refuses a zero hold and a barometric pressure outside 10–16 psia", () => {
    expect(issuesOf(leakTestInputSchema, { ...leakTest, holdMinutes: 0 })[0].path).toEqual(["holdMinutes"]);
    expect(issuesOf(leakTestInputSchema, { ...leakTest, barometricPsia: 9.9 })[0].path).toEqual(["barometricPsia"]);
    // 101.3 is sea level in kPa, not psia.
    expect(issuesOf(leakTestInputSchema, { ...leakTest, barometricPsia: 101.3 })[0].path).toEqual(["barometricPsia"]);
  });

  describe("each method asks for what it decides on", () => {
    const { startPressurePsig: _s, endPressurePsig: _e, startTempF: _st, endTempF: _et, ...noHoldReadings } = leakTest;
    const holdReadings = ["startPressurePsig", "endPressurePsig", "startTempF", "endTempF"];

    it("a soap-only test needs the test pressure it was held at, the gauge, the hold, the seams and the tester, not the decay readings", () => {
      const parsed = leakTestInputSchema.safeParse({ ...noHoldReadings, method: "soap" });
      expect(parsed.success).toBe(true);
      for (const field of ["testPressurePsig", "gaugeFullScalePsi", "gaugeCalibratedOn", "holdMinutes", "tester"]) {
        const { [field as keyof typeof noHoldReadings]: _gone, ...without } = noHoldReadings;
        expect(issuesOf(leakTestInputSchema, { ...without, method: "soap" }).map((i) => i.path), field).toEqual([[field]]);
      }
      expect(issuesOf(leakTestInputSchema, { ...noHoldReadings, method: "soap", seams: [] }).map((i) => i.path)).toEqual([["seams"]]);
    });

    it.each(["decay", "both"])("a %s test is refused without each hold reading, each named", (method) => {
      const issues = issuesOf(leakTestInputSchema, { ...noHoldReadings, method });
      expect(issues.map((i) => i.path)).toEqual(holdReadings.map((r) => [r]));
      expect(issues[0].message).toBe("Enter the start pressure in psig: pressure decay is read from the start and end of the hold.");
      expect(issues[3].message).toBe("Enter the end temperature in °F: pressure decay is read from the start and end of the hold.");
      const { endPressurePsig: _gone, ...noEnd } = leakTest;
      expect(issuesOf(leakTestInputSchema, { ...noEnd, method }).map((i) => i.path)).toEqual([["endPressurePsig"]]);
    });

    it("a half-filled decay test hears of every missing reading at once, with the other fields to fix", () => {
      const paths = issuesOf(leakTestInputSchema, { method: "both", holdMinutes: 20, seams: [{ location: "Fill neck", result: "pass" }] }).map((i) => i.path[0]);
      expect(paths).toEqual(expect.arrayContaining(["testPressurePsig", "gaugeFullScalePsi", "gaugeCalibratedOn", "tester", ...holdReadings]));
      const soap = issuesOf(leakTestInputSchema, { method: "soap", holdMinutes: 20, seams: [{ location: "Fill neck", result: "pass" }] }).map((i) => i.path[0]);
      expect(soap.filter((p) => holdReadings.includes(String(p)))).toEqual([]);
    });

    it("a soap-only test takes hold readings all together or not at all, and still checks the ones given", () => {
      expect(leakTestInputSchema.safeParse({ ...leakTest, method: "soap" }).success).toBe(true);
      const { endTempF: _gone, ...partial } = leakTest;
      const issues = issuesOf(leakTestInputSchema, { ...partial, method: "soap" });
      expect(issues).toEqual([{ path: ["endTempF"], message: "Enter the end temperature in °F too, or leave all four hold readings empty for a soap-only test." }]);
      expect(issuesOf(leakTestInputSchema, { ...leakTest, method: "soap", startTempF: 293 }).map((i) => i.path)).toEqual([["startTempF"]]);
    });
  });

  it("refuses a soap or both test with no seam, and allows a decay test without seams", () => {
    for (const method of ["soap", "both"]) {
      expect(issuesOf(leakTestInputSchema, { ...leakTest, method, seams: [] })).toEqual([
        { path: ["seams"], message: "A soap test needs at least one seam listed with its result." },
      ]);
    }
    expect(leakTestInputSchema.safeParse({ ...leakTest, method: "decay", seams: [] }).success).toBe(true);
  });

  it("names the seam that is incomplete", () => {
    const issues = issuesOf(leakTestInputSchema, { ...leakTest, seams: [{ location: "Fill neck", result: "pass" }, { location: " ", result: "ok" }] });
    expect(issues.map((issue) => issue.path)).toEqual([
      ["seams", 1, "location"],
      ["seams", 1, "result"],
    ]);
  });

  it("refuses an end pressure higher than warming explains, but allows the rise warming causes", () => {
    // 60 → 80 °F from 3 psig: the gas law gives (3 + 14.696) × 539.67 / 519.67 − 14.696 ≈ 3.68 psig; + 0.5 slack.
    const warming = { ...leakTest, startPressurePsig: 3, testPressurePsig: 3, startTempF: 60, endTempF: 80 };
    expect(leakTestInputSchema.safeParse({ ...warming, endPressurePsig: 3.9 }).success).toBe(true);
    expect(issuesOf(leakTestInputSchema, { ...warming, endPressurePsig: 4.4 })[0].path).toEqual(["endPressurePsig"]);
    // With no temperature change only gauge slack is allowed.
    expect(issuesOf(leakTestInputSchema, { ...leakTest, endPressurePsig: 4.6, endTempF: 68 })[0].path).toEqual(["endPressurePsig"]);
  });

  it("refuses a reading above the gauge's full scale", () => {
    const issues = issuesOf(leakTestInputSchema, { ...leakTest, gaugeFullScalePsi: 3 });
    expect(issues.map((issue) => issue.path)).toEqual([["startPressurePsig"], ["endPressurePsig"]]);
  });

  it("refuses an impossible calibration date and a missing tester", () => {
    const issues = issuesOf(leakTestInputSchema, { ...leakTest, gaugeCalibratedOn: "2025-02-30", tester: "" });
    expect(issues.map((issue) => issue.path)).toEqual([["gaugeCalibratedOn"], ["tester"]]);
  });
});

const coatingRun = {
  vendorId: 2,
  finish: { colour: "Gloss black", gloss: "gloss" },
  sentOn: "2025-03-07",
  promisedOn: "2025-03-14",
  partIds: [11, 12],
};

describe("coatingRunSchema", () => {
  it("accepts a run out at the coater, and one back", () => {
    expect(coatingRunSchema.safeParse(coatingRun).success).toBe(true);
    expect(coatingRunSchema.safeParse({ ...coatingRun, receivedOn: "2025-03-07" }).success).toBe(true);
  });

  it("refuses a received date before the sent date, on receivedOn", () => {
    expect(issuesOf(coatingRunSchema, { ...coatingRun, receivedOn: "2025-03-06" })).toEqual([
      { path: ["receivedOn"], message: "The received date cannot be before the sent date." },
    ]);
  });

  it("refuses a promised date before the sent date, on promisedOn", () => {
    expect(issuesOf(coatingRunSchema, { ...coatingRun, promisedOn: "2025-03-06" })[0].path).toEqual(["promisedOn"]);
  });

  it("needs at least one part, each once", () => {
    expect(issuesOf(coatingRunSchema, { ...coatingRun, partIds: [] })[0].path).toEqual(["partIds"]);
    expect(issuesOf(coatingRunSchema, { ...coatingRun, partIds: [11, 11] })[0].path).toEqual(["partIds", 1]);
    expect(issuesOf(coatingRunSchema, { ...coatingRun, partIds: [11, 0] })[0].path).toEqual(["partIds", 1]);
  });

  it("names the nested finish field and a bad date", () => {
    const issues = issuesOf(coatingRunSchema, { ...coatingRun, finish: { colour: "Safety yellow", gloss: "shiny" }, sentOn: "07/03/2025" });
    expect(issues.map((issue) => issue.path)).toEqual([["finish", "gloss"], ["sentOn"]]);
  });
});

describe("receivingInspectionSchema", () => {
  const inspection = { dftReadingsMils: [2.4, 2.8, 3.1], adhesionOk: true, defects: "" };

  it("accepts an inspection and defaults the defects note to empty", () => {
    expect(receivingInspectionSchema.parse({ dftReadingsMils: [2.5], adhesionOk: false }).defects).toBe("");
    expect(receivingInspectionSchema.safeParse(inspection).success).toBe(true);
  });

  it("takes 1 to 20 readings", () => {
    expect(issuesOf(receivingInspectionSchema, { ...inspection, dftReadingsMils: [] })[0].path).toEqual(["dftReadingsMils"]);
    expect(issuesOf(receivingInspectionSchema, { ...inspection, dftReadingsMils: Array(21).fill(2.5) })[0].path).toEqual([
      "dftReadingsMils",
    ]);
    expect(receivingInspectionSchema.safeParse({ ...inspection, dftReadingsMils: Array(20).fill(2.5) }).success).toBe(true);
  });

  it("refuses a reading outside 0.1–40 mils, naming which one (65 looks like µm)", () => {
    const issues = issuesOf(receivingInspectionSchema, { ...inspection, dftReadingsMils: [2.5, 65, 0.05] });
    expect(issues.map((issue) => issue.path)).toEqual([
      ["dftReadingsMils", 1],
      ["dftReadingsMils", 2],
    ]);
  });

  it("needs the adhesion answer", () => {
    expect(issuesOf(receivingInspectionSchema, { dftReadingsMils: [2.5] })[0].path).toEqual(["adhesionOk"]);
  });
});

describe("wiringSignOffSchema", () => {
  it("accepts a partial draft", () => {
    const draft = wiringSignOffSchema.parse({ indicatorSource: "switch", checks: { pump_no_cavitation: true } });
    expect(draft.checks.pump_no_cavitation).toBe(true);
    expect(draft.indicatorInput).toBeUndefined();
  });

  it("names the field it refuses", () => {
    const issues = issuesOf(wiringSignOffSchema, {
      indicatorSource: "lamp",
      checks: { pump_no_cavitation: "yes" },
      reliefPressurePsi: -5,
      timedRunMinutes: 0,
    });
    expect(issues.map((issue) => issue.path)).toEqual([
      ["indicatorSource"],
      ["checks", "pump_no_cavitation"],
      ["reliefPressurePsi"],
      ["timedRunMinutes"],
    ]);
  });

  it("refuses a relief pressure that looks like kPa", () => {
    expect(issuesOf(wiringSignOffSchema, { reliefPressurePsi: 17_200 })[0].path).toEqual(["reliefPressurePsi"]);
  });
});

describe("signOffSaveSchema", () => {
  it("needs the version the form edited, 0 before the first save", () => {
    expect(signOffSaveSchema.parse({ expectedVersion: 0, checks: {} })).toEqual({ expectedVersion: 0, checks: {} });
    expect(signOffSaveSchema.parse({ expectedVersion: 4, indicatorSource: "switch" }).expectedVersion).toBe(4);
    for (const expectedVersion of [undefined, -1, 1.5, "2"]) {
      expect(issuesOf(signOffSaveSchema, { expectedVersion, checks: {} }).map((issue) => issue.path), String(expectedVersion)).toEqual([["expectedVersion"]]);
    }
  });
});
