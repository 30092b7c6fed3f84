import { type Kysely, sql } from "kysely";

// The shop's allowed temperature-corrected drop over a leak test's hold, psi (see server/records/settings.ts).
const DEFAULT_ALLOWED_DROP_PSI = 0.05;

export async function up(db: Kysely<unknown>) {
  await db.schema
    .alterTable("shop")
    .addColumn("leak_allowed_drop_psi", "real", (c) => c.notNull().defaultTo(DEFAULT_ALLOWED_DROP_PSI))
    .execute();

  await db.schema
    .createTable("part")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().references("job.id").onDelete("cascade"))
    .addColumn("name", "text", (c) => c.notNull())
    .addColumn("kind", "text", (c) => c.notNull().check(sql`kind in ('reservoir', 'box', 'bracket', 'other')`))
    .addColumn("material", "text", (c) => c.notNull().check(sql`material in ('aluminum', 'stainless', 'carbon_steel')`))
    .addColumn("shape", "text", (c) => c.notNull().defaultTo("other").check(sql`shape in ('round', 'box', 'other')`))
    .addColumn("geometry", "text")
    .addColumn("needs_leak_test", "integer", (c) => c.notNull().check(sql`needs_leak_test in (0, 1)`))
    .addColumn("needs_coating", "integer", (c) => c.notNull().check(sql`needs_coating in (0, 1)`))
    .addColumn("notes", "text", (c) => c.notNull().defaultTo(""))
    // Each rework starts a new generation; only a passing test of the current generation counts.
    .addColumn("rework_count", "integer", (c) => c.notNull().defaultTo(0).check(sql`rework_count >= 0`))
    .addColumn("reworked_at", "text")
    .addColumn("rework_note", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("updated_at", "text", (c) => c.notNull())
    // Trade reference: a fabricated reservoir is always leak-tested before it is finished.
    .addCheckConstraint("part_reservoir_leak_tested", sql`kind <> 'reservoir' or needs_leak_test = 1`)
    .execute();
  await db.schema.createIndex("part_job").on("part").columns(["job_id", "id"]).execute();

  await db.schema
    .createTable("leak_test")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("part_id", "integer", (c) => c.notNull().references("part.id").onDelete("cascade"))
    .addColumn("rework_count", "integer", (c) => c.notNull())
    .addColumn("method", "text", (c) => c.notNull().check(sql`method in ('soap', 'decay', 'both')`))
    .addColumn("part_shape", "text", (c) => c.notNull().check(sql`part_shape in ('round', 'box', 'other')`))
    .addColumn("test_pressure_psig", "real", (c) => c.notNull())
    .addColumn("gauge_full_scale_psi", "real", (c) => c.notNull())
    .addColumn("gauge_calibrated_on", "text", (c) => c.notNull())
    .addColumn("hold_minutes", "real", (c) => c.notNull())
    .addColumn("start_pressure_psig", "real", (c) => c.notNull())
    .addColumn("end_pressure_psig", "real", (c) => c.notNull())
    .addColumn("start_temp_f", "real", (c) => c.notNull())
    .addColumn("end_temp_f", "real", (c) => c.notNull())
    .addColumn("barometric_psia", "real", (c) => c.notNull())
    .addColumn("seams", "text", (c) => c.notNull().defaultTo("[]"))
    .addColumn("tester", "text", (c) => c.notNull())
    .addColumn("raw_drop_psi", "real", (c) => c.notNull())
    .addColumn("corrected_drop_psi", "real", (c) => c.notNull())
    // The allowance in force when the test was decided, so a later change of the setting never rewrites history.
    .addColumn("allowed_drop_psi", "real", (c) => c.notNull())
    .addColumn("result", "text", (c) => c.notNull().check(sql`result in ('pass', 'fail')`))
    .addColumn("warnings", "text", (c) => c.notNull().defaultTo("[]"))
    .addColumn("recorded_by", "text", (c) => c.references("staff.id"))
    .addColumn("tested_at", "text", (c) => c.notNull())
    .execute();
  await db.schema.createIndex("leak_test_part").on("leak_test").columns(["part_id", "rework_count", "id"]).execute();

  await db.schema
    .createTable("vendor")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("name", "text", (c) => c.notNull().unique().modifyEnd(sql`collate nocase`))
    .addColumn("contact", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("phone", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("email", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("usual_turnaround_days", "integer", (c) => c.notNull().check(sql`usual_turnaround_days > 0`))
    .addColumn("notes", "text", (c) => c.notNull().defaultTo(""))
    .addColumn("created_at", "text", (c) => c.notNull())
    .execute();

  await db.schema
    .createTable("coating_run")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("vendor_id", "integer", (c) => c.notNull().references("vendor.id"))
    .addColumn("finish_colour", "text", (c) => c.notNull())
    .addColumn("finish_gloss", "text", (c) => c.notNull())
    .addColumn("sent_on", "text", (c) => c.notNull())
    .addColumn("promised_on", "text", (c) => c.notNull())
    .addColumn("received_on", "text")
    .addColumn("dft_readings_mils", "text")
    .addColumn("adhesion_ok", "integer", (c) => c.check(sql`adhesion_ok in (0, 1)`))
    .addColumn("defects", "text")
    .addColumn("inspected_at", "text")
    .addColumn("inspected_by", "text", (c) => c.references("staff.id"))
    .addColumn("created_by", "text", (c) => c.references("staff.id"))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("updated_at", "text", (c) => c.notNull())
    .addCheckConstraint("coating_run_promise_after_sent", sql`promised_on >= sent_on`)
    .addCheckConstraint("coating_run_received_after_sent", sql`received_on is null or received_on >= sent_on`)
    .addCheckConstraint("coating_run_inspected_when_received", sql`inspected_at is null or received_on is not null`)
    .execute();
  await db.schema.createIndex("coating_run_open").on("coating_run").columns(["received_on", "promised_on"]).execute();
  await db.schema.createIndex("coating_run_vendor").on("coating_run").columns(["vendor_id", "sent_on"]).execute();

  await db.schema
    .createTable("coating_run_part")
    .addColumn("run_id", "integer", (c) => c.notNull().references("coating_run.id").onDelete("cascade"))
    .addColumn("part_id", "integer", (c) => c.notNull().references("part.id").onDelete("cascade"))
    // 1 while the run is out; the partial unique index below keeps a part on at most one open run.
    .addColumn("open", "integer", (c) => c.notNull().defaultTo(1).check(sql`open in (0, 1)`))
    // The part's rework generation when it was sent: a run from before a rework no longer counts.
    .addColumn("rework_count", "integer", (c) => c.notNull().defaultTo(0).check(sql`rework_count >= 0`))
    .addPrimaryKeyConstraint("coating_run_part_pk", ["run_id", "part_id"])
    .execute();
  await db.schema.createIndex("coating_run_part_part").on("coating_run_part").columns(["part_id", "run_id"]).execute();
  await sql`create unique index coating_run_part_one_open on coating_run_part (part_id) where open = 1`.execute(db);

  await db.schema
    .createTable("sign_off")
    .addColumn("id", "integer", (c) => c.primaryKey().autoIncrement())
    .addColumn("job_id", "integer", (c) => c.notNull().unique().references("job.id").onDelete("cascade"))
    // The sign-off's fields as saved (indicator, checks, readings, signed-by name): a draft until complete.
    .addColumn("fields", "text", (c) => c.notNull().defaultTo("{}"))
    .addColumn("complete", "integer", (c) => c.notNull().defaultTo(0).check(sql`complete in (0, 1)`))
    .addColumn("signed_by", "text")
    .addColumn("signed_by_staff_id", "text", (c) => c.references("staff.id"))
    .addColumn("signed_at", "text")
    .addColumn("updated_by", "text", (c) => c.references("staff.id"))
    // Bumped by every save; a save must name the version it edited, so a stale tab cannot overwrite.
    .addColumn("version", "integer", (c) => c.notNull().defaultTo(1).check(sql`version >= 1`))
    .addColumn("created_at", "text", (c) => c.notNull())
    .addColumn("updated_at", "text", (c) => c.notNull())
    .addCheckConstraint("sign_off_signed_when_complete", sql`complete = 0 or (signed_by is not null and signed_at is not null)`)
    .execute();
}

export async function down(db: Kysely<unknown>) {
  for (const table of ["sign_off", "coating_run_part", "coating_run", "vendor", "leak_test", "part"]) {
    await db.schema.dropTable(table).execute();
  }
  await db.schema.alterTable("shop").dropColumn("leak_allowed_drop_psi").execute();
}
