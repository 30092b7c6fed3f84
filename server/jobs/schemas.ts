import { z } from "zod";
import { calendarDate } from "@/server/http/calendar-date";
import { STAGES } from "@/db/schema";

const isoDate = calendarDate("the due date");
const id = (what: string) => z.number({ message: `Choose a ${what}.` }).int(`Choose a ${what}.`).positive(`Choose a ${what}.`);

export const stageSchema = z.enum(STAGES, { message: "Unknown stage. Use one of: " + STAGES.join(", ") + "." });

export const newJobSchema = z.object({
  customerId: id("customer"),
  truckId: id("truck"),
  scope: z.enum(["fabrication", "install_only"], { message: "Say whether the job has fabricated parts." }),
  description: z.string().trim().min(1, "Describe the work (for example: wet kit with a 40 gal round tank).").max(500, "Keep the description under 500 characters."),
  dueOn: isoDate.nullable().optional(),
  assignedTechId: z.string().uuid("Choose someone from the staff list.").nullable().optional(),
  priority: z.enum(["normal", "rush"], { message: "Priority is normal or rush." }).default("normal"),
  notes: z.string().max(4000, "Keep notes under 4000 characters.").default(""),
});

export const jobPatchSchema = z
  .object({
    version: z.number({ message: "Send the job's version (it guards against overwriting someone else's change)." }).int().positive(),
    truckId: id("truck").optional(),
    scope: newJobSchema.shape.scope.optional(),
    description: newJobSchema.shape.description.optional(),
    dueOn: isoDate.nullable().optional(),
    assignedTechId: z.string().uuid("Choose someone from the staff list.").nullable().optional(),
    priority: z.enum(["normal", "rush"]).optional(),
    notes: z.string().max(4000, "Keep notes under 4000 characters.").optional(),
  })
  .strict();

/** What a tech may change on a job: the notes, nothing else. */
export const TECH_EDITABLE = ["notes"] as const;

export const moveSchema = z
  .object({
    toStage: stageSchema,
    beforeJobId: z.number().int("beforeJobId must be a job id.").positive("beforeJobId must be a job id.").nullable().optional(),
    version: z.number({ message: "Send the card's version." }).int().positive("The version is a positive whole number."),
    note: z.string().trim().max(1000, "Keep the note under 1000 characters.").optional(),
    override: z.object({ reason: z.string().trim().min(5, "Write why the job moves on without what it needs (at least a few words).").max(1000) }).optional(),
  })
  .strict();

export const boardFilterSchema = z.object({
  tech: z.string().max(64).optional(),
  customer: z.coerce.number().int().positive().optional(),
  due: z.enum(["overdue", "week", "two_weeks"]).optional(),
  q: z.string().trim().max(60).optional(),
});

/**
 * The Jobs list's filters as they stand in its URL (and the board's customer and tech), read the
 * same way by the page and by the CSV export: `due` is `late` or `soon`, `email` is `failed`.
 */
export const jobListParamsSchema = z.object({
  stage: stageSchema.optional(),
  q: z.string().trim().max(60, "Keep the search under 60 characters.").optional(),
  sort: z.enum(["newest", "due", "customer", "stage"], { message: "sort is newest, due, customer or stage." }).optional(),
  due: z.enum(["late", "soon"], { message: "due is late or soon." }).optional(),
  email: z.enum(["failed"], { message: "email is failed (jobs with a customer e-mail that failed to send)." }).optional(),
  customer: z.coerce.number({ message: "customer is a customer's id." }).int("customer is a customer's id.").positive("customer is a customer's id.").optional(),
  tech: z.union([z.literal("none"), z.string().uuid()], { message: "tech is a staff id, or none for jobs nobody is assigned to." }).optional(),
});
export type JobListParams = z.infer<typeof jobListParamsSchema>;

export type NewJobInput = z.infer<typeof newJobSchema>;
export type JobPatch = z.infer<typeof jobPatchSchema>;
export type MoveInput = z.infer<typeof moveSchema>;
export type BoardFilter = z.infer<typeof boardFilterSchema>;
