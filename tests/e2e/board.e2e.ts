import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";

const enabled = Boolean(baseUrl());

async function cardsIn(page: Page, stage: string) {
  return page.locator(`ul[data-stage="${stage}"] > li[data-card]`).evaluateAll((els) => els.map((e) => e.getAttribute("data-card")));
}

async function firstCardIn(page: Page, stage: string) {
  const names = await cardsIn(page, stage);
  expect(names.length, `a card in ${stage}`).toBeGreaterThan(0);
  return names[0]!;
}

async function waitForCard(page: Page, workOrder: string, stage: string) {
  await page.locator(`ul[data-stage="${stage}"] > li[data-card="${workOrder}"]`).waitFor({ timeout: 10_000 });
}

describe.skipIf(!enabled)("the board in Chromium", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("the demo tech drags a card from Fabricate to Pressure test with the mouse; it survives a reload", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "tech");
    await shot(page, "board-desk");
    const wo = await firstCardIn(page, "fabricate");
    const handle = page.locator(`li[data-card="${wo}"] button[aria-label^="Drag"]`);
    const target = page.locator('ul[data-stage="pressure_test"]');
    const from = (await handle.boundingBox())!;
    const to = (await target.boundingBox())!;
    await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
    await page.mouse.down();
    await page.mouse.move(from.x + 30, from.y + 10, { steps: 5 });
    // Aim near the top of the column: its bottom can sit below the window on a busy board.
    await page.mouse.move(to.x + to.width / 2, to.y + 40, { steps: 15 });
    await page.mouse.up();
    await waitForCard(page, wo, "pressure_test");
    await page.waitForResponse((r) => r.url().includes("/api/board"), { timeout: 10_000 }).catch(() => undefined);
    await page.reload();
    await waitForCard(page, wo, "pressure_test");
    await context.close();
  });

  it("the demo tech moves a card with the keyboard", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "tech");
    const wo = await firstCardIn(page, "fabricate");
    const handle = page.locator(`li[data-card="${wo}"] button[aria-label^="Drag"]`);
    await handle.focus();
    await page.keyboard.press("Space");
    await page.waitForTimeout(200);
    await page.keyboard.press("ArrowRight");
    await page.waitForTimeout(300);
    await page.keyboard.press("Space");
    await waitForCard(page, wo, "pressure_test");
    await page.reload();
    await waitForCard(page, wo, "pressure_test");
    await context.close();
  });

  it("a refused move snaps back and says why", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "tech");
    const wo = await firstCardIn(page, "wire");
    await page.locator(`li[data-card="${wo}"] select`).selectOption("ready");
    const alert = page.locator(`li[data-card="${wo}"] [role="alert"]`);
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/sign-off/i);
    await waitForCard(page, wo, "wire");
    await shot(page, "board-refused");
    await context.close();
  });

  it("works on a phone: the columns scroll sideways and a card moves with 'Move to…'", async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "tech");
    await shot(page, "board-phone");
    const card = page.locator('ul[data-stage="queued"] > li[data-card]:has(option[value="fabricate"])').first();
    const wo = (await card.getAttribute("data-card"))!;
    await card.locator("select").selectOption("fabricate");
    await waitForCard(page, wo, "fabricate");
    await context.close();
  });
});
