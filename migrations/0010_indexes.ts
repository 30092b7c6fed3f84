import { type Kysely, sql } from "kysely";

/*
 * Indexes the hot paths' query plans ask for on a shop with years of delivered jobs
 * (tests/integration/query-plans.test.ts checks the plans). The Jobs list's "due" and "stage"
 * orders are expressions; their indexes repeat the expressions of `listJobs` word for word, or
 * SQLite will not use them.
 */
export async function up(db: Kysely<unknown>) {
  // A job's messages, newest first (job page).
  await db.schema.createIndex("outbox_job").on("outbox").columns(["job_id", "created_at", "id"]).execute();
  // Jobs list, one stage, newest first (Delivered holds almost every job).
  await db.schema.createIndex("job_stage_recent").on("job").columns(["stage", "id"]).execute();
  // Jobs list by due date (no date last), then newest.
  await sql`create index job_due_order on job ((due_on is null), due_on, id desc)`.execute(db);
  // Jobs list by stage, first to last, then newest.
  await sql`create index job_stage_order on job ((case stage when 'queued' then 0 when 'fabricate' then 1 when 'pressure_test' then 2 when 'coating' then 3 when 'install' then 4 when 'wire' then 5 when 'ready' then 6 when 'delivered' then 7 end), id desc)`.execute(db);
  // Jobs list by customer A–Z; the board's customer filter.
  await db.schema.createIndex("customer_name").on("customer").columns(["name", "id"]).execute();

  // Jobs search ("part of a work order, unit number or customer name"): a trigram index finds any
  // three letters or more anywhere in them without reading every job. Row id = job id; kept by
  // triggers, so every way of writing a job, truck or customer keeps it right.
  await sql`create virtual table job_search using fts5(work_order, unit_number, customer_name, content='', contentless_delete=1, tokenize='trigram')`.execute(db);
  const row = (job: string) =>
    sql.raw(`select ${job}.id, ${job}.work_order, (select unit_number from truck where truck.id = ${job}.truck_id), (select name from customer where customer.id = ${job}.customer_id)`);
  await sql`insert into job_search (rowid, work_order, unit_number, customer_name) select job.id, job.work_order, truck.unit_number, customer.name from job join truck on truck.id = job.truck_id join customer on customer.id = job.customer_id`.execute(db);
  await sql`create trigger job_search_insert after insert on job begin
    insert into job_search (rowid, work_order, unit_number, customer_name) ${row("new")};
  end`.execute(db);
  await sql`create trigger job_search_update after update of work_order, truck_id, customer_id on job begin
    delete from job_search where rowid = old.id;
    insert into job_search (rowid, work_order, unit_number, customer_name) ${row("new")};
  end`.execute(db);
  await sql`create trigger job_search_delete after delete on job begin
    delete from job_search where rowid = old.id;
  end`.execute(db);
  await sql`create trigger job_search_truck after update of unit_number on truck begin
    delete from job_search where rowid in (select id from job where truck_id = new.id);
    insert into job_search (rowid, work_order, unit_number, customer_name) ${row("job")} from job where job.truck_id = new.id;
  end`.execute(db);
  await sql`create trigger job_search_customer after update of name on customer begin
    delete from job_search where rowid in (select id from job where customer_id = new.id);
    insert into job_search (rowid, work_order, unit_number, customer_name) ${row("job")} from job where job.customer_id = new.id;
  end`.execute(db);
}

export async function down(db: Kysely<unknown>) {
  for (const name of ["job_search_customer", "job_search_truck", "job_search_delete", "job_search_update", "job_search_insert"]) {
    await sql.raw(`drop trigger if exists ${name}`).execute(db);
  }
  await sql`drop table if exists job_search`.execute(db);
  for (const name of ["customer_name", "job_stage_order", "job_due_order", "job_stage_recent", "outbox_job"]) {
    await db.schema.dropIndex(name).ifExists().execute();
  }
}
