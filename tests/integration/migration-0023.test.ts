import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { type Kysely, sql } from "kysely";
import { afterAll, describe, expect, it } from "vitest";
import { createDb } from "@/db";
import { migrator } from "@/migrations";

const dir = mkdtempSync(join(tmpdir(), "baywright-0023-"));
const db = createDb(join(dir, "before-0023.db")) as Kysely<any>;
afterAll(async () => {
  await db.destroy();
  rmSync(dir, { recursive: true, force: true });
});

const rows = async (query: ReturnType<typeof sql>) => (await query.execute(db)).rows;
const snapshot = async () => ({
  tests: await rows(sql`select * from leak_test order by id`),
  indexes: await rows(sql`select name, sql from sqlite_master where type = 'index' and tbl_name = 'leak_test' order by name`),
  references: await rows(sql`select f."table", f."from", f."to", f.on_delete from pragma_foreign_key_list('leak_test') f order by f."from"`),
  sequence: await rows(sql`select seq from sqlite_sequence where name = 'leak_test'`),
});

type Readings = { start: number | null; end: number | null; startF: number | null; endF: number | null; raw: number | null; corrected: number | null };
const FULL: Readings = { start: 2, end: 2, startF: 70, endF: 70, raw: 0, corrected: 0 };
const NONE: Readings = { start: null, end: null, startF: null, endF: null, raw: null, corrected: null };
const leakTest = (method: string, r: Readings, partId = 1) =>
  sql`insert into leak_test (part_id, rework_count, method, part_shape, test_pressure_psig, gauge_full_scale_psi, gauge_calibrated_on, hold_minutes, start_pressure_psig, end_pressure_psig, start_temp_f, end_temp_f, barometric_psia, seams, tester, raw_drop_psi, corrected_drop_psi, allowed_drop_psi, result, warnings, recorded_by, tested_at, invalid_reasons)
    values (${partId}, 0, ${method}, 'box', 2, 5, '2026-01-01', 15, ${r.start}, ${r.end}, ${r.startF}, ${r.endF}, 14.696, '[{"location":"Top seam","result":"pass"}]', 'T', ${r.raw}, ${r.corrected}, 0.05, 'pass', '[]', 's1', '2026-02-01T10:00:00Z', '[]')`.execute(db);

describe("migration 0023: a soap-only leak test may be kept without hold readings", () => {
  let before: Awaited<ReturnType<typeof snapshot>>;

  it("keeps every leak test with its id, indexes, reference and id counter", async () => {
    expect((await migrator(db).migrateTo("0019_report_indexes")).error).toBeUndefined();
    const at = "2026-01-01T00:00:00Z";
    await sql`insert into staff (id, email, name, role, password_hash, active, created_at) values ('s1', 'a@shop.example', 'A', 'owner', 'x', 1, ${at})`.execute(db);
    await sql`insert into customer (kind, name, phone, email, notes, created_at) values ('company', 'Fleet', '', '', '', ${at})`.execute(db);
    await sql`insert into truck (customer_id, unit_number, vin, year, description, transmission, created_at) values (1, 'U-1', '1PF5T3X20RK000007', 2024, '', '', ${at})`.execute(db);
    await sql`insert into job (work_order, customer_id, truck_id, scope, description, stage, position, version, created_at, updated_at) values ('WO-1', 1, 1, 'fabrication', 'Tank', 'coating', 0, 1, ${at}, ${at})`.execute(db);
    await sql`insert into part (job_id, name, kind, material, shape, needs_leak_test, needs_coating, created_at, updated_at) values (1, 'Box tank', 'reservoir', 'aluminum', 'box', 1, 1, ${at}, ${at})`.execute(db);
    await leakTest("soap", FULL);
    await leakTest("both", FULL);
    await leakTest("decay", FULL);
    // Before 0023 a soap-only test had to carry every reading.
    await expect(leakTest("soap", NONE)).rejects.toThrow(/NOT NULL constraint failed/);
    // The last test is gone before the migration: its id is never handed out again.
    await sql`delete from leak_test where id = 3`.execute(db);
    before = await snapshot();
    expect(before.tests).toHaveLength(2);

    const up = await migrator(db).migrateToLatest();
    expect(up.error).toBeUndefined();
    expect(up.results?.map((r) => r.migrationName)).toContain("0023_soap_test_readings");
    const after = await snapshot();
    expect(after).toEqual(before);
    expect(after.references).toContainEqual({ table: "part", from: "part_id", to: "id", on_delete: "CASCADE" });
    expect(await rows(sql`select count(*) as n from sqlite_master where name like '%_next'`)).toEqual([{ n: 0 }]);
  });

  it("takes a soap-only test without readings, and refuses pressure decay without them or a soap test with only some", async () => {
    await leakTest("soap", NONE);
    const kept = (await rows(sql`select id, method, start_pressure_psig, corrected_drop_psi from leak_test where start_pressure_psig is null`))[0];
    // AUTOINCREMENT kept its counter: the deleted test's id 3 is not reused.
    expect(kept).toEqual({ id: 4, method: "soap", start_pressure_psig: null, corrected_drop_psi: null });
    await expect(leakTest("decay", NONE)).rejects.toThrow(/CHECK constraint failed/);
    await expect(leakTest("both", NONE)).rejects.toThrow(/CHECK constraint failed/);
    await expect(leakTest("soap", { ...FULL, endF: null })).rejects.toThrow(/CHECK constraint failed/);
    await expect(leakTest("soap", NONE, 999)).rejects.toThrow(/FOREIGN KEY constraint failed/);
  });

  it("will not go down while a soap-only test has no readings; without one it goes down to NOT NULL again", async () => {
    const refused = await migrator(db).migrateDown();
    expect(String(refused.error)).toMatch(/soap-only leak tests have no hold readings \(ids 4\)/);
    await sql`delete from leak_test where id = 4`.execute(db);
    const down = await migrator(db).migrateDown();
    expect(down.error).toBeUndefined();
    expect(await snapshot()).toEqual({ ...before, sequence: [{ seq: 4 }] });
    await expect(leakTest("soap", NONE)).rejects.toThrow(/NOT NULL constraint failed/);
    expect((await migrator(db).migrateToLatest()).error).toBeUndefined();
  });
});
