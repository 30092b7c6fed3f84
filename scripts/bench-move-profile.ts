// Where a move's time goes, in-process and one at a time (no HTTP, no other load): the whole
// transaction under synchronous=FULL, NORMAL, and NORMAL without automatic checkpoints.
// Run: tsx --conditions=react-server scripts/bench-move-profile.ts [jobs] [moves]
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { Kysely, SqliteDialect } from "kysely";
import type { Database } from "@/db/schema";
import { createDb, openSqlite, withStatementCache } from "@/db";
import { migrateToLatest } from "@/migrations";
import { moveJob } from "@/server/jobs/mutations";
import type { StaffUser } from "@/server/auth/session";
import { generateShop } from "./bench-shop";

const jobs = Number(process.argv[2] ?? 5000);
const count = Number(process.argv[3] ?? 400);
const dir = mkdtempSync(join(tmpdir(), "baywright-moveprof-"));
const path = join(dir, "p.db");
const m = createDb(path);
await migrateToLatest(m);
await m.destroy();
const setup = openSqlite(path);
await generateShop(setup, { jobs, onBoard: 600, password: "profile-password-1" });
const owner = setup.prepare("select id, name, email, role from staff where role = 'owner'").get() as StaffUser;
setup.close();

const pct = (t: number[], p: number) => [...t].sort((a, b) => a - b)[Math.min(t.length - 1, Math.ceil((p / 100) * t.length) - 1)];
// FULL, NORMAL, and NORMAL with no automatic checkpoint (what a checkpoint on the event loop costs).
for (const [synchronous, autocheckpoint] of [[2, 1000], [1, 1000], [1, 0]]) {
  const sqlite = openSqlite(path);
  sqlite.pragma(`synchronous = ${synchronous}`);
  sqlite.pragma(`wal_autocheckpoint = ${autocheckpoint}`);
  let statements = 0;
  const db = new Kysely<Database>({ dialect: new SqliteDialect({ database: withStatementCache(sqlite) }), plugins: [{ transformQuery: (a) => (statements++, a.node), transformResult: async (a) => a.result }] });
  const cards = sqlite.prepare("select id, version, stage from job where stage in ('queued','fabricate') and scope = 'fabrication' limit 64").all() as { id: number; version: number; stage: string }[];
  const times: number[] = [];
  statements = 0;
  for (let i = 0; i < count; i++) {
    const card = cards[i % cards.length];
    const toStage = card.stage === "queued" ? "fabricate" : "queued";
    const s = performance.now();
    const r = await moveJob(db as never, owner, card.id, { toStage, version: card.version } as never);
    times.push(performance.now() - s);
    card.version = r.job.version;
    card.stage = r.job.stage;
  }
  const mean = times.reduce((a, b) => a + b, 0) / count;
  console.log(JSON.stringify({ jobs, synchronous, autocheckpoint, moves: count, meanMs: +mean.toFixed(2), p50Ms: +pct(times, 50).toFixed(2), p95Ms: +pct(times, 95).toFixed(2), statementsPerMove: +(statements / count).toFixed(1), serialMovesPerSecond: Math.round(1000 / mean) }));
  await db.destroy();
}
rmSync(dir, { recursive: true, force: true });
