import AxeBuilder from "@axe-core/playwright";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";

const enabled = Boolean(baseUrl());

describe.skipIf(!enabled)("the owner reads the audit trail in Chromium", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("finds a failed sign-in and their own sign-in, filters by kind, and downloads the CSV", async () => {
    // A wrong password for the office first, so there is something to find.
    const stranger = await browser.newContext(DESK);
    const wrong = await stranger.newPage();
    await wrong.goto(`${baseUrl()}/sign-in`);
    await wrong.getByLabel("E-mail").fill(DEMO.office);
    await wrong.getByLabel("Password").fill("not-the-password");
    await wrong.getByRole("button", { name: "Sign in" }).click();
    await wrong.getByText(/do not match an active staff account/).waitFor();
    await stranger.close();

    const context = await browser.newContext({ ...DESK, acceptDownloads: true });
    const page = await signIn(context, "owner");
    await page.getByRole("link", { name: "Audit" }).first().click();
    await page.waitForURL(/\/audit/);
    await page.getByRole("heading", { name: "Audit trail" }).waitFor();
    const trail = page.getByTestId("audit-lines");
    await trail.getByText(`Failed sign-in for`).first().waitFor();
    await trail.getByText(/signed in\.$/).first().waitFor();
    await shot(page, "audit-desk");
    const axe = await new AxeBuilder({ page } as never).analyze();
    expect(axe.violations.map((v) => v.id)).toEqual([]);

    await page.getByLabel("What").selectOption("sign_in_failed");
    await page.getByRole("button", { name: "Show" }).click();
    await page.waitForURL(/kind=sign_in_failed/);
    const kinds = await trail.locator("li > span.font-semibold").allTextContents();
    expect(kinds.length).toBeGreaterThan(0);
    expect(new Set(kinds)).toEqual(new Set(["Sign-in failed"]));

    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: /Download CSV/ }).click()]);
    expect(download.suggestedFilename()).toMatch(/^audit-trail-\d{4}-\d{2}-\d{2}\.csv$/);
    await context.close();
  });

  it("reads on a phone, and stays closed to the office", async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "owner");
    await page.goto(`${baseUrl()}/audit`);
    await page.getByTestId("audit-lines").waitFor();
    await shot(page, "audit-phone");
    const axe = await new AxeBuilder({ page } as never).analyze();
    expect(axe.violations.map((v) => v.id)).toEqual([]);
    await context.close();

    const office = await browser.newContext(PHONE);
    const officePage = await signIn(office, "office");
    expect(await officePage.getByRole("link", { name: "Audit" }).count()).toBe(0);
    await officePage.goto(`${baseUrl()}/audit`);
    expect(officePage.url()).not.toMatch(/\/audit/);
    expect((await officePage.request.get(`${baseUrl()}/api/audit`)).status()).toBe(403);
    await office.close();
  });
});
