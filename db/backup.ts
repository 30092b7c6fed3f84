import { createHash } from "node:crypto";
import { chmodSync, copyFileSync, cpSync, existsSync, mkdirSync, readFileSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from "node:fs";
import { dirname, join, relative, resolve } from "node:path";
import SQLite from "better-sqlite3";
import { backupsDir, databasePath, photosDir, statusLinkSecretPath } from "./paths";

/**
 * Backups of the shop: the database through SQLite's online backup API (a consistent copy while
 * the app keeps writing; a plain file copy in WAL mode misses what still sits in the -wal file),
 * the photos folder and the status-link secret, in one dated folder with a manifest that restore
 * checks against.
 */

export const BACKUP_PREFIX = "baywright-";
const BACKUP_NAME = /^baywright-\d{4}-\d{2}-\d{2}T\d{2}-\d{2}-\d{2}Z(-\d+)?$/;
export const DEFAULT_KEEP = 14;

export interface PhotoFile {
  path: string;
  bytes: number;
  sha256: string;
}

export interface BackupManifest {
  format: 1;
  createdAt: string;
  database: { file: string; integrity: "ok"; tables: Record<string, number> };
  photos: { folder: string; files: PhotoFile[] };
  /** "file": the secret's file is in the backup; "environment": STATUS_LINK_SECRET is set and must be kept with the server's settings; "none": no link was ever issued. */
  statusLinkSecret: "file" | "environment" | "none";
}

export class BackupError extends Error {}

function sha256(path: string) {
  return createHash("sha256").update(readFileSync(path)).digest("hex");
}

function listFiles(root: string): string[] {
  if (!existsSync(root)) return [];
  const out: string[] = [];
  for (const entry of readdirSync(root, { withFileTypes: true, recursive: true })) {
    if (!entry.isFile()) continue;
    // A photo being written is `name.<pid>.tmp` until it is renamed into place.
    if (entry.name.endsWith(".tmp")) continue;
    out.push(relative(root, join(entry.parentPath, entry.name)));
  }
  return out.sort();
}

export function describePhotos(root: string): PhotoFile[] {
  return listFiles(root).map((path) => {
    const full = join(root, path);
    return { path, bytes: statSync(full).size, sha256: sha256(full) };
  });
}

/** Every table's rows, in rowid order: what the drill and the restore compare. */
export function tableNames(sqlite: SQLite.Database): string[] {
  // Ordinary tables only: a full-text index (the Jobs search) and its shadow tables are derived
  // from them, and some of those have no rowid to order by.
  return (sqlite.prepare("select name from pragma_table_list where schema = 'main' and type = 'table' and name not like 'sqlite_%' order by name").all() as { name: string }[]).map((r) => r.name);
}

export function tableCounts(sqlite: SQLite.Database): Record<string, number> {
  return Object.fromEntries(tableNames(sqlite).map((t) => [t, (sqlite.prepare(`select count(*) as n from "${t}"`).get() as { n: number }).n]));
}

export function integrity(sqlite: SQLite.Database): string {
  const rows = sqlite.pragma("integrity_check") as { integrity_check: string }[];
  return rows.map((r) => r.integrity_check).join("; ");
}

function stamp(now: Date) {
  return now.toISOString().replace(/\.\d{3}Z$/, "Z").replaceAll(":", "-");
}

export interface BackupOptions {
  into?: string;
  keep?: number;
  now?: Date;
}

export interface BackupResult {
  folder: string;
  manifest: BackupManifest;
  removed: string[];
}

/** Backs up the shop while the app runs. Only complete backups carry their final name. */
export async function backupShop(options: BackupOptions = {}): Promise<BackupResult> {
  const into = resolve(options.into ?? backupsDir());
  const keep = options.keep ?? DEFAULT_KEEP;
  if (!Number.isInteger(keep) || keep < 1) throw new BackupError(`Keep at least 1 backup; got ${keep}.`);
  const source = databasePath();
  if (!existsSync(source)) throw new BackupError(`There is no database at ${source}: nothing to back up. Set DATABASE_PATH to the shop's database.`);

  mkdirSync(into, { recursive: true });
  let name = `${BACKUP_PREFIX}${stamp(options.now ?? new Date())}`;
  for (let n = 2; existsSync(join(into, name)); n++) name = `${BACKUP_PREFIX}${stamp(options.now ?? new Date())}-${n}`;
  const folder = join(into, name);
  const partial = `${folder}.partial`;
  rmSync(partial, { recursive: true, force: true });
  mkdirSync(partial, { recursive: true });

  try {
    const dbFile = join(partial, "baywright.db");
    const live = new SQLite(source, { fileMustExist: true, timeout: 5000 });
    try {
      // All remaining pages in one step: a write by the app between steps would restart the copy.
      await live.backup(dbFile, { progress: ({ totalPages }) => Math.max(totalPages, 1) });
    } finally {
      live.close();
    }
    const copy = new SQLite(dbFile);
    let tables: Record<string, number>;
    try {
      // The copy stands alone as one file: no -wal beside it to lose.
      copy.pragma("journal_mode = DELETE");
      const check = integrity(copy);
      if (check !== "ok") throw new BackupError(`The copied database failed its integrity check (${check}); the backup was not kept. Run the backup again; if it fails again, the shop's database needs attention.`);
      tables = tableCounts(copy);
    } finally {
      copy.close();
    }

    // After the database: a photo recorded in the copy had its files written before its row.
    const photos = photosDir();
    const photoCopy = join(partial, "photos");
    mkdirSync(photoCopy, { recursive: true });
    if (existsSync(photos)) cpSync(photos, photoCopy, { recursive: true, filter: (src) => !src.endsWith(".tmp") });

    let statusLinkSecret: BackupManifest["statusLinkSecret"] = "none";
    if (process.env.STATUS_LINK_SECRET) statusLinkSecret = "environment";
    else if (existsSync(statusLinkSecretPath())) {
      copyFileSync(statusLinkSecretPath(), join(partial, "status-link.secret"));
      chmodSync(join(partial, "status-link.secret"), 0o600);
      statusLinkSecret = "file";
    }

    const manifest: BackupManifest = {
      format: 1,
      createdAt: (options.now ?? new Date()).toISOString(),
      database: { file: "baywright.db", integrity: "ok", tables },
      photos: { folder: "photos", files: describePhotos(photoCopy) },
      statusLinkSecret,
    };
    writeFileSync(join(partial, "manifest.json"), `${JSON.stringify(manifest, null, 2)}\n`);
    renameSync(partial, folder);
    return { folder, manifest, removed: pruneBackups(into, keep) };
  } catch (err) {
    rmSync(partial, { recursive: true, force: true });
    throw err;
  }
}

/** Complete backups in a folder, oldest first. */
export function listBackups(into: string): string[] {
  if (!existsSync(into)) return [];
  return readdirSync(into)
    .filter((name) => BACKUP_NAME.test(name) && existsSync(join(into, name, "manifest.json")))
    .sort((a, b) => a.localeCompare(b, "en", { numeric: true }));
}

/** Keeps the newest `keep` backups; touches nothing else in the folder. */
export function pruneBackups(into: string, keep: number): string[] {
  const all = listBackups(into);
  const old = all.slice(0, Math.max(0, all.length - keep));
  for (const name of old) rmSync(join(into, name), { recursive: true, force: true });
  return old;
}

/**
 * True when another program (the running app) has the database open. In WAL mode every open
 * connection holds a shared lock on the database's shared-memory file, so SQLite refuses anyone
 * else an exclusive lock for as long as the app runs, even while it is idle.
 */
export function databaseInUse(path = databasePath()): boolean {
  if (!existsSync(path)) return false;
  const probe = new SQLite(path, { timeout: 250 });
  try {
    probe.pragma("locking_mode = EXCLUSIVE");
    probe.exec("BEGIN EXCLUSIVE");
    probe.exec("COMMIT");
    return false;
  } catch (err) {
    if ((err as { code?: string }).code === "SQLITE_BUSY") return true;
    throw err;
  } finally {
    probe.close();
  }
}

export interface RestoreResult {
  database: string;
  photos: string;
  /** Where the data that was replaced now is (nothing is deleted by a restore). */
  setAside: string[];
  tables: Record<string, number>;
  photoFiles: number;
}

function readManifest(backup: string): BackupManifest {
  const file = join(backup, "manifest.json");
  if (!existsSync(file)) throw new BackupError(`${backup} is not a Baywright backup (it has no manifest.json). Give the path of a folder made by npm run db:backup.`);
  let manifest: BackupManifest;
  try {
    manifest = JSON.parse(readFileSync(file, "utf8")) as BackupManifest;
  } catch {
    throw new BackupError(`${file} cannot be read as JSON; this backup is damaged. Restore an older one.`);
  }
  if (manifest.format !== 1) throw new BackupError(`${backup} was made by another version of Baywright (format ${String(manifest.format)}).`);
  return manifest;
}

/** Checks a backup folder against its manifest: integrity, every table's row count, every photo's bytes. */
export function verifyBackup(backup: string): BackupManifest {
  const manifest = readManifest(backup);
  const dbFile = join(backup, manifest.database.file);
  if (!existsSync(dbFile)) throw new BackupError(`${backup} has no ${manifest.database.file}; this backup is incomplete. Restore another one.`);
  const copy = new SQLite(dbFile, { readonly: true, fileMustExist: true });
  try {
    const check = integrity(copy);
    if (check !== "ok") throw new BackupError(`The backup's database fails its integrity check (${check}). Restore another backup.`);
    const problems = compareCounts(manifest.database.tables, tableCounts(copy));
    if (problems.length) throw new BackupError(`The backup's database does not match its manifest: ${problems.join("; ")}. Restore another backup.`);
  } finally {
    copy.close();
  }
  const photoProblems = comparePhotos(manifest.photos.files, join(backup, manifest.photos.folder));
  if (photoProblems.length) throw new BackupError(`The backup's photos do not match its manifest: ${photoProblems.slice(0, 5).join("; ")}. Restore another backup.`);
  if (manifest.statusLinkSecret === "file" && !existsSync(join(backup, "status-link.secret"))) {
    throw new BackupError(`${backup} should hold status-link.secret and does not; without it every status link already sent stops working. Restore another backup.`);
  }
  return manifest;
}

function compareCounts(want: Record<string, number>, got: Record<string, number>): string[] {
  const names = [...new Set([...Object.keys(want), ...Object.keys(got)])].sort();
  return names.filter((t) => want[t] !== got[t]).map((t) => `${t}: ${want[t] ?? "missing"} rows expected, ${got[t] ?? "missing"} found`);
}

function comparePhotos(want: PhotoFile[], root: string): string[] {
  const problems: string[] = [];
  const present = new Set(listFiles(root));
  for (const file of want) {
    if (!present.has(file.path)) problems.push(`${file.path} is missing`);
    else if (sha256(join(root, file.path)) !== file.sha256) problems.push(`${file.path} differs`);
    present.delete(file.path);
  }
  for (const extra of present) problems.push(`${extra} is not in the manifest`);
  return problems;
}

function setAside(path: string, suffix: string, moved: string[]) {
  if (!existsSync(path)) return;
  const to = `${path}.before-restore-${suffix}`;
  renameSync(path, to);
  moved.push(to);
}

/**
 * Puts a backup in place of the shop's data. Refuses while the app has the database open. What
 * was there before is renamed `*.before-restore-<time>`, never deleted.
 */
export function restoreShop(backup: string, options: { now?: Date } = {}): RestoreResult {
  const from = resolve(backup);
  const manifest = verifyBackup(from);
  const target = databasePath();
  if (databaseInUse(target)) {
    throw new BackupError(`The app is running: it has ${target} open (SQLite refused an exclusive lock on it). Stop the app, then run the restore again.`);
  }
  const suffix = stamp(options.now ?? new Date());
  const moved: string[] = [];
  mkdirSync(dirname(target), { recursive: true });
  // Closing the last connection folds the -wal file into the database, so the set-aside copy is whole.
  if (existsSync(target)) new SQLite(target).close();
  for (const ext of ["", "-wal", "-shm"]) setAside(target + ext, suffix, moved);
  const incoming = `${target}.restoring`;
  copyFileSync(join(from, manifest.database.file), incoming);
  renameSync(incoming, target);

  const photos = photosDir();
  setAside(photos, suffix, moved);
  cpSync(join(from, manifest.photos.folder), photos, { recursive: true });

  if (manifest.statusLinkSecret === "file") {
    const secret = statusLinkSecretPath();
    setAside(secret, suffix, moved);
    copyFileSync(join(from, "status-link.secret"), secret);
    chmodSync(secret, 0o600);
  }

  const restored = new SQLite(target, { fileMustExist: true });
  let tables: Record<string, number>;
  try {
    const check = integrity(restored);
    if (check !== "ok") throw new BackupError(`The restored database fails its integrity check (${check}). The data that was there before is at ${moved.join(", ") || "(nothing was there)"}.`);
    tables = tableCounts(restored);
    const problems = compareCounts(manifest.database.tables, tables);
    if (problems.length) throw new BackupError(`The restored database does not match the backup: ${problems.join("; ")}.`);
  } finally {
    restored.close();
  }
  const photoProblems = comparePhotos(manifest.photos.files, photos);
  if (photoProblems.length) throw new BackupError(`The restored photos do not match the backup: ${photoProblems.slice(0, 5).join("; ")}.`);
  return { database: target, photos, setAside: moved, tables, photoFiles: manifest.photos.files.length };
}
