import { describe, expect, it } from "vitest";
import * as jobQuotes from "@/app/api/jobs/[id]/quotes/route";
import * as kitLines from "@/app/api/jobs/[id]/quotes/kit-lines/route";
import * as kitSpec from "@/app/api/jobs/[id]/kit-spec/route";
import * as priceItems from "@/app/api/price-items/route";
import * as priceItem from "@/app/api/price-items/[id]/route";
import * as quoteRoute from "@/app/api/quotes/[id]/route";
import * as sendRoute from "@/app/api/quotes/[id]/send/route";
import * as moneySettings from "@/app/api/shop-settings/money/route";
import type { Role } from "@/db/schema";
import { demoKitCalcInput } from "@/server/kit-calc";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

async function as(role: Role) {
  await ensureShop(db());
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

const setMoney = (cookie: string, body: unknown) => moneySettings.PUT(request("/api/shop-settings/money", { method: "PUT", cookie, body }));
const postQuote = (cookie: string, jobId: number, body: unknown) => jobQuotes.POST(request(`/api/jobs/${jobId}/quotes`, { cookie, body }), params({ id: String(jobId) }));
const putQuote = (cookie: string, id: number, body: unknown) => quoteRoute.PUT(request(`/api/quotes/${id}`, { method: "PUT", cookie, body }), params({ id: String(id) }));
const send = (cookie: string, id: number) => sendRoute.POST(request(`/api/quotes/${id}/send`, { cookie, body: {} }), params({ id: String(id) }));

const SHOP_RATE = { taxRatePercent: 8.25, depositKind: "percent", depositPercent: 50, depositFixedCents: 0, quoteTerms: "Half down, the rest on pickup." };

const LINES = [
  { kind: "labour", description: "Install wet kit", quantity: 6.5, unitPriceCents: 12_500, taxable: false },
  { kind: "part", description: "PTO", quantity: 1, unitPriceCents: 148_900, taxable: true },
  { kind: "part", description: "Return hose, 1 in", quantity: 14, unitPriceCents: 675, taxable: true },
  { kind: "coating", description: "Powder coat, black", quantity: 1, unitPriceCents: 38_500, taxable: false },
];

describe("quotes", () => {
  it("answers 201 with totals worked out on the server: tax half-up once on the taxable part (SSUTA §324)", async () => {
    const owner = await as("owner");
    expect((await setMoney(owner.cookie, SHOP_RATE)).status).toBe(200);
    const office = await as("office");
    const job = await makeJob(db());
    const res = await postQuote(office.cookie, job.id, { lines: LINES });
    expect(res.status).toBe(201);
    const { quote } = await readBody(res);
    // By hand: 6.5 × 125.00 = 812.50; 1489.00; 14 × 6.75 = 94.50; 385.00 → subtotal 2781.00;
    // taxable 1583.50 × 8.25 % = 130.63875 → 130.64; total 2911.64; 50 % deposit 1455.82.
    expect(quote).toMatchObject({ version: 1, status: "draft", subtotalCents: 278_100, taxableCents: 158_350, taxRatePercent: 8.25, taxCents: 13_064, totalCents: 291_164, depositCents: 145_582 });
    expect(quote.lines.map((l: { amountCents: number }) => l.amountCents)).toEqual([81_250, 148_900, 9_450, 38_500]);
  });

  it("refuses a tech, and bad lines with the field named, changing nothing", async () => {
    const tech = await as("tech");
    const office = await as("office");
    const job = await makeJob(db());
    expect((await postQuote(tech.cookie, job.id, { lines: LINES })).status).toBe(403);
    const bad = await postQuote(office.cookie, job.id, { lines: [{ ...LINES[0], quantity: 1.0005 }] });
    expect(bad.status).toBe(400);
    expect((await readBody(bad)).error.details.fields["lines.0.quantity"][0]).toMatch(/three decimals/);
    const negative = await postQuote(office.cookie, job.id, { lines: [LINES[0], LINES[1], { ...LINES[2], quantity: -1 }] });
    expect(negative.status).toBe(400);
    expect((await readBody(negative)).error.details.fields).toEqual({ "lines.2.quantity": ["The quantity must be more than 0."] });
    const float = await postQuote(office.cookie, job.id, { lines: [{ ...LINES[0], unitPriceCents: 12.5 }] });
    expect((await readBody(float)).error.details.fields["lines.0.unitPriceCents"][0]).toMatch(/whole cents/);
    expect(await db().selectFrom("quote").select("id").where("job_id", "=", job.id).execute()).toEqual([]);
  });

  it("a sent quote is never changed, only replaced by a new version", async () => {
    const office = await as("office");
    const job = await makeJob(db());
    const v1 = (await readBody(await postQuote(office.cookie, job.id, { lines: LINES }))).quote;
    // One draft at a time.
    expect((await postQuote(office.cookie, job.id, { lines: LINES })).status).toBe(409);
    const edited = await putQuote(office.cookie, v1.id, { lines: LINES.slice(0, 2), updatedAt: v1.updatedAt });
    expect(edited.status).toBe(200);
    expect((await readBody(edited)).quote.subtotalCents).toBe(81_250 + 148_900);
    // Someone else's older copy of the draft is stale.
    expect((await putQuote(office.cookie, v1.id, { lines: LINES, updatedAt: v1.updatedAt })).status).toBe(409);
    const sent = await send(office.cookie, v1.id);
    expect((await readBody(sent)).quote.status).toBe("sent");
    const change = await putQuote(office.cookie, v1.id, { lines: LINES });
    expect(change.status).toBe(409);
    expect((await readBody(change)).error.message).toMatch(/never changed/);
    expect((await send(office.cookie, v1.id)).status).toBe(409);

    const v2 = (await readBody(await postQuote(office.cookie, job.id, { lines: LINES }))).quote;
    expect(v2.version).toBe(2);
    await send(office.cookie, v2.id);
    const list = (await readBody(await jobQuotes.GET(request(`/api/jobs/${job.id}/quotes`, { cookie: office.cookie }), params({ id: String(job.id) })))).quotes;
    expect(list.map((q: { version: number; status: string; supersedesId: number | null }) => [q.version, q.status, q.supersedesId])).toEqual([
      [2, "sent", v1.id],
      [1, "superseded", null],
    ]);
    const audit = await db().selectFrom("audit_event").select(["kind", "summary"]).where("kind", "=", "quote_sent").where("subject", "=", job.work_order).execute();
    expect(audit).toHaveLength(2);
  });

  it("a change order needs an approved quote", async () => {
    const office = await as("office");
    const job = await makeJob(db());
    const res = await postQuote(office.cookie, job.id, { kind: "change_order", lines: LINES });
    expect(res.status).toBe(409);
    expect((await readBody(res)).error.message).toMatch(/approved quote/);
  });
});

describe("the price list and the shop's money settings", () => {
  it("only the owner changes a price, and each change is an audit line with the old and new price", async () => {
    const owner = await as("owner");
    const office = await as("office");
    const body = { kind: "labour", name: "Shop labour", unit: "hour", unitPriceCents: 12_500, taxable: false };
    expect((await priceItems.POST(request("/api/price-items", { cookie: office.cookie, body }))).status).toBe(403);
    const created = await priceItems.POST(request("/api/price-items", { cookie: owner.cookie, body }));
    expect(created.status).toBe(201);
    const { item } = await readBody(created);
    const patch = (cookie: string, b: unknown) => priceItem.PATCH(request(`/api/price-items/${item.id}`, { method: "PATCH", cookie, body: b }), params({ id: String(item.id) }));
    expect((await patch(office.cookie, { unitPriceCents: 1 })).status).toBe(403);
    expect((await patch(owner.cookie, { unitPriceCents: 13_250 })).status).toBe(200);
    expect((await patch(owner.cookie, { unitPriceCents: 132.5 })).status).toBe(400);
    const lines = await db().selectFrom("audit_event").select(["kind", "summary"]).where("kind", "=", "price_changed").where("subject", "=", "Shop labour").orderBy("id").execute();
    expect(lines.map((l) => l.summary)).toEqual([
      `${owner.staff.name} added Shop labour at $125.00 per hour, not taxed to the price list.`,
      `${owner.staff.name} changed the price of Shop labour from $125.00 to $132.50 per hour.`,
    ]);
    const list = (await readBody(await priceItems.GET(request("/api/price-items", { cookie: office.cookie })))).items;
    expect(list.find((i: { id: number }) => i.id === item.id).unitPriceCents).toBe(13_250);
  });

  it("the tax rate takes three decimals at most and is audited", async () => {
    const owner = await as("owner");
    const bad = await setMoney(owner.cookie, { ...SHOP_RATE, taxRatePercent: 8.8755 });
    expect(bad.status).toBe(400);
    expect((await readBody(bad)).error.details.fields.taxRatePercent[0]).toMatch(/three decimals/);
    expect((await setMoney(owner.cookie, { ...SHOP_RATE, taxRatePercent: 8.875 })).status).toBe(200);
    const got = (await readBody(await moneySettings.GET(request("/api/shop-settings/money", { cookie: owner.cookie })))).settings;
    expect(got).toMatchObject({ taxMillipercent: 8_875, taxRatePercent: 8.875, depositPercent: 50 });
    const audit = await db().selectFrom("audit_event").select("summary").where("subject", "=", "Prices and deposit").orderBy("id", "desc").executeTakeFirstOrThrow();
    expect(audit.summary).toMatch(/sales tax from .* to 8\.875 %/);
    await setMoney(owner.cookie, SHOP_RATE);
  });
});

describe("start from the kit spec", () => {
  it("fills lines from the job's saved kit spec and names what the list has no price for", async () => {
    const owner = await as("owner");
    const job = await makeJob(db());
    const noSpec = await kitLines.GET(request(`/api/jobs/${job.id}/quotes/kit-lines`, { cookie: owner.cookie }), params({ id: String(job.id) }));
    expect(noSpec.status).toBe(409);
    await kitSpec.PUT(request(`/api/jobs/${job.id}/kit-spec`, { method: "PUT", cookie: owner.cookie, body: { inputs: demoKitCalcInput } }), params({ id: String(job.id) }));
    await priceItems.POST(request("/api/price-items", { cookie: owner.cookie, body: { kind: "part", name: "Hose, 1 in", unit: "ft", unitPriceCents: 675, taxable: true, kitUse: "hose", sizeIn: 1 } }));
    const res = await kitLines.GET(request(`/api/jobs/${job.id}/quotes/kit-lines`, { cookie: owner.cookie }), params({ id: String(job.id) }));
    expect(res.status).toBe(200);
    const body = await readBody(res);
    const hose = body.lines.find((l: { description: string }) => l.description.startsWith("Hose, 1 in"));
    expect(hose).toMatchObject({ quantity: 14, unitPriceCents: 675, taxable: true });
    expect(body.unpriced).toContain("Suction hose, 1.75 in inside diameter, 4 ft");
    // The lines go straight into a draft.
    const created = await postQuote(owner.cookie, job.id, { lines: body.lines.map((l: Record<string, unknown>) => ({ ...l, priceItemId: l.priceItemId ?? undefined })) });
    expect(created.status).toBe(201);
  });
});
