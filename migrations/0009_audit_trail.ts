import { type Kysely, sql } from "kysely";

export async function up(db: Kysely<unknown>) {
  await db.schema
    .createTable("audit_event")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("at", "text", (c) => c.notNull())
    .addColumn("kind", "text", (c) => c.notNull())
    // Null for what no signed-in person did (a failed sign-in, the first owner's own account).
    .addColumn("actor_id", "text", (c) => c.references("staff.id"))
    // The name as it was then: a later rename does not rewrite history.
    .addColumn("actor_name", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("address", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("subject", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("summary", "text", (c) => c.notNull())
    .addColumn("details", "text")
    .execute();
  await db.schema.createIndex("audit_event_at").on("audit_event").columns(["at", "id"]).execute();
  await db.schema.createIndex("audit_event_kind").on("audit_event").columns(["kind", "at"]).execute();
  await db.schema.createIndex("audit_event_actor").on("audit_event").columns(["actor_id", "at"]).execute();
  // The trail is only ever added to.
  await sql`create trigger audit_event_no_update before update on audit_event begin select raise(abort, 'The audit trail is never changed.'); end`.execute(db);
  await sql`create trigger audit_event_no_delete before delete on audit_event begin select raise(abort, 'The audit trail is never changed.'); end`.execute(db);
}

export async function down(db: Kysely<unknown>) {
  await sql`drop trigger if exists audit_event_no_delete`.execute(db);
  await sql`drop trigger if exists audit_event_no_update`.execute(db);
  await db.schema.dropTable("audit_event").execute();
}
