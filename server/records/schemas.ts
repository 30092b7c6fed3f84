import { z } from "zod";
import { calendarDate } from "@/server/http/calendar-date";
import { HOLD_READINGS, type HoldReading, expectedEndPressurePsig, holdReadingsOf, missingHoldReadings, SEA_LEVEL_PSIA, usesPressureDecay } from "./leak-test";
import { GLOSS_LEVELS, PART_KINDS, PART_MATERIALS, PART_SHAPES, type PartKind } from "./labels";
import { type LeakTestProcedure, PROCEDURE_LIMITS } from "./procedure";
import { DOLLARS_AND_CENTS } from "@/server/parts/schemas";
import { INDICATOR_INPUTS, INDICATOR_SOURCES, SIGN_OFF_CHECK_KEYS, type SignOffCheckKey } from "./sign-off";

// The lists, labels and kind defaults need no zod, so the forms in the browser import them from ./labels.
export {
  GLOSS_LEVELS,
  PART_KINDS,
  PART_MATERIALS,
  PART_SHAPES,
  glossLabels,
  kindDefaults,
  partKindLabels,
  partMaterialLabels,
  partShapeLabels,
  type PartKind,
  type PartMaterial,
} from "./labels";

// Numbers arrive as numbers: the form converts its fields before parsing, so an empty box is
// "missing", never a silent 0.

const isoDate = calendarDate;

const name = (what: string) =>
  z
    .string({ error: `Enter ${what}.` })
    .trim()
    .min(1, { error: `Enter ${what}.` })
    .max(120, { error: `Keep ${what} to 120 characters.` });

// A reservoir leak test is a low-pressure test; 15 psig is where pressure-vessel rules begin
// (from memory), so a bigger number is a slip of the finger or a different kind of test.
export const MAX_LEAK_TEST_PSIG = 15;
// Shop-floor air in °F (common practice, no published source); 293 is room temperature in kelvin.
export const SHOP_TEMP_RANGE_F = { min: -40, max: 150 } as const;
// A reading may rise over the hold by what warming explains plus one gauge reading's slack
// (common practice, no published source); more than that is a mistyped reading.
export const END_PRESSURE_RISE_SLACK_PSI = 0.5;

const psig = (what: string) =>
  z
    .number({ error: `Enter ${what} in psig.` })
    .min(0, { error: `${what} cannot be negative: enter the gauge reading in psig.` })
    .max(MAX_LEAK_TEST_PSIG, {
      error: `${what} above ${MAX_LEAK_TEST_PSIG} psig is not a low-pressure leak test; check the reading.`,
    });

const shopTempF = (what: string) =>
  z
    .number({ error: `Enter ${what} in °F.` })
    .min(SHOP_TEMP_RANGE_F.min, {
      error: `Enter ${what} in °F (${SHOP_TEMP_RANGE_F.min} to ${SHOP_TEMP_RANGE_F.max} °F).`,
    })
    .max(SHOP_TEMP_RANGE_F.max, {
      error: `Enter ${what} in °F (${SHOP_TEMP_RANGE_F.min} to ${SHOP_TEMP_RANGE_F.max} °F); a number this high looks like kelvin or another unit.`,
    });

export const leakTestMethodSchema = z.enum(["soap", "decay", "both"], {
  error: "Choose the method: soap solution, pressure decay, or both.",
});
export type LeakTestMethod = z.infer<typeof leakTestMethodSchema>;

export const seamCheckSchema = z.object({
  location: name("where on the part the seam is"),
  result: z.enum(["pass", "leak"], { error: "Mark the seam pass or leak." }),
});
export type SeamCheck = z.infer<typeof seamCheckSchema>;

export const leakTestInputSchema = z
  .object({
    method: leakTestMethodSchema,
    testPressurePsig: psig("Test pressure").refine((value) => value > 0, {
      error: "Test pressure must be above 0 psig.",
    }),
    gaugeFullScalePsi: z
      .number({ error: "Enter the gauge's full-scale reading in psi." })
      .positive({ error: "The gauge's full scale must be above 0 psi." }),
    gaugeCalibratedOn: isoDate("the gauge's last calibration date"),
    holdMinutes: z
      .number({ error: "Enter how many minutes the pressure was held." })
      .positive({ error: "Hold time must be more than 0 minutes." })
      .max(24 * 60, { error: "Hold time above 24 hours (1440 min) is not plausible; check the entry." }),
    // The readings over the hold: what pressure decay decides on. A soap-only test may leave them
    // out (its test pressure is the gauge pressure it was held at); see HOLD_READINGS below.
    startPressurePsig: psig("Start pressure").optional(),
    endPressurePsig: psig("End pressure").optional(),
    startTempF: shopTempF("the start temperature").optional(),
    endTempF: shopTempF("the end temperature").optional(),
    // 10–16 psia spans high-altitude shops to a deep low at sea level; 14.696 is sea level.
    barometricPsia: z
      .number({ error: "Enter the barometric pressure in psia." })
      .min(10, { error: "Barometric pressure must be 10–16 psia (14.696 at sea level)." })
      .max(16, { error: "Barometric pressure must be 10–16 psia (14.696 at sea level)." })
      .default(SEA_LEVEL_PSIA),
    seams: z.array(seamCheckSchema).max(100, { error: "List at most 100 seams." }).default([]),
    tester: name("the tester's name"),
  })
  .superRefine((test, ctx) => {
    // A soap test that looked at no seam examined nothing: refuse rather than record a pass.
    if (test.method !== "decay" && test.seams.length === 0) {
      ctx.addIssue({
        code: "custom",
        path: ["seams"],
        message: "A soap test needs at least one seam listed with its result.",
      });
    }
    for (const reading of ["startPressurePsig", "endPressurePsig"] as const) {
      const value = test[reading];
      if (value !== undefined && value > test.gaugeFullScalePsi) {
        ctx.addIssue({
          code: "custom",
          path: [reading],
          message: `The reading is above the gauge's ${test.gaugeFullScalePsi} psi full scale; check the reading or the gauge.`,
        });
      }
    }
    const readings = holdReadingsOf(test);
    if (!readings) return;
    const highestEnd = Math.max(readings.startPressurePsig, expectedEndPressurePsig(readings)) + END_PRESSURE_RISE_SLACK_PSI;
    if (readings.endPressurePsig > highestEnd) {
      ctx.addIssue({
        code: "custom",
        path: ["endPressurePsig"],
        message: `End pressure is higher than warming can explain (at most ${highestEnd.toFixed(2)} psig); check the readings.`,
      });
    }
  })
  .check(
    // Each method asks for what it decides on: pressure decay (alone or with soap) needs every
    // reading over the hold; a soap-only test needs none, but readings given are given in full.
    // Run even when other fields are wrong, so a half-filled form hears of every missing reading at once.
    z.superRefine(
      (value: unknown, ctx) => {
        const test = (value ?? {}) as Record<string, unknown>;
        const method = leakTestMethodSchema.safeParse(test.method);
        if (!method.success) return;
        const given = Object.fromEntries(HOLD_READINGS.map((r) => [r, test[r] === undefined ? undefined : 0]));
        for (const reading of missingHoldReadings({ method: method.data, ...given })) {
          ctx.addIssue({ code: "custom", path: [reading], message: HOLD_READING_MISSING[reading](method.data) });
        }
      },
      { when: () => true },
    ),
  );
export type LeakTestInput = z.output<typeof leakTestInputSchema>;

const HOLD_READING_WORDS: Record<HoldReading, string> = {
  startPressurePsig: "the start pressure in psig",
  endPressurePsig: "the end pressure in psig",
  startTempF: "the start temperature in °F",
  endTempF: "the end temperature in °F",
};
const HOLD_READING_MISSING = Object.fromEntries(
  HOLD_READINGS.map((r) => [
    r,
    (method: LeakTestMethod) =>
      usesPressureDecay(method)
        ? `Enter ${HOLD_READING_WORDS[r]}: pressure decay is read from the start and end of the hold.`
        : `Enter ${HOLD_READING_WORDS[r]} too, or leave all four hold readings empty for a soap-only test.`,
  ]),
) as Record<HoldReading, (method: LeakTestMethod) => string>;
export type LeakTestFormInput = z.input<typeof leakTestInputSchema>;

export const coatingFinishSchema = z.object({
  colour: name("the color"),
  gloss: z.enum(GLOSS_LEVELS, { error: "Choose the gloss level." }),
});
export type CoatingFinish = z.infer<typeof coatingFinishSchema>;

// Row ids are the database's integer keys.
const recordId = (message: string) =>
  z.number({ error: message }).int({ error: message }).positive({ error: message });

// What a coater charges for a run, in cents: up to $100,000; anything more is a slip of the finger.
export const MAX_RUN_PRICE_CENTS = 10_000_000;
const runPriceCents = z
  .number({ error: DOLLARS_AND_CENTS })
  .int({ error: DOLLARS_AND_CENTS })
  .min(0, { error: "The coater's price cannot be negative." })
  .max(MAX_RUN_PRICE_CENTS, { error: "The coater's price is at most $100,000.00 for a run." });

const moveJobIdsSchema = z
  .array(recordId("Choose a job to move."), { error: "List the jobs to move as job ids." })
  .max(200, { error: "At most 200 jobs move with one run." })
  .default([]);

export const coatingRunSchema = z
  .object({
    vendorId: recordId("Choose the coater."),
    // Optional: the office often learns the price only when the invoice comes with the parts.
    priceCents: runPriceCents.nullable().optional(),
    finish: coatingFinishSchema,
    sentOn: isoDate("the date the parts went out"),
    promisedOn: isoDate("the date the coater promised"),
    receivedOn: isoDate("the date the parts came back").optional(),
    partIds: z
      .array(recordId("Choose a part."), { error: "Choose the parts on this run." })
      .min(1, { error: "A coating run carries at least one part." })
      .max(200, { error: "A coating run carries at most 200 parts." }),
    // Jobs the office ticked to move with the run (into Outside coating on sending, into Install
    // with the receiving inspection); each goes through the same move as a drag on the board.
    moveJobIds: moveJobIdsSchema,
  })
  .superRefine((run, ctx) => {
    if (run.promisedOn < run.sentOn) {
      ctx.addIssue({ code: "custom", path: ["promisedOn"], message: "The promised date cannot be before the sent date." });
    }
    if (run.receivedOn !== undefined && run.receivedOn < run.sentOn) {
      ctx.addIssue({ code: "custom", path: ["receivedOn"], message: "The received date cannot be before the sent date." });
    }
    const seen = new Set<number>();
    run.partIds.forEach((partId, index) => {
      if (seen.has(partId)) {
        ctx.addIssue({ code: "custom", path: ["partIds", index], message: "This part is already on the run." });
      }
      seen.add(partId);
    });
  });
export type CoatingRunInput = z.infer<typeof coatingRunSchema>;

export const receivingInspectionSchema = z.object({
  // Dry film thickness by magnetic or eddy-current gauge (ASTM D7091); powder is commonly 2–3 mils.
  dftReadingsMils: z
    .array(
      z
        .number({ error: "Enter each film-thickness reading in mils." })
        .min(0.1, { error: "A film-thickness reading is 0.1 to 40 mils; check the unit (mils, not µm)." })
        .max(40, { error: "A film-thickness reading is 0.1 to 40 mils; check the unit (mils, not µm)." }),
      { error: "Enter the film-thickness readings." },
    )
    .min(1, { error: "Enter at least one film-thickness reading." })
    .max(20, { error: "Enter at most 20 film-thickness readings." }),
  adhesionOk: z.boolean({ error: "Say whether the coating passed the adhesion check." }),
  defects: z
    .string({ error: "Describe any defects, or leave the box empty." })
    .trim()
    .max(2000, { error: "Keep the defects note to 2000 characters." })
    .default(""),
});
export type ReceivingInspectionInput = z.infer<typeof receivingInspectionSchema>;

const checkShape = Object.fromEntries(
  SIGN_OFF_CHECK_KEYS.map((key) => [key, z.boolean({ error: "A check is ticked or not." }).optional()]),
) as Record<SignOffCheckKey, z.ZodOptional<z.ZodBoolean>>;

// Every field is optional so a half-done run test saves as a draft; signOffMissing decides complete.
export const wiringSignOffSchema = z.object({
  indicatorSource: z.enum(INDICATOR_SOURCES, { error: "Choose the indicator source." }).nullish(),
  indicatorInput: z.enum(INDICATOR_INPUTS, { error: "Choose the indicator input." }).nullish(),
  checks: z.object(checkShape).default({}),
  // Gear-pump wet kits relieve at a few thousand psi (from memory); 10,000 catches a kPa slip.
  reliefPressurePsi: z
    .number({ error: "Enter the relief pressure in psi." })
    .positive({ error: "Relief pressure must be above 0 psi." })
    .max(10_000, { error: "Relief pressure above 10,000 psi is not plausible; enter psi, not kPa." })
    .nullish(),
  timedRunMinutes: z
    .number({ error: "Enter the timed run in minutes." })
    .positive({ error: "The timed run must last more than 0 minutes." })
    .max(600, { error: "A timed run above 600 minutes is not plausible; check the entry." })
    .nullish(),
  signedBy: z
    .string({ error: "Enter the name of the person signing." })
    .trim()
    .max(120, { error: "Keep the name to 120 characters." })
    .nullish(),
});
export type WiringSignOff = z.output<typeof wiringSignOffSchema>;
export type WiringSignOffFormInput = z.input<typeof wiringSignOffSchema>;

// A save names the version it edited (0 before the first save), so a tab left open cannot
// re-complete a sign-off someone has since un-ticked.
export const signOffSaveSchema = wiringSignOffSchema.extend({
  expectedVersion: z
    .number({ error: "Send expectedVersion: the version of the sign-off you edited (0 if none was saved yet)." })
    .int({ error: "expectedVersion must be a whole number." })
    .min(0, { error: "expectedVersion must be 0 or more." })
    .max(1_000_000, { error: "expectedVersion is too large." }),
});
export type SignOffSave = z.output<typeof signOffSaveSchema>;

// An unknown key in a body gets the schema's own plain-word message; other object errors keep zod's.
const strictError = (message: string) => (issue: { code?: string }) =>
  issue.code === "unrecognized_keys" ? message : issue.code === "invalid_type" ? "Send the changes as a JSON object." : undefined;

// Same sane range as the calculator's tank dimensions: 1 to 240 in.
const tankInches = (what: string) =>
  z
    .number({ error: `Enter the tank's ${what} in inches.` })
    .min(1, { error: `The tank's ${what} is 1 to 240 in.` })
    .max(240, { error: `The tank's ${what} is 1 to 240 in.` });

export const partGeometrySchema = z.discriminatedUnion(
  "shape",
  [
    z.object({ shape: z.literal("round"), insideDiameterIn: tankInches("inside diameter"), lengthIn: tankInches("length") }),
    z.object({
      shape: z.literal("box"),
      lengthIn: tankInches("length"),
      widthIn: tankInches("width"),
      heightIn: tankInches("height"),
    }),
    // The calculator's D-shaped tank: width from the rail to the crown of the half round.
    z.object({
      shape: z.literal("d"),
      lengthIn: tankInches("length"),
      widthIn: tankInches("width"),
      heightIn: tankInches("height"),
    }),
  ],
  { error: "Tank geometry is round (inside diameter and length), or box or D-shaped (length, width and height)." },
);
export type PartGeometry = z.infer<typeof partGeometrySchema>;

const partFields = {
  name: name("the part's name"),
  kind: z.enum(PART_KINDS, { error: "Choose the kind of part: reservoir, box, bracket or other." }),
  material: z.enum(PART_MATERIALS, { error: "Choose the material: aluminum, stainless or carbon steel." }),
  shape: z.enum(PART_SHAPES, { error: "Choose the shape: round, box, D-shaped or other." }),
  geometry: partGeometrySchema.nullable(),
  needsLeakTest: z.boolean({ error: "Say whether the part gets a leak test." }),
  needsCoating: z.boolean({ error: "Say whether the part goes out for coating." }),
  notes: z.string({ error: "Notes are text." }).trim().max(2000, { error: "Keep the notes to 2000 characters." }),
};

export type PartRecord = {
  kind: PartKind;
  shape: (typeof PART_SHAPES)[number];
  geometry: PartGeometry | null;
  needsLeakTest: boolean;
};

/** Rules that tie a part's fields together; checked on create and again on every edit, after merging. */
export function partProblems(part: PartRecord): { path: string; message: string }[] {
  const problems: { path: string; message: string }[] = [];
  if (part.geometry && part.kind !== "reservoir") {
    problems.push({ path: "geometry", message: "Only a reservoir carries tank geometry; clear it or make the part a reservoir." });
  }
  if (part.geometry && part.geometry.shape !== part.shape) {
    problems.push({ path: "shape", message: `The geometry is for a ${part.geometry.shape === "d" ? "D-shaped" : part.geometry.shape} tank; set the shape to match.` });
  }
  // A D-shaped tank's width runs from the flat side to the crown of the half round of diameter
  // h, so it is at least h/2 (the calculator refuses the same).
  if (part.geometry?.shape === "d" && part.geometry.widthIn < part.geometry.heightIn / 2) {
    problems.push({
      path: "geometry.widthIn",
      message: `A D-shaped tank's width (${part.geometry.widthIn} in) runs from the rail to the crown of the curve, so it is at least half its height (${part.geometry.heightIn / 2} in).`,
    });
  }
  // Trade reference: fabricated tanks are leak-tested with low air before they are finished.
  if (part.kind === "reservoir" && !part.needsLeakTest) {
    problems.push({ path: "needsLeakTest", message: "A fabricated reservoir is always leak-tested before coating." });
  }
  return problems;
}

function addPartProblems(part: PartRecord, ctx: z.RefinementCtx) {
  for (const problem of partProblems(part)) ctx.addIssue({ code: "custom", path: [problem.path], message: problem.message });
}

export const partInputSchema = z
  .object({
    ...partFields,
    // A tank's shape follows its geometry; anything else is "other" unless the form says.
    shape: partFields.shape.optional(),
    geometry: partFields.geometry.optional(),
    needsLeakTest: partFields.needsLeakTest,
    notes: partFields.notes.default(""),
  })
  .transform((part) => ({
    ...part,
    geometry: part.geometry ?? null,
    shape: part.shape ?? part.geometry?.shape ?? (part.kind === "box" ? ("box" as const) : ("other" as const)),
  }))
  .superRefine(addPartProblems);
export type PartInput = z.output<typeof partInputSchema>;

export const partPatchSchema = z
  .strictObject(
    {
    name: partFields.name.optional(),
    kind: partFields.kind.optional(),
    material: partFields.material.optional(),
    shape: partFields.shape.optional(),
    geometry: partFields.geometry.optional(),
    needsLeakTest: partFields.needsLeakTest.optional(),
    needsCoating: partFields.needsCoating.optional(),
    notes: partFields.notes.optional(),
    // Marking a part reworked voids every earlier test of it: a repaired seam is an untested seam.
    reworked: z.literal(true, { error: "Send reworked: true to mark the part reworked." }).optional(),
    reworkNote: z.string({ error: "Say what was reworked." }).trim().max(500, { error: "Keep the rework note to 500 characters." }).optional(),
    },
    { error: strictError("Only a part's name, kind, material, shape, geometry, test and coating flags, notes and rework can be changed.") },
  )
  .refine((patch) => Object.keys(patch).length > 0, { error: "Send at least one change." });
export type PartPatch = z.infer<typeof partPatchSchema>;

// The job page's form names the job it was opened from, so a leak test is never filed on another job's tank.
export const leakTestRequestSchema = z.object({ jobId: recordId("The job id must be a positive whole number.").optional() }).and(leakTestInputSchema);
export type LeakTestRequest = z.output<typeof leakTestRequestSchema>;

const optionalText = (what: string, max: number) =>
  z.string({ error: `${what} is text.` }).trim().max(max, { error: `Keep ${what.toLowerCase()} to ${max} characters.` }).default("");

export const vendorInputSchema = z.object({
  name: name("the coater's name"),
  contact: optionalText("The contact's name", 120),
  phone: optionalText("The phone number", 40),
  email: optionalText("The e-mail address", 200).refine((email) => email === "" || z.email().safeParse(email).success, {
    error: "Enter an e-mail address like office@coater.example, or leave it empty.",
  }),
  usualTurnaroundDays: z
    .number({ error: "Enter the usual turnaround in business days." })
    .int({ error: "Enter the usual turnaround as whole business days." })
    .min(1, { error: "The usual turnaround is 1 to 60 business days." })
    .max(60, { error: "The usual turnaround is 1 to 60 business days." }),
  notes: optionalText("The notes", 1000),
});
export type VendorInput = z.infer<typeof vendorInputSchema>;

export const coatingRunPatchSchema = z
  .strictObject(
    {
      receivedOn: isoDate("the date the parts came back").optional(),
      promisedOn: isoDate("the date the coater promised").optional(),
      inspection: receivingInspectionSchema.optional(),
      priceCents: runPriceCents.nullable().optional(),
      moveJobIds: moveJobIdsSchema.optional(),
    },
    {
      error: strictError(
        "Only the received date, the promised date, the coater's price and the receiving inspection can be changed (and the jobs to move to Install with the inspection).",
      ),
    },
  )
  .refine((patch) => Object.keys(patch).some((k) => k !== "moveJobIds"), { error: "Send the received date, the promised date, the coater's price or the inspection." })
  .refine((patch) => !patch.moveJobIds?.length || patch.inspection, {
    path: ["moveJobIds"],
    error: "Jobs move to Install with the receiving inspection: record it in the same save.",
  });
export type CoatingRunPatch = z.infer<typeof coatingRunPatchSchema>;

// Past half a psi over a hold at 1.5–5 psig a tank is plainly leaking (common practice, no published source).
export const MAX_ALLOWED_DROP_PSI = 0.5;

export const recordsSettingsPatchSchema = z.strictObject(
  {
    leakAllowedDropPsi: z
      .number({ error: "Enter the allowed drop in psi." })
      .min(0, { error: `The allowed drop is 0 to ${MAX_ALLOWED_DROP_PSI} psi.` })
      .max(MAX_ALLOWED_DROP_PSI, { error: `The allowed drop is 0 to ${MAX_ALLOWED_DROP_PSI} psi.` }),
  },
  { error: strictError("Only the leak test's allowed drop can be changed here.") },
);

const procedureNumber = (what: string, unit: string, limits: { min: number; max: number }) =>
  z
    .number({ error: `Enter ${what} in ${unit}.` })
    .min(limits.min, { error: `${what[0].toUpperCase()}${what.slice(1)} is ${limits.min} to ${limits.max} ${unit}.` })
    .max(limits.max, { error: `${what[0].toUpperCase()}${what.slice(1)} is ${limits.min} to ${limits.max} ${unit}.` });

/** The owner's change to the leak-test procedure; the merged result is checked again (lowest below highest). */
export const leakTestProcedurePatchSchema = z
  .strictObject(
    {
      minHoldMinutes: procedureNumber("the shortest hold", "min", PROCEDURE_LIMITS.minHoldMinutes),
      gaugeRatioMin: procedureNumber("the lowest gauge ratio", "× the test pressure", PROCEDURE_LIMITS.gaugeRatio),
      gaugeRatioMax: procedureNumber("the highest gauge ratio", "× the test pressure", PROCEDURE_LIMITS.gaugeRatio),
      roundMinPsig: procedureNumber("the round tank's lowest test pressure", "psig", PROCEDURE_LIMITS.testPsig),
      roundMaxPsig: procedureNumber("the round tank's highest test pressure", "psig", PROCEDURE_LIMITS.testPsig),
      boxMinPsig: procedureNumber("the box tank's lowest test pressure", "psig", PROCEDURE_LIMITS.testPsig),
      boxMaxPsig: procedureNumber("the box tank's highest test pressure", "psig", PROCEDURE_LIMITS.testPsig),
      calibrationMonths: z
        .number({ error: "Enter the oldest gauge calibration accepted, in months." })
        .int({ error: "Enter the calibration age in whole months." })
        .min(PROCEDURE_LIMITS.calibrationMonths.min, { error: `The calibration age is ${PROCEDURE_LIMITS.calibrationMonths.min} to ${PROCEDURE_LIMITS.calibrationMonths.max} months.` })
        .max(PROCEDURE_LIMITS.calibrationMonths.max, { error: `The calibration age is ${PROCEDURE_LIMITS.calibrationMonths.min} to ${PROCEDURE_LIMITS.calibrationMonths.max} months.` }),
    },
    { error: strictError("Only the leak-test procedure's hold, gauge ratios, test-pressure bands and calibration age can be changed here.") },
  )
  .partial()
  .refine((patch) => Object.keys(patch).length > 0, { error: "Send at least one of the procedure's figures." });
export type LeakTestProcedurePatch = z.infer<typeof leakTestProcedurePatchSchema>;

/** Lowest below highest, for each pair, once the change is merged with what is stored. */
export function procedureProblems(p: LeakTestProcedure): Record<string, string> {
  const problems: Record<string, string> = {};
  if (p.gaugeRatioMin >= p.gaugeRatioMax) problems.gaugeRatioMax = `The highest gauge ratio must be above the lowest (${p.gaugeRatioMin}×).`;
  if (p.roundMinPsig >= p.roundMaxPsig) problems.roundMaxPsig = `The round tank's highest test pressure must be above its lowest (${p.roundMinPsig} psig).`;
  if (p.boxMinPsig >= p.boxMaxPsig) problems.boxMaxPsig = `The box tank's highest test pressure must be above its lowest (${p.boxMinPsig} psig).`;
  return problems;
}
