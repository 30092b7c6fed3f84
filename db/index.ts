import { mkdirSync } from "node:fs";
import { dirname } from "node:path";
import SQLite from "better-sqlite3";
import { Kysely, type KyselyPlugin, type RootOperationNode, SqliteDialect, type SqliteDatabase } from "kysely";
import { type Checkpointer, startCheckpointer } from "./checkpoint";
import { databasePath } from "./paths";
import type { Database } from "./schema";

export type DB = Kysely<Database>;

export { databasePath } from "./paths";

/**
 * Pragmas set on every connection, checked after setting (see DEVELOPERS.md, "Speed").
 * - WAL: readers read the last committed snapshot while a write is in progress.
 * - synchronous=NORMAL: a commit is appended to the WAL file without waiting for the disk; the
 *   WAL is flushed at each checkpoint. A killed or crashed server process loses nothing it has
 *   answered (the commit is in the OS's file cache, which outlives the process); a power cut or
 *   kernel crash can lose the last commits since the previous checkpoint, and never corrupts the
 *   file. FULL cost one disk flush per commit, on the one event loop every reader shares.
 * - cache_size / temp_store / mmap_size: keep the working set (the active board, recent jobs)
 *   in memory, so a 100,000-job history does not push it out.
 */
export const PRAGMAS = {
  journal_mode: "wal",
  synchronous: 1, // NORMAL
  foreign_keys: 1,
  busy_timeout: 5000,
  cache_size: -65536, // KiB: 64 MiB of page cache per connection
  temp_store: 2, // MEMORY
  mmap_size: 268435456, // 256 MiB
} as const;

export function openSqlite(path: string): SQLite.Database {
  if (path !== ":memory:") mkdirSync(dirname(path), { recursive: true });
  const sqlite = new SQLite(path);
  sqlite.pragma(`journal_mode = ${PRAGMAS.journal_mode}`);
  sqlite.pragma(`synchronous = ${PRAGMAS.synchronous}`);
  sqlite.pragma(`foreign_keys = ${PRAGMAS.foreign_keys}`);
  sqlite.pragma(`busy_timeout = ${PRAGMAS.busy_timeout}`);
  sqlite.pragma(`cache_size = ${PRAGMAS.cache_size}`);
  sqlite.pragma(`temp_store = ${PRAGMAS.temp_store}`);
  sqlite.pragma(`mmap_size = ${PRAGMAS.mmap_size}`);
  checkPragmas(sqlite, path);
  return sqlite;
}

/** The pragmas as the connection reports them. */
export function readPragmas(sqlite: SQLite.Database) {
  return {
    journal_mode: sqlite.pragma("journal_mode", { simple: true }),
    synchronous: sqlite.pragma("synchronous", { simple: true }),
    foreign_keys: sqlite.pragma("foreign_keys", { simple: true }),
    busy_timeout: sqlite.pragma("busy_timeout", { simple: true }),
    cache_size: sqlite.pragma("cache_size", { simple: true }),
    temp_store: sqlite.pragma("temp_store", { simple: true }),
    mmap_size: sqlite.pragma("mmap_size", { simple: true }),
  };
}

function checkPragmas(sqlite: SQLite.Database, path: string) {
  const got = readPragmas(sqlite);
  const memory = path === ":memory:";
  const want = { ...PRAGMAS, journal_mode: memory ? "memory" : PRAGMAS.journal_mode, mmap_size: memory ? got.mmap_size : PRAGMAS.mmap_size };
  for (const key of Object.keys(want) as (keyof typeof want)[]) {
    if (got[key] !== want[key]) throw new Error(`SQLite pragmas did not hold on ${path}: ${JSON.stringify(got)}`);
  }
}

/**
 * Counts statements that write, so read caches (the board) know when anything changed. Writes by
 * other processes (scripts, a second server) show in SQLite's data_version instead.
 */
// Kept on globalThis: the production build can hold several copies of this module, and they
// must all count into (and read) the same number.
const writes = ((globalThis as unknown as { __baywrightWrites?: { n: number } }).__baywrightWrites ??= { n: 0 });
// A raw statement that starts with SELECT or EXPLAIN only reads (the status page's one read is raw SQL).
function isRead(node: RootOperationNode) {
  if (node.kind === "SelectQueryNode") return true;
  return node.kind === "RawNode" && /^\s*(select|explain)\b/i.test(node.sqlFragments[0] ?? "");
}

const writeCounter: KyselyPlugin = {
  transformQuery(args) {
    if (!isRead(args.node)) writes.n++;
    return args.node;
  },
  async transformResult(args) {
    return args.result;
  },
};

/**
 * better-sqlite3 compiles a statement on every prepare, and Kysely prepares on every query; the
 * app runs the same few hundred statements over and over, so each connection keeps its compiled
 * statements (least recently used dropped past `size`). SQLite recompiles a kept statement by
 * itself if a migration changes the schema under it.
 */
export function withStatementCache(sqlite: SQLite.Database, size = 500): SqliteDatabase {
  const kept = new Map<string, SQLite.Statement>();
  return {
    close: () => sqlite.close(),
    prepare(text: string) {
      let statement = kept.get(text);
      if (statement) {
        kept.delete(text);
      } else {
        statement = sqlite.prepare(text);
        if (kept.size >= size) kept.delete(kept.keys().next().value!);
      }
      kept.set(text, statement);
      return statement;
    },
  };
}

export function createDb(path = databasePath()): DB {
  return new Kysely<Database>({ dialect: new SqliteDialect({ database: withStatementCache(openSqlite(path)) }), plugins: [writeCounter] });
}

const holder = globalThis as unknown as { __baywrightDb?: { path: string; db: DB; sqlite: SQLite.Database; checkpointer: Checkpointer | null } };

/**
 * One connection per process (per database path), kept across dev-server reloads. Its WAL
 * checkpoints run on a worker thread (db/checkpoint.ts), never inside a request's commit.
 */
export function getDb(): DB {
  const path = databasePath();
  if (!holder.__baywrightDb || holder.__baywrightDb.path !== path) {
    void holder.__baywrightDb?.checkpointer?.stop();
    const sqlite = openSqlite(path);
    const checkpointer = path === ":memory:" ? null : startCheckpointer(sqlite, path);
    holder.__baywrightDb = { path, sqlite, checkpointer, db: new Kysely<Database>({ dialect: new SqliteDialect({ database: withStatementCache(sqlite) }), plugins: [writeCounter] }) };
  }
  return holder.__baywrightDb.db;
}

/** The server connection's checkpoint worker, when it has one (for tests and the bench). */
export function serverCheckpointer(): Checkpointer | null {
  return holder.__baywrightDb?.checkpointer ?? null;
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
  await current?.checkpointer?.stop();
  if (current) await current.db.destroy();
}
