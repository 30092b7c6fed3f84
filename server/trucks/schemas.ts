import { z } from "zod";
import { optionalText, requiredText } from "@/server/customers/schemas";
import { VIN_MESSAGES, vinProblem } from "@/server/vehicles/vin";
import { TRUCK_LIMITS } from "./limits";

// The limits need no zod, so the truck form in the browser imports them from ./limits.
export { TRUCK_LIMITS } from "./limits";

/** Model years run one ahead of the calendar; read the clock at parse time, not at start-up. */
export function latestModelYear(now = new Date()) {
  return now.getFullYear() + 1;
}

export const vinSchema = z
  .string({ error: "Enter the VIN." })
  .trim()
  .toUpperCase()
  .superRefine((vin, ctx) => {
    const problem = vinProblem(vin);
    if (problem) ctx.addIssue({ code: "custom", message: VIN_MESSAGES[problem] });
  });

export const modelYearSchema = z
  .number({ error: "Enter the model year as a number, like 2024." })
  .int({ error: "Enter the model year as a whole number, like 2024." })
  .min(TRUCK_LIMITS.firstYear, { error: `Enter a model year from ${TRUCK_LIMITS.firstYear} on.` })
  .refine((year) => year <= latestModelYear(), { error: () => `Enter a model year up to ${latestModelYear()}.` });

const rpmMessage = `Enter the engine speed at work in rpm, ${TRUCK_LIMITS.rpmMin} to ${TRUCK_LIMITS.rpmMax}, or leave it empty.`;

/** Engine speed while the PTO drives the pump; null when not known yet. */
export const workEngineRpmSchema = z
  .number({ error: rpmMessage })
  .int({ error: "Enter the engine speed in whole rpm." })
  .min(TRUCK_LIMITS.rpmMin, { error: rpmMessage })
  .max(TRUCK_LIMITS.rpmMax, { error: rpmMessage })
  .nullable();

export const customerIdSchema = z
  .number({ error: "Choose the customer who owns the truck." })
  .int({ error: "Choose the customer who owns the truck." })
  .positive({ error: "Choose the customer who owns the truck." });

const truckFields = {
  customerId: customerIdSchema,
  unitNumber: requiredText("the unit number", TRUCK_LIMITS.unitNumber),
  vin: vinSchema,
  year: modelYearSchema,
  description: optionalText("the description", TRUCK_LIMITS.description),
  transmission: optionalText("the transmission", TRUCK_LIMITS.transmission),
  workEngineRpm: workEngineRpmSchema,
  // Make, model, transmission and PTO opening are what a PTO is chosen and fitted by.
  make: optionalText("the make", TRUCK_LIMITS.make),
  model: optionalText("the model", TRUCK_LIMITS.model),
  ptoOpening: optionalText("the PTO opening", TRUCK_LIMITS.ptoOpening),
};

export const newTruckSchema = z.object({
  ...truckFields,
  description: truckFields.description.default(""),
  transmission: truckFields.transmission.default(""),
  workEngineRpm: truckFields.workEngineRpm.default(null),
  make: truckFields.make.default(""),
  model: truckFields.model.default(""),
  ptoOpening: truckFields.ptoOpening.default(""),
});
export type NewTruckInput = z.infer<typeof newTruckSchema>;

export const truckPatchSchema = z
  .object({
    customerId: truckFields.customerId.optional(),
    unitNumber: truckFields.unitNumber.optional(),
    vin: truckFields.vin.optional(),
    year: truckFields.year.optional(),
    description: truckFields.description.optional(),
    transmission: truckFields.transmission.optional(),
    workEngineRpm: truckFields.workEngineRpm.optional(),
    make: truckFields.make.optional(),
    model: truckFields.model.optional(),
    ptoOpening: truckFields.ptoOpening.optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), {
    error: "Say what to change: customer, unit number, VIN, year, make, model, description, transmission, PTO opening or engine speed.",
  });
export type TruckPatch = z.infer<typeof truckPatchSchema>;

export const truckListQuerySchema = z.object({
  customerId: z
    .string()
    .regex(/^[1-9][0-9]{0,9}$/, { error: "customerId must be a positive whole number." })
    .transform(Number)
    .optional(),
  q: z
    .string()
    .trim()
    .max(TRUCK_LIMITS.search, { error: `Keep the search to ${TRUCK_LIMITS.search} characters.` })
    .optional(),
});
export type TruckListQuery = z.infer<typeof truckListQuerySchema>;

export interface TruckView {
  id: number;
  customerId: number;
  customerName: string;
  unitNumber: string;
  vin: string;
  year: number;
  description: string;
  transmission: string;
  workEngineRpm: number | null;
  createdAt: string;
  make: string;
  model: string;
  ptoOpening: string;
}
