import "server-only";
import type { DB } from "@/db";
import { sql } from "kysely";
import { STAGES, type Stage } from "@/db/schema";
import { notFound } from "@/server/http/errors";
import { parseId } from "@/server/http/respond";

/** The job as staff see it, with names resolved. */
export async function findJob(db: DB, id: number) {
  return db
    .selectFrom("job")
    .innerJoin("customer", "customer.id", "job.customer_id")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .leftJoin("staff", "staff.id", "job.assigned_tech_id")
    .select([
      "job.id", "job.work_order as workOrder", "job.stage", "job.position", "job.version", "job.scope", "job.description",
      "job.due_on as dueOn", "job.assigned_tech_id as assignedTechId", "job.priority", "job.notes", "job.created_at as createdAt",
      "job.updated_at as updatedAt", "customer.id as customerId", "customer.name as customerName", "truck.id as truckId",
      "truck.unit_number as unitNumber", "truck.vin", "truck.year as truckYear", "truck.description as truckDescription",
      "truck.transmission", "staff.name as techName",
    ])
    .where("job.id", "=", id)
    .executeTakeFirst();
}
export type JobDetail = NonNullable<Awaited<ReturnType<typeof findJob>>>;

export async function stageEvents(db: DB, jobId: number) {
  return db
    .selectFrom("stage_event")
    .leftJoin("staff", "staff.id", "stage_event.actor_id")
    .select(["stage_event.id", "stage_event.from_stage as fromStage", "stage_event.to_stage as toStage", "stage_event.at", "stage_event.note", "stage_event.override_reason as overrideReason", "staff.name as actorName"])
    .where("stage_event.job_id", "=", jobId)
    .orderBy("stage_event.id", "desc")
    .execute();
}

export interface JobListFilter {
  stage?: Stage;
  customerId?: number;
  truckId?: number;
  q?: string;
  sort?: "newest" | "due" | "customer" | "stage";
  limit?: number;
}

export async function listJobs(db: DB, filter: JobListFilter = {}) {
  let query = db
    .selectFrom("job")
    .innerJoin("customer", "customer.id", "job.customer_id")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .leftJoin("staff", "staff.id", "job.assigned_tech_id")
    .select([
      "job.id", "job.work_order as workOrder", "job.stage", "job.scope", "job.description", "job.due_on as dueOn", "job.priority",
      "job.updated_at as updatedAt", "customer.id as customerId", "customer.name as customerName", "truck.id as truckId",
      "truck.unit_number as unitNumber", "staff.name as techName",
    ]);
  if (filter.stage) query = query.where("job.stage", "=", filter.stage);
  if (filter.customerId) query = query.where("job.customer_id", "=", filter.customerId);
  if (filter.truckId) query = query.where("job.truck_id", "=", filter.truckId);
  if (filter.q) {
    const q = `%${filter.q.toUpperCase()}%`;
    query = query.where((eb) => eb.or([eb(eb.fn("upper", ["job.work_order"]), "like", q), eb(eb.fn("upper", ["truck.unit_number"]), "like", q), eb(eb.fn("upper", ["customer.name"]), "like", q)]));
  }
  switch (filter.sort ?? "newest") {
    case "due":
      query = query.orderBy(sql`job.due_on is null`).orderBy("job.due_on").orderBy("job.id", "desc");
      break;
    case "customer":
      query = query.orderBy("customer.name").orderBy("job.id", "desc");
      break;
    case "stage":
      query = query.orderBy(sql`case job.stage ${sql.join(STAGES.map((st, i) => sql`when ${st} then ${i}`), sql` `)} end`).orderBy("job.id", "desc");
      break;
    default:
      query = query.orderBy("job.id", "desc");
  }
  return query.limit(filter.limit ?? 500).execute();
}

/** How far an empty shop has got: what to add before the first job. */
export async function shopBeginnings(db: DB) {
  const [customers, trucks, jobs] = await Promise.all(
    (["customer", "truck", "job"] as const).map((table) =>
      db.selectFrom(table).select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow().then((r) => Number(r.n)),
    ),
  );
  return { customers, trucks, jobs };
}

/** A job id from a route: 400 when it is not an id, 404 when no such job exists. */
export async function existingJobId(db: DB, raw: string): Promise<number> {
  const id = parseId(raw, "Job");
  const job = await db.selectFrom("job").select("id").where("id", "=", id).executeTakeFirst();
  if (!job) throw notFound("That job");
  return id;
}
