import Database from "better-sqlite3";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";
import { readyForWork } from "./money-helpers";

const enabled = Boolean(baseUrl());

type Mail = { to: string[]; subject: string; text: string; html: string; createdAt: string };

/** A customer with a contact who gets e-mail updates, and one of their trucks. */
function pickCustomer() {
  const sqlite = new Database(inject("databasePath"), { readonly: true, fileMustExist: true });
  try {
    return sqlite
      .prepare(
        `select customer.id as customerId, truck.id as truckId, truck.unit_number as unit from customer join truck on truck.customer_id = customer.id
         where exists (select 1 from contact where contact.customer_id = customer.id and contact.receives_email = 1 and contact.email != '')
         order by customer.id limit 1`,
      )
      .get() as { customerId: number; truckId: number; unit: string };
  } finally {
    sqlite.close();
  }
}

async function mails(): Promise<Mail[]> {
  return (await fetch(`${inject("fakesUrl")}/__fake/emails`)).json();
}

async function mailStarting(prefix: string, since: string): Promise<Mail> {
  const until = Date.now() + 30_000;
  while (Date.now() < until) {
    const found = (await mails()).find((m) => m.subject.startsWith(prefix) && m.createdAt >= since);
    if (found) return found;
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`No e-mail "${prefix}…" reached the fake within 30 s`);
}

async function noHorizontalScroll(page: Page) {
  return page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth);
}

describe.skipIf(!enabled)("customer e-mail and the status page follow the job's own route", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("a stainless-only job (one tank, no outside coating) never shows a powder coat step; a new link is asked for and e-mailed", { timeout: 180_000 }, async () => {
    const pick = pickCustomer();
    const description = "Wet kit: 35 gal stainless tank, PTO pump";
    const officeContext = await browser.newContext(DESK);
    const office = await signIn(officeContext, "office");
    const created = await office.request.post(`${baseUrl()}/api/jobs`, { headers: { origin: baseUrl() }, data: { customerId: pick.customerId, truckId: pick.truckId, scope: "fabrication", description } });
    expect(created.status()).toBe(201);
    const job = (await created.json()).job as { id: number; version: number; workOrder: string };
    const part = await office.request.post(`${baseUrl()}/api/jobs/${job.id}/parts`, {
      headers: { origin: baseUrl() },
      data: { name: "35 gal stainless tank", kind: "reservoir", material: "stainless", shape: "round", geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 32 }, needsLeakTest: true, needsCoating: false },
    });
    expect(part.status(), await part.text()).toBe(201);

    // The first link is issued at once; replacing it asks first and offers to e-mail the new one.
    await office.goto(`${baseUrl()}/jobs/${job.id}`);
    const messages = office.locator("#messages");
    await messages.scrollIntoViewIfNeeded();
    await messages.getByRole("button", { name: "Issue a link" }).click();
    const firstUrl = await messages.getByTestId("new-status-link").inputValue();
    await messages.getByRole("button", { name: "Issue a new link…" }).click();
    await messages.getByText("The current link stops working at once, for everyone who has it.").waitFor();
    const emailIt = messages.getByRole("checkbox", { name: /^E-mail the new link now to / });
    expect(await emailIt.isChecked()).toBe(true);
    await office.locator("#messages").screenshot({ path: "screenshots/new-link-ask-desk.png" });
    const since = new Date().toISOString();
    await messages.getByRole("button", { name: "Issue and e-mail the new link" }).click();
    await messages.getByText(/E-mailing it to /).waitFor();
    const url = await messages.getByTestId("new-status-link").inputValue();
    expect(url).not.toBe(firstUrl);
    const linkMail = await mailStarting(`New status link · Work order ${job.workOrder} · Unit ${pick.unit} · ${description}`, since);
    expect(linkMail.text).toContain(url);
    expect(linkMail.text).toContain("The link we sent before no longer works");
    expect((await fetch(firstUrl)).status).toBe(404);

    // Two quick moves: one e-mail, about where the job ended up, and no word of a coater.
    const move = async (toStage: string) => {
      const current = (await (await office.request.get(`${baseUrl()}/api/jobs/${job.id}`)).json()).job;
      const res = await office.request.post(`${baseUrl()}/api/jobs/${job.id}/moves`, { headers: { origin: baseUrl() }, data: { toStage, version: current.version } });
      expect(res.status(), await res.text()).toBe(200);
    };
    // Money is not the subject: the customer approved a quote on this link and the deposit is in.
    await readyForWork(office.request, job.id, url);
    const movedAt = new Date().toISOString();
    await move("fabricate");
    await move("pressure_test");
    const stageMail = await mailStarting(`Pressure test · Work order ${job.workOrder} · Unit ${pick.unit} · ${description}`, movedAt);
    expect(stageMail.text.split("\n")[0]).toBe(`Work order ${job.workOrder} · Unit ${pick.unit} · ${description}`);
    expect(stageMail.text).toContain("Next, we install the kit on your truck.");
    expect(`${stageMail.text}${stageMail.html}`).not.toMatch(/coat|photo/i);
    expect((await mails()).filter((m) => m.subject.includes(job.workOrder) && m.subject.startsWith("Fabrication"))).toEqual([]);
    await officeContext.close();

    // The e-mail fits a 360 px phone: the long link wraps.
    const mailContext = await browser.newContext({ ...PHONE, viewport: { width: 360, height: 740 } });
    const mailPage = await mailContext.newPage();
    await mailPage.setContent(stageMail.html);
    expect(await noHorizontalScroll(mailPage)).toBe(true);
    await shot(mailPage, "stage-email-360");
    await mailContext.close();

    for (const width of [360, 390]) {
      const customer = await browser.newContext({ ...PHONE, viewport: { width, height: 800 } });
      const status = await customer.newPage();
      expect((await status.goto(url))?.status()).toBe(200);
      const heading = (await status.getByTestId("job-heading").textContent()) ?? "";
      expect(heading).toContain(`Unit ${pick.unit}`);
      expect(heading).toContain(job.workOrder);
      expect(heading).toContain(description);
      const steps = (await status.locator("#timeline-title + ol > li > div > p:first-child").allTextContents()).map((t) => t.split(" · ")[0].trim());
      expect(steps).toEqual(["Booked in", "Fabrication", "Pressure test", "Install", "Wiring and run test", "Ready for pickup", "Picked up"]);
      expect(await status.locator("main").textContent()).not.toMatch(/powder coat|coater/i);
      expect(await status.getByTestId("what-next").textContent()).toBe("Next, we install the kit on your truck.");
      expect(await noHorizontalScroll(status)).toBe(true);
      await shot(status, `status-stainless-${width}`);
      await customer.close();
    }
  });
});
