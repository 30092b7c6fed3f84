import { type Kysely, sql } from "kysely";

export async function up(db: Kysely<unknown>) {
  // What an hour of the shop's labour costs, in cents; 0 until the owner sets it (job cost then
  // shows hours without a labour figure). The next purchase-order number, like work orders.
  await db.schema.alterTable("shop").addColumn("labour_rate_cents", "integer", (c) => c.notNull().defaultTo(0)).execute();
  await db.schema.alterTable("shop").addColumn("next_purchase_order", "integer", (c) => c.notNull().defaultTo(1)).execute();

  await db.schema
    .createTable("purchase_order")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("number", "text", (c) => c.notNull().unique())
    .addColumn("supplier", "text", (c) => c.notNull())
    .addColumn("ordered_on", "text", (c) => c.notNull())
    .addColumn("expected_on", "text")
    .addColumn("notes", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("created_by", "text", (c) => c.references("staff.id"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("purchase_order_supplier").on("purchase_order").columns(["supplier", "ordered_on"]).execute();

  await db.schema
    .createTable("bought_part")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ('pto', 'pump', 'valve', 'hose', 'fitting', 'control', 'other')`))
    .addColumn("description", "text", (c) => c.notNull())
    .addColumn("part_number", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("quantity", "integer", (c) => c.notNull().check(sql`quantity > 0`))
    .addColumn("supplier", "text", (c) => c.notNull().defaultTo(""))
    // Cost of one, in cents; null until the office knows it.
    .addColumn("unit_cost_cents", "integer", (c) => c.check(sql`unit_cost_cents >= 0`))
    .addColumn("state", "text", (c) => c.notNull().defaultTo("needed").check(sql`state in ('needed', 'ordered', 'received', 'installed')`))
    .addColumn("purchase_order_id", "integer", (c) => c.references("purchase_order.id"))
    .addColumn("expected_on", "text")
    .addColumn("received_quantity", "integer", (c) => c.notNull().defaultTo(0).check(sql`received_quantity >= 0 and received_quantity <= quantity`))
    .addColumn("installed_at", "text")
    .addColumn("installed_by", "text", (c) => c.references("staff.id"))
    // Fit checks: the transmission a PTO fits and its output ratio (% of engine speed, as the kit
    // spec holds it); a pump's displacement (cu in per revolution).
    .addColumn("fits_transmission", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("ratio_percent", "real")
    .addColumn("displacement_cu_in", "real")
    .addColumn("source", "text", (c) => c.notNull().defaultTo("manual").check(sql`source in ('manual', 'kit_spec', 'quote')`))
    .addColumn("created_by", "text", (c) => c.references("staff.id"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("updated_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("bought_part_job").on("bought_part").columns(["job_id", "id"]).execute();
  await db.schema.createIndex("bought_part_state").on("bought_part").columns(["state", "supplier", "id"]).execute();
  await db.schema.createIndex("bought_part_order").on("bought_part").columns(["purchase_order_id"]).execute();

  await db.schema
    .createTable("bought_part_receipt")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("bought_part_id", "integer", (c) => c.notNull().references("bought_part.id").onDelete("cascade"))
    .addColumn("quantity", "integer", (c) => c.notNull().check(sql`quantity > 0`))
    .addColumn("received_by", "text", (c) => c.references("staff.id"))
    .addColumn("received_by_name", "text", (c) => c.notNull())
    .addColumn("received_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("bought_part_receipt_part").on("bought_part_receipt").columns(["bought_part_id"]).execute();
  await db.schema.createIndex("bought_part_receipt_at").on("bought_part_receipt").columns(["received_at"]).execute();

  await db.schema
    .createTable("clock_entry")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("staff_id", "text", (c) => c.notNull().references("staff.id"))
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    // The job's stage when the clock went on; hours by stage split the entry at stage events.
    .addColumn("stage", "text", (c) => c.notNull())
    .addColumn("started_at", "text", (c) => c.notNull())
    .addColumn("ended_at", "text")
    // An office correction keeps the times as first clocked and the reason.
    .addColumn("original_started_at", "text")
    .addColumn("original_ended_at", "text")
    .addColumn("correction_reason", "text")
    .addColumn("corrected_by", "text", (c) => c.references("staff.id"))
    .addColumn("corrected_at", "text")
    .addCheckConstraint("clock_entry_order", sql`ended_at is null or ended_at >= started_at`)
    .execute();
  // One open clock per person.
  await sql`create unique index clock_entry_open on clock_entry (staff_id) where ended_at is null`.execute(db);
  await db.schema.createIndex("clock_entry_job").on("clock_entry").columns(["job_id", "started_at"]).execute();
  await db.schema.createIndex("clock_entry_staff").on("clock_entry").columns(["staff_id", "started_at"]).execute();
}

export async function down(db: Kysely<unknown>) {
  await db.schema.dropTable("clock_entry").execute();
  await db.schema.dropTable("bought_part_receipt").execute();
  await db.schema.dropTable("bought_part").execute();
  await db.schema.dropTable("purchase_order").execute();
  await db.schema.alterTable("shop").dropColumn("next_purchase_order").execute();
  await db.schema.alterTable("shop").dropColumn("labour_rate_cents").execute();
}
