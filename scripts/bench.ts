import { type ChildProcess, spawn, spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync, writeFileSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { gzipSync } from "node:zlib";
import autocannon from "autocannon";
import { createDb, openSqlite } from "@/db";
import { migrateToLatest, migrations } from "@/migrations";
import { demoKitCalcInput } from "@/server/kit-calc/demo";
import { generateShop } from "./bench-shop";
import { benchStatusAndPhotos } from "./bench-status";

const JOBS = 5000;
const ON_BOARD = 600;
const CONNECTIONS = 16;
/** BENCH_QUICK=1: the same runs, shorter, for a look in about a minute (the 100,000-job shop is kept between runs). */
const QUICK = process.env.BENCH_QUICK === "1";
const SECONDS = Number(process.env.BENCH_SECONDS ?? (QUICK ? 3 : 10));
const BIG_JOBS = 100_000;
const MIXED_CLIENTS = 50;
const MIXED_SECONDS = Number(process.env.BENCH_MIXED_SECONDS ?? (QUICK ? 8 : 30));
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

/** Latency of one GET under 16 (or `connections`) concurrent connections, each response timed by autocannon. */
async function measureGet(url: string, cookie: string, seconds = SECONDS, connections = CONNECTIONS) {
  const times: number[] = [];
  let bad = 0;
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url, connections, duration: seconds, headers: { cookie } }, (err, res) => (err ? reject(err) : resolve(res)));
    instance.on("response", (_client, status, _bytes, ms) => {
      if (status !== 200) bad++;
      times.push(ms);
    });
  });
  if (bad) throw new Error(`${url} answered ${bad} requests with a status other than 200`);
  if (!times.length) throw new Error(`${url} answered nothing in ${seconds} s (${result.errors} connection errors): is the server built and running?`);
  times.sort((a, b) => a - b);
  return { p50: percentile(times, 50), p95: percentile(times, 95), p99: percentile(times, 99), max: times.at(-1)!, rps: result.requests.average, errors: result.errors + result.non2xx };
}

/**
 * A server page as a person waits for it: 16 connections, each timing the first bytes (the page's
 * head, sent before the sections that read their own records) and the last.
 */
async function measurePage(url: string, cookie: string, seconds = SECONDS) {
  const first: number[] = [];
  const last: number[] = [];
  const until = Date.now() + seconds * 1000;
  await Promise.all(
    Array.from({ length: CONNECTIONS }, async () => {
      while (Date.now() < until) {
        const t0 = performance.now();
        const res = await fetch(url, { headers: { cookie } });
        const reader = res.body!.getReader();
        let chunk = await reader.read();
        first.push(performance.now() - t0);
        while (!chunk.done) chunk = await reader.read();
        last.push(performance.now() - t0);
        if (res.status !== 200) throw new Error(`${url} answered ${res.status}`);
      }
    }),
  );
  first.sort((a, b) => a - b);
  last.sort((a, b) => a - b);
  return { firstByteP95Ms: Math.round(percentile(first, 95)), p95Ms: Math.round(percentile(last, 95)), perSecond: Math.round(last.length / seconds) };
}

/** Moves per second: 16 workers each shuttle their own cards between Queued and Fabricate. */
async function measureMoves(base: string, cookie: string, cards: { id: number; version: number; stage: string }[]) {
  const until = Date.now() + SECONDS * 1000;
  let moves = 0;
  let failures = 0;
  let firstRefusal: string | undefined;
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
        firstRefusal ??= `${res.status} ${await res.text()}`;
        if (failures > 20) break;
      }
    }
  });
  const started = Date.now();
  await Promise.all(workers);
  // Every card is moved by one worker only, so a refusal means the bench shop no longer meets the
  // shop's rules (a gate added since): the figure would time refusals, not moves.
  if (failures) throw new Error(`${failures} moves were refused; the first: ${firstRefusal!.slice(0, 400)}`);
  times.sort((a, b) => a - b);
  return { perSecond: moves / ((Date.now() - started) / 1000), failures, p95: percentile(times, 95) };
}

/** First-load JavaScript of the board page: every script the page's HTML loads, gzipped. */
async function firstLoadJs(base: string, cookie: string, path = "/board") {
  const html = await (await fetch(`${base}${path}`, { headers: { cookie } })).text();
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

/** The shop's pages a person opens first (ids from the bench shop); each page's first-load JS, the largest named. */
async function everyPageFirstLoadJs(base: string, cookie: string, jobId: number) {
  const paths = ["/", "/board", "/jobs", `/jobs/${jobId}`, "/customers", "/trucks", "/coating", "/parts", "/job-costs", "/calculator", "/prices", "/reports", "/staff", "/settings", "/audit", "/account"];
  const pages: Record<string, number> = {};
  for (const path of paths) pages[path] = Math.round((await firstLoadJs(base, cookie, path)).gzipKb);
  const [largestPage, largestKb] = Object.entries(pages).sort(([, a], [, b]) => b - a)[0];
  return { pages, largestPage, largestKb };
}

/**
 * A shop's day at once: `clients` people each doing one thing after another for `seconds`:
 * looking at the board, opening a job page, moving a card, working the calculator (no moves in the
 * read-only run). Every request is timed from send to its last byte.
 */
async function mixedLoad(base: string, cookie: string, opts: { clients: number; seconds: number; moves: boolean; jobIds: number[]; movers: { id: number; version: number; stage: string }[] }) {
  const times: number[] = [];
  let errors = 0;
  let non2xx = 0;
  let firstNon2xx = "";
  const until = Date.now() + opts.seconds * 1000;
  const started = Date.now();
  const calcBody = JSON.stringify(demoKitCalcInput);
  const headers = { cookie, "content-type": "application/json", origin: base };
  const client = async (c: number) => {
    const mine = opts.movers.filter((_, i) => i % opts.clients === c);
    let n = c;
    while (Date.now() < until) {
      n++;
      const roll = (n * 37 + c * 11) % 100;
      const t0 = performance.now();
      try {
        let res: Response;
        if (roll < 40) res = await fetch(`${base}/api/board`, { headers: { cookie } });
        else if (roll < 65) res = await fetch(`${base}/jobs/${opts.jobIds[n % opts.jobIds.length]}`, { headers: { cookie } });
        else if (roll < 85 && opts.moves && mine.length) {
          const card = mine[n % mine.length];
          res = await fetch(`${base}/api/jobs/${card.id}/moves`, { method: "POST", headers, body: JSON.stringify({ toStage: card.stage === "queued" ? "fabricate" : "queued", version: card.version }) });
          if (res.ok) {
            const body = (await res.json()) as { job: { version: number; stage: string } };
            card.version = body.job.version;
            card.stage = body.job.stage;
          }
        } else res = await fetch(`${base}/api/kit-calc`, { method: "POST", headers, body: calcBody });
        if (res.status < 200 || res.status > 299) {
          non2xx++;
          if (!firstNon2xx && !res.bodyUsed) firstNon2xx = `${res.url} ${res.status} ${(await res.text()).slice(0, 300)}`;
        }
        if (!res.bodyUsed) await res.arrayBuffer();
      } catch {
        errors++;
      }
      times.push(performance.now() - t0);
    }
  };
  await Promise.all(Array.from({ length: opts.clients }, (_, c) => client(c)));
  const elapsed = (Date.now() - started) / 1000;
  times.sort((a, b) => a - b);
  if (firstNon2xx) console.log(`mixed load: ${non2xx} answers were not 2xx; the first: ${firstNon2xx}`);
  return { clients: opts.clients, seconds: opts.seconds, rps: Math.round(times.length / elapsed), p50Ms: Math.round(percentile(times, 50)), p95Ms: Math.round(percentile(times, 95)), p99Ms: Math.round(percentile(times, 99)), errors, non2xx };
}

/** Starts `next start` on a database; answers its base URL, a signed-in owner's cookie and how to stop it. */
async function startServer(dbPath: string, ownerEmail: string) {
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
  for (let i = 0; i < 400; i++) {
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
  return { base, cookie, stop };
}

/**
 * A migrated shop of `jobs` jobs with their history. The 100,000-job one takes about a minute to
 * write, so it is kept in bench/.shops (gitignored), named after the generator's source, the
 * migrations and the size; a run copies it, so every run starts from the same shop.
 */
async function shopDatabase(dir: string, jobs: number) {
  const key = createHash("sha256").update(readFileSync("scripts/bench-shop.ts")).update(Object.keys(migrations).join(",")).update(String(jobs)).digest("hex").slice(0, 12);
  const shops = join("bench", ".shops");
  const kept = join(shops, `shop-${jobs}-${key}.db`);
  const dbPath = join(dir, `shop-${jobs}.db`);
  let seedMs = 0;
  if (!existsSync(kept)) {
    rmSync(shops, { recursive: true, force: true });
    mkdirSync(shops, { recursive: true });
    const building = `${kept}.building`;
    const db = createDb(building);
    await migrateToLatest(db);
    await db.destroy();
    const sqlite = openSqlite(building);
    const t0 = performance.now();
    await generateShop(sqlite, { jobs, onBoard: ON_BOARD, password: PASSWORD, history: true });
    seedMs = performance.now() - t0;
    sqlite.pragma("wal_checkpoint(TRUNCATE)");
    sqlite.close();
    renameSync(building, kept);
  }
  copyFileSync(kept, dbPath);
  return { dbPath, seedMs };
}

/** Cards the movers shuttle, and the job pages people open (on the board, and a few delivered). */
function shopSample(dbPath: string) {
  const sqlite = openSqlite(dbPath);
  const movers = sqlite.prepare("select id, version, stage from job where stage in ('queued', 'fabricate') and scope = 'fabrication' limit 64").all() as { id: number; version: number; stage: string }[];
  const jobIds = (sqlite.prepare("select id from job where stage in ('fabricate', 'pressure_test', 'coating', 'install', 'wire') order by id limit 40").all() as { id: number }[]).map((r) => r.id);
  jobIds.push(...(sqlite.prepare("select id from job where stage = 'delivered' order by id desc limit 10").all() as { id: number }[]).map((r) => r.id));
  sqlite.close();
  return { movers, jobIds };
}

/** How the office's pages are used on a working day (see `measureOfficePage`). */
const OFFICE_PEOPLE = 2;
const FLOOR_PHONES = 10;
const PHONE_EVERY_MS = 2000;
const MOVE_EVERY_MS = 5000;

/**
 * A page as the office waits for it on a working day: OFFICE_PEOPLE people asking for it again
 * the moment it arrives (no pause to read, so far more often than anyone does), while
 * FLOOR_PHONES phones read the board every 2 s (the board polls every 15 s) and a card moves
 * every 5 s (every move empties the kept desk and report, so some answers are rebuilt).
 * The parts desk and Hours are office pages: one or two people have them open, not sixteen.
 */
async function measureOfficePage(url: string, base: string, cookie: string, movers: { id: number; version: number; stage: string }[]) {
  let running = true;
  let floorReads = 0;
  let moves = 0;
  const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
  const phone = async (p: number) => {
    await sleep((p * PHONE_EVERY_MS) / FLOOR_PHONES);
    while (running) {
      const res = await fetch(`${base}/api/board`, { headers: { cookie } });
      await res.arrayBuffer();
      if (!res.ok) throw new Error(`the board answered ${res.status} during the office run`);
      floorReads++;
      await sleep(PHONE_EVERY_MS);
    }
  };
  const mover = async () => {
    let n = 0;
    // The first move half an interval in, so a 10-second run sees two.
    await sleep(MOVE_EVERY_MS / 2);
    while (running && movers.length) {
      if (!running) break;
      const card = movers[n++ % movers.length];
      const res = await fetch(`${base}/api/jobs/${card.id}/moves`, {
        method: "POST",
        headers: { cookie, "content-type": "application/json", origin: base },
        body: JSON.stringify({ toStage: card.stage === "queued" ? "fabricate" : "queued", version: card.version }),
      });
      if (!res.ok) throw new Error(`a move during the office run was refused: ${res.status} ${(await res.text()).slice(0, 300)}`);
      const body = (await res.json()) as { job: { version: number; stage: string } };
      card.version = body.job.version;
      card.stage = body.job.stage;
      moves++;
      await sleep(MOVE_EVERY_MS);
    }
  };
  const background = [...Array.from({ length: FLOOR_PHONES }, (_, p) => phone(p)), mover()];
  try {
    const office = await measureGet(url, cookie, SECONDS, OFFICE_PEOPLE);
    return { p50Ms: Math.round(office.p50), p95Ms: Math.round(office.p95), p99Ms: Math.round(office.p99), maxMs: Math.round(office.max), rps: Math.round(office.rps), officePeople: OFFICE_PEOPLE, boardReadsMeanwhile: floorReads, movesMeanwhile: moves };
  } finally {
    running = false;
    await Promise.all(background);
  }
}

/**
 * The parts desk and the Hours and job cost page (goal: p95 < 100 ms on the 5,000-job shop), as
 * the office meets them on a working day (the goal's figure) and at 16 connections (a stress
 * figure), each beside the shop's smallest page measured the same way.
 */
async function benchPartsPages(base: string, cookie: string, movers: { id: number; version: number; stage: string }[]) {
  await measureGetQuick(`${base}/parts`, cookie);
  await measureGetQuick(`${base}/job-costs`, cookie);
  await measureGetQuick(`${base}/account`, cookie);
  const office = {
    partsDesk: await measureOfficePage(`${base}/parts`, base, cookie, movers),
    jobCostReport: await measureOfficePage(`${base}/job-costs`, base, cookie, movers),
    smallestShopPage: await measureOfficePage(`${base}/account`, base, cookie, movers),
  };
  const desk = await measureGet(`${base}/parts`, cookie);
  const cost = await measureGet(`${base}/job-costs`, cookie);
  // The yardstick for server pages, as the trivial route is for JSON: the shop's smallest page
  // (the frame, the menu and one short form), so a page's figure reads against what any page costs.
  const floor = await measureGet(`${base}/account`, cookie);
  const out = {
    partsDesk: { p50Ms: Math.round(desk.p50), p95Ms: Math.round(desk.p95), rps: Math.round(desk.rps) },
    jobCostReport: { p50Ms: Math.round(cost.p50), p95Ms: Math.round(cost.p95), rps: Math.round(cost.rps) },
    smallestShopPage: { p50Ms: Math.round(floor.p50), p95Ms: Math.round(floor.p95), rps: Math.round(floor.rps) },
    officeWorkingDay: office,
  };
  console.log(
    `as the office meets them (${OFFICE_PEOPLE} people, ${FLOOR_PHONES} phones on the board, a move every ${MOVE_EVERY_MS / 1000} s): parts desk p95 ${office.partsDesk.p95Ms} ms, Hours and job cost p95 ${office.jobCostReport.p95Ms} ms, /account p95 ${office.smallestShopPage.p95Ms} ms (goal < 100 ms)`,
  );
  console.log(`stress, ${CONNECTIONS} connections: parts desk p95 ${out.partsDesk.p95Ms} ms, Hours and job cost p95 ${out.jobCostReport.p95Ms} ms, the smallest shop page (/account) p95 ${out.smallestShopPage.p95Ms} ms`);
  return out;
}

/** BENCH_ONLY=parts: only the parts desk and job cost pages on the 5,000-job shop, merged into bench/results.json. */
async function partsOnly() {
  const dir = mkdtempSync(join(tmpdir(), "baywright-bench-"));
  const dbPath = join(dir, "bench.db");
  const db = createDb(dbPath);
  await migrateToLatest(db);
  await db.destroy();
  const sqlite = openSqlite(dbPath);
  const { ownerEmail } = await generateShop(sqlite, { jobs: JOBS, onBoard: ON_BOARD, password: PASSWORD, history: true });
  sqlite.close();
  const { movers } = shopSample(dbPath);
  const { base, cookie, stop } = await startServer(dbPath, ownerEmail);
  try {
    const parts = await benchPartsPages(base, cookie, movers);
    const previous = existsSync("bench/results.json") ? (JSON.parse(readFileSync("bench/results.json", "utf8")) as Record<string, unknown>) : {};
    mkdirSync("bench", { recursive: true });
    writeFileSync("bench/results.json", `${JSON.stringify({ ...previous, ...parts, partsMeasuredAt: new Date().toISOString(), partsQuick: QUICK }, null, 2)}\n`);
  } finally {
    stop();
    rmSync(dir, { recursive: true, force: true });
  }
}

async function main() {
  // Every mode starts the production server, so every mode builds first: a build left from older
  // sources would measure old code. BENCH_SKIP_BUILD=1 reuses the build (only right after one).
  if (process.env.BENCH_SKIP_BUILD !== "1" || !existsSync(".next/BUILD_ID")) {
    console.log("Building first…");
    const b = spawnSync("npx", ["next", "build"], { stdio: "inherit" });
    if (b.status !== 0) process.exit(1);
  }
  if (process.env.BENCH_ONLY === "parts") return partsOnly();
  const dir = mkdtempSync(join(tmpdir(), "baywright-bench-"));
  const dbPath = join(dir, "bench.db");
  const db = createDb(dbPath);
  await migrateToLatest(db);
  await db.destroy();
  const sqlite = openSqlite(dbPath);
  const t0 = performance.now();
  const { ownerEmail } = await generateShop(sqlite, { jobs: JOBS, onBoard: ON_BOARD, password: PASSWORD, history: true });
  const seedMs = performance.now() - t0;
  sqlite.close();
  const { movers, jobIds } = shopSample(dbPath);

  const cold = spawnSync("npx", ["tsx", "--conditions=react-server", "scripts/bench-board-cold.ts", dbPath, "40"], { encoding: "utf8" });
  if (cold.status !== 0) throw new Error(`cold board timing failed: ${cold.stderr}`);
  const boardCold = JSON.parse(cold.stdout.trim().split("\n").at(-1)!) as { p50Ms: number; p95Ms: number; bytes: number };

  const { base, cookie, stop } = await startServer(dbPath, ownerEmail);
  try {
    if (process.env.BENCH_ONLY === "desk") {
      // `BENCH_ONLY=desk npm run bench`: only the office's desk, on the 5,000-job shop.
      const desk = { ...(await measureDesk(base, cookie, jobIds[0])), builtAfterAWrite: reportsCold(dbPath) };
      const previous = existsSync("bench/results.json") ? (JSON.parse(readFileSync("bench/results.json", "utf8")) as Record<string, unknown>) : {};
      mkdirSync("bench", { recursive: true });
      writeFileSync("bench/results.json", `${JSON.stringify({ ...previous, desk: { at: new Date().toISOString(), quick: QUICK, ...desk } }, null, 2)}\n`);
      console.log(JSON.stringify(desk, null, 2));
      return;
    }
    const boardBody = await (await fetch(`${base}/api/board`, { headers: { cookie } })).json();
    if (boardBody.cards.length !== ON_BOARD) throw new Error(`board shows ${boardBody.cards.length} cards, expected ${ON_BOARD}`);

    // Warm both routes so the first compile of each is not measured.
    await measureGetQuick(`${base}/api/ping`, cookie);
    await measureGetQuick(`${base}/api/board`, cookie);
    const trivial = await measureGet(`${base}/api/ping`, cookie);
    const board = await measureGet(`${base}/api/board`, cookie);
    const moves = await measureMoves(base, cookie, movers);
    const js = await firstLoadJs(base, cookie);
    const allJs = await everyPageFirstLoadJs(base, cookie, jobIds[0]);
    const statusAndPhotos = await benchStatusAndPhotos({ baseUrl: base, databasePath: dbPath, requests: QUICK ? 120 : 300, photoRuns: QUICK ? 1 : 3 });
    // Server pages, as a browser asks for them (HTML, rendered on the server).
    const activeJob = jobIds[0];
    await measureGetQuick(`${base}/jobs/${activeJob}`, cookie);
    await measureGetQuick(`${base}/jobs`, cookie);
    const jobPage = await measureGet(`${base}/jobs/${activeJob}`, cookie);
    const jobPageStreamed = await measurePage(`${base}/jobs/${activeJob}`, cookie);
    const jobsList = await measureGet(`${base}/jobs`, cookie);
    const search = await measureGet(`${base}/jobs?q=Customer%2012`, cookie);
    const parts = await benchPartsPages(base, cookie, shopSample(dbPath).movers);
    const desk = { ...(await measureDesk(base, cookie, jobIds[0])), builtAfterAWrite: reportsCold(dbPath) };
    const readOnly = await mixedLoad(base, cookie, { clients: MIXED_CLIENTS, seconds: MIXED_SECONDS, moves: false, jobIds, movers: [] });
    const mixed = await mixedLoad(base, cookie, { clients: MIXED_CLIENTS, seconds: MIXED_SECONDS, moves: true, jobIds, movers: shopSample(dbPath).movers });
    stop();

    // The same board, job page, Jobs list and search on a shop twenty times older.
    const big = await shopDatabase(dir, BIG_JOBS);
    const bigSample = shopSample(big.dbPath);
    const bigServer = await startServer(big.dbPath, ownerEmail);
    let board100k: { p50Ms: number; p95Ms: number; ratioTo5k: number };
    let big100k: Record<string, { p95Ms: number; ratioTo5k: number }>;
    try {
      const bigSeconds = Math.max(3, Math.round(SECONDS / 2));
      await measureGetQuick(`${bigServer.base}/api/board`, bigServer.cookie);
      await measureGetQuick(`${bigServer.base}/jobs/${bigSample.jobIds[0]}`, bigServer.cookie);
      await measureGetQuick(`${bigServer.base}/jobs`, bigServer.cookie);
      const b = await measureGet(`${bigServer.base}/api/board`, bigServer.cookie, bigSeconds);
      const jp = await measureGet(`${bigServer.base}/jobs/${bigSample.jobIds[0]}`, bigServer.cookie, bigSeconds);
      const jl = await measureGet(`${bigServer.base}/jobs`, bigServer.cookie, bigSeconds);
      const se = await measureGet(`${bigServer.base}/jobs?q=Customer%2012`, bigServer.cookie, bigSeconds);
      const cold100k = spawnSync("npx", ["tsx", "--conditions=react-server", "scripts/bench-board-cold.ts", big.dbPath, "20"], { encoding: "utf8" });
      const boardCold100k = cold100k.status === 0 ? (JSON.parse(cold100k.stdout.trim().split("\n").at(-1)!) as { p95Ms: number }) : null;
      const ratio = (a: number, b: number) => Math.round((a / Math.max(b, 1)) * 100) / 100;
      board100k = { p50Ms: Math.round(b.p50), p95Ms: Math.round(b.p95), ratioTo5k: ratio(b.p95, board.p95) };
      big100k = {
        jobPage: { p95Ms: Math.round(jp.p95), ratioTo5k: ratio(jp.p95, jobPage.p95) },
        jobsList: { p95Ms: Math.round(jl.p95), ratioTo5k: ratio(jl.p95, jobsList.p95) },
        search: { p95Ms: Math.round(se.p95), ratioTo5k: ratio(se.p95, search.p95) },
        ...(boardCold100k ? { boardBuiltFromDatabase: { p95Ms: Math.round(boardCold100k.p95Ms * 10) / 10, ratioTo5k: ratio(boardCold100k.p95Ms, boardCold.p95Ms) } } : {}),
      };
      // Every report, built right after a write, against the same on the 5,000-job shop.
      const reports100k = reportsCold(big.dbPath);
      for (const [name, r] of Object.entries(reports100k)) {
        const small = desk.builtAfterAWrite[name];
        if (small) big100k[`${name}BuiltAfterAWrite`] = { p95Ms: r.p95Ms, ratioTo5k: ratio(r.p95Ms, small.p95Ms) };
      }
    } finally {
      bigServer.stop();
    }

    const previous = existsSync("bench/results.json") ? (JSON.parse(readFileSync("bench/results.json", "utf8")) as Record<string, unknown>) : {};
    const results = {
      ...previous,
      at: new Date().toISOString(),
      quick: QUICK,
      loadAverageAtEnd: (await import("node:os")).loadavg().map((n) => Math.round(n * 10) / 10),
      machine: { cpus: (await import("node:os")).cpus().length, node: process.version },
      shop: { jobs: JOBS, onBoard: ON_BOARD, seedMs: Math.round(seedMs) },
      connections: CONNECTIONS,
      seconds: SECONDS,
      trivialRoute: { p50Ms: Math.round(trivial.p50), p95Ms: Math.round(trivial.p95), rps: Math.round(trivial.rps) },
      board: { p50Ms: Math.round(board.p50), p95Ms: Math.round(board.p95), rps: Math.round(board.rps), p95RatioToTrivial: Math.round((board.p95 / Math.max(trivial.p95, 1)) * 100) / 100 },
      boardBuiltFromDatabase: { p50Ms: Math.round(boardCold.p50Ms * 10) / 10, p95Ms: Math.round(boardCold.p95Ms * 10) / 10, jsonKb: Math.round(boardCold.bytes / 1024) },
      moves: { perSecond: Math.round(moves.perSecond), p95Ms: Math.round(moves.p95), failures: moves.failures },
      boardFirstLoadJs: { scripts: js.scripts, gzipKb: Math.round(js.gzipKb), rawKb: Math.round(js.rawKb) },
      firstLoadJsByPage: allJs,
      statusPage: statusAndPhotos.statusPage,
      photo5MB: statusAndPhotos.photo5MB,
      jobPage: { p50Ms: Math.round(jobPage.p50), p95Ms: Math.round(jobPage.p95), rps: Math.round(jobPage.rps), firstByteP95Ms: jobPageStreamed.firstByteP95Ms, lastByteP95Ms: jobPageStreamed.p95Ms },
      jobsList: { p50Ms: Math.round(jobsList.p50), p95Ms: Math.round(jobsList.p95), rps: Math.round(jobsList.rps) },
      search: { p50Ms: Math.round(search.p50), p95Ms: Math.round(search.p95), rps: Math.round(search.rps) },
      ...parts,
      desk,
      mixedLoad: mixed,
      readOnlyLoad: readOnly,
      board100k,
      shop100k: { jobs: BIG_JOBS, seedMs: big.seedMs ? Math.round(big.seedMs) : "kept from an earlier run", ...big100k },
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
    console.log(`board page first-load JS: ${results.boardFirstLoadJs.gzipKb} kB gzipped in ${js.scripts} scripts; the largest of ${Object.keys(allJs.pages).length} pages is ${allJs.largestPage} at ${allJs.largestKb} kB (goal < 200 kB on every page)`);
    if (statusAndPhotos.statusPage) console.log(`status page: p50 ${Math.round(statusAndPhotos.statusPage.p50Ms)} ms, p95 ${Math.round(statusAndPhotos.statusPage.p95Ms)} ms at ${statusAndPhotos.statusPage.concurrency} concurrent`);
    if (statusAndPhotos.photo5MB) console.log(`5 MB photo, upload check to thumbnail: median ${Math.round(statusAndPhotos.photo5MB.medianMs)} ms over ${statusAndPhotos.photo5MB.runsMs.length} runs`);
    console.log(`job page first bytes p95 ${results.jobPage.firstByteP95Ms} ms, last byte p95 ${results.jobPage.lastByteP95Ms} ms`);
    console.log(`job page p95 ${results.jobPage.p95Ms} ms, Jobs list p95 ${results.jobsList.p95Ms} ms, search p95 ${results.search.p95Ms} ms at ${CONNECTIONS} connections (goal < 100 ms)`);
    console.log(`mixed load, ${mixed.clients} clients for ${mixed.seconds} s: ${mixed.rps} req/s, p50 ${mixed.p50Ms} ms, p95 ${mixed.p95Ms} ms, p99 ${mixed.p99Ms} ms, ${mixed.errors} errors, ${mixed.non2xx} not 2xx; read-only p95 ${readOnly.p95Ms} ms`);
    console.log(`100,000 jobs: board p95 ${board100k.p95Ms} ms (${board100k.ratioTo5k}x the 5,000-job figure), ${Object.entries(big100k).map(([k, v]) => `${k} ${v.p95Ms} ms (${v.ratioTo5k}x)`).join(", ")}`);
    console.log("written to bench/results.json");
  } finally {
    stop();
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The reports, job cost, parts desk and overview built right after a write, in-process (nothing kept helps). */
function reportsCold(dbPath: string) {
  const run = spawnSync("npx", ["tsx", "--conditions=react-server", "scripts/bench-reports-cold.ts", dbPath, QUICK ? "8" : "20"], { encoding: "utf8" });
  if (run.status !== 0) throw new Error(`cold report timing failed: ${run.stderr}`);
  return JSON.parse(run.stdout.trim().split("\n").at(-1)!) as Record<string, { p50Ms: number; p95Ms: number }>;
}

/**
 * The office's desk: the overview page and its JSON, each report over the default 90 days, the
 * one search, and the board, job page and job API that carry the likely ready date (goals: p95
 * under 100 ms each, search under 30 ms).
 */
async function measureDesk(base: string, cookie: string, jobId: number) {
  const paths: Record<string, string> = {
    overviewPage: "/",
    overview: "/api/overview",
    reportStageTimes: "/api/reports/stage-times",
    reportThroughput: "/api/reports/throughput",
    reportCoaters: "/api/reports/coaters",
    reportWorkload: "/api/reports/workload",
    reportsPage: "/reports",
    search: "/api/search?q=reservoir",
    searchVin: "/api/search?q=000123",
    // The likely ready date rides on the board's cards, the job page and the job API.
    board: "/api/board",
    jobPage: `/jobs/${jobId}`,
    jobApi: `/api/jobs/${jobId}`,
  };
  const out: Record<string, { p50Ms: number; p95Ms: number; rps: number }> = {};
  for (const [key, path] of Object.entries(paths)) {
    await measureGetQuick(`${base}${path}`, cookie);
    const m = await measureGet(`${base}${path}`, cookie, Math.max(2, Math.round(SECONDS / 2)));
    out[key] = { p50Ms: Math.round(m.p50), p95Ms: Math.round(m.p95), rps: Math.round(m.rps) };
  }
  return out;
}

async function measureGetQuick(url: string, cookie: string) {
  await autocannon({ url, connections: 4, amount: 200, headers: { cookie } });
}

await main();
process.exit(0);
