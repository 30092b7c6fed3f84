import { z } from "zod";
import { CUSTOMER_KINDS, CUSTOMER_LIMITS, type CustomerKind } from "./labels";

// Kinds, labels and limits need no zod, so the customer form in the browser imports them from ./labels.
export { CUSTOMER_KINDS, CUSTOMER_KIND_LABELS, CUSTOMER_LIMITS, type CustomerKind } from "./labels";

export const requiredText = (what: string, max: number) =>
  z
    .string({ error: `Enter ${what}.` })
    .trim()
    .min(1, { error: `Enter ${what}.` })
    .max(max, { error: `Keep ${what} to ${max} characters.` });

export const optionalText = (what: string, max: number) =>
  z
    .string({ error: `Enter ${what} as text.` })
    .trim()
    .max(max, { error: `Keep ${what} to ${max} characters.` });

export const phoneSchema = optionalText("the phone number", CUSTOMER_LIMITS.phone);

const EMAIL_MESSAGE = "Enter an e-mail address like name@fleet.example, or leave it empty.";

/** An e-mail address or nothing: forms send an empty box as "". */
export const optionalEmailSchema = z
  .string({ error: "Enter the e-mail address as text." })
  .trim()
  .toLowerCase()
  .max(CUSTOMER_LIMITS.email, { error: `Keep the e-mail address to ${CUSTOMER_LIMITS.email} characters.` })
  .pipe(z.union([z.literal(""), z.email({ error: EMAIL_MESSAGE })], { error: EMAIL_MESSAGE }));

export const customerKindSchema = z.enum(CUSTOMER_KINDS, { error: "Choose company or owner-operator." });

const contactFields = {
  name: requiredText("the contact's name", CUSTOMER_LIMITS.name),
  email: optionalEmailSchema.default(""),
  phone: phoneSchema.default(""),
  receivesEmail: z.boolean({ error: "Say whether this contact gets e-mail updates (true or false)." }).optional(),
};

// Status e-mails go to contacts that ask for them; one with no address could never receive them,
// so the box defaults to "yes" only when there is an address, and "yes" without one is refused.
function withEmailRule<T extends { email: string; receivesEmail?: boolean }>(contact: z.ZodType<T>) {
  return contact
    .refine((c) => !(c.receivesEmail === true && c.email === ""), {
      error: "Add an e-mail address, or untick \u201cgets e-mail updates\u201d.",
      path: ["email"],
    })
    .transform((c) => ({ ...c, receivesEmail: c.receivesEmail ?? c.email !== "" }));
}

export const newContactSchema = withEmailRule(z.object(contactFields));

export const contactEditSchema = withEmailRule(
  z.object({
    id: z.number({ error: "A contact id is a number." }).int({ error: "A contact id is a whole number." }).positive({ error: "A contact id is a positive number." }).optional(),
    ...contactFields,
  }),
);

const contactList = <S extends z.ZodType>(contact: S) =>
  z.array(contact, { error: "Send contacts as a list." }).max(CUSTOMER_LIMITS.contacts, { error: `List at most ${CUSTOMER_LIMITS.contacts} contacts.` });

export const newCustomerSchema = z.object({
  kind: customerKindSchema,
  name: requiredText("the customer's name", CUSTOMER_LIMITS.name),
  phone: phoneSchema.default(""),
  email: optionalEmailSchema.default(""),
  notes: optionalText("the notes", CUSTOMER_LIMITS.notes).default(""),
  contacts: contactList(newContactSchema).default([]),
});
export type NewCustomerInput = z.infer<typeof newCustomerSchema>;

export const customerPatchSchema = z
  .object({
    kind: customerKindSchema.optional(),
    name: requiredText("the customer's name", CUSTOMER_LIMITS.name).optional(),
    phone: phoneSchema.optional(),
    email: optionalEmailSchema.optional(),
    notes: optionalText("the notes", CUSTOMER_LIMITS.notes).optional(),
    contacts: contactList(contactEditSchema)
      .superRefine((contacts, ctx) => {
        const seen = new Set<number>();
        contacts.forEach((c, i) => {
          if (c.id === undefined) return;
          if (seen.has(c.id)) ctx.addIssue({ code: "custom", path: [i, "id"], message: "This contact is listed twice." });
          seen.add(c.id);
        });
      })
      .optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), {
    error: "Say what to change: kind, name, phone, email, notes or contacts.",
  });
export type CustomerPatch = z.infer<typeof customerPatchSchema>;

export const CUSTOMER_SORTS = ["name", "kind", "trucks"] as const;
export type CustomerSort = (typeof CUSTOMER_SORTS)[number];

export const customerListQuerySchema = z.object({
  q: z
    .string()
    .trim()
    .max(CUSTOMER_LIMITS.search, { error: `Keep the search to ${CUSTOMER_LIMITS.search} characters.` })
    .optional(),
  sort: z.enum(CUSTOMER_SORTS, { error: "Sort by name, kind or trucks." }).optional(),
  dir: z.enum(["asc", "desc"], { error: "Sort direction is asc or desc." }).optional(),
});
export type CustomerListQuery = z.infer<typeof customerListQuerySchema>;

/** What the API and pages show; columns are renamed to the API's camelCase once, in the queries. */
export interface CustomerListRow {
  id: number;
  kind: CustomerKind;
  name: string;
  phone: string;
  email: string;
  truckCount: number;
  openJobCount: number;
}

export interface CustomerFacts {
  id: number;
  kind: CustomerKind;
  name: string;
  phone: string;
  email: string;
  notes: string;
  createdAt: string;
}

export interface ContactView {
  id: number;
  name: string;
  email: string;
  phone: string;
  receivesEmail: boolean;
}
