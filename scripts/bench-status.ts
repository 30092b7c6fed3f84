import { spawn } from "node:child_process";
import { createHash, randomBytes } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import Module, { register } from "node:module";
import { fileURLToPath } from "node:url";
import { openSqlite } from "@/db";

/*
 * Two figures for `npm run bench`:
 * - the customer status page's latency (p50/p95) on a running production server, over a link
 *   issued for the bench and deleted afterwards;
 * - a 5 MB phone photo's time from "upload" to "thumbnail on disk": the app's upload route asks
 *   for a presigned URL, the file goes to the local fake upload service, the fake calls the app
 *   back, and the app fetches, checks, re-encodes and records it.
 * The photo run loads the server modules outside Next's bundle, where their `server-only`
 * marker would throw; it runs in a child process that maps the marker to its empty module, so
 * the bench's own process and env stay as they were.
 */

export interface BenchStatusOptions {
  /** A running production server, e.g. http://127.0.0.1:3000. Without it the page figure is null. */
  baseUrl?: string;
  /** That server's database: a bench link is written there and removed afterwards. */
  databasePath?: string;
  /** Status page requests to time (after 20 warm-up requests). Default 300. */
  requests?: number;
  /** Requests in flight at once. Default 8. */
  concurrency?: number;
  /** 5 MB uploads to time. Default 3. */
  photoRuns?: number;
}

export interface BenchStatusResult {
  statusPage: { p50Ms: number; p95Ms: number; requests: number; concurrency: number; bytes: number } | null;
  photo5MB: { bytes: number; runsMs: number[]; medianMs: number } | null;
}

function percentile(sorted: number[], p: number) {
  if (!sorted.length) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

const round = (n: number) => Math.round(n * 10) / 10;

async function measureStatusPage(baseUrl: string, databasePath: string, requests: number, concurrency: number) {
  const sqlite = openSqlite(databasePath);
  const token = randomBytes(32).toString("base64url");
  let linkId: number | null = null;
  try {
    // The job whose page carries the most: most customer photos, then the most stage events.
    const job = sqlite
      .prepare(
        `select job.id from job
         where job.stage != 'delivered'
         order by (select count(*) from photo where photo.job_id = job.id and photo.customer_visible = 1) desc,
                  (select count(*) from stage_event where stage_event.job_id = job.id) desc, job.id
         limit 1`,
      )
      .get() as { id: number } | undefined;
    if (!job) throw new Error("The bench database has no job on the board to show a status page for.");
    linkId = Number(
      sqlite
        .prepare("insert into status_link (job_id, token_hash, nonce, issued_by, created_at) values (?, ?, ?, null, ?)")
        .run(job.id, createHash("sha256").update(token).digest("hex"), randomBytes(16).toString("base64url"), new Date().toISOString()).lastInsertRowid,
    );
    const url = `${baseUrl}/status/${token}`;
    let bytes = 0;
    const once = async () => {
      const started = performance.now();
      const res = await fetch(url);
      const body = await res.arrayBuffer();
      if (res.status !== 200) throw new Error(`${url} answered ${res.status}`);
      bytes = body.byteLength;
      return performance.now() - started;
    };
    for (let i = 0; i < 20; i++) await once();
    const times: number[] = [];
    let next = 0;
    await Promise.all(
      Array.from({ length: concurrency }, async () => {
        while (next < requests) {
          next++;
          times.push(await once());
        }
      }),
    );
    times.sort((a, b) => a - b);
    return { p50Ms: round(percentile(times, 50)), p95Ms: round(percentile(times, 95)), requests: times.length, concurrency, bytes };
  } finally {
    if (linkId !== null) sqlite.prepare("delete from status_link where id = ?").run(linkId);
    sqlite.close();
  }
}

/** Runs the photo measurement in a child process (see the note at the top) and reads its JSON answer. */
function measurePhotoInChild(runs: number): Promise<BenchStatusResult["photo5MB"]> {
  const script = fileURLToPath(import.meta.url);
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ["--import", "tsx", script, "--photo-bench", String(runs)], { stdio: ["ignore", "pipe", "inherit"], env: process.env });
    let out = "";
    child.stdout.on("data", (d) => (out += d));
    child.on("error", reject);
    child.on("exit", (code) => {
      if (code !== 0) return reject(new Error(`the photo bench exited ${code}`));
      const line = out.trim().split("\n").at(-1) ?? "";
      try {
        resolve(JSON.parse(line));
      } catch {
        reject(new Error(`the photo bench printed no result: ${out.slice(-500)}`));
      }
    });
  });
}

/** A phone-sized JPEG of about 5 MB: camera noise does not compress, so the size holds. */
async function fiveMegabytePhoto() {
  const sharp = (await import("sharp")).default;
  const width = 3000;
  const height = 2250;
  const noise = randomBytes(width * height * 3);
  for (let q = 70; q <= 100; q += 2) {
    const jpeg = await sharp(noise, { raw: { width, height, channels: 3 } }).jpeg({ quality: q }).toBuffer();
    if (jpeg.length >= 5 * 1024 * 1024) return jpeg;
  }
  throw new Error("Could not make a 5 MB JPEG");
}

/** Lets this process import modules marked `server-only` (both through import and require). */
function allowServerModules() {
  const empty = join(process.cwd(), "node_modules", "server-only", "empty.js");
  register(`data:text/javascript,${encodeURIComponent(`export async function resolve(s, c, n) { return s === "server-only" ? { url: ${JSON.stringify(`file://${empty}`)}, shortCircuit: true } : n(s, c); }`)}`);
  const cjs = Module as unknown as { _resolveFilename: (request: string, ...rest: unknown[]) => string };
  const original = cjs._resolveFilename;
  cjs._resolveFilename = function (request: string, ...rest: unknown[]) {
    return request === "server-only" ? empty : original.call(this, request, ...rest);
  };
}

async function photoBench(runs: number): Promise<NonNullable<BenchStatusResult["photo5MB"]>> {
  const dir = mkdtempSync(join(tmpdir(), "baywright-photo-bench-"));
  const { startFakes } = await import("../fakes/server.mjs");
  const fakes = await startFakes({ port: 0, dataDir: join(dir, "fakes") });
  const token = Buffer.from(JSON.stringify({ apiKey: "sk_bench_photos", appId: "benchphotos", regions: ["local1"] })).toString("base64");
  Object.assign(process.env, {
    DATABASE_PATH: join(dir, "bench.db"),
    PHOTOS_DIR: join(dir, "photos"),
    UPLOADTHING_TOKEN: token,
    UPLOADTHING_INGEST_URL: fakes.url,
    UPLOADTHING_API_URL: fakes.url,
    UPLOADTHING_UFS_HOST: `localhost:${new URL(fakes.url).port}`,
    UPLOADTHING_UFS_APP_ID_LOCATION: "path",
    UPLOADTHING_LOG_LEVEL: "Error",
  });
  const { getDb, closeDb } = await import("@/db");
  const { migrateToLatest } = await import("@/migrations");
  const { lucia } = await import("@/server/auth/lucia");
  const route = await import("@/app/api/uploadthing/route");
  const db = getDb();
  await migrateToLatest(db);
  const at = new Date().toISOString();
  const staffId = "bench-photo-tech";
  await db.insertInto("staff").values({ id: staffId, email: "tech@bench.example", name: "Bench Tech", role: "tech", password_hash: "-", active: 1, created_at: at }).execute();
  const customer = await db.insertInto("customer").values({ kind: "company", name: "Bench Customer", phone: "", email: "", notes: "", created_at: at }).returning("id").executeTakeFirstOrThrow();
  const truck = await db.insertInto("truck").values({ customer_id: customer.id, unit_number: "B-1", vin: "1BN5T3X20RK000017", year: 2024, description: "", transmission: "", work_engine_rpm: null, created_at: at }).returning("id").executeTakeFirstOrThrow();
  const job = await db
    .insertInto("job")
    .values({ work_order: "WO-B-1", customer_id: customer.id, truck_id: truck.id, scope: "fabrication", description: "", stage: "fabricate", position: 0, due_on: null, assigned_tech_id: null, priority: "normal", notes: "", version: 1, created_at: at, updated_at: at })
    .returning("id")
    .executeTakeFirstOrThrow();
  const session = await lucia.createSession(staffId, {});
  const cookie = `${lucia.sessionCookieName}=${session.id}`;

  const server = http.createServer(async (req, res) => {
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const request = new Request(`http://${req.headers.host}${req.url}`, { method: req.method, headers: req.headers as Record<string, string>, body: req.method === "GET" ? undefined : Buffer.concat(chunks) });
    const response = await (req.method === "GET" ? route.GET : route.POST)(request as never);
    res.writeHead(response.status, Object.fromEntries(response.headers));
    res.end(Buffer.from(await response.arrayBuffer()));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const app = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  // The uploader's write carries the app's own origin, as a browser on its pages would.
  process.env.APP_URL = app;
  try {
    const photo = await fiveMegabytePhoto();
    const runsMs: number[] = [];
    for (let i = 0; i < runs; i++) {
      const started = performance.now();
      const action = await fetch(`${app}/api/uploadthing?actionType=upload&slug=jobPhoto`, {
        method: "POST",
        headers: { "content-type": "application/json", cookie, origin: app },
        body: JSON.stringify({ files: [{ name: `bench-${i}.jpg`, size: photo.length, type: "image/jpeg", lastModified: Date.now() }], input: { jobId: job.id, stage: "fabricate" } }),
      });
      if (!action.ok) throw new Error(`upload request answered ${action.status}: ${await action.text()}`);
      const [presigned] = (await action.json()) as { url: string }[];
      const form = new FormData();
      form.append("file", new Blob([photo], { type: "image/jpeg" }), `bench-${i}.jpg`);
      const put = await fetch(presigned.url, { method: "PUT", body: form });
      const answer = (await put.json()) as { serverData?: { photoId?: number; refused?: string } };
      if (!answer.serverData?.photoId) throw new Error(`the photo was not recorded: ${JSON.stringify(answer)}`);
      runsMs.push(Math.round(performance.now() - started));
    }
    const sorted = [...runsMs].sort((a, b) => a - b);
    return { bytes: photo.length, runsMs, medianMs: sorted[Math.floor(sorted.length / 2)] };
  } finally {
    await new Promise<void>((resolve) => {
      server.close(() => resolve());
      server.closeAllConnections();
    });
    await fakes.close();
    await closeDb();
    rmSync(dir, { recursive: true, force: true });
  }
}

/** The status page's latency on a running server (when given) and a 5 MB photo's upload-to-thumbnail time. */
export async function benchStatusAndPhotos(opts: BenchStatusOptions = {}): Promise<BenchStatusResult> {
  const statusPage = opts.baseUrl && opts.databasePath ? await measureStatusPage(opts.baseUrl, opts.databasePath, opts.requests ?? 300, opts.concurrency ?? 8) : null;
  const photo5MB = await measurePhotoInChild(opts.photoRuns ?? 3);
  return { statusPage, photo5MB };
}

const invokedAs = process.argv[1] ? fileURLToPath(import.meta.url) === process.argv[1] : false;
if (invokedAs && process.argv.includes("--photo-bench")) {
  const runs = Number(process.argv[process.argv.indexOf("--photo-bench") + 1]) || 3;
  allowServerModules();
  console.log(JSON.stringify(await photoBench(runs)));
  process.exit(0);
} else if (invokedAs) {
  // tsx scripts/bench-status.ts [baseUrl databasePath]
  console.log(JSON.stringify(await benchStatusAndPhotos({ baseUrl: process.argv[2], databasePath: process.argv[3] }), null, 2));
  process.exit(0);
}
