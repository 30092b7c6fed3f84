import { type ChildProcess, spawn, spawnSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { gzipSync } from "node:zlib";
import autocannon from "autocannon";
import { createDb, openSqlite } from "@/db";
import { migrateToLatest } from "@/migrations";
import { generateShop } from "./bench-shop";
import { benchStatusAndPhotos } from "./bench-status";

const JOBS = 5000;
const ON_BOARD = 600;
const CONNECTIONS = 16;
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const PASSWORD = "bench-password-2026";

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const srv = createServer();
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
  });
}

function percentile(sorted: number[], p: number) {
  if (!sorted.length) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

/** Latency of one GET under 16 concurrent connections, each response timed by autocannon. */
async function measureGet(url: string, cookie: string) {
  const times: number[] = [];
  let bad = 0;
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url, connections: CONNECTIONS, duration: SECONDS, headers: { cookie } }, (err, res) => (err ? reject(err) : resolve(res)));
    instance.on("response", (_client, status, _bytes, ms) => {
      if (status !== 200) bad++;
      times.push(ms);
    });
  });
  if (bad) throw new Error(`${url} answered ${bad} requests with a status other than 200`);
  times.sort((a, b) => a - b);
  return { p50: percentile(times, 50), p95: percentile(times, 95), rps: result.requests.average, errors: result.errors + result.non2xx };
}

/** Moves per second: 16 workers each shuttle their own cards between Queued and Fabricate. */
async function measureMoves(base: string, cookie: string, cards: { id: number; version: number; stage: string }[]) {
  const until = Date.now() + SECONDS * 1000;
  let moves = 0;
  let failures = 0;
  const times: number[] = [];
  const workers = Array.from({ length: CONNECTIONS }, async (_, w) => {
    const mine = cards.filter((_, i) => i % CONNECTIONS === w);
    let i = 0;
    while (Date.now() < until && mine.length) {
      const card = mine[i++ % mine.length];
      const toStage = card.stage === "queued" ? "fabricate" : "queued";
      const started = performance.now();
      const res = await fetch(`${base}/api/jobs/${card.id}/moves`, {
        method: "POST",
        headers: { cookie, "content-type": "application/json", origin: base },
        body: JSON.stringify({ toStage, version: card.version }),
      });
      times.push(performance.now() - started);
      if (res.ok) {
        const body = (await res.json()) as { job: { version: number; stage: string } };
        card.version = body.job.version;
        card.stage = body.job.stage;
        moves++;
      } else {
        failures++;
        await res.text();
      }
    }
  });
  const started = Date.now();
  await Promise.all(workers);
  times.sort((a, b) => a - b);
  return { perSecond: moves / ((Date.now() - started) / 1000), failures, p95: percentile(times, 95) };
}

/** First-load JavaScript of the board page: every script the page's HTML loads, gzipped. */
async function boardFirstLoadJs(base: string, cookie: string) {
  const html = await (await fetch(`${base}/board`, { headers: { cookie } })).text();
  // Scripts marked noModule are legacy polyfills that modern browsers never download.
  const tags = [...html.matchAll(/<script[^>]*>/g)].map((m) => m[0]).filter((t) => !/nomodule/i.test(t));
  const srcs = [...new Set(tags.map((t) => /src="([^"]+)"/.exec(t)?.[1]).filter((s): s is string => Boolean(s)))];
  let raw = 0;
  let gz = 0;
  for (const src of srcs) {
    const body = Buffer.from(await (await fetch(new URL(src, base))).arrayBuffer());
    raw += body.length;
    gz += gzipSync(body, { level: 9 }).length;
  }
  return { scripts: srcs.length, rawKb: raw / 1024, gzipKb: gz / 1024 };
}

async function main() {
  if (!existsSync(".next/BUILD_ID")) {
    console.log("Building first…");
    const b = spawnSync("npx", ["next", "build"], { stdio: "inherit" });
    if (b.status !== 0) process.exit(1);
  }
  const dir = mkdtempSync(join(tmpdir(), "baywright-bench-"));
  const dbPath = join(dir, "bench.db");
  const db = createDb(dbPath);
  await migrateToLatest(db);
  await db.destroy();
  const sqlite = openSqlite(dbPath);
  const t0 = performance.now();
  const { ownerEmail } = await generateShop(sqlite, { jobs: JOBS, onBoard: ON_BOARD, password: PASSWORD });
  const seedMs = performance.now() - t0;
  const movers = sqlite.prepare("select id, version, stage from job where stage in ('queued', 'fabricate') and scope = 'fabrication' limit 64").all() as { id: number; version: number; stage: string }[];
  sqlite.close();

  const cold = spawnSync("npx", ["tsx", "--conditions=react-server", "scripts/bench-board-cold.ts", dbPath, "40"], { encoding: "utf8" });
  if (cold.status !== 0) throw new Error(`cold board timing failed: ${cold.stderr}`);
  const boardCold = JSON.parse(cold.stdout.trim().split("\n").at(-1)!) as { p50Ms: number; p95Ms: number; bytes: number };

  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const server: ChildProcess = spawn("npx", ["next", "start", "-p", String(port), "-H", "127.0.0.1"], { env: { ...process.env, DATABASE_PATH: dbPath, NODE_ENV: "production", APP_URL: base }, stdio: "ignore", detached: true });
  const stop = () => {
    try {
      if (server.pid) process.kill(-server.pid, "SIGTERM");
    } catch {
      // already gone
    }
  };
  process.on("exit", stop);
  try {
    for (let i = 0; i < 200; i++) {
      try {
        if ((await fetch(`${base}/api/health`)).ok) break;
      } catch {
        // not up yet
      }
      await new Promise((r) => setTimeout(r, 250));
    }
    const signIn = await fetch(`${base}/api/session`, { method: "POST", headers: { "content-type": "application/json", origin: base }, body: JSON.stringify({ email: ownerEmail, password: PASSWORD }) });
    if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status}`);
    const cookie = (signIn.headers.get("set-cookie") ?? "").split(";")[0];
    const boardBody = await (await fetch(`${base}/api/board`, { headers: { cookie } })).json();
    if (boardBody.cards.length !== ON_BOARD) throw new Error(`board shows ${boardBody.cards.length} cards, expected ${ON_BOARD}`);

    // Warm both routes so the first compile of each is not measured.
    await measureGetQuick(`${base}/api/ping`, cookie);
    await measureGetQuick(`${base}/api/board`, cookie);
    const trivial = await measureGet(`${base}/api/ping`, cookie);
    const board = await measureGet(`${base}/api/board`, cookie);
    const moves = await measureMoves(base, cookie, movers);
    const js = await boardFirstLoadJs(base, cookie);
    const statusAndPhotos = await benchStatusAndPhotos({ baseUrl: base, databasePath: dbPath });

    const results = {
      at: new Date().toISOString(),
      machine: { cpus: (await import("node:os")).cpus().length, node: process.version },
      shop: { jobs: JOBS, onBoard: ON_BOARD, seedMs: Math.round(seedMs) },
      connections: CONNECTIONS,
      seconds: SECONDS,
      trivialRoute: { p50Ms: Math.round(trivial.p50), p95Ms: Math.round(trivial.p95), rps: Math.round(trivial.rps) },
      board: { p50Ms: Math.round(board.p50), p95Ms: Math.round(board.p95), rps: Math.round(board.rps), p95RatioToTrivial: Math.round((board.p95 / Math.max(trivial.p95, 1)) * 100) / 100 },
      boardBuiltFromDatabase: { p50Ms: Math.round(boardCold.p50Ms * 10) / 10, p95Ms: Math.round(boardCold.p95Ms * 10) / 10, jsonKb: Math.round(boardCold.bytes / 1024) },
      moves: { perSecond: Math.round(moves.perSecond), p95Ms: Math.round(moves.p95), failures: moves.failures },
      boardFirstLoadJs: { scripts: js.scripts, gzipKb: Math.round(js.gzipKb), rawKb: Math.round(js.rawKb) },
      statusPage: statusAndPhotos.statusPage,
      photo5MB: statusAndPhotos.photo5MB,
    };
    mkdirSync("bench", { recursive: true });
    writeFileSync("bench/results.json", `${JSON.stringify(results, null, 2)}\n`);
    console.table({
      "trivial route (GET /api/ping)": { p50_ms: results.trivialRoute.p50Ms, p95_ms: results.trivialRoute.p95Ms, req_per_s: results.trivialRoute.rps },
      "board (GET /api/board, 600 cards)": { p50_ms: results.board.p50Ms, p95_ms: results.board.p95Ms, req_per_s: results.board.rps },
      "moves (POST /api/jobs/:id/moves)": { p50_ms: "", p95_ms: results.moves.p95Ms, req_per_s: results.moves.perSecond },
    });
    console.log(`board built from the database (after any write, one at a time): p50 ${results.boardBuiltFromDatabase.p50Ms} ms, p95 ${results.boardBuiltFromDatabase.p95Ms} ms, ${results.boardBuiltFromDatabase.jsonKb} kB of JSON`);
    console.log(`board p95 / trivial p95 = ${results.board.p95RatioToTrivial} (goal ≤ 2, and board p95 < 30 ms)`);
    console.log(`board page first-load JS: ${results.boardFirstLoadJs.gzipKb} kB gzipped in ${js.scripts} scripts (goal < 200 kB)`);
    if (statusAndPhotos.statusPage) console.log(`status page: p50 ${Math.round(statusAndPhotos.statusPage.p50Ms)} ms, p95 ${Math.round(statusAndPhotos.statusPage.p95Ms)} ms at ${statusAndPhotos.statusPage.concurrency} concurrent`);
    if (statusAndPhotos.photo5MB) console.log(`5 MB photo, upload check to thumbnail: median ${Math.round(statusAndPhotos.photo5MB.medianMs)} ms over ${statusAndPhotos.photo5MB.runsMs.length} runs`);
    console.log("written to bench/results.json");
  } finally {
    stop();
    rmSync(dir, { recursive: true, force: true });
  }
}

async function measureGetQuick(url: string, cookie: string) {
  await autocannon({ url, connections: 4, amount: 200, headers: { cookie } });
}

await main();
process.exit(0);
