import type { APIRequestContext, Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { withCheckDigit } from "@/server/vehicles/vin";
import { DEMO, DESK, PHONE, baseUrl, launch, shot } from "./browser";

const enabled = Boolean(baseUrl());

async function json<T = any>(res: Awaited<ReturnType<APIRequestContext["get"]>>, status = 200): Promise<T> {
  expect(res.status(), await res.text()).toBe(status);
  return (await res.json()) as T;
}

/** Signs in without leaving the page the person lands on. */
async function signInWhereTheyLand(browser: Browser, role: "office" | "owner" | "tech", device = DESK): Promise<Page> {
  const page = await (await browser.newContext(device)).newPage();
  await page.goto(`${baseUrl()}/sign-in`);
  await page.getByLabel("E-mail").fill(DEMO[role]);
  await page.getByLabel("Password").fill(DEMO.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(role === "tech" ? /\/board$/ : (url) => url.pathname === "/");
  await page.waitForLoadState("networkidle");
  return page;
}

/** A customer, truck and job of this test's own, so nothing another file does to the demo changes it. */
async function ownJob(api: APIRequestContext, opts: { dueOn?: string; description: string }) {
  const n = Date.now() % 1_000_000;
  const post = async (path: string, data: unknown) => json(await api.post(`${baseUrl()}${path}`, { headers: { origin: baseUrl() }, data }), 201);
  const { customer } = await post("/api/customers", { kind: "company", name: `Desk Fleet ${n}` });
  const vin = withCheckDigit(`1DK5T3X20RK${String(n).padStart(6, "0")}`);
  const { truck } = await post("/api/trucks", { customerId: customer.id, unitNumber: `DK-${n}`, vin, year: 2024 });
  const { job } = await post("/api/jobs", { customerId: customer.id, truckId: truck.id, scope: "install_only", description: opts.description, dueOn: opts.dueOn ?? null });
  return { job: job as { id: number; workOrder: string }, vin, customerName: customer.name as string };
}

describe.skipIf(!enabled)("the office's desk", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("the office lands on the overview and follows the past-due number to the jobs behind it; a tech lands on the board", async () => {
    const page = await signInWhereTheyLand(browser, "office");
    expect(new URL(page.url()).pathname).toBe("/");
    // A job long past due, of this test's own.
    const { job } = await ownJob(page.request, { dueOn: "2021-01-04", description: "Dump body hoist wiring" });
    await page.reload();
    await page.getByRole("heading", { name: "Overview", level: 1 }).waitFor();
    await shot(page, "overview-desk");
    const pastDue = page.getByRole("link", { name: /^Past due/ });
    const shown = Number((await pastDue.locator("span.text-3xl").textContent())?.trim());
    expect(shown).toBeGreaterThanOrEqual(1);
    await pastDue.click();
    await page.waitForURL(/\/jobs\?due=late/);
    await expect.poll(() => page.getByRole("status").textContent()).toMatch(new RegExp(`^${shown} jobs? past their due date`));
    expect(await page.getByRole("link", { name: job.workOrder }).count()).toBeGreaterThan(0);
    await page.context().close();

    const tech = await signInWhereTheyLand(browser, "tech");
    expect(new URL(tech.url()).pathname).toBe("/board");
    await tech.goto(`${baseUrl()}/`);
    await tech.waitForURL(/\/board$/);
    await tech.context().close();

    const phone = await signInWhereTheyLand(browser, "owner", PHONE);
    await phone.getByRole("heading", { name: "Overview", level: 1 }).waitFor();
    expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await shot(phone, "overview-phone");
    await phone.context().close();
  });

  it("a report draws its chart over its table, and its CSV downloads", async () => {
    const page = await signInWhereTheyLand(browser, "owner");
    await page.goto(`${baseUrl()}/reports?report=throughput`);
    const table = page.getByTestId("report-table");
    await table.waitFor();
    expect(await table.locator("tbody tr").count()).toBeGreaterThan(0);
    const chart = page.getByTestId("report-chart");
    await chart.locator("svg.recharts-surface").first().waitFor();
    expect(await chart.locator(".recharts-cartesian-axis-tick").count()).toBeGreaterThan(2);
    await shot(page, "report-throughput-desk");
    await page.getByRole("link", { name: "Time in each stage" }).click();
    await page.waitForURL(/report=stage-times/);
    await page.getByTestId("report-chart").locator("svg.recharts-surface").first().waitFor();
    await shot(page, "report-stage-times-desk");
    const csv = await page.request.get(`${baseUrl()}${await page.getByRole("link", { name: "Download CSV" }).getAttribute("href")}`);
    expect(csv.status()).toBe(200);
    expect((await csv.text()).split("\r\n")[0]).toBe("stage,jobs_through,median_business_days,p90_business_days");
    await page.context().close();

    const phone = await signInWhereTheyLand(browser, "office", PHONE);
    await phone.goto(`${baseUrl()}/reports?report=coaters`);
    await phone.getByTestId("report-table").waitFor();
    expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await shot(phone, "report-coaters-phone");
    await phone.context().close();
  });

  it("one search finds a job by a word of its work description and a truck by the last six of its VIN, from the keyboard", async () => {
    const page = await signInWhereTheyLand(browser, "office");
    const word = `tank${Date.now().toString(36)}`;
    const { job, vin } = await ownJob(page.request, { description: `Wet kit, 35 gal ${word} reservoir` });
    await page.goto(`${baseUrl()}/board`);
    await page.getByRole("heading", { level: 1 }).first().waitFor();
    await page.locator("body").press("/");
    const box = page.getByRole("dialog", { name: "Search the shop" }).getByRole("combobox");
    await expect.poll(() => box.evaluate((el) => el === document.activeElement)).toBe(true);
    await box.fill(word);
    const option = page.getByRole("option", { name: new RegExp(job.workOrder) });
    await option.waitFor();
    await shot(page, "search-desk");
    await box.press("Enter");
    await page.waitForURL(new RegExp(`/jobs/${job.id}$`));

    await page.locator("body").press("/");
    await box.fill(vin.slice(-6));
    const truck = page.getByRole("group", { name: "Trucks" }).getByRole("option");
    await truck.first().waitFor();
    expect(await truck.first().textContent()).toContain(`VIN …${vin.slice(-6)}`);
    await box.press("ArrowDown");
    await box.press("ArrowUp");
    await box.press("Enter");
    await page.waitForURL(/\/trucks\/\d+$/);
    await page.context().close();

    const phone = await signInWhereTheyLand(browser, "office", PHONE);
    await phone.getByRole("button", { name: "Search" }).click();
    await phone.getByRole("dialog", { name: "Search the shop" }).getByRole("combobox").fill(word);
    await phone.getByRole("option").first().waitFor();
    expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await shot(phone, "search-phone");
    await phone.context().close();
  });
  it("a job page gives a likely ready date from the shop's history, or says there is not enough history yet", async () => {
    const page = await signInWhereTheyLand(browser, "office");
    const { job } = await ownJob(page.request, { dueOn: "2031-06-02", description: "Likely-date check: PTO indicator" });
    await page.goto(`${baseUrl()}/jobs/${job.id}`);
    const likely = page.getByTestId("likely-ready");
    await likely.waitFor();
    const text = (await likely.textContent()) ?? "";
    // The demo's history decides which: either a date said to be an estimate, or no date at all.
    if (text.startsWith("Not enough history yet")) {
      expect(text).not.toMatch(/Around/);
    } else {
      expect(text).toMatch(/^Around \w{3} \d{1,2} \w{3} \d{4} · late case \w{3} \d{1,2} \w{3} \d{4}/);
      expect(text).toContain("An estimate");
    }
    const api = await json(await page.request.get(`${baseUrl()}/api/jobs/${job.id}`));
    expect(["estimate", "not_enough_history"]).toContain(api.prediction.kind);
    await page.context().close();
  });
});
