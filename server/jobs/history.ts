import "server-only";
import type { DB } from "@/db";
import { shopDateOf } from "@/server/shop/business-days";
import { shopSettings } from "@/server/shop/queries";

/** When each delivered job went out (its newest move into Delivered), for a customer's or truck's history. */
export async function deliveredDates(db: DB, jobIds: number[]): Promise<Map<number, string>> {
  if (jobIds.length === 0) return new Map();
  const rows = await db
    .selectFrom("stage_event")
    .innerJoin("job", "job.id", "stage_event.job_id")
    .select(["stage_event.job_id", (eb) => eb.fn.max("stage_event.at").as("at")])
    .where("stage_event.job_id", "in", jobIds)
    .where("job.stage", "=", "delivered")
    .where("stage_event.to_stage", "=", "delivered")
    .groupBy("stage_event.job_id")
    .execute();
  return new Map(rows.map((r) => [r.job_id, String(r.at)]));
}

/** A truck's kit specs (the newest version of each job's) and its photos, newest first. */
export async function truckRecords(db: DB, truckId: number) {
  const [specs, photos] = await Promise.all([
    db
      .selectFrom("kit_spec")
      .innerJoin("job", "job.id", "kit_spec.job_id")
      .leftJoin("staff", "staff.id", "kit_spec.saved_by")
      .select(["kit_spec.id", "kit_spec.job_id as jobId", "kit_spec.version", "kit_spec.saved_at as savedAt", "job.work_order as workOrder", "staff.name as savedBy"])
      .where("job.truck_id", "=", truckId)
      .where("kit_spec.version", "=", (eb) => eb.selectFrom("kit_spec as k").select((e) => e.fn.max("k.version").as("v")).whereRef("k.job_id", "=", "kit_spec.job_id"))
      .orderBy("kit_spec.saved_at", "desc")
      .execute(),
    db
      .selectFrom("photo")
      .innerJoin("job", "job.id", "photo.job_id")
      .select(["photo.id", "photo.job_id as jobId", "photo.caption", "photo.width", "photo.height", "photo.created_at as createdAt", "job.work_order as workOrder"])
      .where("job.truck_id", "=", truckId)
      .orderBy("photo.id", "desc")
      .limit(60)
      .execute(),
  ]);
  return { specs, photos };
}

/** Each job with the day it was delivered, on the shop's calendar (history lists). */
export async function withDeliveredDays<T extends { id: number }>(db: DB, jobs: T[]): Promise<(T & { deliveredAt: string | null })[]> {
  const [dates, shop] = await Promise.all([deliveredDates(db, jobs.map((j) => j.id)), shopSettings(db)]);
  return jobs.map((j) => {
    const at = dates.get(j.id);
    return { ...j, deliveredAt: at ? shopDateOf(at, shop.timeZone) : null };
  });
}
