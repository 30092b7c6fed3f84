import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { savePhotoFiles } from "@/server/photos/store";
import { issueStatusLink } from "@/server/status/links";
import { appEntries, type AppEntry, inlineServerActions } from "../support/app-tree";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { request, sessionCookieFor } from "../support/http";
import { makePriceItemAndQuote } from "../support/money";
import { ACCESS_MATRIX, type Outcome, type Row, WHO, type Who } from "./access-matrix.table";

// Pages and server actions read the cookie through next/headers; here it comes from the cell being tried.
const jar = vi.hoisted(() => ({ cookie: "" as string }));
vi.mock("next/headers", () => {
  const read = () => {
    const map = new Map<string, string>();
    for (const part of jar.cookie.split(";")) {
      const [k, ...v] = part.trim().split("=");
      if (k) map.set(k, v.join("="));
    }
    return map;
  };
  return {
    cookies: async () => ({
      get: (name: string) => (read().has(name) ? { name, value: read().get(name)! } : undefined),
      has: (name: string) => read().has(name),
      getAll: () => [...read()].map(([name, value]) => ({ name, value })),
      set: () => {},
      delete: () => {},
    }),
    headers: async () => new Headers({ host: "localhost:3000", origin: "http://localhost:3000", cookie: jar.cookie }),
  };
});

const { db } = useFreshDatabase();

interface Fixture {
  cookies: Record<Who, string>;
  ids: Record<string, string>;
  token: string;
  visiblePhotoId: string;
  customerQuoteId: string;
}
let fx: Fixture;

const photosDir = mkdtempSync(join(tmpdir(), "baywright-matrix-photos-"));
afterAll(() => rmSync(photosDir, { recursive: true, force: true }));

async function photoRow(jobId: number, uploadedBy: string, visible: boolean) {
  // The bytes only have to be there: nothing here decodes them.
  await savePhotoFiles(jobId, `matrix-${jobId}-${visible}`, { display: Buffer.from("RIFF0000WEBP"), thumb: Buffer.from("RIFF0000WEBP") });
  const at = new Date().toISOString();
  const row = await db()
    .insertInto("photo")
    .values({ job_id: jobId, stage: "fabricate", part_id: null, caption: "Tank mount", customer_visible: visible ? 1 : 0, uploaded_by: uploadedBy, upload_key: `matrix-${jobId}-${visible}`, original_name: "a.jpg", original_type: "image/jpeg", original_bytes: 100, width: 40, height: 30, created_at: at, updated_at: at })
    .returning("id")
    .executeTakeFirstOrThrow();
  return String(row.id);
}

beforeAll(async () => {
  process.env.PHOTOS_DIR = photosDir;
  await ensureShop(db());
  const owner = await makeStaff(db(), "owner");
  const office = await makeStaff(db(), "office");
  const tech = await makeStaff(db(), "tech");
  const gone = await makeStaff(db(), "tech", { active: 0 });
  const target = await makeStaff(db(), "tech");
  const jobA = await makeJob(db());
  const jobB = await makeJob(db(), { stage: "fabricate" });
  const actor = { id: office.id, name: office.name, email: office.email, role: office.role };
  const linkA = await issueStatusLink(db(), actor, jobA.id);
  const linkB = await issueStatusLink(db(), actor, jobB.id);
  const token = linkB.url.split("/status/")[1];
  const part = await db().selectFrom("part").select("id").where("job_id", "=", jobA.id).executeTakeFirstOrThrow();
  const job = await db().selectFrom("job").select(["customer_id", "truck_id"]).where("id", "=", jobA.id).executeTakeFirstOrThrow();
  const goneSession = await sessionCookieFor(gone.id);
  const money = await makePriceItemAndQuote(db(), jobA.id, office.id);
  // The customer's copy of a quote is read on the job of the link the customer holds (job B).
  const sentOnB = await makePriceItemAndQuote(db(), jobB.id, office.id);
  await db().updateTable("quote").set({ status: "sent", sent_at: new Date().toISOString() }).where("id", "=", sentOnB.quoteId).execute();
  const po = await db().insertInto("purchase_order").values({ number: "PO-26-0001", supplier: "Matrix Supply", ordered_on: "2026-03-02", expected_on: null, created_by: office.id, created_at: new Date().toISOString() }).returning("id").executeTakeFirstOrThrow();
  const bought = await db()
    .insertInto("bought_part")
    .values({ job_id: jobA.id, kind: "pump", description: "Gear pump", quantity: 1, unit_cost_cents: null, state: "ordered", purchase_order_id: po.id, expected_on: null, installed_at: null, installed_by: null, ratio_percent: null, displacement_cu_in: null, created_by: office.id, created_at: new Date().toISOString(), updated_at: new Date().toISOString() })
    .returning("id")
    .executeTakeFirstOrThrow();
  fx = {
    cookies: { none: "", statusLink: `bw_session=${token}`, tech: "", office: "", owner: "", deactivated: goneSession },
    ids: {
      jobs: String(jobA.id),
      customers: String(job.customer_id),
      trucks: String(job.truck_id),
      parts: String(part.id),
      photos: await photoRow(jobA.id, tech.id, false),
      staff: target.id,
      "status-links": String(linkA.id),
      quotes: String(money.quoteId),
      "price-items": String(money.priceItemId),
      "purchase-orders": String(po.id),
      "bought-parts": String(bought.id),
    },
    token,
    visiblePhotoId: await photoRow(jobB.id, tech.id, true),
    customerQuoteId: String(sentOnB.quoteId),
  };
  staffIds = { tech: tech.id, office: office.id, owner: owner.id };
});
let staffIds: Record<"tech" | "office" | "owner", string>;

/** A fresh signed-in device for each cell, so a sign-out tried in one cell cannot change the next. */
async function cookieFor(who: Who): Promise<string> {
  if (who === "tech" || who === "office" || who === "owner") return sessionCookieFor(staffIds[who]);
  return fx.cookies[who];
}

/** Values for a path's dynamic segments: rows that exist, picked by the folder before the segment. */
function paramsFor(entry: AppEntry, who: Who): Record<string, string> {
  const segments = entry.path.split("/").filter(Boolean);
  const out: Record<string, string> = {};
  segments.forEach((seg, i) => {
    const m = /^\[(?:\.\.\.)?(\w+)\]$/.exec(seg);
    if (!m) return;
    const name = m[1];
    if (name === "token") out[name] = who === "statusLink" ? fx.token : "not-a-live-link-0000000000000000000000000";
    else if (name === "photoId") out[name] = fx.visiblePhotoId;
    else if (name === "quoteId") out[name] = fx.customerQuoteId;
    else out[name] = fx.ids[segments[i - 1]] ?? "1";
  });
  return out;
}

function fill(path: string, values: Record<string, string>) {
  return path.replace(/\[(?:\.\.\.)?(\w+)\]/g, (_, name: string) => encodeURIComponent(values[name] ?? "1"));
}

interface NextSignal {
  digest?: string;
}
function redirectTarget(err: unknown): Outcome | null {
  const digest = (err as NextSignal)?.digest;
  if (typeof digest !== "string") return null;
  if (digest.startsWith("NEXT_REDIRECT")) return `→${digest.split(";")[2]}` as Outcome;
  if (digest.includes("404")) return "404";
  return null;
}

async function tryRoute(entry: AppEntry, who: Who): Promise<Outcome | string> {
  const mod = await import(/* @vite-ignore */ join(process.cwd(), entry.file));
  const values = paramsFor(entry, who);
  const withBody = !["GET", "HEAD", "DELETE", "OPTIONS"].includes(entry.method!);
  const cookie = await cookieFor(who);
  const req = request(fill(entry.path, values), { method: entry.method, cookie: cookie || undefined, body: withBody ? {} : undefined, headers: { origin: "http://localhost:3000", "sec-fetch-site": "same-origin" } });
  const res: Response = await mod[entry.method!](req, { params: Promise.resolve(values) });
  if (res.status >= 500) return `answered ${res.status}`;
  // JSON holds one signed-in person's view of the shop: no cache may keep it.
  if ((res.headers.get("content-type") ?? "").includes("json") && !/no-store/.test(res.headers.get("cache-control") ?? "")) return `JSON without Cache-Control: no-store (${res.status})`;
  if (res.status === 401 || res.status === 403) return res.status;
  if (res.status === 404 && entry.path.includes("[token]")) return 404;
  return "ok";
}

async function tryPage(entry: AppEntry, who: Who): Promise<Outcome | string> {
  const mod = await import(/* @vite-ignore */ join(process.cwd(), entry.file));
  jar.cookie = await cookieFor(who);
  try {
    await mod.default({ params: Promise.resolve(paramsFor(entry, who)), searchParams: Promise.resolve({}) });
    return "ok";
  } catch (err) {
    const signal = redirectTarget(err);
    if (signal) return signal;
    return `threw ${String(err)}`;
  }
}

async function tryAction(entry: AppEntry, who: Who): Promise<Outcome | string> {
  const mod = await import(/* @vite-ignore */ join(process.cwd(), entry.file));
  jar.cookie = await cookieFor(who);
  try {
    const result = await mod[entry.exportName!]({}, new FormData());
    return result && typeof result === "object" && ("message" in result || "error" in result) ? "refused" : "ok";
  } catch (err) {
    const signal = redirectTarget(err);
    if (signal) return signal;
    const status = (err as { status?: number }).status;
    if (status === 401 || status === 403) return status;
    return `threw ${String(err)}`;
  }
}

function pasteRow(entry: AppEntry) {
  if (entry.kind === "page") return `staffPage("${entry.key}"), // or officePage / ownerPage / row(...)`;
  if (entry.kind === "action") return `row("${entry.key}", "refused", "refused", "ok", "ok", "ok", "refused"),`;
  const write = entry.method !== "GET";
  return `${write ? "officeUp" : "anyStaff"}("${entry.key}"), // who may use it: anyStaff / officeUp / ownerOnly / row(key, none, statusLink, tech, office, owner, deactivated)`;
}

const entries = appEntries();
const byKey = new Map(ACCESS_MATRIX.map((r) => [r.key, r]));

describe("the access matrix", () => {
  it("lists every route handler, page and server action in app/", () => {
    const missing = entries.filter((e) => !byKey.has(e.key));
    const message = missing.length
      ? `Add these rows to tests/integration/access-matrix.table.ts (decide who may use each):\n${missing.map((e) => "  " + pasteRow(e)).join("\n")}`
      : "";
    expect(missing.map((e) => e.key), message).toEqual([]);
  });

  it("lists nothing that no longer exists, and each thing once", () => {
    const known = new Set(entries.map((e) => e.key));
    expect(ACCESS_MATRIX.filter((r) => !known.has(r.key)).map((r) => r.key), "rows for routes that are gone").toEqual([]);
    expect(ACCESS_MATRIX.length, "a key is listed twice").toBe(byKey.size);
  });

  it("finds no inline server actions (keep them in an actions.ts so the matrix sees them)", () => {
    expect(inlineServerActions()).toEqual([]);
  });

  for (const entry of entries) {
    const expected: Row | undefined = byKey.get(entry.key);
    if (!expected) continue;
    it(entry.key, async () => {
      const seen: Partial<Record<Who, Outcome | string>> = {};
      for (const who of WHO) {
        seen[who] = entry.kind === "route" ? await tryRoute(entry, who) : entry.kind === "page" ? await tryPage(entry, who) : await tryAction(entry, who);
      }
      const want = Object.fromEntries(WHO.map((w) => [w, expected[w]]));
      expect(seen).toEqual(want);
    });
  }
});
