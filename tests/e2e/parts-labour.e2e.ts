import type { APIRequestContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";
import { readyForWork } from "./money-helpers";

const enabled = Boolean(baseUrl());

async function json<T = any>(res: Awaited<ReturnType<APIRequestContext["get"]>>, status = 200): Promise<T> {
  expect(res.status(), await res.text()).toBe(status);
  return (await res.json()) as T;
}

/** A fresh install-only job on a demo truck, made through the API so no other file's moves matter. */
async function newJob(page: Page, what: string, { ready = true } = {}) {
  const jobs = (await json<{ jobs: { customerName: string; customerId: number; truckId: number }[] }>(await page.request.get(`${baseUrl()}/api/jobs`))).jobs;
  const truck = jobs.find((j) => j.customerName === "Dell Okafor")!;
  const made = await json(await page.request.post(`${baseUrl()}/api/jobs`, { headers: { origin: baseUrl() }, data: { customerId: truck.customerId, truckId: truck.truckId, scope: "install_only", description: `${what} ${Date.now().toString(36)}` } }), 201);
  // Money is not the subject: an approved quote and its deposit, so Install asks only for what these tests look at.
  if (ready) await readyForWork(page.request, made.job.id);
  return made.job as { id: number; workOrder: string };
}

const card = (page: Page, wo: string) => page.locator(`li[data-card="${wo}"]`);

describe.skipIf(!enabled)("bought-in parts and the labour clock in Chromium", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("on a 390 px phone a tech clocks on from the board card, moves the job, and clocks off on the job page; the hours follow the move", async () => {
    const office = await browser.newContext(DESK);
    const desk = await signIn(office, "office");
    const job = await newJob(desk, "Clocked indicator rewire");
    await office.close();

    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "tech");
    await card(page, job.workOrder).waitFor();
    await card(page, job.workOrder).getByRole("button", { name: `Clock on ${job.workOrder}` }).click();
    const strip = page.locator("[data-clock-strip]");
    await strip.waitFor();
    expect(await strip.textContent()).toContain(`On the clock: ${job.workOrder}`);
    await expect.poll(() => card(page, job.workOrder).getByRole("button", { name: `Clock off ${job.workOrder}` }).count()).toBe(1);
    await shot(page, "clock-board-phone");

    await page.goto(`${baseUrl()}/jobs/${job.id}`);
    const hours = page.locator("#hours");
    await hours.getByText("You are on the clock here").waitFor();
    await shot(page, "clock-job-phone");
    await page.getByRole("combobox", { name: /^Move to/ }).selectOption("install");
    await page.getByRole("button", { name: "Move to Install" }).click();
    await page.getByText("Moved to Install.").waitFor();
    await page.waitForTimeout(1200);
    await hours.getByRole("button", { name: `Clock off ${job.workOrder}` }).click();
    await hours.getByText("Your clock is off.").waitFor();
    expect((await json(await page.request.get(`${baseUrl()}/api/clock`))).clock).toBeNull();
    // The entry ran across the move: its hours count to Queued and to Install.
    await page.reload();
    const byStage = (await hours.getByText(/^By stage:/).textContent()) ?? "";
    expect(byStage).toMatch(/Queued \d+\.\d\d h/);
    expect(byStage).toMatch(/Install \d+\.\d\d h/);
    await shot(page, "clock-job-after-phone");
    await context.close();
  });

  it("the office corrects a clock entry on the shop's clock from a computer set to another time zone, in fields wide enough to read", async () => {
    for (const [device, name] of [[DESK, "desk"], [PHONE, "phone"]] as const) {
      // The office computer is set to Japan time (UTC+9, no daylight time); the demo shop keeps US
      // Central time, UTC−6 in January.
      const context = await browser.newContext({ ...device, timezoneId: "Asia/Tokyo" });
      const page = await signIn(context, "office");
      const headers = { origin: baseUrl() };
      const job = await newJob(page, "Corrected hours", { ready: false });
      const entry = (await json(await page.request.post(`${baseUrl()}/api/clock`, { headers, data: { jobId: job.id } }), 201)).entry as { id: number };
      await json(await page.request.delete(`${baseUrl()}/api/clock`, { headers, data: {} }));
      // 19:44–21:00 UTC on Tuesday 13 January 2026 is 13:44–15:00 at the shop (a day of its own for each device).
      const day = name === "desk" ? "13" : "14";
      await json(await page.request.patch(`${baseUrl()}/api/clock-entries/${entry.id}`, { headers, data: { startedAt: `2026-01-${day}T19:44:00.000Z`, endedAt: `2026-01-${day}T21:00:00.000Z`, reason: "Times set by the office" } }));

      await page.goto(`${baseUrl()}/jobs/${job.id}`);
      await page.locator("#hours summary", { hasText: "Clock entries" }).click();
      const row = page.locator(`[data-clock-entry="${entry.id}"]`);
      expect(await row.locator("p").first().textContent()).toContain(`${day} Jan 13:44 – 15:00`);
      await row.getByRole("button", { name: "Correct" }).click();
      const started = row.getByLabel("Started");
      const ended = row.getByLabel("Ended");
      expect(await started.inputValue()).toBe(`2026-01-${day}T13:44`);
      expect(await ended.inputValue()).toBe(`2026-01-${day}T15:00`);
      // "01/13/2026, 01:44 PM" and the calendar button fit without being cut off.
      for (const field of [started, ended]) expect((await field.boundingBox())!.width, `${name} date-time field width`).toBeGreaterThanOrEqual(250);
      await shot(page, `clock-correct-${name}`);

      // 16:30 typed at the desk is 16:30 at the shop: 2 h 46 min = 2.77 h.
      await ended.fill(`2026-01-${day}T16:30`);
      await row.getByLabel("Why (kept with the entry)").fill("Stayed to finish the bracket welds");
      await row.getByRole("button", { name: "Save the correction" }).click();
      await expect.poll(() => row.locator("p").first().textContent()).toContain(`${day} Jan 13:44 – 16:30 · 2.77 h`);
      await context.close();
    }
  });

  it("on a 390 px phone the on-the-clock link and the work-order links on the parts desk and hours page are 44 px tall; at the desk they stay one line", async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "office");
    const headers = { origin: baseUrl() };
    const job = await newJob(page, "Tap targets");
    const supplier = `Low Meadow Hose ${Date.now().toString(36)}`;
    await json(await page.request.post(`${baseUrl()}/api/jobs/${job.id}/bought-parts`, { headers, data: { kind: "fitting", description: "Breakaway coupler pair", quantity: 1, supplier, costCents: 4_900 } }), 201);
    await json(await page.request.post(`${baseUrl()}/api/clock`, { headers, data: { jobId: job.id } }), 201);
    try {
      const height = async (where: string, link: ReturnType<Page["locator"]>) => {
        await link.first().waitFor();
        return { where, height: Math.round((await link.first().boundingBox())!.height) };
      };
      await page.goto(`${baseUrl()}/board`);
      const phone = [await height("on-the-clock link", page.locator("[data-clock-strip]").getByRole("link", { name: job.workOrder }))];
      await page.goto(`${baseUrl()}/job-costs?all=1`);
      phone.push(await height("clock running now", page.locator("#running").getByRole("link", { name: job.workOrder })));
      phone.push(await height("jobs table", page.locator("#jobs").getByRole("link", { name: job.workOrder })));
      await shot(page, "job-costs-phone");
      await page.goto(`${baseUrl()}/parts?supplier=${encodeURIComponent(supplier)}`);
      phone.push(await height("parts desk line", page.locator("main").getByRole("link", { name: job.workOrder })));
      await shot(page, "parts-phone");
      for (const h of phone) expect(h.height, h.where).toBeGreaterThanOrEqual(44);

      // At the desk a work order in a table is one line of text.
      const desk = await browser.newContext(DESK);
      const deskPage = await signIn(desk, "office");
      await deskPage.goto(`${baseUrl()}/job-costs?all=1`);
      expect((await height("desk jobs table", deskPage.locator("#jobs").getByRole("link", { name: job.workOrder }))).height).toBeLessThan(30);
      await deskPage.goto(`${baseUrl()}/parts?supplier=${encodeURIComponent(supplier)}`);
      expect((await height("desk parts line", deskPage.locator("main").getByRole("link", { name: job.workOrder }))).height).toBeLessThan(30);
      await desk.close();
    } finally {
      await page.request.delete(`${baseUrl()}/api/clock`, { headers, data: {} });
      await context.close();
    }
  });

  it("the office orders a PTO on a purchase order and receives it on the parts desk; the card's 'waiting on' clears", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "office");
    const job = await newJob(page, "PTO swap");
    const supplier = `Hollow Pine Drive Supply ${Date.now().toString(36)}`;
    const description = "10-bolt PTO, air shift, 122 % output";
    await json(await page.request.post(`${baseUrl()}/api/jobs/${job.id}/bought-parts`, { headers: { origin: baseUrl() }, data: { kind: "pto", description, quantity: 1, supplier, costCents: 118_500, fitsTransmission: "18-speed manual", ratioPercent: 122 } }), 201);

    await page.goto(`${baseUrl()}/board`);
    const waiting = card(page, job.workOrder).locator("[data-waiting-parts]");
    await waiting.waitFor();
    expect(await waiting.textContent()).toContain(`Waiting on 1 part: ${description}`);
    // Install refuses, naming the part.
    const refused = await page.request.post(`${baseUrl()}/api/jobs/${job.id}/moves`, { headers: { origin: baseUrl() }, data: { toStage: "install", version: 1 } });
    expect(refused.status()).toBe(422);
    expect((await refused.json()).error.details.unmet).toEqual([`Into Install: waiting on ${description}: not ordered yet; order it from the parts desk.`]);

    // A busy desk folds each section to a row per supplier; the office opens its supplier's lines.
    const openSupplier = async (action: "Open to order" | "Open to receive") => {
      await page.goto(`${baseUrl()}/parts`);
      const open = page.getByRole("link", { name: `${action} from ${supplier}` });
      if (await open.count()) {
        await open.click();
        await page.waitForURL(/\/parts\?supplier=/);
      }
    };
    await openSupplier("Open to order");
    const group = page.locator(`form[data-order-group="${supplier}"]`);
    expect(await group.getByRole("checkbox", { name: `Order ${description} for ${job.workOrder}` }).isChecked()).toBe(true);
    await group.getByLabel("Expected on").fill(new Date(Date.now() + 5 * 86_400_000).toISOString().slice(0, 10));
    await group.getByRole("button", { name: "Order 1 line on one PO" }).click();
    await page.waitForURL(/\/purchase-orders\/\d+$/);
    expect(await page.locator("[data-po-total]").textContent()).toBe("$1,185.00");
    const poNumber = ((await page.getByRole("heading", { level: 1 }).textContent()) ?? "").replace("Purchase order ", "");
    expect(poNumber).toMatch(/^PO-\d{2}-\d{4}$/);
    await shot(page, "purchase-order-desk");
    // Printed for the supplier, the order keeps its header (the shop, the PO number, the dates);
    // only the app's top bar and the buttons stay off the paper.
    const shopName = (await json<{ settings: { name: string } }>(await page.request.get(`${baseUrl()}/api/shop-settings/shop`))).settings.name;
    await page.emulateMedia({ media: "print" });
    expect(await page.getByRole("heading", { level: 1, name: `Purchase order ${poNumber}` }).isVisible()).toBe(true);
    expect(await page.locator("article header").getByText(shopName, { exact: true }).isVisible()).toBe(true);
    expect(await page.locator("article header").getByText(/^Ordered /).isVisible()).toBe(true);
    expect(await page.getByRole("navigation", { name: "Main" }).isVisible()).toBe(false);
    await shot(page, "purchase-order-print");
    await page.emulateMedia({ media: "screen" });

    await openSupplier("Open to receive");
    const row = page.locator(`tr[data-on-order="${description}"]`, { hasText: job.workOrder });
    expect(await row.textContent()).toContain(poNumber);
    await shot(page, "parts-desk-desk");
    await row.getByRole("button", { name: `Receive ${description} for ${job.workOrder}` }).click();
    await row.getByRole("button", { name: "Record" }).click();
    await page.locator(`tr[data-on-order="${description}"]`, { hasText: job.workOrder }).waitFor({ state: "detached" });

    await page.goto(`${baseUrl()}/board`);
    await card(page, job.workOrder).waitFor();
    expect(await card(page, job.workOrder).locator("[data-waiting-parts]").count()).toBe(0);
    await page.goto(`${baseUrl()}/jobs/${job.id}`);
    const line = page.locator(`[data-bought-part="${description}"]`);
    await line.waitFor();
    // Every part is here, so the job moves to Install.
    await page.getByRole("combobox", { name: /^Move to/ }).selectOption("install");
    await page.getByRole("button", { name: "Move to Install" }).click();
    await page.getByText("Moved to Install.").waitFor();
    expect(await line.locator("[data-state]").getAttribute("data-state")).toBe("received");
    expect(await line.locator("[data-fit-flag]").count()).toBe(0);
    await shot(page, "job-bought-parts-desk");
    await context.close();
  });
  it("the office lists a job's bought-in parts from its approved quote, once, with the costs left to fill", async () => {
    for (const [device, name] of [[DESK, "desk"], [PHONE, "phone"]] as const) {
      const context = await browser.newContext(device);
      const page = await signIn(context, "office");
      const headers = { origin: baseUrl() };
      // The test writes and approves the quote itself.
      const job = await newJob(page, "Quoted wet kit", { ready: false });
      const link = (await json(await page.request.post(`${baseUrl()}/api/jobs/${job.id}/status-links`, { headers }), 201)).link as { url: string };
      const lines = [
        { kind: "part", description: "Directional control valve, 2 spool", quantity: 1, unitPriceCents: 61_500, taxable: true },
        { kind: "part", description: "Breakaway coupler pair", quantity: 2, unitPriceCents: 9_800, taxable: true },
        { kind: "labour", description: "Install and plumb", quantity: 6, unitPriceCents: 12_500, taxable: false },
      ];
      const quote = (await json(await page.request.post(`${baseUrl()}/api/jobs/${job.id}/quotes`, { headers, data: { lines } }), 201)).quote as { id: number };
      await json(await page.request.post(`${baseUrl()}/api/quotes/${quote.id}/send`, { headers, data: {} }));
      // The customer approves on the status link, as the status page's form sends it.
      await json(await page.request.post(`${baseUrl()}/status/${link.url.split("/status/")[1]}/quote`, { headers, data: { decision: "approve", quoteId: quote.id, name: "Dana Reyes", acceptTerms: true } }));

      await page.goto(`${baseUrl()}/jobs/${job.id}`);
      const section = page.locator("#bought-parts");
      await section.getByRole("button", { name: "List from the quote" }).click();
      const valve = section.locator('[data-bought-part="Directional control valve, 2 spool"]');
      await valve.waitFor();
      expect(await valve.textContent()).toMatch(/Valve\s*1 × Directional control valve, 2 spool/);
      expect(await valve.textContent()).toContain("cost not entered");
      expect(await section.locator('[data-bought-part="Breakaway coupler pair"]').textContent()).toMatch(/Fitting\s*2 × Breakaway coupler pair/);
      expect(await section.locator("[data-bought-part]").count()).toBe(2);
      await shot(page, `bought-parts-from-quote-${name}`);

      // A second press lists nothing twice and says why.
      await section.getByRole("button", { name: "List from the quote" }).click();
      await expect.poll(() => section.getByRole("alert").textContent()).toContain("already listed");
      expect(await section.locator("[data-bought-part]").count()).toBe(2);
      await context.close();
    }
  });
});
