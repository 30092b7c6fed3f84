import { type Kysely, sql } from "kysely";

// Every save of a job's kit spec is a new row: the history of what was specified, and by whom, is kept.
export async function up(db: Kysely<unknown>) {
  await db.schema
    .createTable("kit_spec")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("version", "integer", (c) => c.notNull().check(sql`version >= 1`))
    .addColumn("inputs", "text", (c) => c.notNull().check(sql`json_valid(inputs)`))
    .addColumn("results", "text", (c) => c.notNull().check(sql`json_valid(results)`))
    .addColumn("saved_by", "text", (c) => c.notNull().references("staff.id"))
    .addColumn("saved_at", "text", (c) => c.notNull())
    .addUniqueConstraint("kit_spec_job_version", ["job_id", "version"])
    .execute();
}

export async function down(db: Kysely<unknown>) {
  await db.schema.dropTable("kit_spec").execute();
}
