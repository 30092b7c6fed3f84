import { join } from "node:path";
import fc from "fast-check";
import { sql } from "kysely";
import { beforeAll, describe, expect, it } from "vitest";
import { issueStatusLink } from "@/server/status/links";
import { appEntries } from "../support/app-tree";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { request, sessionCookieFor } from "../support/http";
import { makePriceItemAndQuote } from "../support/money";

/**
 * Every mutating route handler, fed hostile input by the owner (who may do the most): wrong types,
 * missing and extra fields, huge strings and numbers, impossible dates, unicode, prototype keys,
 * SQL and HTML fragments, deep nesting, bodies that are not JSON, and junk ids. None may answer
 * 500, and a refused request must leave the database exactly as it was.
 */
const { db } = useFreshDatabase();
const RUNS_PER_ROUTE = 10;

let ownerId = "";
const ids: Record<string, string> = {};

beforeAll(async () => {
  await ensureShop(db());
  const owner = await makeStaff(db(), "owner");
  ownerId = owner.id;
  const target = await makeStaff(db(), "tech");
  const job = await makeJob(db(), { stage: "fabricate" });
  const link = await issueStatusLink(db(), { id: owner.id, name: owner.name, email: owner.email, role: "owner" }, job.id);
  const part = await db().selectFrom("part").select("id").where("job_id", "=", job.id).executeTakeFirstOrThrow();
  const row = await db().selectFrom("job").select(["customer_id", "truck_id"]).where("id", "=", job.id).executeTakeFirstOrThrow();
  const money = await makePriceItemAndQuote(db(), job.id, owner.id);
  Object.assign(ids, { quotes: String(money.quoteId), "price-items": String(money.priceItemId) });
  Object.assign(ids, { jobs: String(job.id), parts: String(part.id), customers: String(row.customer_id), trucks: String(row.truck_id), staff: target.id, "status-links": String(link.id) });
  const at = new Date().toISOString();
  const po = await db().insertInto("purchase_order").values({ number: "PO-26-0001", supplier: "Test Drive Supply", ordered_on: "2026-03-02", expected_on: null, created_by: owner.id, created_at: at }).returning("id").executeTakeFirstOrThrow();
  const bought = await db()
    .insertInto("bought_part")
    .values({ job_id: job.id, kind: "pto", description: "10-bolt PTO", quantity: 2, unit_cost_cents: 100, state: "ordered", purchase_order_id: po.id, expected_on: null, installed_at: null, installed_by: null, ratio_percent: null, displacement_cu_in: null, created_by: owner.id, created_at: at, updated_at: at })
    .returning("id")
    .executeTakeFirstOrThrow();
  Object.assign(ids, { "bought-parts": String(bought.id), "purchase-orders": String(po.id) });
});

/** Every table's rows, in order, as text; sessions (sign-in bookkeeping) and audit trails are left out. */
async function dump(): Promise<string> {
  const tables = await sql<{ name: string }>`select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like '%audit%' and name not in ('session', 'kysely_migration', 'kysely_migration_lock') order by name`.execute(db());
  const out: string[] = [];
  for (const { name } of tables.rows) {
    const rows = await sql.raw(`select * from "${name}"`).execute(db());
    out.push(`${name}:${rows.rows.map((r) => JSON.stringify(r)).sort().join("\n")}`);
  }
  return out.join("\n");
}

const SQL_AND_HTML = ["'; drop table job; --", "1 or 1=1", "<script>alert(1)</script>", "\" onmouseover=\"x", "%00", "../../etc/passwd", "${7*7}", "{{7*7}}"];
const NUMBERS = [0, -1, 1e308, -1e308, 2 ** 53 + 1, 1.5, -0, 99999999999];
const DATES = ["2026-02-31", "2026-13-01", "0000-00-00", "9999-99-99", "2026-02-29", "yesterday", "2026-1-1"];

const hostileString = fc.oneof(
  fc.constantFrom(...SQL_AND_HTML, ...DATES, "", " ", "\u0000", "\ud800", "🛢️🔧", "ＷＯ－２６", "\u202eevil", "a".repeat(300_000 / 4)),
  fc.string({ unit: "binary", maxLength: 40 }),
  fc.string({ maxLength: 5 }).map((s) => s.repeat(5000)),
);
const hostileNumber = fc.oneof(fc.constantFrom(...NUMBERS), fc.integer(), fc.double());
const leaf = fc.oneof(hostileString, hostileNumber, fc.boolean(), fc.constant(null));
const FIELD_NAMES = ["name", "email", "role", "password", "version", "toStage", "stage", "dueOn", "customerId", "truckId", "scope", "description", "notes", "kind", "vin", "unitNumber", "jobId", "partIds", "sentOn", "promisedOn", "receivedOn", "caption", "customerVisible", "active", "enabled", "inputs", "checks", "reason", "override", "id", "quantity", "costCents", "supplier", "orderedOn", "expectedOn", "installed", "labourRateCents", "startedAt", "endedAt", "lines", "replacesId", "quoteId", "decision", "acceptTerms", "moveJobIds"];
const hostileObject = fc.dictionary(fc.oneof(fc.constantFrom(...FIELD_NAMES), fc.string({ maxLength: 8 })), fc.oneof(leaf, fc.array(leaf, { maxLength: 4 }), fc.dictionary(fc.constantFrom(...FIELD_NAMES), leaf, { maxKeys: 4 })), { maxKeys: 8 });

/** Raw bodies: text a JSON encoder would never write. */
const RAW_BODIES = [
  "",
  "not json",
  "{",
  "[]",
  "null",
  "42",
  '"text"',
  '{"__proto__":{"role":"owner","isAdmin":true},"constructor":{"prototype":{"polluted":true}}}',
  '{"version":NaN,"position":Infinity}',
  "[".repeat(5000) + "]".repeat(5000),
  '{"a":' + '{"a":'.repeat(3000) + "1" + "}".repeat(3001),
  '{"name":"\\ud800\\udc00\\ud800"}',
];
const rawBody = fc.oneof(fc.constantFrom(...RAW_BODIES), hostileObject.map((o) => JSON.stringify(o)), fc.array(leaf, { maxLength: 5 }).map((a) => JSON.stringify(a)));

const JUNK_IDS = ["0", "-1", "abc", "1e3", "99999999999", "1.5", " 1", "%", "\ud800", "'; drop table job; --", "00000000-0000-0000-0000-000000000000"];

function paramsFor(path: string, junk: string | null) {
  const segments = path.split("/").filter(Boolean);
  const out: Record<string, string> = {};
  segments.forEach((seg, i) => {
    const m = /^\[(\w+)\]$/.exec(seg);
    if (m) out[m[1]] = junk ?? ids[segments[i - 1]] ?? "1";
  });
  return out;
}

/** The id as a browser would put it in the path (half a UTF-16 pair goes as its raw bytes). */
function urlSegment(value: string) {
  try {
    return encodeURIComponent(value);
  } catch {
    return "%ED%A0%80";
  }
}

const mutating = appEntries().filter((e) => e.kind === "route" && ["POST", "PUT", "PATCH", "DELETE"].includes(e.method!));

describe("hostile input to every mutating route", () => {
  it("finds the mutating routes", () => expect(mutating.length).toBeGreaterThan(20));

  for (const entry of mutating) {
    it(`${entry.key}: never 500, and a refusal changes nothing`, { timeout: 60_000 }, async () => {
      const mod = await import(/* @vite-ignore */ join(process.cwd(), entry.file));
      const handler = mod[entry.method!] as (req: Request, ctx: unknown) => Promise<Response>;
      await fc.assert(
        fc.asyncProperty(rawBody, fc.option(fc.constantFrom(...JUNK_IDS), { freq: 3 }), async (body, junkId) => {
          const cookie = await sessionCookieFor(ownerId);
          const values = paramsFor(entry.path, junkId);
          const url = entry.path.replace(/\[(\w+)\]/g, (_, n: string) => urlSegment(values[n]));
          const before = await dump();
          const req = request(url, { method: entry.method, cookie, rawBody: entry.method === "DELETE" ? undefined : body, headers: { "content-type": "application/json" } });
          const res = await handler(req, { params: Promise.resolve(values) });
          expect(res.status, `${entry.key} with ${body.slice(0, 120)} and id ${junkId}`).toBeLessThan(500);
          if (res.status >= 400) expect(await dump(), `${entry.key} answered ${res.status} but changed data`).toBe(before);
        }),
        { numRuns: RUNS_PER_ROUTE },
      );
    });
  }
});
