import { z } from "zod";
import { BOUGHT_PART_KINDS } from "@/db/tables/bought-parts";
import { calendarDate } from "@/server/http/calendar-date";

// Row ids are the database's integer keys.
const recordId = (message: string) => z.number({ error: message }).int({ error: message }).positive({ error: message }).max(2 ** 53 - 1, { error: message });

const text = (what: string, max: number) =>
  z.string({ error: `${what} is text.` }).trim().max(max, { error: `Keep ${what.toLowerCase()} to ${max} characters.` });

// The API carries cents, but the person types dollars in the form ("Cost of one ($)"), so a
// refusal of what they typed speaks of dollars and cents, never of whole cents.
export const DOLLARS_AND_CENTS = "Type dollars and cents, such as 48.75.";

// Up to $1,000,000 for one bought-in item, in cents: anything more is a slip of the finger.
export const MAX_UNIT_COST_CENTS = 100_000_000;
const cents = (what: string) =>
  z
    .number({ error: DOLLARS_AND_CENTS })
    .int({ error: DOLLARS_AND_CENTS })
    .min(0, { error: `${what[0].toUpperCase()}${what.slice(1)} cannot be negative.` })
    .max(MAX_UNIT_COST_CENTS, { error: `${what[0].toUpperCase()}${what.slice(1)} is at most $1,000,000.00.` });

const quantity = z
  .number({ error: "Enter the quantity as a whole number." })
  .int({ error: "Enter the quantity as a whole number." })
  .min(1, { error: "The quantity is at least 1." })
  .max(9999, { error: "The quantity is at most 9,999." });

const fields = {
  kind: z.enum(BOUGHT_PART_KINDS, { error: "Choose the kind: PTO, pump, valve, hose, fitting, control or other." }),
  description: text("The description", 200).min(1, { error: "Say what the part is, as the supplier writes it." }),
  partNumber: text("The part number", 80),
  quantity,
  supplier: text("The supplier", 120),
  costCents: cents("the cost of one").nullable(),
  fitsTransmission: text("The transmission it fits", 80),
  // PTO output ratio as % of engine speed, the calculator's unit; same range the calculator takes.
  ratioPercent: z.number({ error: "Enter the PTO ratio as % of engine speed, like 122." }).min(10, { error: "Enter the PTO ratio as % of engine speed (10 to 300), like 122." }).max(300, { error: "Enter the PTO ratio as % of engine speed (10 to 300), like 122." }).nullable(),
  displacementCuIn: z.number({ error: "Enter the pump's displacement in cu in per revolution." }).gt(0, { error: "The pump's displacement is above 0 cu in/rev." }).max(50, { error: "The pump's displacement is at most 50 cu in/rev; check the figure." }).nullable(),
};

const strictError = (message: string) => (issue: { code?: string }) =>
  issue.code === "unrecognized_keys" ? message : issue.code === "invalid_type" ? "Send the part as a JSON object." : undefined;

export const boughtPartInputSchema = z.strictObject(
  {
    kind: fields.kind,
    description: fields.description,
    quantity: fields.quantity,
    partNumber: fields.partNumber.default(""),
    supplier: fields.supplier.default(""),
    costCents: fields.costCents.optional(),
    fitsTransmission: fields.fitsTransmission.default(""),
    ratioPercent: fields.ratioPercent.default(null),
    displacementCuIn: fields.displacementCuIn.default(null),
  },
  { error: strictError("A bought-in part takes kind, description, quantity, partNumber, supplier, costCents, fitsTransmission, ratioPercent and displacementCuIn.") },
);
export type BoughtPartInput = z.output<typeof boughtPartInputSchema>;

export const boughtPartPatchSchema = z
  .strictObject(
    {
      kind: fields.kind.optional(),
      description: fields.description.optional(),
      partNumber: fields.partNumber.optional(),
      quantity: fields.quantity.optional(),
      supplier: fields.supplier.optional(),
      costCents: fields.costCents.optional(),
      fitsTransmission: fields.fitsTransmission.optional(),
      ratioPercent: fields.ratioPercent.optional(),
      displacementCuIn: fields.displacementCuIn.optional(),
      installed: z.boolean({ error: "Send installed as true or false." }).optional(),
    },
    { error: strictError("Only a bought-in part's kind, description, part number, quantity, supplier, cost, fit figures and installed mark can be changed.") },
  )
  .refine((patch) => Object.keys(patch).length > 0, { error: "Send at least one change." });
export type BoughtPartPatch = z.output<typeof boughtPartPatchSchema>;

export const receiptInputSchema = z.strictObject(
  { quantity: fields.quantity },
  { error: strictError("A receipt takes only the quantity received.") },
);

export const purchaseOrderInputSchema = z
  .strictObject(
    {
      supplier: text("The supplier", 120).min(1, { error: "Enter the supplier the order goes to." }),
      partIds: z.array(recordId("Choose the bought-in parts to order."), { error: "Choose the bought-in parts to order." }).min(1, { error: "Choose at least one bought-in part to order." }).max(200, { error: "Order at most 200 lines on one purchase order." }),
      orderedOn: calendarDate("the order date"),
      expectedOn: calendarDate("the expected date").nullable().default(null),
      notes: text("The notes", 1000).default(""),
    },
    { error: strictError("A purchase order takes supplier, partIds, orderedOn, expectedOn and notes.") },
  )
  .refine((po) => po.expectedOn === null || po.expectedOn >= po.orderedOn, { error: "The expected date cannot be before the order date.", path: ["expectedOn"] })
  .refine((po) => new Set(po.partIds).size === po.partIds.length, { error: "A part is listed twice; list each once.", path: ["partIds"] });
export type PurchaseOrderInput = z.output<typeof purchaseOrderInputSchema>;

export const purchaseOrderPatchSchema = z.strictObject(
  { expectedOn: calendarDate("the expected date").nullable() },
  { error: strictError("Only a purchase order's expected date can be changed.") },
);

export const labourRateSchema = z.strictObject(
  { labourRateCents: cents("the labour rate").max(10_000_00, { error: "The labour rate is at most $10,000.00 an hour." }) },
  { error: strictError("Send labourRateCents only.") },
);

export { recordId };
