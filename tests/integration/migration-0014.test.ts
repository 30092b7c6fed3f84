import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { type Kysely, sql } from "kysely";
import { afterAll, describe, expect, it } from "vitest";
import { createDb } from "@/db";
import { migrator } from "@/migrations";

const dir = mkdtempSync(join(tmpdir(), "baywright-0014-"));
const db = createDb(join(dir, "before-0014.db")) as Kysely<any>;
afterAll(async () => {
  await db.destroy();
  rmSync(dir, { recursive: true, force: true });
});

const FAMILY = sql`('part', 'leak_test', 'coating_run_part')`;
const rows = async (query: ReturnType<typeof sql>) => (await query.execute(db)).rows;
const snapshot = async () => ({
  parts: await rows(sql`select * from part order by id`),
  tests: await rows(sql`select * from leak_test order by id`),
  runParts: await rows(sql`select * from coating_run_part order by run_id, part_id`),
  indexes: await rows(sql`select name, tbl_name, sql from sqlite_master where type = 'index' and tbl_name in ${FAMILY} order by name`),
  triggers: await rows(sql`select name, tbl_name, sql from sqlite_master where type = 'trigger' and tbl_name in ${FAMILY} order by name`),
  references: await rows(sql`select m.name, f."table", f."from", f."to", f.on_delete from sqlite_master m, pragma_foreign_key_list(m.name) f where m.type = 'table' and m.name in ${FAMILY} order by m.name, f."from"`),
  sequence: await rows(sql`select name, seq from sqlite_sequence where name in ${FAMILY} order by name`),
});
const searchIds = async (words: string) =>
  (await rows(sql`select rowid from desk_search where desk_search match ${`"${words}"`} order by rowid`)).map((r) => (r as { rowid: number }).rowid);

const leakTest = (partId: number, shape: string, result = "pass") =>
  sql`insert into leak_test (part_id, rework_count, method, part_shape, test_pressure_psig, gauge_full_scale_psi, gauge_calibrated_on, hold_minutes, start_pressure_psig, end_pressure_psig, start_temp_f, end_temp_f, barometric_psia, seams, tester, raw_drop_psi, corrected_drop_psi, allowed_drop_psi, result, warnings, recorded_by, tested_at, invalid_reasons)
    values (${partId}, 0, 'soap', ${shape}, 2, 5, '2026-01-01', 15, 2, 2, 70, 70, 14.696, '[]', 'T', 0, 0, 0.05, ${result}, '[]', 's1', '2026-02-01T10:00:00Z', '[]')`.execute(db);
const part = (name: string, shape: string) =>
  sql`insert into part (job_id, name, kind, material, shape, needs_leak_test, needs_coating, created_at, updated_at) values (1, ${name}, 'reservoir', 'aluminum', ${shape}, 1, 1, '2026-01-01T00:00:00Z', '2026-01-01T00:00:00Z')`.execute(db);

describe("migration 0014: D-shaped tanks in the part and leak-test records", () => {
  let before: Awaited<ReturnType<typeof snapshot>>;

  it("keeps every part, leak test and coating run part with its id, references, indexes, triggers and id counter", async () => {
    const to = await migrator(db).migrateTo("0013_money");
    expect(to.error).toBeUndefined();
    const at = "2026-01-01T00:00:00Z";
    await sql`insert into staff (id, email, name, role, password_hash, active, created_at) values ('s1', 'a@shop.example', 'A', 'owner', 'x', 1, ${at})`.execute(db);
    await sql`insert into customer (kind, name, phone, email, notes, created_at) values ('company', 'Fleet', '', '', '', ${at})`.execute(db);
    await sql`insert into truck (customer_id, unit_number, vin, year, description, transmission, created_at) values (1, 'U-1', '1PF5T3X20RK000007', 2024, '', '', ${at})`.execute(db);
    await sql`insert into job (work_order, customer_id, truck_id, scope, description, stage, position, version, created_at, updated_at) values ('WO-1', 1, 1, 'fabrication', 'Tank', 'coating', 0, 1, ${at}, ${at})`.execute(db);
    await part("Saddle reservoir", "round");
    await part("Battery box", "box");
    await part("Scrapped tank", "other");
    await sql`update part set geometry = '{"shape":"round","insideDiameterIn":20,"lengthIn":30}', rework_count = 1, rework_note = 'Re-welded the sump' where id = 1`.execute(db);
    await leakTest(1, "round", "fail");
    await leakTest(1, "round");
    await leakTest(2, "box");
    await leakTest(3, "other");
    await sql`insert into vendor (name, usual_turnaround_days, created_at) values ('Coater One', 5, ${at})`.execute(db);
    await sql`insert into coating_run (vendor_id, finish_colour, finish_gloss, sent_on, promised_on, created_at, updated_at) values (1, 'Black', 'gloss', '2026-02-02', '2026-02-09', ${at}, ${at})`.execute(db);
    await sql`insert into coating_run_part (run_id, part_id, open, rework_count) values (1, 1, 1, 1), (1, 2, 0, 0)`.execute(db);
    // The last part and its test are gone before the migration: its id is never handed out again.
    await sql`delete from part where id = 3`.execute(db);
    before = await snapshot();
    expect(before.parts).toHaveLength(2);
    expect(before.tests).toHaveLength(3);
    expect(before.runParts).toHaveLength(2);
    expect(await searchIds("Saddle")).toEqual([1 * 8 + 4]);

    const up = await migrator(db).migrateToLatest();
    expect(up.error).toBeUndefined();
    expect(up.results?.map((r) => r.migrationName)).toContain("0014_d_shaped_tanks");

    const after = await snapshot();
    expect(after.parts).toEqual(before.parts);
    expect(after.tests).toEqual(before.tests);
    expect(after.runParts).toEqual(before.runParts);
    expect(after.indexes).toEqual(before.indexes);
    expect(after.triggers).toEqual(before.triggers);
    expect(after.triggers.map((t) => (t as { name: string }).name)).toEqual(["desk_search_part_delete", "desk_search_part_insert", "desk_search_part_update"]);
    expect(after.references).toEqual(before.references);
    expect(after.references).toContainEqual({ name: "leak_test", table: "part", from: "part_id", to: "id", on_delete: "CASCADE" });
    expect(after.references).toContainEqual({ name: "coating_run_part", table: "part", from: "part_id", to: "id", on_delete: "CASCADE" });
    expect(after.sequence).toEqual(before.sequence);
    expect(await rows(sql`select count(*) as n from pragma_foreign_key_check`)).toEqual([{ n: 0 }]);
    expect(await rows(sql`select count(*) as n from sqlite_master where name like '%_next'`)).toEqual([{ n: 0 }]);
  });

  it("takes D-shaped parts and leak tests, and still refuses a shape it does not know", async () => {
    await part("D tank, left rail", "d");
    const d = (await rows(sql`select id, shape from part where name = 'D tank, left rail'`))[0] as { id: number; shape: string };
    // AUTOINCREMENT kept its counter: the deleted part's id 3 is not reused.
    expect(d).toEqual({ id: 4, shape: "d" });
    await leakTest(4, "d");
    await expect(part("Hexagon tank", "hex")).rejects.toThrow(/CHECK constraint failed/);
    await expect(leakTest(4, "oval")).rejects.toThrow(/CHECK constraint failed/);
  });

  it("keeps the references and triggers working: search follows names, a deleted part takes its tests and run lines", async () => {
    await expect(leakTest(999, "round")).rejects.toThrow(/FOREIGN KEY constraint failed/);
    expect(await searchIds("left rail")).toEqual([4 * 8 + 4]);
    await sql`update part set name = 'Saddle tank, right' where id = 1`.execute(db);
    expect(await searchIds("Saddle reservoir")).toEqual([]);
    expect(await searchIds("Saddle tank")).toEqual([1 * 8 + 4]);
    // The one-open-run rule for a part still holds.
    await sql`insert into coating_run (vendor_id, finish_colour, finish_gloss, sent_on, promised_on, created_at, updated_at) values (1, 'Red', 'gloss', '2026-02-03', '2026-02-10', '2026-02-03T00:00:00Z', '2026-02-03T00:00:00Z')`.execute(db);
    await expect(sql`insert into coating_run_part (run_id, part_id, open, rework_count) values (2, 1, 1, 1)`.execute(db)).rejects.toThrow(/UNIQUE constraint failed/);

    await sql`delete from part where id = 1`.execute(db);
    expect(await rows(sql`select count(*) as n from leak_test where part_id = 1`)).toEqual([{ n: 0 }]);
    expect(await rows(sql`select count(*) as n from coating_run_part where part_id = 1`)).toEqual([{ n: 0 }]);
    expect(await searchIds("Saddle tank")).toEqual([]);
    expect(await rows(sql`select count(*) as n from leak_test where part_id = 2`)).toEqual([{ n: 1 }]);
  });

  it("will not go down while a part is D-shaped, and names it; without one it goes down with D tests read as box tests", async () => {
    // Later migrations go down first, so the next step down is this one.
    expect((await migrator(db).migrateTo("0014_d_shaped_tanks")).error).toBeUndefined();
    const refused = await migrator(db).migrateDown();
    expect(String(refused.error)).toMatch(/D tank, left rail \(WO-1\).*box or other/);
    expect(await rows(sql`select shape from part where id = 4`)).toEqual([{ shape: "d" }]);

    await sql`update part set shape = 'box' where id = 4`.execute(db);
    const down = await migrator(db).migrateDown();
    expect(down.error).toBeUndefined();
    expect(await rows(sql`select part_shape from leak_test where part_id = 4`)).toEqual([{ part_shape: "box" }]);
    await expect(part("Another D tank", "d")).rejects.toThrow(/CHECK constraint failed/);
    expect(await rows(sql`select count(*) as n from pragma_foreign_key_check`)).toEqual([{ n: 0 }]);

    const again = await migrator(db).migrateToLatest();
    expect(again.error).toBeUndefined();
    const after = await snapshot();
    expect(after.indexes).toEqual(before.indexes);
    expect(after.triggers).toEqual(before.triggers);
    expect(after.references).toEqual(before.references);
  });
});
