import { describe, expect, it } from "vitest";
import * as answerRoute from "@/app/(public)/status/[token]/quote/route";
import * as jobQuotes from "@/app/api/jobs/[id]/quotes/route";
import * as staffPdf from "@/app/api/quotes/[id]/pdf/route";
import * as quoteRoute from "@/app/api/quotes/[id]/route";
import * as sendRoute from "@/app/api/quotes/[id]/send/route";
import type { Role } from "@/db/schema";
import { jobPrice, jobPriceCents } from "@/server/money/job-price";
import { issueStatusLink } from "@/server/status/links";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

const QUOTE = [
  { kind: "part", description: "PTO", quantity: 1, unitPriceCents: 148_900, taxable: true },
  { kind: "labour", description: "Install", quantity: 4, unitPriceCents: 12_500, taxable: false },
];
const LIGHTS = [{ kind: "part", description: "LED work lights, pair", quantity: 1, unitPriceCents: 38_950, taxable: true }];
const COOLER = [
  { kind: "part", description: "Return-line oil cooler", quantity: 1, unitPriceCents: 64_000, taxable: true },
  { kind: "labour", description: "Fit and plumb the cooler", quantity: 1.5, unitPriceCents: 12_500, taxable: false },
];

async function staff(role: Role) {
  const s = await makeStaff(db(), role);
  return { ...s, cookie: await sessionCookieFor(s.id) };
}

async function setUp() {
  await ensureShop(db());
  await db().updateTable("shop").set({ sales_tax_millipercent: 8_250, deposit_kind: "percent", deposit_percent: 50 }).where("id", "=", 1).execute();
  const office = await staff("office");
  const job = await makeJob(db());
  const link = await issueStatusLink(db(), { id: office.id, name: office.name, email: office.email, role: office.role }, job.id);
  const token = link.url.split("/status/")[1];
  const create = async (lines: unknown, extra: Record<string, unknown> = {}, cookie = office.cookie) => jobQuotes.POST(request(`/api/jobs/${job.id}/quotes`, { cookie, body: { lines, ...extra } }), params({ id: String(job.id) }));
  const send = (id: number) => sendRoute.POST(request(`/api/quotes/${id}/send`, { cookie: office.cookie, body: {} }), params({ id: String(id) }));
  const createAndSend = async (lines: unknown, extra: Record<string, unknown> = {}) => {
    const res = await create(lines, extra);
    expect(res.status, JSON.stringify(await res.clone().json())).toBe(201);
    const id = (await readBody(res)).quote.id as number;
    expect((await send(id)).status).toBe(200);
    return id;
  };
  const answer = (body: unknown) => answerRoute.POST(request(`/status/${token}/quote`, { body }), params({ token }));
  const approve = (quoteId: number) => answer({ decision: "approve", quoteId, name: "Dana Reyes", acceptTerms: true });
  const status = async (id: number) => (await db().selectFrom("quote").select("status").where("id", "=", id).executeTakeFirstOrThrow()).status;
  return { office, job, token, create, send, createAndSend, answer, approve, status };
}

describe("change orders", () => {
  it("the customer approves and declines change orders on the status link; the job price is the approved quote plus approved changes", async () => {
    const t = await setUp();
    const quote = await t.createAndSend(QUOTE);
    expect((await t.approve(quote)).status).toBe(200);
    // Quote: 1,989.00 + 8.25 % of 1,489.00 (122.8425 → 122.84) = 2,111.84.
    expect(await jobPriceCents(db(), t.job.id)).toBe(211_184);

    const lights = await t.createAndSend(LIGHTS, { kind: "change_order" });
    const cooler = await t.createAndSend(COOLER, { kind: "change_order" });
    // Two change orders are two pieces of work: the second does not replace the first.
    expect(await t.status(lights)).toBe("sent");
    expect(await t.status(cooler)).toBe("sent");
    const rows = await db().selectFrom("quote").select(["id", "deposit_cents", "total_cents"]).where("id", "in", [lights, cooler]).orderBy("id").execute();
    // Lights: 389.50 + 8.25 % (32.13375 → 32.13) = 421.63. Cooler: 640.00 + 187.50 + 8.25 % of 640.00 (52.80) = 880.30. Neither asks a deposit.
    expect(rows).toEqual([
      { id: lights, deposit_cents: 0, total_cents: 42_163 },
      { id: cooler, deposit_cents: 0, total_cents: 88_030 },
    ]);

    const noTick = await t.answer({ decision: "approve", quoteId: lights, name: "Dana Reyes", acceptTerms: false });
    expect(noTick.status).toBe(400);
    expect((await readBody(noTick)).error.details.fields.acceptTerms).toBeTruthy();
    expect(await t.status(lights)).toBe("sent");

    expect((await t.approve(lights)).status).toBe(200);
    const declined = await t.answer({ decision: "decline", quoteId: cooler, reason: "The trailer has its own cooler" });
    expect(declined.status).toBe(200);
    const kept = await db().selectFrom("quote").select(["status", "decided_name", "decided_at", "terms_accepted", "version", "decline_reason"]).where("id", "in", [lights, cooler]).orderBy("id").execute();
    expect(kept[0]).toMatchObject({ status: "approved", decided_name: "Dana Reyes", terms_accepted: 1, version: 2 });
    expect(kept[0].decided_at).toBeTruthy();
    expect(kept[1]).toMatchObject({ status: "declined", decline_reason: "The trailer has its own cooler", version: 3 });

    // 2,111.84 + 421.63 = 2,533.47; the declined cooler is not part of the price.
    const price = await jobPrice(db(), t.job.id);
    expect(price.priceCents).toBe(253_347);
    expect(price.quote?.id).toBe(quote);
    expect(price.changeOrders.map((c) => [c.id, c.lines.map((l) => l.description)])).toEqual([[lights, ["LED work lights, pair"]]]);

    const audit = await db().selectFrom("audit_event").select(["kind", "summary"]).where("subject", "=", t.job.work_order).where("kind", "in", ["quote_approved", "quote_declined"]).orderBy("id").execute();
    expect(audit.map((a) => a.summary)).toEqual([
      expect.stringMatching(/approved quote version 1 for \$2,111\.84/),
      expect.stringMatching(/approved change order version 2 for \$421\.63/),
      expect.stringMatching(/declined change order version 3 on the status link: “The trailer has its own cooler”/),
    ]);
    // Answered once only.
    expect((await t.approve(lights)).status).toBe(409);
  });

  it("a sent change order is never edited; a new version from it replaces it, and only the newest can be answered", async () => {
    const t = await setUp();
    await t.approve(await t.createAndSend(QUOTE));
    const first = await t.createAndSend(LIGHTS, { kind: "change_order" });
    const edit = await quoteRoute.PUT(request(`/api/quotes/${first}`, { method: "PUT", cookie: t.office.cookie, body: { lines: COOLER } }), params({ id: String(first) }));
    expect(edit.status).toBe(409);
    expect((await readBody(edit)).error.message).toMatch(/never changed/);
    expect((await db().selectFrom("quote_line").select("description").where("quote_id", "=", first).execute()).map((l) => l.description)).toEqual(["LED work lights, pair"]);

    const second = await t.createAndSend([{ ...LIGHTS[0], unitPriceCents: 35_000 }], { kind: "change_order", replacesId: first });
    expect(await t.status(first)).toBe("superseded");
    const old = await t.approve(first);
    expect(old.status).toBe(409);
    expect((await readBody(old)).error.message).toMatch(/newer version/);
    expect((await t.approve(second)).status).toBe(200);
  });

  it("bad input is 400 naming the field and changes nothing", async () => {
    const t = await setUp();
    const quote = await t.createAndSend(QUOTE);
    await t.approve(quote);
    const before = await db().selectFrom("quote").select((e) => e.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
    const cases: [unknown, Record<string, unknown>, string][] = [
      [LIGHTS, { kind: "change_order", replacesId: quote }, "replacesId"],
      [LIGHTS, { kind: "change_order", replacesId: "two" }, "replacesId"],
      [LIGHTS, { kind: "extra" }, "kind"],
      [[{ ...LIGHTS[0], unitPriceCents: -5 }], { kind: "change_order" }, "lines.0.unitPriceCents"],
      [[{ ...LIGHTS[0], quantity: 0 }], { kind: "change_order" }, "lines.0.quantity"],
    ];
    for (const [lines, extra, field] of cases) {
      const res = await t.create(lines, extra);
      expect(res.status, field).toBe(400);
      expect(Object.keys((await readBody(res)).error.details.fields), field).toContain(field);
    }
    const after = await db().selectFrom("quote").select((e) => e.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
    expect(after.n).toBe(before.n);
  });

  it("techs see no prices: quotes, change orders and their PDFs are 403", async () => {
    const t = await setUp();
    const quote = await t.createAndSend(QUOTE);
    const tech = await staff("tech");
    expect((await jobQuotes.GET(request(`/api/jobs/${t.job.id}/quotes`, { cookie: tech.cookie }), params({ id: String(t.job.id) }))).status).toBe(403);
    expect((await t.create(LIGHTS, { kind: "change_order" }, tech.cookie)).status).toBe(403);
    expect((await quoteRoute.GET(request(`/api/quotes/${quote}`, { cookie: tech.cookie }), params({ id: String(quote) }))).status).toBe(403);
    expect((await staffPdf.GET(request(`/api/quotes/${quote}/pdf`, { cookie: tech.cookie }), params({ id: String(quote) }))).status).toBe(403);
  });
});
