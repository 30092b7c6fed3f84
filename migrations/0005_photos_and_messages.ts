import { type Kysely, sql } from "kysely";

const stageList = sql`('queued', 'fabricate', 'pressure_test', 'coating', 'install', 'wire', 'ready', 'delivered')`;

export async function up(db: Kysely<unknown>) {
  await db.schema
    .createTable("photo")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("stage", "text", (c) => c.notNull().check(sql`stage in ${stageList}`))
    // No foreign key: parts live in another area's migration; the app checks the part belongs to the job.
    .addColumn("part_id", "integer")
    .addColumn("caption", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("customer_visible", "integer", (c) => c.notNull().defaultTo(0).check(sql`customer_visible in (0, 1)`))
    .addColumn("uploaded_by", "text", (c) => c.notNull().references("staff.id"))
    .addColumn("upload_key", "text", (c) => c.notNull().unique())
    .addColumn("original_name", "text", (c) => c.notNull())
    .addColumn("original_type", "text", (c) => c.notNull())
    .addColumn("original_bytes", "integer", (c) => c.notNull())
    .addColumn("width", "integer", (c) => c.notNull())
    .addColumn("height", "integer", (c) => c.notNull())
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("updated_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("photo_job").on("photo").columns(["job_id", "id"]).execute();

  await db.schema
    .createTable("status_link")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("token_hash", "text", (c) => c.notNull().unique())
    .addColumn("nonce", "text", (c) => c.notNull())
    .addColumn("issued_by", "text", (c) => c.references("staff.id"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("revoked_at", "text")
    .addColumn("revoked_by", "text", (c) => c.references("staff.id"))
    .addColumn("last_opened_at", "text")
    .execute();
  await db.schema.createIndex("status_link_job").on("status_link").columns(["job_id", "id"]).execute();

  await db.schema
    .createTable("email_message")
    .addColumn("outbox_id", "text", (c) => c.primaryKey().references("outbox.id").onDelete("cascade"))
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("from_address", "text", (c) => c.notNull())
    .addColumn("to_addresses", "text", (c) => c.notNull())
    .addColumn("reply_to", "text")
    .addColumn("subject", "text", (c) => c.notNull())
    .addColumn("html", "text", (c) => c.notNull())
    .addColumn("text", "text", (c) => c.notNull())
    .addColumn("status_link_id", "integer", (c) => c.references("status_link.id").onDelete("set null"))
    .addColumn("revision", "integer", (c) => c.notNull().defaultTo(0).check(sql`revision >= 0`))
    .addColumn("provider_id", "text")
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("email_message_job").on("email_message").column("job_id").execute();

  await db.schema
    .createTable("job_email_setting")
    .addColumn("job_id", "integer", (c) => c.primaryKey().references("job.id").onDelete("cascade"))
    .addColumn("email_off", "integer", (c) => c.notNull().defaultTo(0).check(sql`email_off in (0, 1)`))
    .addColumn("recipients_chosen", "integer", (c) => c.notNull().defaultTo(0).check(sql`recipients_chosen in (0, 1)`))
    .addColumn("updated_at", "text", (c) => c.notNull())
    .addColumn("updated_by", "text", (c) => c.references("staff.id"))
    .execute();

  await db.schema
    .createTable("job_email_recipient")
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("contact_id", "integer", (c) => c.notNull().references("contact.id").onDelete("cascade"))
    .addPrimaryKeyConstraint("job_email_recipient_pk", ["job_id", "contact_id"])
    .execute();

  await db.schema
    .createTable("message_setting")
    .addColumn("id", "integer", (c) => c.primaryKey().check(sql`id = 1`))
    .addColumn("notify_stages", "text", (c) => c.notNull())
    .addColumn("status_link_days", "integer", (c) => c.notNull().defaultTo(60).check(sql`status_link_days between 1 and 365`))
    .addColumn("updated_at", "text", (c) => c.notNull())
    .addColumn("updated_by", "text", (c) => c.references("staff.id"))
    .execute();
}

export async function down(db: Kysely<unknown>) {
  for (const table of ["message_setting", "job_email_recipient", "job_email_setting", "email_message", "status_link", "photo"]) {
    await db.schema.dropTable(table).execute();
  }
}
