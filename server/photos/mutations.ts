import "server-only";
import type { DB } from "@/db";
import type { Stage } from "@/db/schema";
import type { StaffUser } from "@/server/auth/session";
import { recordAudit } from "@/server/audit/record";
import { ApiError } from "@/server/http/errors";
import { findPhoto, listJobPhotos } from "./queries";
import type { PhotoPatch } from "./schemas";
import { removePhotoFiles } from "./store";

export interface NewPhoto {
  jobId: number;
  stage: Stage;
  partId: number | null;
  caption: string;
  uploadedBy: string;
  uploadKey: string;
  originalName: string;
  originalType: string;
  originalBytes: number;
  width: number;
  height: number;
}

/** Records an uploaded photo once: the upload service may call back twice for one file. */
export async function recordPhoto(db: DB, photo: NewPhoto): Promise<number> {
  const at = new Date().toISOString();
  await db
    .insertInto("photo")
    .values({
      job_id: photo.jobId,
      stage: photo.stage,
      part_id: photo.partId,
      caption: photo.caption,
      customer_visible: 0,
      uploaded_by: photo.uploadedBy,
      upload_key: photo.uploadKey,
      original_name: photo.originalName.slice(0, 200),
      original_type: photo.originalType,
      original_bytes: photo.originalBytes,
      width: photo.width,
      height: photo.height,
      created_at: at,
      updated_at: at,
    })
    .onConflict((oc) => oc.column("upload_key").doNothing())
    .execute();
  const row = await db.selectFrom("photo").select("id").where("upload_key", "=", photo.uploadKey).executeTakeFirstOrThrow();
  return row.id;
}

export async function patchPhoto(db: DB, _actor: StaffUser, id: number, patch: PhotoPatch) {
  const photo = await findPhoto(db, id);
  if (!photo) throw new ApiError("not_found", "That photo was not found.");
  await db
    .updateTable("photo")
    .set({
      ...(patch.caption !== undefined ? { caption: patch.caption } : {}),
      ...(patch.customerVisible !== undefined ? { customer_visible: patch.customerVisible ? 1 : 0 } : {}),
      ...(patch.stage !== undefined ? { stage: patch.stage } : {}),
      updated_at: new Date().toISOString(),
    })
    .where("id", "=", id)
    .execute();
  return (await listJobPhotos(db, photo.job_id)).find((p) => p.id === id)!;
}

export async function deletePhoto(db: DB, actor: StaffUser, id: number) {
  const photo = await findPhoto(db, id);
  if (!photo) throw new ApiError("not_found", "That photo was not found.");
  await db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select("work_order").where("id", "=", photo.job_id).executeTakeFirst();
    const removed = await trx.deleteFrom("photo").where("id", "=", id).executeTakeFirst();
    if (Number(removed.numDeletedRows) !== 1) return;
    const what = photo.caption ? `the photo "${photo.caption}"` : `a photo (${photo.original_name})`;
    await recordAudit(trx, { kind: "photo_deleted", actor, subject: job ? `work order ${job.work_order}` : "", summary: `${actor.name} deleted ${what} from work order ${job?.work_order ?? photo.job_id}.`, details: { photoId: id, jobId: photo.job_id, customerVisible: photo.customer_visible === 1 } });
  });
  await removePhotoFiles(photo.job_id, photo.upload_key);
  return { id, jobId: photo.job_id };
}
