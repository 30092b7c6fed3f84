import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { sql } from "kysely";
import { afterAll, describe, expect, it } from "vitest";
import { createDb } from "@/db";
import { migrator } from "@/migrations";

const dir = mkdtempSync(join(tmpdir(), "baywright-0007-"));
const db = createDb(join(dir, "before-0007.db"));
afterAll(async () => {
  await db.destroy();
  rmSync(dir, { recursive: true, force: true });
});

const warning = (code: string) => ({ code, message: `flag ${code}` });

describe("migration 0007: leak tests recorded before the procedure counted", () => {
  it("turns a pass saved with a procedure flag into invalid with that flag as its reason; fails and clean passes stay", async () => {
    const to = await migrator(db).migrateTo("0006_email_quiet_period");
    expect(to.error).toBeUndefined();
    const at = new Date().toISOString();
    await sql`insert into staff (id, email, name, role, password_hash, active, created_at) values ('s1', 'a@shop.example', 'A', 'owner', 'x', 1, ${at})`.execute(db);
    await sql`insert into customer (kind, name, phone, email, notes, created_at) values ('company', 'Fleet', '', '', '', ${at})`.execute(db);
    await sql`insert into truck (customer_id, unit_number, vin, year, description, transmission, created_at) values (1, 'U-1', '1PF5T3X20RK000007', 2024, '', '', ${at})`.execute(db);
    await sql`insert into job (work_order, customer_id, truck_id, scope, description, stage, position, version, created_at, updated_at) values ('WO-1', 1, 1, 'fabrication', 'Tank', 'pressure_test', 0, 1, ${at}, ${at})`.execute(db);
    await sql`insert into part (job_id, name, kind, material, shape, needs_leak_test, needs_coating, created_at, updated_at) values (1, 'Tank', 'reservoir', 'aluminum', 'round', 1, 1, ${at}, ${at})`.execute(db);
    const test = (result: string, warnings: object[]) =>
      sql`insert into leak_test (part_id, rework_count, method, part_shape, test_pressure_psig, gauge_full_scale_psi, gauge_calibrated_on, hold_minutes, start_pressure_psig, end_pressure_psig, start_temp_f, end_temp_f, barometric_psia, seams, tester, raw_drop_psi, corrected_drop_psi, allowed_drop_psi, result, warnings, recorded_by, tested_at)
        values (1, 0, 'both', 'round', 3, 30, '2026-01-01', 10, 3, 3, 70, 70, 14.696, '[]', 'T', 0, 0, 0.05, ${result}, ${JSON.stringify(warnings)}, 's1', ${at})`.execute(db);
    await test("pass", [warning("hold_too_short"), warning("gauge_range"), warning("pressure_rose_after_correction")]);
    await test("fail", [warning("hold_too_short")]);
    await test("pass", []);
    await test("pass", [warning("soap_only_drop_exceeds_allowed")]);

    const up = await migrator(db).migrateToLatest();
    expect(up.error).toBeUndefined();
    const rows = await sql<{ id: number; result: string; invalid_reasons: string }>`select id, result, invalid_reasons from leak_test order by id`.execute(db);
    expect(rows.rows.map((r) => [r.result, JSON.parse(r.invalid_reasons).map((w: { code: string }) => w.code)])).toEqual([
      ["invalid", ["hold_too_short", "gauge_range"]],
      ["fail", []],
      ["pass", []],
      ["pass", []],
    ]);
    const shop = await sql`select count(*) as n from pragma_table_info('shop') where name like 'leak_%'`.execute(db);
    expect((shop.rows[0] as { n: number }).n).toBe(9);
  });
});
