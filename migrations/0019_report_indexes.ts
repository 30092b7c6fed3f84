import type { Kysely } from "kysely";

/*
 * The desk's reads on a shop with a long history (tests/integration/query-plans.test.ts checks
 * the plans): job cost reads the clock entries started in a period; the coaters report reads the
 * runs sent in a period, whichever coater.
 */
export async function up(db: Kysely<unknown>) {
  await db.schema.createIndex("clock_entry_started").on("clock_entry").columns(["started_at"]).execute();
  await db.schema.createIndex("coating_run_sent").on("coating_run").columns(["sent_on"]).execute();
}

export async function down(db: Kysely<unknown>) {
  await db.schema.dropIndex("coating_run_sent").execute();
  await db.schema.dropIndex("clock_entry_started").execute();
}
