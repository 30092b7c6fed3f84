import { type Kysely, sql } from "kysely";

/**
 * The money side of a job: the owner's price list, the shop's sales-tax and deposit settings,
 * quotes (and change orders) with their lines, invoices, checkout requests, payments and the
 * payment service's webhook events. Money is integer cents in every column; a tax rate is kept in
 * thousandths of a percent (8.25 % is 8250) so it is an integer too.
 */
const SHOP_COLUMNS: [name: string, type: "integer" | "text", value: number | string][] = [
  ["sales_tax_millipercent", "integer", 0],
  ["deposit_kind", "text", "percent"],
  ["deposit_percent", "integer", 50],
  ["deposit_fixed_cents", "integer", 0],
  ["quote_terms", "text", ""],
];

const LINE_KINDS = sql`('labour', 'part', 'fabrication', 'coating', 'fee')`;

export async function up(db: Kysely<unknown>) {
  for (const [name, type, value] of SHOP_COLUMNS) {
    await db.schema.alterTable("shop").addColumn(name, type, (c) => c.notNull().defaultTo(value)).execute();
  }

  await db.schema
    .createTable("price_item")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ${LINE_KINDS}`))
    .addColumn("name", "text", (c) => c.notNull())
    // What one of it is: "hour", "each", "ft", "job".
    .addColumn("unit", "text", (c) => c.notNull())
    .addColumn("unit_price_cents", "integer", (c) => c.notNull().check(sql`unit_price_cents >= 0`))
    .addColumn("taxable", "integer", (c) => c.notNull().check(sql`taxable in (0, 1)`))
    // Which line of a kit spec this price fills ("pto", "pump", "reservoir", "hose"), if any.
    .addColumn("kit_use", "text")
    // For hose: the inside diameter it is sold for, thousandths of an inch (1.25 in is 1250).
    .addColumn("size_milli_in", "integer")
    .addColumn("active", "integer", (c) => c.notNull().defaultTo(1).check(sql`active in (0, 1)`))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("updated_at", "text", (c) => c.notNull())
    .execute();

  await db.schema
    .createTable("quote")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    // 1, 2, 3… per job across quotes and change orders.
    .addColumn("version", "integer", (c) => c.notNull().check(sql`version >= 1`))
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ('quote', 'change_order')`))
    .addColumn("status", "text", (c) => c.notNull().check(sql`status in ('draft', 'sent', 'approved', 'declined', 'superseded')`))
    .addColumn("supersedes_id", "integer", (c) => c.references("quote.id"))
    .addColumn("tax_millipercent", "integer", (c) => c.notNull().check(sql`tax_millipercent >= 0`))
    .addColumn("subtotal_cents", "integer", (c) => c.notNull())
    .addColumn("taxable_cents", "integer", (c) => c.notNull())
    .addColumn("tax_cents", "integer", (c) => c.notNull())
    .addColumn("total_cents", "integer", (c) => c.notNull())
    .addColumn("deposit_cents", "integer", (c) => c.notNull())
    .addColumn("terms", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("note", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("created_by", "text", (c) => c.notNull().references("staff.id"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("updated_at", "text", (c) => c.notNull())
    .addColumn("sent_at", "text")
    .addColumn("sent_by", "text", (c) => c.references("staff.id"))
    // The customer's answer on the status link: typed name, terms ticked, time and address.
    .addColumn("decided_at", "text")
    .addColumn("decided_name", "text")
    .addColumn("decided_address", "text")
    .addColumn("terms_accepted", "integer")
    .addColumn("decline_reason", "text")
    .addUniqueConstraint("quote_job_version", ["job_id", "version"])
    .execute();
  await db.schema.createIndex("quote_job_status").on("quote").columns(["job_id", "status"]).execute();

  await db.schema
    .createTable("quote_line")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("quote_id", "integer", (c) => c.notNull().references("quote.id").onDelete("cascade"))
    .addColumn("position", "integer", (c) => c.notNull())
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ${LINE_KINDS}`))
    .addColumn("description", "text", (c) => c.notNull())
    // Thousandths of a unit, so 2.5 hours is 2500 and every amount stays an integer computation.
    .addColumn("quantity_milli", "integer", (c) => c.notNull().check(sql`quantity_milli > 0`))
    .addColumn("unit_price_cents", "integer", (c) => c.notNull().check(sql`unit_price_cents >= 0`))
    .addColumn("taxable", "integer", (c) => c.notNull().check(sql`taxable in (0, 1)`))
    .addColumn("amount_cents", "integer", (c) => c.notNull())
    .addColumn("price_item_id", "integer", (c) => c.references("price_item.id").onDelete("set null"))
    .execute();
  await db.schema.createIndex("quote_line_quote").on("quote_line").columns(["quote_id", "position"]).execute();

  await db.schema
    .createTable("invoice")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("number", "text", (c) => c.notNull().unique())
    .addColumn("status", "text", (c) => c.notNull().check(sql`status in ('open', 'paid', 'on_account', 'void')`))
    .addColumn("total_cents", "integer", (c) => c.notNull())
    .addColumn("created_by", "text", (c) => c.references("staff.id"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("void_reason", "text")
    .addColumn("voided_at", "text")
    .execute();
  await db.schema.createIndex("invoice_job").on("invoice").columns(["job_id"]).execute();

  // A hosted-checkout request: what the customer was asked to pay, and for what.
  await db.schema
    .createTable("checkout")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("purpose", "text", (c) => c.notNull().check(sql`purpose in ('deposit', 'invoice')`))
    .addColumn("quote_id", "integer", (c) => c.references("quote.id"))
    .addColumn("invoice_id", "integer", (c) => c.references("invoice.id"))
    .addColumn("amount_cents", "integer", (c) => c.notNull().check(sql`amount_cents > 0`))
    .addColumn("currency", "text", (c) => c.notNull())
    .addColumn("session_id", "text", (c) => c.notNull().unique())
    .addColumn("status", "text", (c) => c.notNull().check(sql`status in ('open', 'paid', 'expired')`))
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();

  // Money received (or given back: a refund is a negative amount). Never a card number.
  await db.schema
    .createTable("payment")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("purpose", "text", (c) => c.notNull().check(sql`purpose in ('deposit', 'invoice')`))
    .addColumn("method", "text", (c) => c.notNull().check(sql`method in ('card', 'cash', 'check', 'on_account', 'refund')`))
    .addColumn("amount_cents", "integer", (c) => c.notNull())
    .addColumn("reference", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("checkout_id", "integer", (c) => c.references("checkout.id"))
    .addColumn("recorded_by", "text", (c) => c.references("staff.id"))
    .addColumn("at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("payment_job").on("payment").columns(["job_id"]).execute();

  // Each webhook event once: its id is the key; refused ones are kept with the reason.
  await db.schema
    .createTable("payment_event")
    .addColumn("event_id", "text", (c) => c.primaryKey())
    .addColumn("type", "text", (c) => c.notNull())
    .addColumn("outcome", "text", (c) => c.notNull().check(sql`outcome in ('applied', 'refused')`))
    .addColumn("reason", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("received_at", "text", (c) => c.notNull())
    .execute();
}

export async function down(db: Kysely<unknown>) {
  for (const table of ["payment_event", "payment", "checkout", "invoice", "quote_line", "quote", "price_item"]) {
    await db.schema.dropTable(table).execute();
  }
  for (const [name] of [...SHOP_COLUMNS].reverse()) {
    await db.schema.alterTable("shop").dropColumn(name).execute();
  }
}
