import { mkdirSync } from "node:fs";
import { dirname } from "node:path";
import SQLite from "better-sqlite3";
import { Kysely, type KyselyPlugin, SqliteDialect } from "kysely";
import { databasePath } from "./paths";
import type { Database } from "./schema";

export type DB = Kysely<Database>;

export { databasePath } from "./paths";

/**
 * Pragmas set on every connection. `synchronous=FULL` costs a little write speed but a power cut
 * in a shop office must never lose a recorded leak test or stage move; WAL keeps reads (the
 * board) from waiting on writes.
 */
export const PRAGMAS = {
  journal_mode: "wal",
  synchronous: 2, // FULL
  foreign_keys: 1,
  busy_timeout: 5000,
} as const;

export function openSqlite(path: string): SQLite.Database {
  if (path !== ":memory:") mkdirSync(dirname(path), { recursive: true });
  const sqlite = new SQLite(path);
  sqlite.pragma(`journal_mode = ${PRAGMAS.journal_mode}`);
  sqlite.pragma(`synchronous = ${PRAGMAS.synchronous}`);
  sqlite.pragma(`foreign_keys = ${PRAGMAS.foreign_keys}`);
  sqlite.pragma(`busy_timeout = ${PRAGMAS.busy_timeout}`);
  checkPragmas(sqlite, path);
  return sqlite;
}

function checkPragmas(sqlite: SQLite.Database, path: string) {
  const got = {
    journal_mode: sqlite.pragma("journal_mode", { simple: true }),
    synchronous: sqlite.pragma("synchronous", { simple: true }),
    foreign_keys: sqlite.pragma("foreign_keys", { simple: true }),
    busy_timeout: sqlite.pragma("busy_timeout", { simple: true }),
  };
  const wantJournal = path === ":memory:" ? "memory" : PRAGMAS.journal_mode;
  if (
    got.journal_mode !== wantJournal ||
    got.synchronous !== PRAGMAS.synchronous ||
    got.foreign_keys !== PRAGMAS.foreign_keys ||
    got.busy_timeout !== PRAGMAS.busy_timeout
  ) {
    throw new Error(`SQLite pragmas did not hold on ${path}: ${JSON.stringify(got)}`);
  }
}

/**
 * Counts statements that write, so read caches (the board) know when anything changed. Writes by
 * other processes (scripts, a second server) show in SQLite's data_version instead.
 */
// Kept on globalThis: the production build can hold several copies of this module, and they
// must all count into (and read) the same number.
const writes = ((globalThis as unknown as { __baywrightWrites?: { n: number } }).__baywrightWrites ??= { n: 0 });
const writeCounter: KyselyPlugin = {
  transformQuery(args) {
    if (args.node.kind !== "SelectQueryNode") writes.n++;
    return args.node;
  },
  async transformResult(args) {
    return args.result;
  },
};

export function createDb(path = databasePath()): DB {
  return new Kysely<Database>({ dialect: new SqliteDialect({ database: openSqlite(path) }), plugins: [writeCounter] });
}

const holder = globalThis as unknown as { __baywrightDb?: { path: string; db: DB; sqlite: SQLite.Database } };

/** One connection per process (per database path), kept across dev-server reloads. */
export function getDb(): DB {
  const path = databasePath();
  if (!holder.__baywrightDb || holder.__baywrightDb.path !== path) {
    const sqlite = openSqlite(path);
    holder.__baywrightDb = { path, sqlite, db: new Kysely<Database>({ dialect: new SqliteDialect({ database: sqlite }), plugins: [writeCounter] }) };
  }
  return holder.__baywrightDb.db;
}

/** Changes whenever any data may have changed, in this process or another. */
export function dataGeneration(): string {
  const sqlite = holder.__baywrightDb?.sqlite;
  const external = sqlite ? String(sqlite.pragma("data_version", { simple: true })) : "-";
  return `${writes.n}:${external}`;
}

export async function closeDb() {
  const current = holder.__baywrightDb;
  holder.__baywrightDb = undefined;
  if (current) await current.db.destroy();
}
