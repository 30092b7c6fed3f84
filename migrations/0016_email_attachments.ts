import { type Kysely, sql } from "kysely";

/**
 * Files an e-mail carries (a quote's PDF). Kept with the rendered message, so a retry sends the
 * very bytes the first attempt sent, under the same idempotency key.
 */
export async function up(db: Kysely<unknown>) {
  await db.schema
    .createTable("email_attachment")
    .addColumn("outbox_id", "text", (c) => c.notNull().references("outbox.id").onDelete("cascade"))
    .addColumn("position", "integer", (c) => c.notNull().check(sql`position >= 0`))
    .addColumn("filename", "text", (c) => c.notNull())
    .addColumn("content_type", "text", (c) => c.notNull())
    .addColumn("content", "blob", (c) => c.notNull())
    .addPrimaryKeyConstraint("email_attachment_pk", ["outbox_id", "position"])
    .execute();
}

export async function down(db: Kysely<unknown>) {
  await db.schema.dropTable("email_attachment").execute();
}
