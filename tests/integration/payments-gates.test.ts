import { describe, expect, it } from "vitest";
import * as checkoutRoute from "@/app/(public)/status/[token]/checkout/route";
import * as answerRoute from "@/app/(public)/status/[token]/quote/route";
import * as invoiceRoute from "@/app/api/jobs/[id]/invoice/route";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as paymentsRoute from "@/app/api/jobs/[id]/payments/route";
import * as jobQuotes from "@/app/api/jobs/[id]/quotes/route";
import * as voidRoute from "@/app/api/invoices/[id]/void/route";
import * as sendRoute from "@/app/api/quotes/[id]/send/route";
import * as moneyChecksRoute from "@/app/api/shop-settings/money-checks/route";
import type { Stage } from "@/db/schema";
import { customerPayment } from "@/server/money/customer-payment";
import { issueStatusLink } from "@/server/status/links";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { giveJobMoney } from "../support/money";

const { db } = useFreshDatabase();

// $1,000.00 of labour and a $400.00 part taxed at 8.25 %: 400 × 0.0825 = 33.00, total 1,433.00, half 716.50.
const LINES = [
  { kind: "labour", description: "Install and plumb", quantity: 8, unitPriceCents: 12_500, taxable: false },
  { kind: "part", description: "Gear pump", quantity: 1, unitPriceCents: 40_000, taxable: true },
];

async function people() {
  await ensureShop(db());
  await db().updateTable("shop").set({ sales_tax_millipercent: 8_250, deposit_kind: "percent", deposit_percent: 50, money_checks: 1 }).where("id", "=", 1).execute();
  const office = await makeStaff(db(), "office");
  const owner = await makeStaff(db(), "owner");
  const tech = await makeStaff(db(), "tech");
  return { office, owner, tech, officeCookie: await sessionCookieFor(office.id), ownerCookie: await sessionCookieFor(owner.id), techCookie: await sessionCookieFor(tech.id) };
}

async function approvedJob(p: Awaited<ReturnType<typeof people>>, scope: "fabrication" | "install_only" = "fabrication") {
  const job = await makeJob(db(), { scope });
  const link = await issueStatusLink(db(), { id: p.office.id, name: p.office.name, email: p.office.email, role: "office" }, job.id);
  const token = link.url.split("/status/")[1];
  const created = (await readBody(await jobQuotes.POST(request(`/api/jobs/${job.id}/quotes`, { cookie: p.officeCookie, body: { lines: LINES } }), params({ id: String(job.id) })))).quote;
  await sendRoute.POST(request(`/api/quotes/${created.id}/send`, { cookie: p.officeCookie, body: {} }), params({ id: String(created.id) }));
  return { job, token, quoteId: created.id as number };
}

async function move(cookie: string, jobId: number, toStage: Stage, override?: string) {
  const { version } = await db().selectFrom("job").select("version").where("id", "=", jobId).executeTakeFirstOrThrow();
  return moves.POST(request(`/api/jobs/${jobId}/moves`, { cookie, body: { toStage, version, ...(override ? { override: { reason: override } } : {}) } }), params({ id: String(jobId) }));
}
const pay = (cookie: string, jobId: number, body: unknown) => paymentsRoute.POST(request(`/api/jobs/${jobId}/payments`, { cookie, body }), params({ id: String(jobId) }));

describe("money before work", () => {
  it("refuses Fabricate before the quote is approved and before the deposit, and allows it after", async () => {
    const p = await people();
    const { job, token, quoteId } = await approvedJob(p);
    const early = await move(p.techCookie, job.id, "fabricate");
    expect(early.status).toBe(422);
    expect((await readBody(early)).error.details.unmet).toEqual(["Into Fabricate: An approved quote: the quote is sent and waiting for the customer's answer."]);

    await answerRoute.POST(request(`/status/${token}/quote`, { body: { decision: "approve", quoteId, name: "Dana Reyes", acceptTerms: true } }), params({ token }));
    const noDeposit = await move(p.techCookie, job.id, "fabricate");
    expect(noDeposit.status).toBe(422);
    expect((await readBody(noDeposit)).error.details.unmet).toEqual([
      "Into Fabricate: Deposit: $716.50 not paid yet; the customer pays on the status link, or record cash or a check under Money.",
    ]);

    // Part of it in cash leaves the rest owed; the rest by check lets the job start.
    expect((await pay(p.officeCookie, job.id, { purpose: "deposit", method: "cash", amountCents: 50_000, reference: "" })).status).toBe(201);
    expect((await readBody(await move(p.techCookie, job.id, "fabricate"))).error.details.unmet[0]).toMatch(/Deposit: \$216\.50 not paid yet/);
    const over = await pay(p.officeCookie, job.id, { purpose: "deposit", method: "check", amountCents: 21_651, reference: "Check 2201" });
    expect(over.status).toBe(400);
    expect((await readBody(over)).error.message).toMatch(/more than is owed \(\$216\.50\)/);
    expect((await pay(p.officeCookie, job.id, { purpose: "deposit", method: "check", amountCents: 21_650, reference: "Check 2201" })).status).toBe(201);
    expect((await move(p.techCookie, job.id, "fabricate")).status).toBe(200);

    const audit = await db().selectFrom("audit_event").select("summary").where("kind", "=", "payment_recorded").where("subject", "=", job.work_order).orderBy("id").execute();
    expect(audit.map((a) => a.summary)).toEqual([`${p.office.name} recorded $500.00 cash for the deposit.`, `${p.office.name} recorded $216.50 check for the deposit (Check 2201).`]);
  });

  it("install-only work meets the same check at Install", async () => {
    const p = await people();
    const { job } = await approvedJob(p, "install_only");
    const res = await move(p.techCookie, job.id, "install");
    expect(res.status).toBe(422);
    expect((await readBody(res)).error.details.unmet[0]).toMatch(/^Into Install: An approved quote/);
  });

  it("the owner overrides with a reason; the shop may turn the checks off, and that is audited", async () => {
    const p = await people();
    const { job } = await approvedJob(p);
    expect((await move(p.officeCookie, job.id, "fabricate", "Fleet customer, deposit waived by phone")).status).toBe(403);
    expect((await move(p.ownerCookie, job.id, "fabricate", "Fleet customer, deposit waived by phone")).status).toBe(200);
    const other = await approvedJob(p);
    const put = (cookie: string, on: unknown) => moneyChecksRoute.PUT(request("/api/shop-settings/money-checks", { method: "PUT", cookie, body: { on } }));
    expect((await put(p.officeCookie, false)).status).toBe(403);
    expect((await put(p.ownerCookie, "no")).status).toBe(400);
    expect((await put(p.ownerCookie, false)).status).toBe(200);
    expect((await move(p.techCookie, other.job.id, "fabricate")).status).toBe(200);
    const line = await db().selectFrom("audit_event").select(["summary"]).where("subject", "=", "Money checks before work and delivery").executeTakeFirstOrThrow();
    expect(line.summary).toBe(`${p.owner.name} turned the money checks before work and delivery off.`);
    await put(p.ownerCookie, true);
  });

  it("only the owner puts money on account; a check needs its number", async () => {
    const p = await people();
    const job = await makeJob(db());
    await giveJobMoney(db(), job.id, "quote-approved", p.office.id);
    expect((await pay(p.officeCookie, job.id, { purpose: "deposit", method: "on_account", amountCents: 50_000, reference: "Fleet account" })).status).toBe(403);
    expect((await pay(p.techCookie, job.id, { purpose: "deposit", method: "cash", amountCents: 100, reference: "" })).status).toBe(403);
    const noNumber = await pay(p.officeCookie, job.id, { purpose: "deposit", method: "check", amountCents: 100, reference: " " });
    expect(noNumber.status).toBe(400);
    expect((await pay(p.ownerCookie, job.id, { purpose: "deposit", method: "on_account", amountCents: 50_000, reference: "Fleet account" })).status).toBe(201);
    expect(await db().selectFrom("payment").select(["method", "amount_cents"]).where("job_id", "=", job.id).execute()).toEqual([{ method: "on_account", amount_cents: 50_000 }]);
  });
});

describe("the invoice and Delivered", () => {
  it("is made at Ready for pickup; Delivered waits for the balance; the owner voids with a reason", async () => {
    const p = await people();
    const job = await makeJob(db(), { stage: "wire" });
    await giveJobMoney(db(), job.id, "deposit-paid", p.office.id);
    // The sign-off is not the subject: the owner moves it on with a reason.
    expect((await move(p.ownerCookie, job.id, "ready", "Signed off on paper today")).status).toBe(200);
    const inv = await db().selectFrom("invoice").selectAll().where("job_id", "=", job.id).executeTakeFirstOrThrow();
    expect(inv).toMatchObject({ status: "open", total_cents: 100_000 });
    expect(inv.number).toMatch(/^INV-\d{2}-0001$/);

    // The sign-off (not the subject here) stays missing; only what Delivered itself asks is looked at.
    const deliveredNeeds = async () => {
      const res = await move(p.techCookie, job.id, "delivered");
      expect(res.status).toBe(422);
      return ((await readBody(res)).error.details.unmet as string[]).filter((u) => u.startsWith("Into Delivered"));
    };
    expect(await deliveredNeeds()).toEqual([`Into Delivered: Invoice ${inv.number}: balance due $500.00; the customer pays on the status link, or record a payment under Money.`]);

    // Voiding: owner only, with a reason; the invoice stays, a new one is made on asking.
    const voidIt = (cookie: string, reason: unknown) => voidRoute.POST(request(`/api/invoices/${inv.id}/void`, { cookie, body: { reason } }), params({ id: String(inv.id) }));
    expect((await voidIt(p.officeCookie, "Wrong total")).status).toBe(403);
    expect((await voidIt(p.ownerCookie, "")).status).toBe(400);
    expect((await voidIt(p.ownerCookie, "Labour line was doubled")).status).toBe(200);
    expect((await voidIt(p.ownerCookie, "Again")).status).toBe(409);
    expect(await db().selectFrom("invoice").select(["status", "void_reason"]).where("id", "=", inv.id).executeTakeFirstOrThrow()).toEqual({ status: "void", void_reason: "Labour line was doubled" });
    expect((await db().selectFrom("audit_event").select("summary").where("kind", "=", "invoice_voided").executeTakeFirstOrThrow()).summary).toBe(`${p.owner.name} voided invoice ${inv.number} ($1,000.00): Labour line was doubled`);
    expect(await deliveredNeeds()).toEqual([expect.stringMatching(/^Into Delivered: Invoice: none yet/)]);
    const remade = await invoiceRoute.POST(request(`/api/jobs/${job.id}/invoice`, { cookie: p.officeCookie, body: {} }), params({ id: String(job.id) }));
    expect(remade.status).toBe(201);
    const second = await db().selectFrom("invoice").selectAll().where("job_id", "=", job.id).where("status", "=", "open").executeTakeFirstOrThrow();
    expect(second.number).toMatch(/^INV-\d{2}-0002$/);

    expect((await pay(p.officeCookie, job.id, { purpose: "invoice", method: "check", amountCents: 50_000, reference: "Check 3307" })).status).toBe(201);
    expect((await db().selectFrom("invoice").select("status").where("id", "=", second.id).executeTakeFirstOrThrow()).status).toBe("paid");
    // The sign-off the owner waived on the way to Ready is not asked again: paid, it goes.
    expect((await move(p.techCookie, job.id, "delivered")).status).toBe(200);
  });

  it("once the owner moved a job past what it needed, the office delivers it paid without a second override", async () => {
    const p = await people();
    const job = await makeJob(db(), { stage: "fabricate" });
    await db().insertInto("part").values({ job_id: job.id, name: "35 gal round reservoir", kind: "reservoir", material: "aluminum", shape: "round", needs_leak_test: 1, needs_coating: 0, notes: "", rework_count: 0, rework_note: "", created_at: new Date().toISOString(), updated_at: new Date().toISOString() }).execute();
    await giveJobMoney(db(), job.id, "deposit-paid", p.office.id);
    // Untested tank and no sign-off: the owner moves it on with a reason.
    expect((await move(p.officeCookie, job.id, "ready")).status).toBe(422);
    expect((await move(p.ownerCookie, job.id, "ready", "Tested and signed off on paper; records to follow")).status).toBe(200);
    const inv = await db().selectFrom("invoice").select(["id"]).where("job_id", "=", job.id).executeTakeFirstOrThrow();
    expect((await pay(p.officeCookie, job.id, { purpose: "invoice", method: "check", amountCents: 50_000, reference: "Check 3310" })).status).toBe(201);
    expect((await db().selectFrom("invoice").select("status").where("id", "=", inv.id).executeTakeFirstOrThrow()).status).toBe("paid");
    // Delivered asks only its own need (the money), which is met.
    expect((await move(p.officeCookie, job.id, "delivered")).status).toBe(200);
  });

  it("a change order approved after the invoice was paid holds the truck until the invoice is made again and paid", async () => {
    const p = await people();
    const { job, token, quoteId } = await approvedJob(p);
    expect((await answerRoute.POST(request(`/status/${token}/quote`, { body: { decision: "approve", quoteId, name: "Dana Reyes", acceptTerms: true } }), params({ token }))).status).toBe(200);
    expect((await pay(p.officeCookie, job.id, { purpose: "deposit", method: "check", amountCents: 71_650, reference: "Check 4100" })).status).toBe(201);
    // The customer's page: the deposit paid, and the rest (1,433.00 − 716.50) owed at pickup.
    expect((await customerPayment(db(), job.id))?.deposit).toEqual({ askedCents: 71_650, paidCents: 71_650, owedCents: 0, restCents: 71_650 });
    // Records are not the subject: the owner moves it to Ready with a reason, which makes the invoice.
    expect((await move(p.ownerCookie, job.id, "ready", "Built and signed off on paper")).status).toBe(200);
    const first = await db().selectFrom("invoice").select(["id", "number", "total_cents"]).where("job_id", "=", job.id).executeTakeFirstOrThrow();
    expect(first.total_cents).toBe(143_300);
    expect((await pay(p.officeCookie, job.id, { purpose: "invoice", method: "check", amountCents: 71_650, reference: "Check 4101" })).status).toBe(201);

    // Then two work lights at $80.00, taxable: 160.00 + 8.25 % (13.20) = 173.20; the work is now 1,433.00 + 173.20 = 1,606.20.
    const co = await jobQuotes.POST(
      request(`/api/jobs/${job.id}/quotes`, { cookie: p.officeCookie, body: { kind: "change_order", lines: [{ kind: "part", description: "LED work light", quantity: 2, unitPriceCents: 8_000, taxable: true }] } }),
      params({ id: String(job.id) }),
    );
    expect(co.status).toBe(201);
    const coId = (await readBody(co)).quote.id as number;
    expect((await sendRoute.POST(request(`/api/quotes/${coId}/send`, { cookie: p.officeCookie, body: {} }), params({ id: String(coId) }))).status).toBe(200);
    expect((await answerRoute.POST(request(`/status/${token}/quote`, { body: { decision: "approve", quoteId: coId, name: "Dana Reyes", acceptTerms: true } }), params({ token }))).status).toBe(200);

    const held = await move(p.officeCookie, job.id, "delivered");
    expect(held.status).toBe(422);
    expect((await readBody(held)).error.details.unmet).toEqual([
      `Into Delivered: Invoice ${first.number} bills $1,433.00, but the approved work is now $1,606.20 after a change order: the owner voids it under Money, then make the new invoice there.`,
    ]);
    // No payment is taken against the old invoice, at the counter or online, and the customer is told why.
    const counter = await pay(p.officeCookie, job.id, { purpose: "invoice", method: "cash", amountCents: 17_320, reference: "" });
    expect(counter.status).toBe(409);
    expect((await readBody(counter)).error.message).toBe(`Invoice ${first.number} bills $1,433.00, but the approved work is now $1,606.20 after a change order. The owner voids it and a new one is made before payment is taken against it.`);
    const online = await checkoutRoute.POST(request(`/status/${token}/checkout`, { body: { purpose: "invoice" } }), params({ token }));
    expect(online.status).toBe(409);
    expect((await readBody(online)).error.message).toBe(`The shop is making invoice ${first.number} again with your approved change on it; the new invoice comes by e-mail. Nothing was charged.`);
    expect((await customerPayment(db(), job.id))?.invoice).toMatchObject({ number: first.number, outOfDate: true });
    expect(await db().selectFrom("payment").select("amount_cents").where("job_id", "=", job.id).execute()).toHaveLength(2);

    // The owner voids it, the office makes the new one: it bills the change, and only the change is owed.
    expect((await voidRoute.POST(request(`/api/invoices/${first.id}/void`, { cookie: p.ownerCookie, body: { reason: "Work lights approved after invoicing" } }), params({ id: String(first.id) }))).status).toBe(200);
    expect((await invoiceRoute.POST(request(`/api/jobs/${job.id}/invoice`, { cookie: p.officeCookie, body: {} }), params({ id: String(job.id) }))).status).toBe(201);
    const second = await db().selectFrom("invoice").select(["number", "status", "total_cents"]).where("job_id", "=", job.id).where("status", "!=", "void").executeTakeFirstOrThrow();
    expect(second).toMatchObject({ status: "open", total_cents: 160_620 });
    expect((await customerPayment(db(), job.id))?.invoice).toMatchObject({ number: second.number, outOfDate: false, balanceCents: 17_320 });
    expect((await readBody(await move(p.officeCookie, job.id, "delivered"))).error.details.unmet).toEqual([
      `Into Delivered: Invoice ${second.number}: balance due $173.20; the customer pays on the status link, or record a payment under Money.`,
    ]);
    expect((await pay(p.officeCookie, job.id, { purpose: "invoice", method: "cash", amountCents: 17_320, reference: "" })).status).toBe(201);
    expect((await move(p.officeCookie, job.id, "delivered")).status).toBe(200);
  });

  it("numbers on past 9999 in a year instead of reusing a number", async () => {
    const p = await people();
    const before = await makeJob(db(), { stage: "delivered" });
    const yy = new Date().toISOString().slice(2, 4);
    for (const [n, status] of [["9999", "paid"], ["10000", "void"]] as const) {
      await db().insertInto("invoice").values({ job_id: before.id, number: `INV-${yy}-${n}`, status, total_cents: 100, created_by: p.office.id, created_at: new Date().toISOString(), sent_at: null, void_reason: null, voided_at: null }).execute();
    }
    const job = await makeJob(db(), { stage: "wire" });
    await giveJobMoney(db(), job.id, "deposit-paid", p.office.id);
    expect((await move(p.ownerCookie, job.id, "ready", "Signed off on paper today")).status).toBe(200);
    expect((await db().selectFrom("invoice").select("number").where("job_id", "=", job.id).executeTakeFirstOrThrow()).number).toBe(`INV-${yy}-10001`);
  });
});
