import { type Kysely, sql } from "kysely";

// What the coater charged for a run, integer cents; null until the office records it.
export async function up(db: Kysely<unknown>) {
  await db.schema.alterTable("coating_run").addColumn("price_cents", "integer", (c) => c.check(sql`price_cents >= 0`)).execute();
}

export async function down(db: Kysely<unknown>) {
  await db.schema.alterTable("coating_run").dropColumn("price_cents").execute();
}
