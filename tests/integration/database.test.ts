import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import * as health from "@/app/api/health/route";
import { createDb, openSqlite, readPragmas, serverCheckpointer } from "@/db";
import { seedDemo } from "@/db/seed";
import { migrateToLatest, migrations, migrator } from "@/migrations";
import { vinProblem } from "@/server/vehicles/vin";
import { useFreshDatabase } from "../support/db";
import { readBody } from "../support/http";

const { db } = useFreshDatabase();

describe("the database", () => {
  it("holds its pragmas on every open: WAL, synchronous NORMAL, foreign keys, busy timeout, memory for cache and temp", () => {
    const sqlite = openSqlite(process.env.DATABASE_PATH!);
    // Values as SQLite reports them: synchronous 1 is NORMAL, temp_store 2 is MEMORY, a negative
    // cache_size is in KiB.
    expect(readPragmas(sqlite)).toEqual({
      journal_mode: "wal",
      synchronous: 1,
      foreign_keys: 1,
      busy_timeout: 5000,
      cache_size: -65536,
      temp_store: 2,
      mmap_size: 268435456,
    });
    sqlite.close();
  });

  it("gives the server's own connection (the one every route uses) the same pragmas", async () => {
    const read = async (name: string) => (await sql.raw<Record<string, unknown>>(`pragma ${name}`).execute(db())).rows[0];
    expect(await read("journal_mode")).toEqual({ journal_mode: "wal" });
    expect(await read("synchronous")).toEqual({ synchronous: 1 });
    expect(await read("foreign_keys")).toEqual({ foreign_keys: 1 });
  });

  it("checkpoints the server connection's WAL on a worker thread, never inside a request's commit", async () => {
    const read = async (name: string) => (await sql.raw<Record<string, unknown>>(`pragma ${name}`).execute(db())).rows[0];
    expect(await read("wal_autocheckpoint")).toEqual({ wal_autocheckpoint: 0 });
    const checkpointer = serverCheckpointer();
    expect(checkpointer?.running).toBe(true);
    await sql`create table if not exists checkpoint_probe (n integer)`.execute(db());
    for (let i = 0; i < 50; i++) await sql`insert into checkpoint_probe (n) values (${i})`.execute(db());
    const result = await checkpointer!.now();
    // Every page the WAL holds is now in the database file (busy 0: nothing stopped it).
    expect(result.busy).toBe(0);
    expect(result.log).toBeGreaterThan(0);
    expect(result.checkpointed).toBe(result.log);
    await sql`drop table checkpoint_probe`.execute(db());
  });

  it("goes back to checkpointing on its own connection if the worker stops", async () => {
    const checkpointer = serverCheckpointer()!;
    await checkpointer.stop();
    expect(checkpointer.running).toBe(false);
    const read = async (name: string) => (await sql.raw<Record<string, unknown>>(`pragma ${name}`).execute(db())).rows[0];
    expect(await read("wal_autocheckpoint")).toEqual({ wal_autocheckpoint: 1000 });
  });

  it("lets a process with nothing else to do wait for the worker to stop (a script closing the database)", () => {
    // Run in a child: an unreferenced worker used to let such a process exit mid-await (code 13).
    const dir = mkdtempSync(join(tmpdir(), "baywright-stop-"));
    try {
      const script = `
        import Database from "better-sqlite3";
        import { startCheckpointer } from "./db/checkpoint.ts";
        const path = ${JSON.stringify(join(dir, "t.db"))};
        const sqlite = new Database(path);
        sqlite.pragma("journal_mode = WAL");
        sqlite.exec("create table t (n integer)");
        for (let round = 0; round < 5; round++) {
          const c = startCheckpointer(sqlite, path, 1000);
          await c.stop();
        }
        console.log("stopped five times");`;
      const out = spawnSync(process.execPath, ["--import", "tsx", "--input-type=module", "-e", script], { cwd: process.cwd(), encoding: "utf8", timeout: 60_000 });
      expect({ status: out.status, stdout: out.stdout.trim() }, out.stderr).toEqual({ status: 0, stdout: "stopped five times" });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it("reports healthy once migrated", async () => {
    const res = await health.GET();
    expect(res.status).toBe(200);
    expect(await readBody(res)).toEqual({ ok: true, database: "migrated" });
  });

  it("migrates down to nothing and up again", async () => {
    const other = createDb(`${process.env.DATABASE_PATH}-roundtrip`);
    await migrateToLatest(other);
    const m = migrator(other);
    for (let i = 0; i < Object.keys(migrations).length; i++) {
      const { error } = await m.migrateDown();
      expect(error).toBeUndefined();
    }
    await migrateToLatest(other);
    await other.destroy();
  });

  it("seeds the demo shop once, with VINs that pass the check digit, and refuses a second time", async () => {
    await seedDemo(db(), "demo-password-for-tests");
    const staff = await db().selectFrom("staff").select(["email", "role"]).execute();
    expect(staff).toHaveLength(6);
    expect(staff.filter((s) => s.role === "tech")).toHaveLength(4);
    const trucks = await db().selectFrom("truck").select("vin").execute();
    for (const t of trucks) expect(vinProblem(t.vin)).toBeNull();
    const stages = new Set((await db().selectFrom("job").select("stage").execute()).map((j) => j.stage));
    expect([...stages].sort()).toEqual(["coating", "delivered", "fabricate", "install", "pressure_test", "queued", "ready", "wire"]);
    await expect(seedDemo(db(), "x")).rejects.toThrow(/not empty/);
  });
});
