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

export type NewJobInput = z.infer<typeof newJobSchema>;
export type JobPatch = z.infer<typeof jobPatchSchema>;
export type MoveInput = z.infer<typeof moveSchema>;
export type BoardFilter = z.infer<typeof boardFilterSchema>;
