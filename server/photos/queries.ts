import "server-only";
import type { DB } from "@/db";

/** A job's photos as staff see them, newest first. */
export async function listJobPhotos(db: DB, jobId: number) {
  const rows = await db
    .selectFrom("photo")
    .leftJoin("staff", "staff.id", "photo.uploaded_by")
    // Only a part of the same job names the photo's part; a deleted part leaves the photo untagged.
    .leftJoin("part", (join) => join.onRef("part.id", "=", "photo.part_id").onRef("part.job_id", "=", "photo.job_id"))
    .select([
      "photo.id",
      "photo.job_id as jobId",
      "photo.stage",
      "photo.part_id as partId",
      "part.name as partName",
      "photo.caption",
      "photo.customer_visible",
      "photo.width",
      "photo.height",
      "photo.created_at as createdAt",
      "staff.name as uploadedBy",
    ])
    .where("photo.job_id", "=", jobId)
    .orderBy("photo.id", "desc")
    .execute();
  return rows.map(({ customer_visible, ...r }) => ({ ...r, customerVisible: customer_visible === 1 }));
}
export type JobPhoto = Awaited<ReturnType<typeof listJobPhotos>>[number];

export async function findPhoto(db: DB, id: number) {
  return db.selectFrom("photo").select(["id", "job_id", "upload_key", "customer_visible", "caption", "original_name"]).where("id", "=", id).executeTakeFirst();
}

/** Whether a part belongs to the job (the photo table has no foreign key to parts: the app checks). */
export async function partBelongsToJob(db: DB, jobId: number, partId: number): Promise<boolean> {
  const row = await db.selectFrom("part").select("id").where("id", "=", partId).where("job_id", "=", jobId).executeTakeFirst();
  return Boolean(row);
}

/** The job's parts to tag a photo with. */
export async function jobParts(db: DB, jobId: number): Promise<{ id: number; name: string }[]> {
  return db.selectFrom("part").select(["id", "name"]).where("job_id", "=", jobId).orderBy("id").execute();
}
