import { type Kysely, sql } from "kysely";

const stageList = sql`('queued', 'fabricate', 'pressure_test', 'coating', 'install', 'wire', 'ready', 'delivered')`;

export async function up(db: Kysely<unknown>) {
  await db.schema
    .createTable("customer")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ('company', 'owner_operator')`))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("phone", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("email", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("notes", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();

  await db.schema
    .createTable("contact")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("customer_id", "integer", (c) => c.notNull().references("customer.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("email", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("phone", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("receives_email", "integer", (c) => c.notNull().defaultTo(1))
    .execute();
  await db.schema.createIndex("contact_customer").on("contact").column("customer_id").execute();

  await db.schema
    .createTable("truck")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("customer_id", "integer", (c) => c.notNull().references("customer.id"))
    .addColumn("unit_number", "text", (c) => c.notNull())
    .addColumn("vin", "text", (c) => c.notNull().unique())
    .addColumn("year", "integer", (c) => c.notNull())
    .addColumn("description", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("transmission", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("work_engine_rpm", "integer")
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("truck_customer").on("truck").column("customer_id").execute();

  await db.schema
    .createTable("job")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("work_order", "text", (c) => c.notNull().unique())
    .addColumn("customer_id", "integer", (c) => c.notNull().references("customer.id"))
    .addColumn("truck_id", "integer", (c) => c.notNull().references("truck.id"))
    .addColumn("scope", "text", (c) => c.notNull().check(sql`scope in ('fabrication', 'install_only')`))
    .addColumn("description", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("stage", "text", (c) => c.notNull().check(sql`stage in ${stageList}`))
    .addColumn("position", "integer", (c) => c.notNull().check(sql`position >= 0`))
    .addColumn("due_on", "text")
    .addColumn("assigned_tech_id", "text", (c) => c.references("staff.id"))
    .addColumn("priority", "text", (c) => c.notNull().defaultTo("normal").check(sql`priority in ('normal', 'rush')`))
    .addColumn("notes", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("version", "integer", (c) => c.notNull().defaultTo(1))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("updated_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("job_stage_position").on("job").columns(["stage", "position"]).execute();
  await db.schema.createIndex("job_truck").on("job").column("truck_id").execute();
  await db.schema.createIndex("job_customer").on("job").column("customer_id").execute();

  await db.schema
    .createTable("stage_event")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("from_stage", "text")
    .addColumn("to_stage", "text", (c) => c.notNull().check(sql`to_stage in ${stageList}`))
    .addColumn("actor_id", "text", (c) => c.references("staff.id"))
    .addColumn("at", "text", (c) => c.notNull())
    .addColumn("note", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("override_reason", "text")
    .execute();
  await db.schema.createIndex("stage_event_job").on("stage_event").columns(["job_id", "id"]).execute();

  await db.schema
    .createTable("outbox")
    .addColumn("id", "text", (c) => c.primaryKey())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("kind", "text", (c) => c.notNull())
    .addColumn("payload", "text", (c) => c.notNull())
    .addColumn("status", "text", (c) => c.notNull().defaultTo("pending"))
    .addColumn("attempts", "integer", (c) => c.notNull().defaultTo(0))
    .addColumn("next_attempt_at", "text", (c) => c.notNull())
    .addColumn("last_error", "text")
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("sent_at", "text")
    .execute();
  await db.schema.createIndex("outbox_pending").on("outbox").columns(["status", "next_attempt_at"]).execute();
}

export async function down(db: Kysely<unknown>) {
  for (const table of ["outbox", "stage_event", "job", "truck", "contact", "customer"]) {
    await db.schema.dropTable(table).execute();
  }
}
