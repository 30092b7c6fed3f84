import { type Kysely, sql } from "kysely";

export async function up(db: Kysely<unknown>) {
  await db.schema
    .createTable("staff")
    .addColumn("id", "text", (c) => c.primaryKey())
    .addColumn("email", "text", (c) => c.notNull().unique())
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("role", "text", (c) => c.notNull().check(sql`role in ('owner', 'office', 'tech')`))
    .addColumn("password_hash", "text", (c) => c.notNull())
    .addColumn("active", "integer", (c) => c.notNull().defaultTo(1))
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();

  await db.schema
    .createTable("session")
    .addColumn("id", "text", (c) => c.primaryKey())
    .addColumn("staff_id", "text", (c) => c.notNull().references("staff.id").onDelete("cascade"))
    .addColumn("expires_at", "integer", (c) => c.notNull())
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("session_staff").on("session").column("staff_id").execute();

  await db.schema
    .createTable("shop")
    .addColumn("id", "integer", (c) => c.primaryKey().check(sql`id = 1`))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("phone", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("time_zone", "text", (c) => c.notNull().defaultTo("US/Central"))
    .addColumn("work_order_prefix", "text", (c) => c.notNull().defaultTo("WO"))
    .addColumn("next_work_order", "integer", (c) => c.notNull().defaultTo(1))
    .execute();
}

export async function down(db: Kysely<unknown>) {
  await db.schema.dropTable("shop").execute();
  await db.schema.dropTable("session").execute();
  await db.schema.dropTable("staff").execute();
}
