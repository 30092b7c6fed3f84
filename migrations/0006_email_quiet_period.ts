import { type Kysely, sql } from "kysely";

/**
 * Customer e-mail waits a quiet period after a move (the shop's setting, 3 minutes unless changed),
 * so a card dragged on and straight back tells the customer nothing. A message a later move
 * replaced is marked with when, so it is never offered to send again.
 */
export async function up(db: Kysely<unknown>) {
  await db.schema
    .alterTable("message_setting")
    .addColumn("quiet_seconds", "integer", (c) => c.notNull().defaultTo(180).check(sql`quiet_seconds between 0 and 3600`))
    .execute();
  await db.schema.alterTable("outbox").addColumn("replaced_at", "text").execute();
}

export async function down(db: Kysely<unknown>) {
  await db.schema.alterTable("outbox").dropColumn("replaced_at").execute();
  await db.schema.alterTable("message_setting").dropColumn("quiet_seconds").execute();
}
