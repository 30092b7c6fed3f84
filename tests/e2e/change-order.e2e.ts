import AxeBuilder from "@axe-core/playwright";
import Database from "better-sqlite3";
import type { APIRequestContext, Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { pdfPages } from "../support/pdf-text";
import { DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";

const enabled = Boolean(baseUrl());

type Mail = { to: string[]; subject: string; text: string; html: string; createdAt: string; attachments: { filename: string; content: string; content_type?: string }[] | null };

async function json<T = any>(res: Awaited<ReturnType<APIRequestContext["get"]>>, status = 200): Promise<T> {
  expect(res.status(), await res.text()).toBe(status);
  return (await res.json()) as T;
}

/** A customer with a contact who gets e-mail updates, and one of their trucks (read only: the test adds its own job). */
function pickCustomer() {
  const sqlite = new Database(inject("databasePath"), { readonly: true, fileMustExist: true });
  try {
    return sqlite
      .prepare(
        `select customer.id as customerId, customer.name as name, truck.id as truckId, truck.unit_number as unit from customer join truck on truck.customer_id = customer.id
         where exists (select 1 from contact where contact.customer_id = customer.id and contact.receives_email = 1 and contact.email != '')
         order by customer.id desc limit 1`,
      )
      .get() as { customerId: number; name: string; truckId: number; unit: string };
  } finally {
    sqlite.close();
  }
}

async function mailFor(workOrder: string, startsWith: string): Promise<Mail> {
  const until = Date.now() + 30_000;
  while (Date.now() < until) {
    const all = (await (await fetch(`${inject("fakesUrl")}/__fake/emails`)).json()) as Mail[];
    const found = all.find((m) => m.subject.startsWith(startsWith) && m.subject.includes(workOrder));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`No e-mail "${startsWith}… ${workOrder}" reached the fake within 30 s`);
}

/** Dollars written by hand from cents, independent of the app's own formatting: 211184 → "$2,111.84". */
const dollars = (cents: number) => `$${(cents / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

/** Serious and critical accessibility findings on the page as it stands. */
async function axeFindings(page: Page) {
  const results = await new AxeBuilder({ page }).analyze();
  return results.violations.filter((v) => v.impact === "serious" || v.impact === "critical").flatMap((v) => v.nodes.map((n) => `${v.id} at ${n.target.join(" ")}`));
}

const noHorizontalScroll = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth);

describe.skipIf(!enabled)("from quote to approved change order", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("the office sends a quote, the customer gets it by e-mail with its PDF and approves on a phone; a change order follows the same way and the job price adds up", { timeout: 240_000 }, async () => {
    const pick = pickCustomer();
    const suffix = Date.now().toString(36).slice(-4).toUpperCase();
    const description = `Wet kit and lights ${suffix}`;
    const officeContext = await browser.newContext(DESK);
    const office = await signIn(officeContext, "office");
    const api = office.request;
    const headers = { origin: baseUrl() };
    const job = (await json(await api.post(`${baseUrl()}/api/jobs`, { headers, data: { customerId: pick.customerId, truckId: pick.truckId, scope: "install_only", description } }), 201)).job as { id: number; workOrder: string };
    const lines = [
      { kind: "part", description: "PTO, 6-bolt, air shift", quantity: 1, unitPriceCents: 148_900, taxable: true },
      { kind: "labour", description: "Install and plumb", quantity: 4, unitPriceCents: 12_500, taxable: false },
    ];
    await json(await api.post(`${baseUrl()}/api/jobs/${job.id}/quotes`, { headers, data: { lines } }), 201);

    // The office sends the draft from the job page.
    await office.goto(`${baseUrl()}/jobs/${job.id}`);
    const section = office.locator("#quote");
    await section.getByRole("button", { name: "Send to the customer" }).click();
    await expect.poll(() => section.getByRole("status").textContent()).toContain("Version 1 sent");
    const quote = (await json<{ quotes: { id: number; totalCents: number; taxCents: number; subtotalCents: number; depositCents: number }[] }>(await api.get(`${baseUrl()}/api/jobs/${job.id}/quotes`))).quotes[0];
    expect(await section.getByTestId("job-price").count()).toBe(0);

    // The fake mail service has the e-mail, with the quote as a PDF whose figures are the API's.
    const mail = await mailFor(job.workOrder, "Quote ");
    expect(mail.subject).toContain(dollars(quote.totalCents));
    expect(mail.text).toContain(`Total: ${dollars(quote.totalCents)}`);
    expect(mail.attachments?.map((a) => a.filename)).toEqual([`${job.workOrder}-quote-v1.pdf`]);
    const [pdf] = await pdfPages(Buffer.from(mail.attachments![0].content, "base64"));
    expect(pdf).toContain(`Subtotal ${dollars(quote.subtotalCents)}`);
    expect(pdf).toContain(dollars(quote.taxCents));
    expect(pdf).toContain(`Total ${dollars(quote.totalCents)}`);
    expect(pdf).toContain(`Deposit due on approval ${dollars(quote.depositCents)}`);
    expect(pdf).toContain(`For ${pick.name}`);
    const link = /https?:\/\/\S+\/status\/[A-Za-z0-9_-]+#quote/.exec(mail.text)?.[0];
    expect(link).toBeTruthy();

    // The e-mail fits a 360 px phone: the long link wraps.
    const mailContext = await browser.newContext({ ...PHONE, viewport: { width: 360, height: 740 } });
    const mailPage = await mailContext.newPage();
    await mailPage.setContent(mail.html);
    expect(await noHorizontalScroll(mailPage)).toBe(true);
    await shot(mailPage, "quote-email-360");
    await mailContext.close();

    // The truck owner opens the e-mailed link on a phone and approves.
    const customerContext = await browser.newContext(PHONE);
    const phone = await customerContext.newPage();
    expect((await phone.goto(link!.replace(/^https?:\/\/[^/]+/, baseUrl())))?.status()).toBe(200);
    const card = phone.getByRole("article", { name: "Quote version 1" });
    expect(await card.textContent()).toContain(dollars(quote.totalCents));
    const customerPdf = await phone.request.get(`${baseUrl()}${(await card.getByRole("link", { name: /Download PDF/ }).getAttribute("href"))!}`);
    expect(customerPdf.status()).toBe(200);
    expect((await pdfPages(await customerPdf.body()))[0]).toContain(`Total ${dollars(quote.totalCents)}`);
    await card.getByLabel("Your full name").fill("Dana Reyes");
    await card.getByRole("checkbox").check();
    await card.getByRole("button", { name: `Approve ${dollars(quote.totalCents)}` }).click();
    await expect.poll(() => phone.getByTestId("job-price").textContent()).toContain(dollars(quote.totalCents));

    // The office adds work as a change order on the job page and sends it.
    await office.reload();
    await expect.poll(() => section.getByTestId("job-price").textContent()).toContain(dollars(quote.totalCents));
    await section.getByRole("button", { name: "New change order" }).click();
    await section.getByRole("button", { name: "Add a blank line" }).click();
    const draftLines = section.getByRole("list", { name: "Lines of the draft" }).getByRole("listitem");
    await draftLines.nth(0).getByLabel("Kind").selectOption({ label: "Bought-in part" });
    await draftLines.nth(0).getByLabel("Description").fill("LED work lights on the headache rack, pair");
    await draftLines.nth(0).getByLabel("Qty").fill("1");
    await draftLines.nth(0).getByLabel("Unit price ($)").fill("389.50");
    await draftLines.nth(0).getByLabel("Taxable").check();
    await section.getByRole("button", { name: "Send to the customer" }).click();
    await expect.poll(() => section.getByRole("status").textContent()).toContain("Version 2 sent");
    const change = (await json<{ quotes: { id: number; kind: string; totalCents: number; depositCents: number }[] }>(await api.get(`${baseUrl()}/api/jobs/${job.id}/quotes`))).quotes[0];
    expect(change).toMatchObject({ kind: "change_order", depositCents: 0 });
    // A sent change order is never edited.
    expect((await api.put(`${baseUrl()}/api/quotes/${change.id}`, { headers, data: { lines } })).status()).toBe(409);
    const changeMail = await mailFor(job.workOrder, "Change order ");
    expect(changeMail.attachments?.map((a) => a.filename)).toEqual([`${job.workOrder}-change-order-v2.pdf`]);
    await shot(office, "change-order-sent-desk");

    // The customer approves the change order on the same link; the price is the quote plus the change.
    await phone.reload();
    const changeCard = phone.getByRole("article", { name: "Change order version 2" });
    expect(await changeCard.textContent()).toContain(dollars(change.totalCents));
    expect(await axeFindings(phone)).toEqual([]);
    await changeCard.getByLabel("Your full name").fill("Dana Reyes");
    await changeCard.getByRole("checkbox").check();
    await changeCard.getByRole("button", { name: `Approve ${dollars(change.totalCents)}` }).click();
    const both = dollars(quote.totalCents + change.totalCents);
    await expect.poll(() => phone.getByTestId("job-price").textContent()).toContain(both);
    expect(await phone.getByTestId("job-price").textContent()).toContain("1 approved change order");
    expect(await noHorizontalScroll(phone)).toBe(true);
    await shot(phone, "change-order-approved-phone");
    await customerContext.close();

    await office.reload();
    await expect.poll(() => section.getByTestId("job-price").textContent()).toContain(both);
    expect(await axeFindings(office)).toEqual([]);
    await shot(office, "job-price-desk");
    await officeContext.close();

    // A tech sees the job without any price.
    const techContext = await browser.newContext(PHONE);
    const tech = await signIn(techContext, "tech");
    await tech.goto(`${baseUrl()}/jobs/${job.id}`);
    expect(await tech.locator("main").textContent()).not.toContain("Job price");
    expect(await tech.locator("main").textContent()).not.toContain(both);
    expect((await tech.request.get(`${baseUrl()}/api/jobs/${job.id}/quotes`)).status()).toBe(403);
    expect((await tech.request.get(`${baseUrl()}/api/quotes/${change.id}/pdf`)).status()).toBe(403);
    await techContext.close();
  });
});
