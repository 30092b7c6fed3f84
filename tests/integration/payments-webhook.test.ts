import { createHmac } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import Stripe from "stripe";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as checkoutRoute from "@/app/(public)/status/[token]/checkout/route";
import * as answerRoute from "@/app/(public)/status/[token]/quote/route";
import * as webhookRoute from "@/app/api/payments/webhook/route";
import * as jobQuotes from "@/app/api/jobs/[id]/quotes/route";
import * as sendRoute from "@/app/api/quotes/[id]/send/route";
import { startFakes, type Fakes } from "@/fakes/server.mjs";
import { issueStatusLink } from "@/server/status/links";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

const SECRET = "whsec_test_shop_webhook";
const KEY = "sk_test_shop_payments";
let fakes: Fakes;
let relay: http.Server;
const dirs: string[] = [];

// The fake POSTs its signed events here; the relay hands them to the app's route handler as they came.
beforeAll(async () => {
  relay = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c) => chunks.push(c));
    req.on("end", async () => {
      const headers = new Headers();
      for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
      const answer = await webhookRoute.POST(new Request("http://localhost:3000/api/payments/webhook", { method: "POST", headers, body: Buffer.concat(chunks) }));
      res.writeHead(answer.status, { "content-type": "application/json" });
      res.end(await answer.text());
    });
  });
  await new Promise<void>((r) => relay.listen(0, "127.0.0.1", () => r()));
  const dir = mkdtempSync(path.join(tmpdir(), "baywright-payments-"));
  dirs.push(dir);
  fakes = await startFakes({ port: 0, dataDir: dir, paymentsWebhookUrl: `http://127.0.0.1:${(relay.address() as AddressInfo).port}/`, paymentsWebhookSecret: SECRET });
  process.env.PAYMENTS_SECRET_KEY = KEY;
  process.env.PAYMENTS_WEBHOOK_SECRET = SECRET;
  process.env.PAYMENTS_API_URL = fakes.url;
});
afterAll(async () => {
  await fakes?.close();
  await new Promise((r) => relay?.close(r));
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

const LINES = [
  { kind: "part", description: "PTO", quantity: 1, unitPriceCents: 148_900, taxable: true },
  { kind: "labour", description: "Install", quantity: 4, unitPriceCents: 12_500, taxable: false },
];
// By hand: 1489.00 × 8.25 % = 122.8425 → 122.84; total 1489.00 + 500.00 + 122.84 = 2111.84; half is 1055.92.
const TOTAL = 211_184;
const DEPOSIT = 105_592;

/** A job with a quote sent and approved on its status link, so the deposit is owed. */
async function approvedJob() {
  await ensureShop(db());
  await db().updateTable("shop").set({ sales_tax_millipercent: 8_250, deposit_kind: "percent", deposit_percent: 50 }).where("id", "=", 1).execute();
  const office = await makeStaff(db(), "office");
  const cookie = await sessionCookieFor(office.id);
  const job = await makeJob(db());
  const link = await issueStatusLink(db(), { id: office.id, name: office.name, email: office.email, role: office.role }, job.id);
  const token = link.url.split("/status/")[1];
  const created = (await readBody(await jobQuotes.POST(request(`/api/jobs/${job.id}/quotes`, { cookie, body: { lines: LINES } }), params({ id: String(job.id) })))).quote;
  await sendRoute.POST(request(`/api/quotes/${created.id}/send`, { cookie, body: {} }), params({ id: String(created.id) }));
  const ok = await answerRoute.POST(request(`/status/${token}/quote`, { body: { decision: "approve", quoteId: created.id, name: "Dana Reyes", acceptTerms: true } }), params({ token }));
  expect(ok.status).toBe(200);
  return { job, token, cookie, office };
}

const startPay = (token: string, purpose = "deposit") => checkoutRoute.POST(request(`/status/${token}/checkout`, { body: { purpose } }), params({ token }));
const fake = async <T = any>(p: string, body?: unknown): Promise<T> => {
  const res = await fetch(`${fakes.url}${p}`, body === undefined ? {} : { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  return (await res.json()) as T;
};
const paymentsOf = (jobId: number) => db().selectFrom("payment").selectAll().where("job_id", "=", jobId).execute();

/** Signs like the service does (HMAC-SHA256 of "<t>.<body>"), written out here rather than taken from the app. */
function signed(body: string, secret = SECRET, t = Math.floor(Date.now() / 1000)) {
  return `t=${t},v1=${createHmac("sha256", secret).update(`${t}.${body}`).digest("hex")}`;
}
const postEvent = (body: string, signature: string | null) =>
  webhookRoute.POST(new Request("http://localhost:3000/api/payments/webhook", { method: "POST", headers: { "content-type": "application/json", ...(signature ? { "stripe-signature": signature } : {}) }, body }));

function completedEvent(id: string, sessionId: string, amount: number, currency = "usd") {
  return JSON.stringify({ id, object: "event", type: "checkout.session.completed", data: { object: { id: sessionId, object: "checkout.session", amount_total: amount, currency, payment_status: "paid" } } });
}

describe("the payments fake, through the SDK", () => {
  it("creates and retrieves a checkout session and serves its page with Pay and Cancel", async () => {
    const sdk = new Stripe(KEY, { host: "127.0.0.1", port: new URL(fakes.url).port, protocol: "http", maxNetworkRetries: 0 });
    const s = await sdk.checkout.sessions.create({ mode: "payment", line_items: [{ quantity: 2, price_data: { currency: "usd", unit_amount: 1_250, product_data: { name: "Hose clamp" } } }], success_url: "http://shop.example/ok", cancel_url: "http://shop.example/no" });
    expect(s).toMatchObject({ amount_total: 2_500, currency: "usd", payment_status: "unpaid", status: "open" });
    expect((await sdk.checkout.sessions.retrieve(s.id)).amount_total).toBe(2_500);
    const page = await (await fetch(s.url!)).text();
    expect(page).toContain("Pay 25.00 USD");
    expect(page).toContain(">Cancel<");
    const cancel = await fetch(`${fakes.url}/pay/${s.id}/cancel`, { method: "POST", redirect: "manual" });
    expect([cancel.status, cancel.headers.get("location")]).toEqual([303, "http://shop.example/no"]);
    await expect(sdk.checkout.sessions.retrieve("cs_nope12345678")).rejects.toThrow(/No such checkout/);
    await expect(new Stripe("sk_wrong key", { host: "127.0.0.1", port: new URL(fakes.url).port, protocol: "http", maxNetworkRetries: 0 }).checkout.sessions.retrieve(s.id)).rejects.toThrow();
  });
});

describe("deposit through hosted checkout and the signed webhook", () => {
  it("takes the deposit once the webhook lands, and a duplicate delivery applies it once", async () => {
    const { job, token } = await approvedJob();
    const res = await startPay(token);
    expect(res.status).toBe(200);
    const { url } = await readBody(res);
    const sessionId = url.split("/pay/")[1];
    const checkout = await db().selectFrom("checkout").selectAll().where("session_id", "=", sessionId).executeTakeFirstOrThrow();
    expect(checkout).toMatchObject({ job_id: job.id, purpose: "deposit", amount_cents: DEPOSIT, currency: "usd", status: "open" });
    expect(await paymentsOf(job.id)).toEqual([]);

    await fake("/__fake/payments/duplicate-next", { count: 1 });
    await fake(`/__fake/payments/sessions/${sessionId}/pay`, {});
    const { deliveries } = await fake("/__fake/payments");
    const mine = deliveries.filter((d: { sessionId: string }) => d.sessionId === sessionId);
    expect(mine.map((d: { status: number }) => d.status)).toEqual([200, 200]);
    expect(mine[0].eventId).toBe(mine[1].eventId);
    const paid = await paymentsOf(job.id);
    expect(paid).toHaveLength(1);
    expect(paid[0]).toMatchObject({ purpose: "deposit", method: "card", amount_cents: DEPOSIT, checkout_id: checkout.id });
    expect((await db().selectFrom("checkout").select("status").where("id", "=", checkout.id).executeTakeFirstOrThrow()).status).toBe("paid");
    // Paid: nothing more is owed as a deposit.
    expect((await startPay(token)).status).toBe(409);
  });

  it("refuses a missing or wrong signature, and an event signed too long ago, with 400 and no change", async () => {
    const { job, token } = await approvedJob();
    const { url } = await readBody(await startPay(token));
    const sessionId = url.split("/pay/")[1];
    const warn = vi.spyOn(console, "warn").mockImplementation(() => {});
    const body = completedEvent("evt_sig_1", sessionId, DEPOSIT);
    expect((await postEvent(body, null)).status).toBe(400);
    expect((await postEvent(body, signed(body, "whsec_someone_else"))).status).toBe(400);
    expect((await postEvent(body, signed(body.replace(String(DEPOSIT), "1"), SECRET))).status).toBe(400);
    expect((await postEvent(body, signed(body, SECRET, Math.floor(Date.now() / 1000) - 3600))).status).toBe(400);
    expect(await paymentsOf(job.id)).toEqual([]);
    expect(await db().selectFrom("payment_event").selectAll().where("event_id", "=", "evt_sig_1").execute()).toEqual([]);
    // One line each, no stack, no event body.
    expect(warn).toHaveBeenCalledTimes(4);
    for (const [line] of warn.mock.calls) {
      expect(String(line)).toMatch(/^payments webhook: refused, signature not verified/);
      expect(String(line)).not.toContain("\n");
    }
  });

  it("applies a replayed event once and answers 200 both times", async () => {
    const { job, token } = await approvedJob();
    const { url } = await readBody(await startPay(token));
    const sessionId = url.split("/pay/")[1];
    const body = completedEvent("evt_replay_1", sessionId, DEPOSIT);
    const first = await postEvent(body, signed(body));
    expect([first.status, (await readBody(first)).outcome]).toEqual([200, "applied"]);
    const again = await postEvent(body, signed(body));
    expect([again.status, (await readBody(again)).outcome]).toEqual([200, "already"]);
    // Another event for the same paid checkout takes no second payment either.
    const other = completedEvent("evt_replay_2", sessionId, DEPOSIT);
    expect((await postEvent(other, signed(other))).status).toBe(200);
    expect(await paymentsOf(job.id)).toHaveLength(1);
  });

  it("refuses an amount or currency other than the checkout asked, and an unknown checkout", async () => {
    const { job, token } = await approvedJob();
    const { url } = await readBody(await startPay(token));
    const sessionId = url.split("/pay/")[1];
    const warn = vi.spyOn(console, "warn").mockImplementation(() => {});
    const short = completedEvent("evt_short", sessionId, DEPOSIT - 1);
    const res = await postEvent(short, signed(short));
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.message).toMatch(/not the 105592 usd asked/);
    const euros = completedEvent("evt_eur", sessionId, DEPOSIT, "eur");
    expect((await postEvent(euros, signed(euros))).status).toBe(400);
    const stranger = completedEvent("evt_stranger", "cs_test_notours123", DEPOSIT);
    expect((await postEvent(stranger, signed(stranger))).status).toBe(400);
    const unknownType = JSON.stringify({ id: "evt_odd", type: "customer.created", data: { object: { id: "cus_1" } } });
    expect((await postEvent(unknownType, signed(unknownType))).status).toBe(400);
    // The refused event sent again is still refused.
    expect((await postEvent(short, signed(short))).status).toBe(400);
    expect(await paymentsOf(job.id)).toEqual([]);
    const kept = await db().selectFrom("payment_event").select(["event_id", "outcome"]).where("event_id", "in", ["evt_short", "evt_eur", "evt_stranger", "evt_odd"]).orderBy("event_id").execute();
    expect(kept.map((k) => k.outcome)).toEqual(["refused", "refused", "refused", "refused"]);
    expect(warn.mock.calls.every(([l]) => /^payments webhook: refused event evt_/.test(String(l)))).toBe(true);
    // The right amount still goes through afterwards.
    const right = completedEvent("evt_right", sessionId, DEPOSIT);
    expect((await postEvent(right, signed(right))).status).toBe(200);
    expect((await paymentsOf(job.id)).map((p) => p.amount_cents)).toEqual([DEPOSIT]);
  });

  it("says the service did not answer when it fails, and writes no checkout", async () => {
    const { job, token } = await approvedJob();
    const warn = vi.spyOn(console, "warn").mockImplementation(() => {});
    await fake("/__fake/payments/fail-next", { count: 5, status: 500 });
    const res = await startPay(token);
    await fake("/__fake/payments/fail-next", { count: 0 });
    expect(res.status).toBe(409);
    expect((await readBody(res)).error.message).toMatch(/did not answer. Nothing was charged/);
    expect(await db().selectFrom("checkout").selectAll().where("job_id", "=", job.id).execute()).toEqual([]);
    expect(warn).toHaveBeenCalledTimes(1);
  });

  it("offers no deposit before the quote is approved", async () => {
    await ensureShop(db());
    const office = await makeStaff(db(), "office");
    const job = await makeJob(db());
    const link = await issueStatusLink(db(), { id: office.id, name: office.name, email: office.email, role: office.role }, job.id);
    const token = link.url.split("/status/")[1];
    const res = await startPay(token);
    expect(res.status).toBe(409);
    expect((await readBody(res)).error.message).toMatch(/No deposit is owed/);
  });
});
