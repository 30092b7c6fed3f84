import { type Kysely, sql } from "kysely";

// The leak-test procedure's published defaults (server/records/procedure.ts names the sources).
const PROCEDURE_COLUMNS: [name: string, type: "real" | "integer", value: number][] = [
  ["leak_min_hold_minutes", "real", 15],
  ["leak_gauge_ratio_min", "real", 1.5],
  ["leak_gauge_ratio_max", "real", 4],
  ["leak_round_min_psig", "real", 3],
  ["leak_round_max_psig", "real", 5],
  ["leak_box_min_psig", "real", 1.5],
  ["leak_box_max_psig", "real", 3],
  ["leak_calibration_months", "integer", 12],
];

const TRUCK_COLUMNS = ["make", "model", "pto_opening"];

// Codes of the warnings that break the procedure; a pass recorded with one of them did not count.
const BREACH_CODES = sql`('hold_too_short', 'gauge_range', 'test_pressure_outside_band', 'gauge_calibration_old', 'gauge_calibration_future')`;

const LEAK_TEST_COLUMNS = [
  "id", "part_id", "rework_count", "method", "part_shape", "test_pressure_psig", "gauge_full_scale_psi", "gauge_calibrated_on",
  "hold_minutes", "start_pressure_psig", "end_pressure_psig", "start_temp_f", "end_temp_f", "barometric_psia", "seams", "tester",
  "raw_drop_psi", "corrected_drop_psi", "allowed_drop_psi", "result", "warnings", "recorded_by", "tested_at",
].join(", ");

/** The leak_test table with the result values given; SQLite cannot change a check constraint in place. */
async function createLeakTestTable(db: Kysely<unknown>, name: string, results: readonly string[], withReasons: boolean) {
  let table = db.schema
    .createTable(name)
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
    .addColumn("allowed_drop_psi", "real", (c) => c.notNull())
    .addColumn("result", "text", (c) => c.notNull().check(sql`result in (${sql.join(results.map((r) => sql.lit(r)))})`))
    .addColumn("warnings", "text", (c) => c.notNull().defaultTo("[]"))
    .addColumn("recorded_by", "text", (c) => c.references("staff.id"))
    .addColumn("tested_at", "text", (c) => c.notNull());
  // Why an invalid test is invalid: the procedure breaches, JSON [{ code, message }].
  if (withReasons) table = table.addColumn("invalid_reasons", "text", (c) => c.notNull().defaultTo("[]"));
  await table.execute();
}

export async function up(db: Kysely<unknown>) {
  for (const [name, type, value] of PROCEDURE_COLUMNS) {
    await db.schema.alterTable("shop").addColumn(name, type, (c) => c.notNull().defaultTo(value)).execute();
  }

  await createLeakTestTable(db, "leak_test_next", ["pass", "fail", "invalid"], true);
  await sql`insert into leak_test_next (${sql.raw(LEAK_TEST_COLUMNS)}, invalid_reasons) select ${sql.raw(LEAK_TEST_COLUMNS)}, '[]' from leak_test`.execute(db);
  // A pass recorded outside the procedure never proved the tank tight: it becomes invalid, with
  // the flags it was saved with as its reasons, so the part is tested again before coating.
  await sql`
    update leak_test_next
    set result = 'invalid',
        invalid_reasons = (select json_group_array(json(w.value)) from json_each(leak_test_next.warnings) w where json_extract(w.value, '$.code') in ${BREACH_CODES})
    where result = 'pass'
      and exists (select 1 from json_each(leak_test_next.warnings) w where json_extract(w.value, '$.code') in ${BREACH_CODES})
  `.execute(db);
  await db.schema.dropTable("leak_test").execute();
  await sql`alter table leak_test_next rename to leak_test`.execute(db);
  await db.schema.createIndex("leak_test_part").on("leak_test").columns(["part_id", "rework_count", "id"]).execute();

  // The owner's reset hands out a temporary password; its holder chooses their own at next sign-in.
  await db.schema.alterTable("staff").addColumn("must_change_password", "integer", (c) => c.notNull().defaultTo(0)).execute();
  // What browser a signed-in device is, so its owner can tell their devices apart.
  await db.schema.alterTable("session").addColumn("user_agent", "text", (c) => c.notNull().defaultTo("")).execute();

  for (const name of TRUCK_COLUMNS) {
    await db.schema.alterTable("truck").addColumn(name, "text", (c) => c.notNull().defaultTo("")).execute();
  }
}

export async function down(db: Kysely<unknown>) {
  for (const name of TRUCK_COLUMNS) await db.schema.alterTable("truck").dropColumn(name).execute();
  await db.schema.alterTable("session").dropColumn("user_agent").execute();
  await db.schema.alterTable("staff").dropColumn("must_change_password").execute();

  // The earlier schema knows only pass and fail: an invalid test goes back as a fail, its flags kept.
  await createLeakTestTable(db, "leak_test_prev", ["pass", "fail"], false);
  await sql`insert into leak_test_prev (${sql.raw(LEAK_TEST_COLUMNS)}) select ${sql.raw(LEAK_TEST_COLUMNS.replace("result,", "case result when 'invalid' then 'fail' else result end,"))} from leak_test`.execute(db);
  await db.schema.dropTable("leak_test").execute();
  await sql`alter table leak_test_prev rename to leak_test`.execute(db);
  await db.schema.createIndex("leak_test_part").on("leak_test").columns(["part_id", "rework_count", "id"]).execute();

  for (const [name] of [...PROCEDURE_COLUMNS].reverse()) await db.schema.alterTable("shop").dropColumn(name).execute();
}
