import { z } from "zod";
import { calendarDate } from "@/server/http/calendar-date";
import { MAX_ALLOWED_DROP_PSI } from "@/server/records/schemas";

function isTimeZone(raw: string): boolean {
  try {
    new Intl.DateTimeFormat("en-US", { timeZone: raw });
    return true;
  } catch {
    return false;
  }
}

/** The shop's own details, saved together from the Settings page; `version` refuses a stale form. */
export const shopDetailsSchema = z.strictObject({
  version: z.number({ error: "Send the settings' version (it guards against overwriting someone else's change)." }).int().positive(),
  name: z.string({ error: "Enter the shop's name." }).trim().min(1, { error: "Enter the shop's name." }).max(80, { error: "Keep the shop's name under 80 characters." }),
  phone: z.string({ error: "Enter the shop's phone number, or leave it empty." }).trim().max(40, { error: "Keep the phone number under 40 characters." }),
  address: z.string({ error: "Enter the shop's address, or leave it empty." }).trim().max(300, { error: "Keep the address under 300 characters." }),
  timeZone: z
    .string({ error: "Choose the shop's time zone." })
    .trim()
    .refine(isTimeZone, { error: "That is not a time zone this server knows. Use a name like US/Central or America/Denver." }),
  workOrderPrefix: z
    .string({ error: "Enter the work-order prefix." })
    .trim()
    .regex(/^[A-Za-z0-9]{1,6}$/, { error: "The work-order prefix is 1 to 6 letters or digits (for example WO)." })
    .transform((s) => s.toUpperCase()),
  holidays: z
    .array(z.strictObject({ day: calendarDate("the holiday"), name: z.string().trim().max(60, { error: "Keep a holiday's name under 60 characters." }).default("") }), {
      error: "Send the holidays as a list.",
    })
    .max(100, { error: "At most 100 holidays at a time: remove past ones first." })
    .refine((list) => new Set(list.map((h) => h.day)).size === list.length, { error: "A day is listed twice among the holidays." }),
  showPredictedDate: z.boolean({ error: "Say whether the status page shows the likely ready date." }),
  leakAllowedDropPsi: z
    .number({ error: "Enter the allowed leak-test drop in psi." })
    .min(0, { error: `The allowed drop is 0 to ${MAX_ALLOWED_DROP_PSI} psi.` })
    .max(MAX_ALLOWED_DROP_PSI, { error: `The allowed drop is 0 to ${MAX_ALLOWED_DROP_PSI} psi.` }),
});
export type ShopDetailsInput = z.infer<typeof shopDetailsSchema>;
