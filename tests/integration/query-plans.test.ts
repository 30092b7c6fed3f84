import { Kysely, SqliteDialect } from "kysely";
import { beforeAll, describe, expect, it } from "vitest";
import { openSqlite, withStatementCache } from "@/db";
import type { Database } from "@/db/schema";
import type { StaffUser } from "@/server/auth/session";
import { listMessages } from "@/server/email/messages";
import { jobEmailSettings } from "@/server/email/recipients";
import { notifySettings } from "@/server/email/settings";
import { loadBoard } from "@/server/jobs/board";
import { moveJob } from "@/server/jobs/mutations";
import { predictJob } from "@/server/jobs/prediction-queries";
import { findJob, listJobs, stageEvents } from "@/server/jobs/queries";
import { latestKitSpec, kitSpecStartingInputs } from "@/server/kit-spec/queries";
import { jobParts, listJobPhotos } from "@/server/photos/queries";
import { findSignOff, listLeakTests, listParts, recordsSettings } from "@/server/records/queries";
import { shopSettings } from "@/server/shop/queries";
import { listTechs } from "@/server/staff/queries";
import { listStatusLinks } from "@/server/status/links";
import { readStatusPage } from "@/server/status/queries";
import { generateShop } from "@/scripts/bench-shop";
import { jobCostsReport } from "@/server/labour/report";
import { buildPartsDesk } from "@/server/parts/desk";
import { knownSuppliers } from "@/server/parts/queries";
import { loadOverview } from "@/server/reports/overview";
import { coatersReport, reportCalendar, stageTimesReport, throughputReport, workloadReport } from "@/server/reports/queries";
import { useFreshDatabase } from "../support/db";

/*
 * The paths a shop hits all day (board, job page, Jobs list, search, status page, a move) must
 * cost what the active shop costs, not its history. Each statement they run is put through
 * EXPLAIN QUERY PLAN on a generated shop with years of delivered jobs: none may read a whole big
 * table. A scan is allowed only when it walks rows already in the order asked for and stops at a
 * LIMIT (the newest 50 jobs) without a text filter.
 */
const BIG_TABLES = ["job", "stage_event", "clock_entry", "bought_part", "bought_part_receipt", "purchase_order", "coating_run", "quote", "quote_line", "part", "leak_test", "coating_run_part", "photo", "outbox", "email_message", "status_link", "customer", "truck", "contact", "kit_spec", "session"];

const { db: appDb } = useFreshDatabase();
const seen: { sql: string; parameters: readonly unknown[]; path: string }[] = [];
let path = "";
let db: Kysely<Database>;
let sqlite: ReturnType<typeof openSqlite>;

beforeAll(async () => {
  await appDb().selectFrom("job").select("id").limit(1).execute();
  sqlite = openSqlite(process.env.DATABASE_PATH!);
  await generateShop(sqlite, { jobs: 3000, onBoard: 300, password: "plan-check-password" });
  db = new Kysely<Database>({
    dialect: new SqliteDialect({ database: withStatementCache(openSqlite(process.env.DATABASE_PATH!)) }),
    log: (event) => {
      if (event.level === "query") seen.push({ sql: event.query.sql, parameters: event.query.parameters, path });
    },
  });
});

function badScans(sql: string, parameters: readonly unknown[]) {
  const plan = sqlite.prepare(`explain query plan ${sql}`).all(...(parameters as unknown[])) as { detail: string }[];
  // A text search filters as it scans, so its LIMIT bounds nothing when few rows match.
  const orderedWithLimit = /\blimit\b/i.test(sql) && !/\blike\b/i.test(sql) && !plan.some((p) => /USE TEMP B-TREE FOR (ORDER BY|RIGHT PART OF ORDER BY)/.test(p.detail));
  return plan
    .map((p) => p.detail)
    .filter((d) => {
      const m = /^SCAN (\w+)(?: AS \w+)?(?: USING (?:COVERING )?INDEX \w+)?$/.exec(d);
      return m && BIG_TABLES.includes(m[1]) && !orderedWithLimit;
    });
}

async function run(name: string, work: () => Promise<unknown>) {
  path = name;
  const from = seen.length;
  await work();
  const problems = seen.slice(from).flatMap((q) => badScans(q.sql, q.parameters).map((scan) => `${name}: ${scan}\n    in: ${q.sql}`));
  return { statements: seen.length - from, problems };
}

describe("the hot paths use indexes on a shop with a long history", () => {
  it("board, job page, Jobs list, search, status page and a move read no big table in full", async () => {
    const job = sqlite.prepare("select id from job where stage = 'fabricate' and scope = 'fabrication' limit 1").get() as { id: number };
    const delivered = sqlite.prepare("select id from job where stage = 'delivered' order by id limit 1").get() as { id: number };
    const owner = sqlite.prepare("select id, name, email, role from staff where role = 'owner'").get() as StaffUser;
    const problems: string[] = [];
    const check = async (name: string, work: () => Promise<unknown>) => {
      const r = await run(name, work);
      expect(r.statements, name).toBeGreaterThan(0);
      problems.push(...r.problems);
    };
    await check("board", () => loadBoard(db, {}));
    await check("board search", () => loadBoard(db, { q: "WO-26-00001" }));
    for (const id of [job.id, delivered.id]) {
      await check(`job page ${id}`, async () => {
        const found = (await findJob(db, id))!;
        await Promise.all([stageEvents(db, id), listTechs(db, found.assignedTechId), shopSettings(db), listParts(db, { jobId: id }), listLeakTests(db, { jobId: id }), findSignOff(db, id), recordsSettings(db)]);
        await Promise.all([latestKitSpec(db, id), kitSpecStartingInputs(db, id), listJobPhotos(db, id), jobParts(db, id), knownSuppliers(db)]);
        await Promise.all([listMessages(db, id), jobEmailSettings(db, id), listStatusLinks(db, id), notifySettings(db)]);
        await predictJob(db, found);
      });
    }
    for (const sort of ["newest", "due", "customer", "stage"] as const) {
      await check(`Jobs list by ${sort}`, () => listJobs(db, { sort, limit: 50 }));
      await check(`Jobs list by ${sort}, Fabricate only`, () => listJobs(db, { sort, stage: "fabricate", limit: 50 }));
    }
    await check("Jobs search", () => listJobs(db, { q: "Customer 12", limit: 50 }));
    await check("status page", () => readStatusPage(db, "A".repeat(43)));
    const version = (sqlite.prepare("select version from job where id = ?").get(job.id) as { version: number }).version;
    await check("move", () => moveJob(db as never, owner, job.id, { toStage: "queued", version } as never));
    expect(problems, problems.join("\n")).toEqual([]);
  });

  it("the office's desk (overview, every report, job cost, parts desk, search) reads no big table in full", async () => {
    const cal = await reportCalendar(db);
    const period = { from: "2026-01-01", to: "2026-03-31" };
    const problems: string[] = [];
    const check = async (name: string, work: () => Promise<unknown>) => {
      const r = await run(name, work);
      expect(r.statements, name).toBeGreaterThan(0);
      problems.push(...r.problems);
    };
    await check("overview", () => loadOverview(db));
    await check("stage times", () => stageTimesReport(db, period, cal));
    await check("throughput", () => throughputReport(db, period, cal));
    await check("coaters", () => coatersReport(db, period, cal));
    await check("workload", () => workloadReport(db, period, cal));
    await check("job cost", () => jobCostsReport(db, period, cal));
    await check("parts desk", () => buildPartsDesk(db, cal.today, "UTC"));
    expect(problems, problems.join("\n")).toEqual([]);
  });
});
