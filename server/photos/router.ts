import "server-only";
import { type FileRouter, createUploadthing } from "uploadthing/next";
import { UploadThingError } from "uploadthing/server";
import { getDb } from "@/db";
import { sessionFromRequest } from "@/server/auth/session";
import { ingestUploadedPhoto } from "./ingest";
import { partBelongsToJob } from "./queries";
import { HEIC_ADVICE, MAX_PHOTOS_PER_UPLOAD, MAX_PHOTO_BYTES, MAX_PHOTO_SIZE_LABEL, PHOTO_TYPES, photoUploadInput } from "./schemas";

const f = createUploadthing();
const perType = { maxFileSize: MAX_PHOTO_SIZE_LABEL, maxFileCount: MAX_PHOTOS_PER_UPLOAD } as const;

/**
 * Photos of a job. The middleware runs before anything is uploaded: it decides who may upload
 * and refuses what is plainly wrong by its declared type and size. What the bytes really are is
 * decided after the upload, in ingestUploadedPhoto.
 */
export const photoRouter = {
  jobPhoto: f({ "image/jpeg": perType, "image/png": perType, "image/webp": perType }, { awaitServerData: true })
    .input(photoUploadInput)
    .middleware(async ({ req, input, files }) => {
      const found = await sessionFromRequest(req);
      if (!found) throw new UploadThingError({ code: "FORBIDDEN", message: "Sign in first." });
      if (files.length === 0) throw new UploadThingError({ code: "BAD_REQUEST", message: "Choose at least one photo." });
      if (files.length > MAX_PHOTOS_PER_UPLOAD) throw new UploadThingError({ code: "TOO_MANY_FILES", message: `Send at most ${MAX_PHOTOS_PER_UPLOAD} photos at a time; you chose ${files.length}.` });
      for (const file of files) {
        const type = (file.type || "").toLowerCase();
        if (type === "image/heic" || type === "image/heif") throw new UploadThingError({ code: "BAD_REQUEST", message: `${file.name}: ${HEIC_ADVICE}` });
        if (!(PHOTO_TYPES as readonly string[]).includes(type)) throw new UploadThingError({ code: "BAD_REQUEST", message: `${file.name} is not a JPEG, PNG or WebP photo.` });
        if (file.size > MAX_PHOTO_BYTES) throw new UploadThingError({ code: "TOO_LARGE", message: `${file.name} is ${(file.size / 1048576).toFixed(1)} MB; the limit is 8 MB a photo.` });
      }
      const db = getDb();
      const job = await db.selectFrom("job").select("id").where("id", "=", input.jobId).executeTakeFirst();
      if (!job) throw new UploadThingError({ code: "NOT_FOUND", message: "That job was not found." });
      if (input.partId && !(await partBelongsToJob(db, input.jobId, input.partId))) {
        throw new UploadThingError({ code: "BAD_REQUEST", message: "That part is not on this job." });
      }
      return { jobId: input.jobId, stage: input.stage, partId: input.partId ?? null, caption: input.caption, uploadedBy: found.user.id };
    })
    .onUploadComplete(async ({ metadata, file }) => ingestUploadedPhoto(getDb(), metadata, file)),
} satisfies FileRouter;

export type PhotoRouter = typeof photoRouter;
