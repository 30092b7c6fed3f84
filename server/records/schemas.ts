import { z } from "zod";
import { expectedEndPressurePsig, SEA_LEVEL_PSIA } from "./leak-test";
import { INDICATOR_INPUTS, INDICATOR_SOURCES, SIGN_OFF_CHECK_KEYS, type SignOffCheckKey } from "./sign-off";

// Numbers arrive as numbers: the form converts its fields before parsing, so an empty box is
// "missing", never a silent 0.

const isoDate = (what: string) => z.iso.date({ error: `Enter ${what} as a date (YYYY-MM-DD).` });

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
    startPressurePsig: psig("Start pressure"),
    endPressurePsig: psig("End pressure"),
    startTempF: shopTempF("the start temperature"),
    endTempF: shopTempF("the end temperature"),
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
      if (test[reading] > test.gaugeFullScalePsi) {
        ctx.addIssue({
          code: "custom",
          path: [reading],
          message: `The reading is above the gauge's ${test.gaugeFullScalePsi} psi full scale; check the reading or the gauge.`,
        });
      }
    }
    const highestEnd = Math.max(test.startPressurePsig, expectedEndPressurePsig(test)) + END_PRESSURE_RISE_SLACK_PSI;
    if (test.endPressurePsig > highestEnd) {
      ctx.addIssue({
        code: "custom",
        path: ["endPressurePsig"],
        message: `End pressure is higher than warming can explain (at most ${highestEnd.toFixed(2)} psig); check the readings.`,
      });
    }
  });
export type LeakTestInput = z.output<typeof leakTestInputSchema>;
export type LeakTestFormInput = z.input<typeof leakTestInputSchema>;

// Powder-coat gloss levels as coaters quote them (common practice, no published source).
export const GLOSS_LEVELS = ["flat", "matte", "satin", "semi_gloss", "gloss", "high_gloss"] as const;

export const coatingFinishSchema = z.object({
  colour: name("the colour"),
  gloss: z.enum(GLOSS_LEVELS, { error: "Choose the gloss level." }),
});
export type CoatingFinish = z.infer<typeof coatingFinishSchema>;

// Row ids are the database's integer keys.
const recordId = (message: string) =>
  z.number({ error: message }).int({ error: message }).positive({ error: message });

export const coatingRunSchema = z
  .object({
    vendorId: recordId("Choose the coater."),
    finish: coatingFinishSchema,
    sentOn: isoDate("the date the parts went out"),
    promisedOn: isoDate("the date the coater promised"),
    receivedOn: isoDate("the date the parts came back").optional(),
    partIds: z
      .array(recordId("Choose a part."), { error: "Choose the parts on this run." })
      .min(1, { error: "A coating run carries at least one part." })
      .max(200, { error: "A coating run carries at most 200 parts." }),
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
