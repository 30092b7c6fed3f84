import { z } from "zod";

const recordId = (message: string) => z.number({ error: message }).int({ error: message }).positive({ error: message }).max(2 ** 53 - 1, { error: message });

const strictError = (message: string) => (issue: { code?: string }) =>
  issue.code === "unrecognized_keys" ? message : issue.code === "invalid_type" ? "Send the request as a JSON object." : undefined;

export const clockOnSchema = z.strictObject({ jobId: recordId("Say which job to clock on: its id, a positive whole number.") }, { error: strictError("Clocking on takes only the job's id (jobId).") });

// An instant with its offset, as the browser's Date#toISOString writes it.
// A missing or malformed time gets one message: the checks after it wait until it is a time.
const instant = (what: string) =>
  z.iso.datetime({ offset: true, error: `Enter ${what} as a date and time.`, abort: true }).refine((v) => !Number.isNaN(new Date(v).getTime()), { error: `${what[0].toUpperCase()}${what.slice(1)} is not a real time.` });
const isTime = (v: string) => !Number.isNaN(new Date(v).getTime());

export const clockCorrectionSchema = z
  .strictObject(
    {
      startedAt: instant("when the work started"),
      endedAt: instant("when the work ended"),
      reason: z.string({ error: "Say why the entry is corrected." }).trim().min(3, { error: "Say why the entry is corrected (it is kept with the entry)." }).max(500, { error: "Keep the reason to 500 characters." }),
    },
    { error: strictError("A correction takes startedAt, endedAt and reason.") },
  )
  .refine((c) => !isTime(c.startedAt) || !isTime(c.endedAt) || new Date(c.endedAt) >= new Date(c.startedAt), { error: "The end cannot be before the start.", path: ["endedAt"] })
  // Nobody works a 24-hour shift on one job; a longer entry is a date typed wrong.
  .refine((c) => !isTime(c.startedAt) || !isTime(c.endedAt) || new Date(c.endedAt).getTime() - new Date(c.startedAt).getTime() <= 24 * 3_600_000, { error: "An entry is at most 24 hours; split it or check the dates.", path: ["endedAt"] });
export type ClockCorrection = z.output<typeof clockCorrectionSchema>;
