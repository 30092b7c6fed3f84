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
});
