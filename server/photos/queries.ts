import "server-only";
import { sql } from "kysely";
import type { DB } from "@/db";

/** A job's photos as staff see them, newest first. */
export async function listJobPhotos(db: DB, jobId: number) {
  const rows = await db
    .selectFrom("photo")
    .leftJoin("staff", "staff.id", "photo.uploaded_by")
    .select([
      "photo.id",
      "photo.job_id as jobId",
      "photo.stage",
      "photo.part_id as partId",
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
  return db.selectFrom("photo").select(["id", "job_id", "upload_key", "customer_visible"]).where("id", "=", id).executeTakeFirst();
}

/**
 * Whether a part belongs to the job. Parts are another area's table; until it exists there is
 * nothing to check against, and the answer is null (the id is kept and can be checked later).
 */
export async function partBelongsToJob(db: DB, jobId: number, partId: number): Promise<boolean | null> {
  const columns = await sql<{ name: string }>`select name from pragma_table_info('part')`.execute(db);
  if (!columns.rows.some((c) => c.name === "job_id")) return null;
  const row = await sql<{ ok: number }>`select 1 as ok from part where id = ${partId} and job_id = ${jobId}`.execute(db);
  return row.rows.length > 0;
}

/** The job's parts to tag a photo with; none until the parts table exists. */
export async function jobParts(db: DB, jobId: number): Promise<{ id: number; name: string }[]> {
  const columns = await sql<{ name: string }>`select name from pragma_table_info('part')`.execute(db);
  const names = new Set(columns.rows.map((c) => c.name));
  if (!names.has("job_id") || !names.has("name")) return [];
  const rows = await sql<{ id: number; name: string }>`select id, name from part where job_id = ${jobId} order by id`.execute(db);
  return rows.rows;
}
