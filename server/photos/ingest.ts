import "server-only";
import { UTApi } from "uploadthing/server";
import type { DB } from "@/db";
import type { Stage } from "@/db/schema";
import { recordPhoto } from "./mutations";
import { checkAndDerive } from "./process";
import { MAX_PHOTO_BYTES } from "./schemas";
import { savePhotoFiles } from "./store";

export interface UploadMetadata {
  jobId: number;
  stage: Stage;
  partId: number | null;
  caption: string;
  uploadedBy: string;
}

/** `refused`: the file itself is wrong. `failed`: the shop's server could not keep a good photo; sending it again may work. */
export type IngestResult = { photoId: number } | { refused: string } | { failed: string };

/** Reads at most `limit` bytes; a bigger file is refused without being held in memory. */
async function fetchLimited(url: string, limit: number): Promise<Uint8Array | "too_large"> {
  const res = await fetch(url, { signal: AbortSignal.timeout(60_000) });
  if (!res.ok || !res.body) throw new Error(`The upload service answered ${res.status} for the photo.`);
  const chunks: Uint8Array[] = [];
  let size = 0;
  for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
    size += chunk.length;
    if (size > limit) {
      await res.body.cancel().catch(() => undefined);
      return "too_large";
    }
    chunks.push(chunk);
  }
  return Buffer.concat(chunks);
}

/**
 * The original as uploaded still carries the camera's metadata (GPS position among it): once
 * the cleaned copies are on the shop's disk, it is removed from the upload service.
 */
async function dropOriginal(key: string) {
  try {
    await new UTApi({ logLevel: "None" }).deleteFiles(key);
  } catch (err) {
    console.warn(`Could not remove upload ${key} from the upload service:`, err instanceof Error ? err.message : err);
  }
}

/**
 * The server's half of a photo upload: check the bytes, make the copies, record the photo. The
 * original leaves the upload service whatever happens here, once the bytes are in or given up on.
 */
export async function ingestUploadedPhoto(db: DB, meta: UploadMetadata, file: { key: string; name: string; ufsUrl: string }): Promise<IngestResult> {
  try {
    return await checkAndRecord(db, meta, file);
  } catch (err) {
    // Thrown past here, the SDK never answers the upload service and the uploader waits on a photo that is not coming.
    console.error(`Photo ${file.name} (upload ${file.key}) could not be kept:`, err);
    return { failed: `${file.name}: the shop's server could not save this photo. Send it again; if that fails too, tell the office.` };
  } finally {
    await dropOriginal(file.key);
  }
}

async function checkAndRecord(db: DB, meta: UploadMetadata, file: { key: string; name: string; ufsUrl: string }): Promise<IngestResult> {
  const bytes = await fetchLimited(file.ufsUrl, MAX_PHOTO_BYTES);
  if (bytes === "too_large") return { refused: `${file.name}: the photo is over the 8 MB limit.` };
  const check = await checkAndDerive(bytes, { jobId: meta.jobId, name: file.name, uploadedBy: meta.uploadedBy });
  if (!check.ok) return { refused: `${file.name}: ${check.reason}` };
  const job = await db.selectFrom("job").select("id").where("id", "=", meta.jobId).executeTakeFirst();
  if (!job) return { refused: `${file.name}: the job was removed while the photo was uploading.` };
  await savePhotoFiles(meta.jobId, file.key, check);
  const photoId = await recordPhoto(db, {
    ...meta,
    uploadKey: file.key,
    originalName: file.name,
    originalType: check.type,
    originalBytes: bytes.length,
    width: check.width,
    height: check.height,
  });
  return { photoId };
}
