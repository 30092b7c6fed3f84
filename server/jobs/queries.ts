import "server-only";
import type { DB } from "@/db";
import { sql } from "kysely";
import { STAGES, type Stage } from "@/db/schema";
import { notFound } from "@/server/http/errors";
import { parseId } from "@/server/http/respond";
import { BOARD_STAGES } from "./stages";

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
  /** A staff id, or "none" for jobs nobody is assigned to. */
  techId?: string;
  q?: string;
  sort?: "newest" | "due" | "customer" | "stage";
  limit?: number;
  /** Rows to skip (page 2 of 50 skips 50). */
  offset?: number;
  /** Open jobs past their due date (`late`) or due from today to `dueSoonUntil` (`soon`); needs `today`. */
  due?: "late" | "soon";
  today?: string;
  dueSoonUntil?: string;
  /** Jobs with a customer e-mail that failed to send. */
  emailFailed?: boolean;
}

// The orders below repeat, word for word, the expressions of the indexes in
// migrations/0010_indexes.ts; SQLite uses an index on an expression only for the same expression.
const STAGE_ORDER = sql.raw(`case job.stage ${STAGES.map((st, i) => `when '${st}' then ${i}`).join(" ")} end`);

export async function listJobs(db: DB, filter: JobListFilter = {}) {
  const sort = filter.sort ?? "newest";
  // By customer the customer is read first, in name order, and each one's jobs from the job_customer
  // index: the first page reads 50 jobs, not every job sorted.
  const from =
    sort === "customer"
      ? db.selectFrom("customer").crossJoin("job").whereRef("job.customer_id", "=", "customer.id")
      : db.selectFrom("job").innerJoin("customer", "customer.id", "job.customer_id");
  let query = from
    .innerJoin("truck", "truck.id", "job.truck_id")
    .leftJoin("staff", "staff.id", "job.assigned_tech_id")
    .select([
      "job.id", "job.work_order as workOrder", "job.stage", "job.scope", "job.description", "job.due_on as dueOn", "job.priority",
      "job.updated_at as updatedAt", "customer.id as customerId", "customer.name as customerName", "truck.id as truckId",
      "truck.unit_number as unitNumber", "truck.vin", "job.created_at as createdAt", "staff.name as techName",
    ]);
  if (filter.stage) query = query.where("job.stage", "=", filter.stage);
  if (filter.customerId) query = query.where("job.customer_id", "=", filter.customerId);
  if (filter.truckId) query = query.where("job.truck_id", "=", filter.truckId);
  if (filter.techId === "none") query = query.where("job.assigned_tech_id", "is", null);
  else if (filter.techId) query = query.where("job.assigned_tech_id", "=", filter.techId);
  if (filter.due && filter.today) {
    query = query.where("job.stage", "in", BOARD_STAGES).where("job.due_on", "is not", null);
    query = filter.due === "late" ? query.where("job.due_on", "<", filter.today) : query.where("job.due_on", ">=", filter.today).where("job.due_on", "<=", filter.dueSoonUntil ?? filter.today);
  }
  if (filter.emailFailed) {
    query = query.where("job.id", "in", (eb) => eb.selectFrom("outbox").select("outbox.job_id").where("outbox.status", "=", "failed").where("outbox.replaced_at", "is", null));
  }
  if (filter.q && [...filter.q].length >= 3) {
    // Three letters or more: the trigram index (job_search) finds them anywhere in the work order,
    // unit number or customer name, ignoring case, as one quoted phrase (the user's quotes doubled).
    const phrase = `"${filter.q.replace(/"/g, '""')}"`;
    query = query.where("job.id", "in", sql<number>`(select rowid from job_search where job_search match ${phrase})`);
  } else if (filter.q) {
    const q = `%${filter.q.toUpperCase()}%`;
    query = query.where((eb) => eb.or([eb(eb.fn("upper", ["job.work_order"]), "like", q), eb(eb.fn("upper", ["truck.unit_number"]), "like", q), eb(eb.fn("upper", ["customer.name"]), "like", q)]));
  }
  switch (sort) {
    case "due":
      query = query.orderBy(sql`job.due_on is null`).orderBy("job.due_on").orderBy("job.id", "desc");
      break;
    case "customer":
      // Customers who share a name keep their jobs together.
      query = query.orderBy("customer.name").orderBy("customer.id").orderBy("job.id", "desc");
      break;
    case "stage":
      query = query.orderBy(STAGE_ORDER).orderBy("job.id", "desc");
      break;
    default:
      query = query.orderBy("job.id", "desc");
  }
  return query.limit(filter.limit ?? 500).offset(filter.offset ?? 0).execute();
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
