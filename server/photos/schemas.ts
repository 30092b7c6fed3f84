import { z } from "zod";
import { stageSchema } from "@/server/jobs/schemas";

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

export const MAX_PHOTO_BYTES = 8 * 1024 * 1024;
export const MAX_PHOTO_SIZE_LABEL = "8MB";
export const MAX_PHOTOS_PER_UPLOAD = 10;
/** What a phone camera makes at most (12 to 50 megapixels at their usual settings, from memory); a bigger picture costs too much memory to decode. */
export const MAX_PHOTO_PIXELS = 50_000_000;
/** What the shop takes: what phones and cameras write and this server can read. */
export const PHOTO_TYPES = ["image/jpeg", "image/png", "image/webp"] as const;
export type PhotoType = (typeof PHOTO_TYPES)[number];
export const HEIC_ADVICE = "HEIC photos cannot be read here. Set the phone's camera to the most compatible format (JPEG), or pick the photo from the camera button, which sends JPEG.";
