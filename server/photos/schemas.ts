import { z } from "zod";
import { stageSchema } from "@/server/jobs/schemas";

// The upload limits need no zod, so the photo panel in the browser imports them from ./limits.
export { HEIC_ADVICE, MAX_PHOTO_BYTES, MAX_PHOTO_PIXELS, MAX_PHOTO_SIZE_LABEL, MAX_PHOTOS_PER_UPLOAD, PHOTO_TYPES, type PhotoType } from "./limits";

/** What a photo upload says about itself; the files are checked on their own. */
export const photoUploadInput = z.object({
  jobId: z.number({ message: "Say which job the photos belong to." }).int().positive("Say which job the photos belong to."),
  stage: stageSchema,
  partId: z.number().int().positive("A part id is a positive whole number.").nullable().optional(),
  caption: z.string().trim().max(300, "Keep the caption under 300 characters.").default(""),
});
export type PhotoUploadInput = z.infer<typeof photoUploadInput>;

export const photoPatchSchema = z
  .object({
    caption: z.string().trim().max(300, "Keep the caption under 300 characters.").optional(),
    customerVisible: z.boolean({ message: "customerVisible is true or false." }).optional(),
    stage: stageSchema.optional(),
  })
  .strict()
  .refine((p) => Object.keys(p).length > 0, "Send the caption, customerVisible or stage to change.");
export type PhotoPatch = z.infer<typeof photoPatchSchema>;
