import { z } from "zod";
import { AUDIT_KINDS } from "@/db/tables/audit";
import { parseCalendarDate } from "@/server/records/calendar";

const day = z
  .string()
  .trim()
  .refine((v) => {
    try {
      parseCalendarDate(v);
      return true;
    } catch {
      return false;
    }
  }, "Give a real date as YYYY-MM-DD, e.g. 2026-03-14.");

/** The audit page's filters, from the URL. Empty values mean "any". */
export const auditFilterSchema = z
  .object({
    kind: z.enum(AUDIT_KINDS, { message: "Choose a kind from the list." }).optional(),
    staff: z.string().trim().max(100, "That is not a staff id.").optional(),
    from: day.optional(),
    to: day.optional(),
    before: z.coerce.number({ message: "before is an entry number." }).int("before is an entry number.").positive("before is an entry number.").optional(),
  })
  .refine((f) => !f.from || !f.to || f.from <= f.to, { message: "The first day comes before the last day.", path: ["to"] });
export type AuditFilter = z.infer<typeof auditFilterSchema>;

/** URL search params to a filter input: blank fields are left out. */
export function filterInput(params: URLSearchParams | Record<string, string | string[] | undefined>): Record<string, string> {
  const entries = params instanceof URLSearchParams ? [...params.entries()] : Object.entries(params).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v] as const);
  const out: Record<string, string> = {};
  for (const [k, v] of entries) if (typeof v === "string" && v.trim() !== "" && ["kind", "staff", "from", "to", "before"].includes(k)) out[k] = v;
  return out;
}
