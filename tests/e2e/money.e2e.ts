import Database from "better-sqlite3";
import type { APIRequestContext, Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { withCheckDigit } from "@/server/vehicles/vin";
import { DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";


/** A customer with a contact who gets e-mail updates, and one of their trucks (read only: the test adds its own job). */
function customerWithEmail() {
  const sqlite = new Database(inject("databasePath"), { readonly: true, fileMustExist: true });
  try {
    return sqlite
      .prepare(
        `select customer.id as customerId, truck.id as truckId from customer join truck on truck.customer_id = customer.id
         where exists (select 1 from contact where contact.customer_id = customer.id and contact.receives_email = 1 and contact.email != '')
         order by customer.id limit 1`,
      )
      .get() as { customerId: number; truckId: number };
  } finally {
    sqlite.close();
  }
}

const enabled = Boolean(baseUrl());

async function json<T = any>(res: Awaited<ReturnType<APIRequestContext["get"]>>, status = 200): Promise<T> {
  expect(res.status(), await res.text()).toBe(status);
  return (await res.json()) as T;
}

const KIT = {
  engineRpm: 1200,
  ptoRatioPercent: 115,
  pumpDisplacementCuIn: 3.5,
  workingPressurePsi: 2500,
  tank: { shape: "round", insideDiameterIn: 20, lengthIn: 30 },
  suctionLine: { insideDiameterIn: 1.75, lengthFt: 4 },
  returnLine: { insideDiameterIn: 1, lengthFt: 14 },
};

describe.skipIf(!enabled)("quotes in Chromium", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("the office starts a quote from the kit spec, adds labour from the price list, saves and sends it; the sent version cannot be edited", async () => {
    const suffix = Date.now().toString(36).slice(-4).toUpperCase();
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "office");
    const api = page.request;
    const headers = { origin: baseUrl() };
    // A customer whose contact gets e-mail updates (the newest job may belong to one with none).
    const anyJob = customerWithEmail();
    const job = (await json(await api.post(`${baseUrl()}/api/jobs`, { headers, data: { customerId: anyJob.customerId, truckId: anyJob.truckId, scope: "fabrication", description: `Wet kit quote ${suffix}` } }), 201)).job as { id: number };
    await json(await api.put(`${baseUrl()}/api/jobs/${job.id}/kit-spec`, { headers, data: { inputs: KIT } }));

    await page.goto(`${baseUrl()}/jobs/${job.id}`);
    const section = page.locator("#quote");
    await section.getByRole("button", { name: "Start from the kit spec" }).click();
    await expect.poll(() => section.getByRole("list", { name: "Lines of the draft" }).getByRole("listitem").count()).toBe(5);
    await section.getByLabel("Add from the price list").selectOption({ label: "Shop labour — $125.00 / hour" });
    const lines = section.getByRole("list", { name: "Lines of the draft" }).getByRole("listitem");
    await lines.nth(5).getByLabel("Qty").fill("6.5");
    await expect.poll(() => section.getByLabel("Amount of line 6").textContent()).toBe("$812.50");
    await section.getByRole("button", { name: "Save the draft" }).click();
    await expect.poll(() => section.getByRole("status").textContent()).toContain("Draft version 1 saved");

    const draft = (await json<{ quotes: { id: number; status: string; totalCents: number }[] }>(await api.get(`${baseUrl()}/api/jobs/${job.id}/quotes`))).quotes[0];
    expect(draft.status).toBe("draft");
    await shot(page, "quote-draft-desk");

    await section.getByRole("button", { name: "Send to the customer" }).click();
    await expect.poll(() => section.getByRole("status").textContent()).toContain("Version 1 sent");
    const sent = section.getByRole("article", { name: "Quote version 1" });
    await expect.poll(() => sent.textContent()).toContain("Sent: waiting for the customer");
    // The e-mail list on the same page shows the quote's e-mail without a reload.
    await expect.poll(() => page.locator("#messages").getByText("Quote with its PDF").count()).toBeGreaterThan(0);
    expect(await sent.textContent()).toContain(`$${(draft.totalCents / 100).toLocaleString("en-US", { minimumFractionDigits: 2 })}`);
    // The sent version is never edited: the API refuses, and the screen offers a new version instead.
    const refused = await api.put(`${baseUrl()}/api/quotes/${draft.id}`, { headers, data: { lines: [{ kind: "fee", description: "x", quantity: 1, unitPriceCents: 1, taxable: false }] } });
    expect(refused.status()).toBe(409);
    expect(await section.getByRole("button", { name: "New version from version 1" }).isVisible()).toBe(true);
    await shot(page, "quote-sent-desk");
    await context.close();
  });

  it("the truck owner, on a phone with no sign-in, approves the sent quote on the status link with a typed name and the terms ticked", async () => {
    const suffix = Date.now().toString(36).slice(-4).toUpperCase();
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "office");
    const api = page.request;
    const headers = { origin: baseUrl() };
    // A customer whose contact gets e-mail updates (the newest job may belong to one with none).
    const anyJob = customerWithEmail();
    const job = (await json(await api.post(`${baseUrl()}/api/jobs`, { headers, data: { customerId: anyJob.customerId, truckId: anyJob.truckId, scope: "install_only", description: `PTO switch ${suffix}` } }), 201)).job as { id: number };
    const link = (await json(await api.post(`${baseUrl()}/api/jobs/${job.id}/status-links`, { headers }), 201)).link as { url: string };
    const lines = [
      { kind: "part", description: "In-cab PTO switch with engaged light", quantity: 1, unitPriceCents: 21_650, taxable: true },
      { kind: "labour", description: "Install and wire", quantity: 2.5, unitPriceCents: 12_500, taxable: false },
    ];
    const quote = (await json(await api.post(`${baseUrl()}/api/jobs/${job.id}/quotes`, { headers, data: { lines } }), 201)).quote as { id: number };
    const sent = (await json(await api.post(`${baseUrl()}/api/quotes/${quote.id}/send`, { headers, data: {} }))).quote as { totalCents: number };
    await context.close();

    const customer = await browser.newContext(PHONE);
    const phone = await customer.newPage();
    await phone.goto(`${baseUrl()}/status/${link.url.split("/status/")[1]}`);
    const card = phone.getByRole("article", { name: "Quote version 1" });
    const total = `$${(sent.totalCents / 100).toLocaleString("en-US", { minimumFractionDigits: 2 })}`;
    expect(await card.textContent()).toContain(total);
    await shot(phone, "quote-customer-phone");
    // Without the tick the shop's server refuses and says what to do.
    await card.getByLabel("Your full name").fill("Dana Reyes");
    await card.getByRole("button", { name: `Approve ${total}` }).click();
    await expect.poll(() => card.getByRole("alert").textContent()).toContain("Tick that you accept the terms");
    await card.getByRole("checkbox").check();
    await card.getByRole("button", { name: `Approve ${total}` }).click();
    await expect.poll(() => phone.getByRole("status").textContent()).toContain("your approval is with the shop");
    expect(await phone.getByText(`Quote version 1: approved by Dana Reyes`).count()).toBe(1);
    await shot(phone, "quote-customer-approved-phone");
    await customer.close();
  });

  it("from quote to paid: the customer approves and pays the deposit on a phone, the card says so and moves into Fabricate, and at Ready the invoice is paid the same way", { timeout: 120_000 }, async () => {
    const suffix = Date.now().toString(36).slice(-4).toUpperCase();
    const headers = { origin: baseUrl() };
    const officeContext = await browser.newContext(DESK);
    const office = await signIn(officeContext, "office");
    const api = office.request;
    // A customer of this test's own whose contact gets e-mail updates, so the receipts can be told apart from every other e-mail the fake holds.
    const n = Date.now() % 1_000_000;
    const contactEmail = `receipts-${n}@hose-tray-fleet.example`;
    const { customer: ownCustomer } = await json(await api.post(`${baseUrl()}/api/customers`, { headers, data: { kind: "company", name: `Hose Tray Fleet ${suffix}`, contacts: [{ name: "Dana Reyes", email: contactEmail, receivesEmail: true }] } }), 201);
    const { truck: ownTruck } = await json(await api.post(`${baseUrl()}/api/trucks`, { headers, data: { customerId: ownCustomer.id, unitNumber: `HT-${n}`, vin: withCheckDigit(`1HT5T3X20RK${String(n).padStart(6, "0")}`), year: 2024 } }), 201);
    const job = (await json(await api.post(`${baseUrl()}/api/jobs`, { headers, data: { customerId: ownCustomer.id, truckId: ownTruck.id, scope: "fabrication", description: `Hose tray and bracket ${suffix}` } }), 201)).job as { id: number; workOrder: string };
    type FakeMail = { subject: string; text: string; to: string[] };
    const receiptsSent = async () => ((await (await fetch(`${inject("fakesUrl")}/__fake/emails`)).json()) as FakeMail[]).filter((m) => m.to.includes(contactEmail) && m.subject.startsWith("Payment received"));
    const link = (await json(await api.post(`${baseUrl()}/api/jobs/${job.id}/status-links`, { headers }), 201)).link as { url: string };
    // $800.00 of labour (no tax) and a $215.00 part taxed at the demo's 8.25 %: 17.7375 → $17.74;
    // total $1,032.74; half of it, $516.37, is the deposit.
    const lines = [
      { kind: "labour", description: "Fabricate and mount", quantity: 6.4, unitPriceCents: 12_500, taxable: false },
      { kind: "part", description: "Breakaway coupler set", quantity: 1, unitPriceCents: 21_500, taxable: true },
    ];
    await json(await api.post(`${baseUrl()}/api/jobs/${job.id}/quotes`, { headers, data: { lines } }), 201);

    // The office sends it from the job page.
    await office.goto(`${baseUrl()}/jobs/${job.id}`);
    const quoteSection = office.locator("#quote");
    await quoteSection.getByRole("button", { name: "Send to the customer" }).click();
    await expect.poll(() => quoteSection.getByRole("status").textContent()).toContain("Version 1 sent");
    await expect.poll(async () => (await (await api.get(`${baseUrl()}/api/board`)).json()).cards.find((c: { id: number }) => c.id === job.id)?.money).toBe("Quote sent");

    // The truck owner, on a phone with no sign-in, approves and pays the deposit on the service's page.
    const customer = await browser.newContext(PHONE);
    const phone = await customer.newPage();
    await phone.goto(link.url.replace(/^https?:\/\/[^/]+/, baseUrl()));
    const card = phone.getByRole("article", { name: "Quote version 1" });
    await card.getByLabel("Your full name").fill("Dana Reyes");
    await card.getByRole("checkbox").check();
    await card.getByRole("button", { name: "Approve $1,032.74" }).click();
    const payDeposit = phone.getByRole("button", { name: "Pay the deposit $516.37" });
    await payDeposit.waitFor();
    await shot(phone, "money-deposit-due-phone");
    await payDeposit.click();
    await phone.waitForURL((u) => u.href.startsWith(inject("fakesUrl")));
    await phone.getByRole("button", { name: "Pay 516.37 USD" }).waitFor();
    await shot(phone, "money-hosted-checkout-phone");
    await phone.getByRole("button", { name: "Pay 516.37 USD" }).click();
    await phone.waitForURL((u) => u.href.startsWith(baseUrl()) && u.searchParams.get("paid") === "deposit");
    await phone.getByText("Deposit paid: $516.37").waitFor({ timeout: 30_000 });
    await shot(phone, "money-deposit-paid-phone");
    // The customer's receipt reached the e-mail service: the deposit, and by hand $1,032.74 − $516.37 = $516.37 still owed.
    await expect.poll(async () => (await receiptsSent()).length, { timeout: 20_000 }).toBe(1);
    const depositReceipt = (await receiptsSent())[0];
    expect(depositReceipt.subject).toBe(`Payment received $516.37 · Work order ${job.workOrder} · Unit HT-${n} · Hose tray and bracket ${suffix}`);
    for (const words of ["Amount paid: $516.37", "For: Deposit on quote v1", "Paid by: Card (online)", "Still owed on the job: $516.37"]) expect(depositReceipt.text).toContain(words);

    // The card says so, and the job moves into Fabricate from its "Move to…" list.
    await office.goto(`${baseUrl()}/board`);
    const boardCard = office.locator(`li[data-card="${job.workOrder}"]`);
    await expect.poll(() => boardCard.locator("[data-money]").textContent()).toBe("Deposit paid");
    await boardCard.locator("select").selectOption("fabricate");
    await boardCard.getByRole("button", { name: `Move ${job.workOrder} to Fabricate` }).click();
    await office.locator(`ul[data-stage="fabricate"] > li[data-card="${job.workOrder}"]`).waitFor();
    await shot(office, "money-board-deposit-paid-desk");

    // The shop's records are not the subject here: the owner takes it on to Ready for pickup with a reason.
    const ownerContext = await browser.newContext(DESK);
    const owner = await signIn(ownerContext, "owner");
    const current = (await json(await owner.request.get(`${baseUrl()}/api/jobs/${job.id}`))).job as { version: number };
    await json(await owner.request.post(`${baseUrl()}/api/jobs/${job.id}/moves`, { headers, data: { toStage: "ready", version: current.version, override: { reason: "Records kept on paper for this small job" } } }));
    await ownerContext.close();

    // At Ready the invoice is out; the customer pays the balance the same way.
    await office.goto(`${baseUrl()}/jobs/${job.id}`);
    const money = office.locator("#money");
    await expect.poll(() => money.getByTestId("money-words").textContent()).toContain("Balance due $516.37");
    expect(await money.getByTestId("invoice").textContent()).toMatch(/Invoice INV-\d{2}-\d{4} · open/);
    await shot(office, "money-invoice-open-desk");
    // The invoice went to the customer by e-mail with its PDF and the way to pay.
    await expect.poll(async () => ((await (await fetch(`${inject("fakesUrl")}/__fake/emails`)).json()) as { subject: string; attachments: { filename: string }[] | null }[]).find((m) => m.subject.startsWith("Invoice INV-") && m.subject.includes(job.workOrder))?.attachments?.[0]?.filename, { timeout: 20_000 }).toMatch(new RegExp(`^${job.workOrder}-invoice-INV-\\d{2}-\\d{4}\\.pdf$`));
    await office.reload();
    await office.locator("#messages").getByText("Invoice with its PDF").first().waitFor();
    await phone.goto(link.url.replace(/^https?:\/\/[^/]+/, baseUrl()));
    const payBalance = phone.getByRole("button", { name: "Pay the balance $516.37" });
    await payBalance.click();
    await phone.waitForURL((u) => u.href.startsWith(inject("fakesUrl")));
    await phone.getByRole("button", { name: "Pay 516.37 USD" }).click();
    await phone.waitForURL((u) => u.href.startsWith(baseUrl()) && u.searchParams.get("paid") === "invoice");
    await phone.getByText("Paid in full. Thank you.").waitFor({ timeout: 30_000 });
    await shot(phone, "money-invoice-paid-phone");
    // The second receipt: the invoice, and nothing left to pay.
    await expect.poll(async () => (await receiptsSent()).length, { timeout: 20_000 }).toBe(2);
    const invoiceReceipt = (await receiptsSent()).find((m) => m.text.includes("For: Invoice INV-"))!;
    expect(invoiceReceipt.text).toMatch(/For: Invoice INV-\d{2}-\d{4}\n/);
    expect(invoiceReceipt.text).toContain("Still owed on the job: Paid in full");
    await office.reload();
    await expect.poll(() => money.getByTestId("money-words").textContent()).toContain("Paid in full");
    // The job's messages list shows both receipts as sent.
    await expect.poll(() => office.locator("#messages").getByText("Receipt sent").count(), { timeout: 20_000 }).toBe(2);
    await office.locator("#messages").screenshot({ path: "screenshots/money-receipts-messages-desk.png" });
    await office.setViewportSize({ width: 390, height: 844 });
    await office.locator("#messages").screenshot({ path: "screenshots/money-receipts-messages-phone.png" });
    await office.setViewportSize(DESK.viewport!);
    expect(await money.getByRole("list", { name: "Payments" }).textContent()).toMatch(/Card, paid online · deposit.*\$516\.37.*Card, paid online · invoice.*\$516\.37/);
    // Nothing of a card was ever on the shop's side: the fake's page asks for none, and the app stores only amounts.
    const fakePayments = await (await fetch(`${inject("fakesUrl")}/__fake/payments`)).json();
    const delivered = fakePayments.deliveries.filter((d: { status: number }) => d.status === 200);
    expect(delivered.length).toBeGreaterThanOrEqual(2);
    await customer.close();
    await officeContext.close();
  });
});
