import { type Kysely, sql } from "kysely";

/**
 * Payments, deposits and invoices put to work: the shop's "Money checks before work and delivery"
 * setting (on unless the owner turns it off), and who voided an invoice and when it was e-mailed.
 */
export async function up(db: Kysely<unknown>) {
  await db.schema
    .alterTable("shop")
    .addColumn("money_checks", "integer", (c) => c.notNull().defaultTo(1).check(sql`money_checks in (0, 1)`))
    .execute();
  await db.schema.alterTable("invoice").addColumn("voided_by", "text", (c) => c.references("staff.id")).execute();
  await db.schema.alterTable("invoice").addColumn("sent_at", "text").execute();
  // One invoice that counts per job: any number of voided ones beside it.
  await db.schema.createIndex("invoice_one_live_per_job").on("invoice").column("job_id").unique().where(sql.ref("status"), "!=", "void").execute();
  await db.schema.createIndex("checkout_job").on("checkout").columns(["job_id", "purpose"]).execute();
}

export async function down(db: Kysely<unknown>) {
  await db.schema.dropIndex("checkout_job").execute();
  await db.schema.dropIndex("invoice_one_live_per_job").execute();
  await db.schema.alterTable("invoice").dropColumn("sent_at").execute();
  await db.schema.alterTable("invoice").dropColumn("voided_by").execute();
  await db.schema.alterTable("shop").dropColumn("money_checks").execute();
}
