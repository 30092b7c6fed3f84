import { type ChildProcess, execFile, spawn } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { promisify } from "node:util";
import SQLite from "better-sqlite3";
import { sql } from "kysely";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BackupError, backupShop, databaseInUse, describePhotos, listBackups, restoreShop, tableNames } from "@/db/backup";
import { savePhotoFiles } from "@/server/photos/store";
import { useFreshDatabase } from "../support/db";
import { makeJob, makeStaff } from "../support/factories";

const { db } = useFreshDatabase();
const run = promisify(execFile);
const root = mkdtempSync(join(tmpdir(), "baywright-drill-"));
const livePhotos = join(root, "photos");
const liveDb = process.env.DATABASE_PATH!;
const secretFile = join(join(liveDb, ".."), "status-link.secret");
const TSX = join(process.cwd(), "node_modules/.bin/tsx");

beforeAll(() => {
  process.env.PHOTOS_DIR = livePhotos;
  delete process.env.STATUS_LINK_SECRET;
  writeFileSync(secretFile, "a1b2c3d4e5f60718293a4b5c6d7e8f90a1b2c3d4e5f60718293a4b5c6d7e8f90", { mode: 0o600 });
});
afterAll(() => rmSync(root, { recursive: true, force: true }));

/** Every row of every table, in rowid order. */
function dump(path: string): Record<string, unknown[]> {
  const sqlite = new SQLite(path, { readonly: true, fileMustExist: true });
  try {
    return Object.fromEntries(tableNames(sqlite).map((t) => [t, sqlite.prepare(`select * from "${t}" order by rowid`).all()]));
  } finally {
    sqlite.close();
  }
}

/**
 * A second process writing stage events as fast as it can, each in its own committed
 * transaction, numbered, so a backup taken meanwhile can be checked for a clean cut.
 */
function startWriter(jobId: number, staffId: string): ChildProcess {
  const script = `
    const S = require("better-sqlite3");
    const db = new S(process.env.DB, { timeout: 5000 });
    db.pragma("journal_mode = WAL"); db.pragma("synchronous = FULL");
    const add = db.prepare("insert into stage_event (job_id, from_stage, to_stage, actor_id, at, note, override_reason) values (?, 'queued', 'queued', ?, ?, ?, null)");
    const touch = db.prepare("update job set notes = ?, version = version + 1 where id = ?");
    let n = 0, stop = false;
    process.on("message", () => { stop = true; });
    const tick = () => {
      for (let i = 0; i < 20 && !stop; i++) {
        n++;
        db.transaction(() => { add.run(${jobId}, "${staffId}", new Date().toISOString(), "drill-" + n); touch.run("drill " + n, ${jobId}); })();
      }
      if (stop) { db.close(); process.send({ written: n }, () => process.exit(0)); } else setImmediate(tick);
    };
    tick();
  `;
  return spawn(process.execPath, ["-e", script], { env: { ...process.env, DB: liveDb }, stdio: ["ignore", "inherit", "inherit", "ipc"] });
}

function drillRows(path: string): number[] {
  const sqlite = new SQLite(path, { readonly: true, fileMustExist: true });
  try {
    return (sqlite.prepare("select note from stage_event where note like 'drill-%' order by id").all() as { note: string }[]).map((r) => Number(r.note.slice(6)));
  } finally {
    sqlite.close();
  }
}

async function someWebp(shade: number) {
  return sharp({ create: { width: 64, height: 48, channels: 3, background: { r: shade, g: 100, b: 60 } } }).webp().toBuffer();
}

describe("backup and restore drill", () => {
  it("backs up while another process writes, restores into a fresh folder, and every table and photo file matches", async () => {
    const owner = await makeStaff(db(), "owner");
    const jobs = [await makeJob(db(), { stage: "fabricate" }), await makeJob(db(), { stage: "install" })];
    for (const [i, job] of jobs.entries()) {
      await savePhotoFiles(job.id, `drillphoto${i}`, { display: await someWebp(40 * i), thumb: await someWebp(40 * i + 20) });
    }

    const writer = startWriter(jobs[0].id, owner.id);
    const finished = new Promise<number>((resolve) => writer.once("message", (m: { written: number }) => resolve(m.written)));
    for (let i = 0; i < 400 && drillRows(liveDb).length < 100; i++) await new Promise((r) => setTimeout(r, 10));
    const committedBefore = drillRows(liveDb).length;
    expect(committedBefore).toBeGreaterThanOrEqual(100);

    const into = join(root, "backups");
    const { folder, manifest } = await backupShop({ into, keep: 3 });
    const committedAfter = drillRows(liveDb).length;
    writer.send("stop");
    const written = await finished;
    expect(written).toBeGreaterThan(committedAfter - 1);

    // A clean cut: every write committed before the backup began, then a gap-free run, nothing half-done.
    const inBackup = drillRows(join(folder, "baywright.db"));
    expect(inBackup.length).toBeGreaterThanOrEqual(committedBefore);
    expect(inBackup.length).toBeLessThanOrEqual(committedAfter);
    expect(inBackup).toEqual(Array.from({ length: inBackup.length }, (_, i) => i + 1));
    const backedUpJob = dump(join(folder, "baywright.db")).job.find((j) => (j as { id: number }).id === jobs[0].id) as { notes: string };
    expect(backedUpJob.notes).toBe(`drill ${inBackup.length}`);
    expect(manifest.database.integrity).toBe("ok");
    expect(manifest.statusLinkSecret).toBe("file");
    expect(manifest.photos.files.map((f) => f.path)).toEqual([`${jobs[0].id}/drillphoto0-thumb.webp`, `${jobs[0].id}/drillphoto0.webp`, `${jobs[1].id}/drillphoto1-thumb.webp`, `${jobs[1].id}/drillphoto1.webp`].sort());

    // Restore into a fresh folder, as on a replacement machine.
    const fresh = join(root, "fresh");
    const before = { db: process.env.DATABASE_PATH, photos: process.env.PHOTOS_DIR };
    process.env.DATABASE_PATH = join(fresh, "data", "baywright.db");
    process.env.PHOTOS_DIR = join(fresh, "data", "photos");
    try {
      const restored = restoreShop(folder);
      expect(restored.setAside).toEqual([]);
      expect(dump(process.env.DATABASE_PATH)).toEqual(dump(join(folder, "baywright.db")));
      const photosBack = describePhotos(process.env.PHOTOS_DIR);
      expect(photosBack).toEqual(describePhotos(join(folder, "photos")));
      for (const file of photosBack) expect(readFileSync(join(process.env.PHOTOS_DIR, file.path))).toEqual(readFileSync(join(livePhotos, file.path)));
      expect(readFileSync(join(fresh, "data", "status-link.secret"), "utf8")).toBe(readFileSync(secretFile, "utf8"));
    } finally {
      process.env.DATABASE_PATH = before.db;
      process.env.PHOTOS_DIR = before.photos;
    }

    // Tables the writer never touched are exactly as they are live.
    const live = dump(liveDb);
    const copy = dump(join(folder, "baywright.db"));
    for (const table of Object.keys(live).filter((t) => t !== "stage_event" && t !== "job")) expect(copy[table], table).toEqual(live[table]);
  }, 30_000);

  it("a plain copy of the database file alone misses what still sits in the -wal file", async () => {
    const job = await makeJob(db());
    await sql`pragma wal_checkpoint(TRUNCATE)`.execute(db());
    for (let i = 0; i < 20; i++) await db().updateTable("job").set({ notes: `plain copy ${i}` }).where("id", "=", job.id).execute();
    const plain = join(root, "plain.db");
    // Copied by another program, as a person would: opening and closing the file in this process
    // would drop SQLite's locks on it (POSIX locks belong to the process, not the file handle).
    await run("cp", [liveDb, plain]);
    expect(existsSync(`${liveDb}-wal`)).toBe(true);
    const copied = new SQLite(plain, { readonly: true });
    const row = copied.prepare("select notes from job where id = ?").get(job.id) as { notes: string };
    copied.close();
    expect(row.notes).toBe("");

    const { folder } = await backupShop({ into: join(root, "backups") });
    const viaBackup = new SQLite(join(folder, "baywright.db"), { readonly: true });
    expect((viaBackup.prepare("select notes from job where id = ?").get(job.id) as { notes: string }).notes).toBe("plain copy 19");
    viaBackup.close();
  });

  it("refuses to restore while the app has the database open, and says so", async () => {
    const into = join(root, "refuse");
    const { folder } = await backupShop({ into });
    // This test's own connection is open, as the running app's would be.
    await db().selectFrom("staff").select("id").execute();
    const result = await run(TSX, ["scripts/restore.ts", folder], { env: process.env }).catch((err: { code: number; stderr: string }) => err);
    expect(result).toMatchObject({ code: 1, stderr: expect.stringMatching(/The app is running: it has .* open.*Stop the app, then run the restore again\./) });
    expect(databaseInUse(liveDb)).toBe(true);
    expect(() => restoreShop(folder)).toThrow(BackupError);
    const again = await run(TSX, ["scripts/restore.ts", folder], { env: process.env }).catch((err: { code: number; stderr: string }) => err);
    expect(again).toMatchObject({ code: 1, stderr: expect.stringMatching(/The app is running/) });

    const closed = join(root, "closed.db");
    new SQLite(closed).close();
    expect(databaseInUse(closed)).toBe(false);
  }, 30_000);

  it("refuses a folder that is not a backup, and one whose photos were changed", async () => {
    const empty = join(root, "not-a-backup");
    mkdirSync(empty, { recursive: true });
    expect(() => restoreShop(empty)).toThrow(/is not a Baywright backup \(it has no manifest\.json\)/);

    const { folder, manifest } = await backupShop({ into: join(root, "tampered") });
    writeFileSync(join(folder, "photos", manifest.photos.files[0].path), "not the photo");
    expect(() => restoreShop(folder)).toThrow(/photos do not match its manifest: .* differs/);
  });

  it("keeps only the newest N backups, and the command line says what it did", async () => {
    const into = join(root, "rotation");
    const made: string[] = [];
    for (let i = 0; i < 4; i++) made.push((await backupShop({ into, keep: 2, now: new Date(Date.UTC(2026, 0, 10 + i, 17, 30)) })).folder);
    expect(listBackups(into)).toEqual(["baywright-2026-01-12T17-30-00Z", "baywright-2026-01-13T17-30-00Z"]);
    // Something else in the folder is never touched.
    writeFileSync(join(into, "notes.txt"), "keep me");

    const out = await run(TSX, ["scripts/backup.ts", into, "--keep", "2"], { env: process.env });
    expect(out.stdout).toMatch(/^Backed up to .*baywright-\d{4}-\d{2}-\d{2}T\d{2}-\d{2}-\d{2}Z\n/);
    expect(out.stdout).toMatch(/removed 1 older backup \(keeping 2\): baywright-2026-01-12T17-30-00Z/);
    expect(listBackups(into)).toHaveLength(2);
    expect(readFileSync(join(into, "notes.txt"), "utf8")).toBe("keep me");

    const bad = await run(TSX, ["scripts/backup.ts", into, "--keep", "0"], { env: process.env }).catch((err: { code: number; stderr: string }) => err);
    expect(bad).toMatchObject({ code: 1, stderr: expect.stringMatching(/--keep \(or BACKUP_KEEP\) must be a whole number of 1 or more/) });
  }, 30_000);
});
