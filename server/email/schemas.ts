import { z } from "zod";
import { STAGES } from "@/db/schema";

/** Stages whose arrival e-mails the customer unless the shop says otherwise. */
export const DEFAULT_NOTIFY_STAGES = STAGES.filter((s) => s !== "queued");
export const DEFAULT_STATUS_LINK_DAYS = 60;

export const notifySettingsSchema = z
  .object({
    notifyStages: z.array(z.enum(STAGES, { message: `Unknown stage. Use: ${STAGES.join(", ")}.` }), { message: "List the stages that e-mail the customer." }).max(STAGES.length),
    statusLinkDays: z
      .number({ message: "Say how many days a status link keeps working after delivery." })
      .int("Use whole days.")
      .min(1, "A status link must work at least 1 day after delivery.")
      .max(365, "Keep it to 365 days or fewer."),
    quietMinutes: z
      .number({ message: "Say how many minutes a stage e-mail waits after a move." })
      .int("Use whole minutes.")
      .min(0, "Use 0 minutes or more (0 sends at once).")
      .max(60, "Keep it to 60 minutes or fewer: the customer should hear the same hour.")
      .optional(),
  })
  .strict();

export const emailSettingsSchema = z
  .object({
    emailOff: z.boolean({ message: "Say whether e-mail is off for this job (true or false)." }),
    contactIds: z.array(z.number().int().positive("Contact ids are positive whole numbers."), { message: "List the contacts who get e-mail." }).max(50, "Choose at most 50 contacts."),
  })
  .strict();

export const outboxIdSchema = z.uuid({ message: "A message id looks like 3f2b…-…; this one does not." });

export type NotifySettingsInput = z.infer<typeof notifySettingsSchema>;
export type EmailSettingsInput = z.infer<typeof emailSettingsSchema>;

/** The office's choice when issuing a new status link: e-mail it to the job's contacts now, or not. */
export const issueLinkSchema = z
  .object({
    emailContacts: z.boolean({ message: "Say whether to e-mail the new link to the job's contacts (true or false)." }).default(false),
  })
  .strict();
export type IssueLinkInput = z.infer<typeof issueLinkSchema>;
