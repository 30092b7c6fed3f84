import { z } from "zod";
import { KIT_USES, LINE_KINDS } from "@/db/tables/money";
import { MAX_CENTS, MAX_QUANTITY_MILLI, MILLI, QUANTITY_ABOVE_ZERO, QUANTITY_LARGEST, QUANTITY_THREE_DECIMALS, toThousandths } from "./totals";

const cents = (label: string) =>
  z
    .number({ error: `${label} must be a number of cents (a whole number: $12.50 is 1250).` })
    .int({ error: `${label} must be whole cents (a whole number: $12.50 is 1250).` })
    .gte(0, { error: `${label} cannot be negative; write a discount as a lower price.` })
    .lte(MAX_CENTS, { error: `${label} is more than $10,000,000.00; check the figure.` });

const text = (label: string, max: number) =>
  z
    .string({ error: `${label} must be text.` })
    .trim()
    .min(1, { error: `${label} is required.` })
    .max(max, { error: `${label} is at most ${max} characters.` });

export const lineKindSchema = z.enum(LINE_KINDS, { error: `Kind must be one of: ${LINE_KINDS.join(", ")}.` });

/** A quantity typed by a person: more than 0, at most three decimals (a minute is 0.017 h, close enough). */
export const quantitySchema = z
  .number({ error: "Quantity must be a number (hours may be fractional: 2.5)." })
  .superRefine((q, ctx) => {
    // One message, in the order a person fixes them (see quantityProblem): a negative is told to be
    // more than 0, not that it has too many decimals.
    const problem = q <= 0 ? QUANTITY_ABOVE_ZERO : q > MAX_QUANTITY_MILLI / MILLI ? QUANTITY_LARGEST : toThousandths(q) === null ? QUANTITY_THREE_DECIMALS : null;
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });

export const quoteLineInputSchema = z.strictObject(
  {
    kind: lineKindSchema,
    description: text("Description", 200),
    quantity: quantitySchema,
    unitPriceCents: cents("Unit price"),
    taxable: z.boolean({ error: "Taxable must be true or false." }),
    priceItemId: z.number().int().positive().max(2 ** 31).nullable().optional(),
  },
  { error: "Each line needs kind, description, quantity, unitPriceCents and taxable." },
);
export type QuoteLineInput = z.infer<typeof quoteLineInputSchema>;

export const quoteLinesSchema = z
  .array(quoteLineInputSchema, { error: "lines must be a list of priced lines." })
  .min(1, { error: "A quote needs at least one line." })
  .max(100, { error: "A quote has at most 100 lines." });

export const quoteCreateSchema = z.strictObject(
  {
    lines: quoteLinesSchema,
    kind: z.enum(["quote", "change_order"], { error: "Kind must be quote or change_order." }).optional(),
    // The earlier sent or declined version this one replaces (change orders; a quote always replaces the waiting one).
    replacesId: z.number({ error: "replacesId must be the id of the version this one replaces." }).int().positive().max(2 ** 31).nullable().optional(),
    note: z.string({ error: "Note must be text." }).trim().max(2000, { error: "The note is at most 2000 characters." }).optional(),
  },
  { error: "Send { lines: [...] } with the quote's lines." },
);
export type QuoteCreate = z.infer<typeof quoteCreateSchema>;

export const quoteUpdateSchema = z.strictObject(
  {
    lines: quoteLinesSchema,
    note: z.string({ error: "Note must be text." }).trim().max(2000, { error: "The note is at most 2000 characters." }).optional(),
    // The draft's updatedAt as the editor loaded it; another person's save in between answers 409.
    updatedAt: z.string({ error: "updatedAt must be the draft's updatedAt as you loaded it." }).max(40).optional(),
  },
  { error: "Send { lines: [...] } with the draft's lines." },
);
export type QuoteUpdate = z.infer<typeof quoteUpdateSchema>;

export const priceItemSchema = z.strictObject(
  {
    kind: lineKindSchema,
    name: text("Name", 120),
    unit: text("Unit", 20),
    unitPriceCents: cents("Price"),
    taxable: z.boolean({ error: "Taxable must be true or false." }),
    kitUse: z.enum(KIT_USES, { error: `Kit spec line must be one of: ${KIT_USES.join(", ")}.` }).nullable().optional(),
    sizeIn: z
      .number({ error: "Hose size must be an inside diameter in inches (1.25)." })
      .gt(0, { error: "Hose size must be more than 0 in." })
      .lte(6, { error: "Hose size is at most 6 in." })
      .refine((q) => toThousandths(q) !== null, { error: "Hose size has at most three decimals." })
      .nullable()
      .optional(),
  },
  { error: "Send kind, name, unit, unitPriceCents and taxable." },
);
export type PriceItemInput = z.infer<typeof priceItemSchema>;

export const priceItemPatchSchema = priceItemSchema
  .partial()
  .extend({ active: z.boolean({ error: "Active must be true or false." }).optional() })
  .refine((p) => Object.keys(p).length > 0, { error: "Send at least one field to change." });
export type PriceItemPatch = z.infer<typeof priceItemPatchSchema>;

export const moneySettingsSchema = z.strictObject(
  {
    taxRatePercent: z
      .number({ error: "Sales tax rate must be a percent (8.25)." })
      .gte(0, { error: "Sales tax rate cannot be negative." })
      .lte(25, { error: "Sales tax rate is at most 25 %; check the figure." })
      .refine((q) => toThousandths(q) !== null, { error: "Sales tax rate has at most three decimals (8.875)." }),
    depositKind: z.enum(["percent", "fixed"], { error: "Deposit is a percent of the quote or a fixed amount." }),
    depositPercent: z
      .number({ error: "Deposit percent must be a whole number from 0 to 100." })
      .int({ error: "Deposit percent must be a whole number from 0 to 100." })
      .gte(0, { error: "Deposit percent must be from 0 to 100." })
      .lte(100, { error: "Deposit percent must be from 0 to 100." }),
    depositFixedCents: cents("Fixed deposit"),
    quoteTerms: z.string({ error: "Terms must be text." }).trim().max(4000, { error: "Terms are at most 4000 characters." }),
  },
  { error: "Send taxRatePercent, depositKind, depositPercent, depositFixedCents and quoteTerms." },
);
export type MoneySettingsInput = z.infer<typeof moneySettingsSchema>;
