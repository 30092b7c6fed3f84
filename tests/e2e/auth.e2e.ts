import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";

const enabled = Boolean(baseUrl());

describe.skipIf(!enabled)("signing in and out in Chromium", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const role of ["owner", "office", "tech"] as const) {
    it(`signs in as the demo ${role} and sees the shell`, async () => {
      const context = await browser.newContext(DESK);
      const page = await signIn(context, role);
      await expect.poll(() => page.getByTestId("signed-in-as").textContent()).toMatch(new RegExp(role, "i"));
      const staffLink = page.getByRole("link", { name: "Staff" });
      expect(await staffLink.count()).toBe(role === "owner" ? 1 : 0);
      await context.close();
    });
  }

  it("says so when the password is wrong and stays on the sign-in page", async () => {
    const context = await browser.newContext(PHONE);
    const page = await context.newPage();
    await page.goto(`${baseUrl()}/sign-in`);
    await shot(page, "sign-in-phone");
    await page.getByLabel("E-mail").fill(DEMO.office);
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByText(/do not match an active staff account/).waitFor();
    expect(page.url()).toMatch(/\/sign-in$/);
    await context.close();
  });

  it("keeps a tech out of the Staff page, and signing out ends the session", async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "tech");
    await shot(page, "shell-phone-tech");
    await page.goto(`${baseUrl()}/staff`);
    expect(page.url()).not.toMatch(/\/staff/);
    const api = await page.request.get(`${baseUrl()}/api/staff`);
    expect(api.status()).toBe(403);
    // On a phone, sign-out sits in the menu with the pages.
    await page.getByRole("button", { name: /^Menu/ }).click();
    await page.getByRole("button", { name: "Sign out", exact: true }).click();
    await page.waitForURL(/\/sign-in/);
    const after = await page.request.get(`${baseUrl()}/api/me`);
    expect(after.status()).toBe(401);
    await context.close();
  });

  it("shows the owner the Staff page on a desk-sized screen", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "owner");
    await shot(page, "shell-desk-owner");
    await page.getByRole("link", { name: "Staff" }).click();
    await page.waitForURL(/\/staff/);
    expect(await page.getByText("office@cold-creek.example").count()).toBe(1);
    await shot(page, "staff-desk");
    await context.close();
  });
});
