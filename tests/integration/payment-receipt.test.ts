import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as paymentsRoute from "@/app/api/jobs/[id]/payments/route";
import * as resendRoute from "@/app/api/messages/[id]/resend/route";
import { type Fakes, startFakes } from "@/fakes/server.mjs";
import { dispatchDueOutbox } from "@/server/email/dispatcher";
import { type EmailSender, resendSender } from "@/server/email/sender";
import { applyPaymentEvent } from "@/server/money/payments";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { giveJobMoney } from "../support/money";

const { db } = useFreshDatabase();
const dataDir = mkdtempSync(path.join(tmpdir(), "baywright-receipt-mail-"));
let fake: Fakes;
let sender: EmailSender;

type FakeMail = { subject: string; text: string; html: string; to: string[] };

beforeAll(async () => {
  fake = await startFakes({ port: 0, dataDir });
  sender = resendSender("re_test_receipt", `${fake.url}/resend`);
  process.env.APP_URL = "https://status.cold-creek.example";
  process.env.EMAIL_FROM = "updates@cold-creek.example";
  process.env.EMAIL_QUIET_SECONDS = "600";
  await ensureShop(db());
  await db().updateTable("shop").set({ name: "Cold Creek Upfit", phone: "555-0142", time_zone: "US/Central" }).where("id", "=", 1).execute();
});
afterAll(async () => {
  await fake.close();
  rmSync(dataDir, { recursive: true, force: true });
});

const mails = async (): Promise<FakeMail[]> => (await fetch(`${fake.url}/__fake/emails`)).json();
const receiptsOf = (jobId: number) => db().selectFrom("outbox").selectAll().where("job_id", "=", jobId).where("kind", "=", "payment_received").execute();
const pay = (cookie: string, jobId: number, body: unknown) => paymentsRoute.POST(request(`/api/jobs/${jobId}/payments`, { cookie, body }), params({ id: String(jobId) }));

async function jobWithContact(opts: { contact?: "gets" | "none" | "no-email-updates" } = {}) {
  const customer = await makeCustomer(db(), "Harlan Ridge Heavy Haul");
  const truck = await makeTruck(db(), customer.id);
  const contact = opts.contact ?? "gets";
  if (contact !== "none") {
    await db()
      .insertInto("contact")
      .values({ customer_id: customer.id, name: "Dana", email: `dana-${customer.id}@fleet.example`, phone: "", receives_email: contact === "gets" ? 1 : 0 })
      .execute();
  }
  const job = await makeJob(db(), { customerId: customer.id, truckId: truck.id, stage: "queued" });
  const office = await makeStaff(db(), "office");
  const owner = await makeStaff(db(), "owner");
  return { job, truck, office, owner, officeCookie: await sessionCookieFor(office.id), ownerCookie: await sessionCookieFor(owner.id), email: `dana-${customer.id}@fleet.example` };
}

/** Sends what is due, then the one mail the fake received for this address. */
async function receiptMailTo(address: string): Promise<FakeMail> {
  await dispatchDueOutbox(db(), new Date(), sender);
  const mine = (await mails()).filter((m) => m.to.includes(address) && m.subject.startsWith("Payment received"));
  expect(mine).toHaveLength(1);
  return mine[0];
}

describe("the payment receipt", () => {
  it("office records a check on the deposit: one receipt, the amount, what it paid for, the day on the shop's clock and what is still owed", async () => {
    const p = await jobWithContact();
    // $1,000.00 approved, asking a $500.00 deposit (tests/support/money.ts).
    await giveJobMoney(db(), p.job.id, "quote-approved", p.office.id);
    const res = await pay(p.officeCookie, p.job.id, { purpose: "deposit", method: "check", amountCents: 30_000, reference: "Check 2201" });
    expect(res.status).toBe(201);
    const rows = await receiptsOf(p.job.id);
    expect(rows).toHaveLength(1);
    expect(rows[0].status).toBe("pending");
    expect(Date.parse(rows[0].next_attempt_at)).toBeLessThanOrEqual(Date.now());
    // 03:30 UTC on Friday 6 March 2026 is 21:30 on Thursday 5 March in US/Central (UTC−6 until 8 March).
    await db().updateTable("payment").set({ at: "2026-03-06T03:30:00.000Z" }).where("job_id", "=", p.job.id).where("method", "=", "check").execute();
    const mail = await receiptMailTo(p.email);
    // By hand: $1,000.00 − $300.00 = $700.00 still owed.
    expect(mail.subject).toBe(`Payment received $300.00 · Work order ${p.job.work_order} · Unit ${p.truck.unit_number} · Wet kit`);
    expect(mail.text).toContain("Hello Dana,");
    expect(mail.text).toContain("Amount paid: $300.00");
    expect(mail.text).toContain("For: Deposit on quote v1");
    expect(mail.text).toContain("Paid by: Check");
    expect(mail.text).toContain("Date: Thursday 5 March 2026");
    expect(mail.text).toContain("Still owed on the job: $700.00");
    expect(mail.text).toContain("Cold Creek Upfit");
    expect(mail.text).toMatch(/https:\/\/status\.cold-creek\.example\/status\/[A-Za-z0-9_-]+/);
    expect(mail.html).toContain("$300.00");
    expect(mail.html).toContain("Thursday 5 March 2026");
    expect(mail.html).not.toContain("Check 2201");
  });

  it("works out cents and says Paid in full once nothing is owed", async () => {
    const p = await jobWithContact();
    const now = new Date().toISOString();
    // An approved quote of $2,111.84 asking a fixed $1,500.00 deposit.
    await db()
      .insertInto("quote")
      .values({ job_id: p.job.id, version: 2, kind: "quote", status: "approved", supersedes_id: null, tax_millipercent: 0, subtotal_cents: 211_184, taxable_cents: 0, tax_cents: 0, total_cents: 211_184, deposit_cents: 150_000, created_by: p.office.id, created_at: now, updated_at: now, sent_at: now, sent_by: p.office.id, decided_at: now, decided_name: "Dana", terms_accepted: 1 })
      .execute();
    expect((await pay(p.officeCookie, p.job.id, { purpose: "deposit", method: "cash", amountCents: 123_456, reference: "" })).status).toBe(201);
    let mail = await receiptMailTo(p.email);
    // By hand: 2,111.84 − 1,234.56 = 877.28.
    expect(mail.text).toContain("Amount paid: $1,234.56");
    expect(mail.text).toContain("For: Deposit on quote v2");
    expect(mail.text).toContain("Paid by: Cash");
    expect(mail.text).toContain("Still owed on the job: $877.28");
    expect(mail.text).toContain("The rest of the agreed price, $877.28, is invoiced when your truck is ready for pickup.");

    // The invoice for the whole; the office takes the rest by check.
    await db().insertInto("invoice").values({ job_id: p.job.id, number: "INV-26-0003", status: "open", total_cents: 211_184, created_by: p.office.id, created_at: now, void_reason: null, voided_at: null }).execute();
    expect((await pay(p.officeCookie, p.job.id, { purpose: "invoice", method: "check", amountCents: 87_728, reference: "Check 3307" })).status).toBe(201);
    await dispatchDueOutbox(db(), new Date(), sender);
    const all = (await mails()).filter((m) => m.to.includes(p.email) && m.subject.startsWith("Payment received"));
    expect(all).toHaveLength(2);
    mail = all.find((m) => m.subject.startsWith("Payment received $877.28"))!;
    expect(mail.text).toContain("For: Invoice INV-26-0003");
    expect(mail.text).toContain("Still owed on the job: Paid in full");
    expect(mail.text).toContain("Paid in full: nothing more is owed on this job.");
    expect((await db().selectFrom("invoice").select("status").where("job_id", "=", p.job.id).executeTakeFirstOrThrow()).status).toBe("paid");
  });

  it("an online payment applied twice queues one receipt", async () => {
    const p = await jobWithContact();
    await giveJobMoney(db(), p.job.id, "quote-approved", p.office.id);
    const quote = await db().selectFrom("quote").select("id").where("job_id", "=", p.job.id).executeTakeFirstOrThrow();
    const sessionId = `cs_test_receipt_${p.job.id}`;
    await db()
      .insertInto("checkout")
      .values({ job_id: p.job.id, purpose: "deposit", quote_id: quote.id, invoice_id: null, amount_cents: 50_000, currency: "usd", session_id: sessionId, status: "open", created_at: new Date().toISOString() })
      .execute();
    const event = { id: `evt_receipt_${p.job.id}`, type: "checkout.session.completed", data: { object: { id: sessionId, amount_total: 50_000, currency: "usd", payment_status: "paid", object: "checkout.session" } } };
    expect(await applyPaymentEvent(db(), event)).toEqual({ outcome: "applied" });
    expect(await applyPaymentEvent(db(), event)).toEqual({ outcome: "already" });
    // The service may also send a second, different event for the same checkout.
    expect(await applyPaymentEvent(db(), { ...event, id: `evt_receipt_again_${p.job.id}` })).toEqual({ outcome: "already" });
    expect(await receiptsOf(p.job.id)).toHaveLength(1);
    const mail = await receiptMailTo(p.email);
    // By hand: $1,000.00 − $500.00 deposit = $500.00.
    expect(mail.text).toContain("Amount paid: $500.00");
    expect(mail.text).toContain("Paid by: Card (online)");
    expect(mail.text).toContain("Still owed on the job: $500.00");
  });

  it("no contact who gets e-mail updates, no receipt; e-mail off for the job, no receipt", async () => {
    for (const contact of ["none", "no-email-updates"] as const) {
      const p = await jobWithContact({ contact });
      await giveJobMoney(db(), p.job.id, "quote-approved", p.office.id);
      expect((await pay(p.officeCookie, p.job.id, { purpose: "deposit", method: "cash", amountCents: 10_000, reference: "" })).status).toBe(201);
      expect(await receiptsOf(p.job.id)).toEqual([]);
      expect(await db().selectFrom("payment").select("id").where("job_id", "=", p.job.id).where("method", "=", "cash").execute()).toHaveLength(1);
    }
    const p = await jobWithContact();
    await giveJobMoney(db(), p.job.id, "quote-approved", p.office.id);
    await db().insertInto("job_email_setting").values({ job_id: p.job.id, email_off: 1, recipients_chosen: 0, updated_at: new Date().toISOString(), updated_by: p.office.id }).execute();
    expect((await pay(p.officeCookie, p.job.id, { purpose: "deposit", method: "cash", amountCents: 10_000, reference: "" })).status).toBe(201);
    expect(await receiptsOf(p.job.id)).toEqual([]);
  });

  it("an amount the owner puts on account is owed, not paid: no receipt", async () => {
    const p = await jobWithContact();
    await giveJobMoney(db(), p.job.id, "invoiced", p.office.id);
    expect((await pay(p.ownerCookie, p.job.id, { purpose: "invoice", method: "on_account", amountCents: 50_000, reference: "Net 30" })).status).toBe(201);
    expect(await receiptsOf(p.job.id)).toEqual([]);
  });

  it("a refused payment queues nothing", async () => {
    const p = await jobWithContact();
    await giveJobMoney(db(), p.job.id, "quote-approved", p.office.id);
    expect((await pay(p.officeCookie, p.job.id, { purpose: "deposit", method: "check", amountCents: 50_001, reference: "Check 9" })).status).toBe(400);
    expect(await receiptsOf(p.job.id)).toEqual([]);
  });

  it("Send again sends the same receipt once more, with the figures it had", async () => {
    const p = await jobWithContact();
    await giveJobMoney(db(), p.job.id, "quote-approved", p.office.id);
    expect((await pay(p.officeCookie, p.job.id, { purpose: "deposit", method: "cash", amountCents: 20_000, reference: "" })).status).toBe(201);
    await dispatchDueOutbox(db(), new Date(), sender);
    // A later payment changes what is owed now, not what the first receipt said.
    expect((await pay(p.officeCookie, p.job.id, { purpose: "deposit", method: "cash", amountCents: 30_000, reference: "" })).status).toBe(201);
    const first = (await receiptsOf(p.job.id)).find((r) => r.status === "sent")!;
    const res = await resendRoute.POST(request(`/api/messages/${first.id}/resend`, { cookie: p.officeCookie, body: {} }), params({ id: first.id }));
    expect(res.status).toBe(201);
    expect((await readBody(res)).message.resendOf).toBe(first.id);
    await dispatchDueOutbox(db(), new Date(), sender);
    const all = (await mails()).filter((m) => m.to.includes(p.email) && m.subject.startsWith("Payment received $200.00"));
    expect(all).toHaveLength(2);
    // By hand: $1,000.00 − $200.00 = $800.00, both times.
    for (const m of all) expect(m.text).toContain("Still owed on the job: $800.00");
  });
});
