import { createRequire } from "node:module";
import Database from "better-sqlite3";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";
import { readyForWork } from "./money-helpers";

const enabled = Boolean(baseUrl());

const ROUTE = ["queued", "fabricate", "pressure_test", "coating", "install", "wire", "ready"] as const;
const LABELS: Record<string, string> = {
  queued: "Queued", fabricate: "Fabricate", pressure_test: "Pressure test", coating: "Outside coating",
  install: "Install", wire: "Wire & verify", ready: "Ready for pickup",
};

async function cardsIn(page: Page, stage: string) {
  return page.locator(`ul[data-stage="${stage}"] > li[data-card]`).evaluateAll((els) => els.map((e) => e.getAttribute("data-card")!));
}

async function firstCardIn(page: Page, stage: string) {
  const names = await cardsIn(page, stage);
  expect(names.length, `a card in ${stage}`).toBeGreaterThan(0);
  return names[0]!;
}

async function waitForCard(page: Page, workOrder: string, stage: string) {
  await page.locator(`ul[data-stage="${stage}"] > li[data-card="${workOrder}"]`).waitFor({ timeout: 10_000 });
}

type Mail = { subject: string; text: string; createdAt: string };

/** The e-mails about a work order that reached the shop's fake mail service since a moment. */
async function mailsAbout(workOrder: string, since: string) {
  const mails = (await (await fetch(`${inject("fakesUrl")}/__fake/emails`)).json()) as Mail[];
  return mails.filter((m) => m.createdAt >= since && `${m.subject}\n${m.text}`.includes(workOrder));
}

/** An Install job, not the first in its column, whose customer has a contact who gets e-mail updates. */
function installJobWithContacts(): string {
  const sqlite = new Database(inject("databasePath"), { readonly: true, fileMustExist: true });
  try {
    const row = sqlite
      .prepare(
        `select job.work_order as wo from job
         where job.stage = 'install' and job.position > 0
           and exists (select 1 from contact where contact.customer_id = job.customer_id and contact.receives_email = 1 and contact.email != '')
         order by job.position limit 1`,
      )
      .get() as { wo: string } | undefined;
    expect(row, "an Install job (not the first) whose customer gets e-mail updates").toBeDefined();
    return row!.wo;
  } finally {
    sqlite.close();
  }
}

/** Counts the move and undo requests the page sends, to prove that nothing was sent. */
function countMoves(page: Page) {
  const seen: string[] = [];
  page.on("request", (r) => {
    if (/\/api\/jobs\/\d+\/(moves|undo)$/.test(r.url())) seen.push(r.url());
  });
  return seen;
}

/** A new install-only job the office creates and moves (through the API) into Wire & verify, with no sign-off yet. */
async function wireJobWithoutSignOff(browser: Browser): Promise<string> {
  const office = await browser.newContext(DESK);
  const page = await signIn(office, "office");
  const post = (path: string, data: unknown) => page.request.post(`${baseUrl()}${path}`, { headers: { origin: baseUrl() }, data });
  const listed = (await (await page.request.get(`${baseUrl()}/api/jobs`)).json()) as { jobs: { customerId: number; truckId: number }[] };
  const truck = listed.jobs[0]!;
  const created = await post("/api/jobs", { customerId: truck.customerId, truckId: truck.truckId, scope: "install_only", description: `Dash indicator rewire ${Date.now().toString(36)}` });
  expect(created.status(), await created.text()).toBe(201);
  let job = (await created.json()).job as { id: number; workOrder: string; version: number };
  // Money is not the subject: an approved quote and its deposit let it into Install.
  await readyForWork(page.request, job.id);
  for (const toStage of ["install", "wire"]) {
    const moved = await post(`/api/jobs/${job.id}/moves`, { toStage, version: job.version });
    expect(moved.status(), await moved.text()).toBe(200);
    job = { ...job, version: (await moved.json()).job.version };
  }
  await office.close();
  return job.workOrder;
}

async function focusedCard(page: Page) {
  return page.evaluate(() => document.activeElement?.closest("li[data-card]")?.getAttribute("data-card") ?? null);
}

async function mouseDrag(page: Page, workOrder: string, to: { x: number; y: number }) {
  const from = (await page.locator(`li[data-card="${workOrder}"] [data-drag-handle]`).boundingBox())!;
  await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
  await page.mouse.down();
  await page.mouse.move(from.x + from.width / 2 + 12, from.y + from.height / 2 + 4, { steps: 3 });
  await page.mouse.move(to.x, to.y, { steps: 20 });
  await page.mouse.up();
}

/** axe's serious and critical findings on the page as it is now, each as "rule: target". */
async function axeFindings(page: Page) {
  await page.addScriptTag({ path: createRequire(import.meta.url).resolve("axe-core/axe.min.js") });
  const found = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: { id: string; impact: string; nodes: { target: string[] }[] }[] }> } }).axe;
    const result = await axe.run(document, { resultTypes: ["violations"] });
    return result.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).slice(0, 3).join(", ")}`);
  });
  return found;
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
    const target = (await page.locator('ul[data-stage="pressure_test"]').boundingBox())!;
    // Aim near the top of the column: its bottom can sit below the window on a busy board.
    await mouseDrag(page, wo, { x: target.x + target.width / 2, y: target.y + 40 });
    await waitForCard(page, wo, "pressure_test");
    await page.locator("[data-move-toast]", { hasText: `Moved ${wo} to Pressure test` }).waitFor();
    await page.waitForResponse((r) => r.url().includes("/api/board"), { timeout: 10_000 }).catch(() => undefined);
    await page.reload();
    await waitForCard(page, wo, "pressure_test");
    await context.close();
  });

  it("ArrowDown on a focused 'Move to…' only changes the choice; Move (or Enter) moves, and Undo puts the card back in the same place and e-mails nobody", { timeout: 90_000 }, async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "tech");
    const moves = countMoves(page);
    const wo = installJobWithContacts();
    const before = await cardsIn(page, "install");
    expect(before.indexOf(wo), "the card is below another in Install").toBeGreaterThan(0);
    const list = page.locator(`li[data-card="${wo}"] select[data-move-to]`);
    await list.focus();
    await page.keyboard.press("ArrowDown");
    await page.keyboard.press("ArrowDown");
    expect(await list.inputValue(), "the arrow keys changed the choice").not.toBe("");
    await page.waitForTimeout(1500);
    expect(moves).toEqual([]);
    expect(await cardsIn(page, "install")).toEqual(before);

    // A backward move is always allowed: choose Pressure test and press Move.
    await list.selectOption("pressure_test");
    expect(moves).toEqual([]);
    const since = new Date().toISOString();
    await page.locator(`li[data-card="${wo}"]`).getByRole("button", { name: `Move ${wo} to Pressure test` }).click();
    await waitForCard(page, wo, "pressure_test");
    const toast = page.locator("[data-move-toast]");
    await toast.getByText(`Moved ${wo} to Pressure test`).waitFor();
    await expect.poll(() => focusedCard(page)).toBe(wo);
    await shot(page, "board-desk-moved");
    await toast.getByRole("button", { name: `Undo: put ${wo} back in Install` }).click();
    await toast.getByText(`${wo} is back in Install.`).waitFor();
    expect(await cardsIn(page, "install")).toEqual(before);
    await expect.poll(() => focusedCard(page)).toBe(wo);
    await page.reload();
    await waitForCard(page, wo, "install");
    expect(await cardsIn(page, "install")).toEqual(before);
    expect(moves).toHaveLength(2);
    // The browser tests' server waits 3 s before e-mailing a move and sends every second: 8 s is well past both.
    await page.waitForTimeout(8000);
    expect(await mailsAbout(wo, since), "no e-mail about a move that was taken back").toEqual([]);

    // Enter on the list moves too; a move that stands does reach the customer.
    const standing = new Date().toISOString();
    const again = page.locator(`li[data-card="${wo}"] select[data-move-to]`);
    await again.selectOption("pressure_test");
    await again.press("Enter");
    await waitForCard(page, wo, "pressure_test");
    await expect.poll(async () => (await mailsAbout(wo, standing)).length, { timeout: 30_000, interval: 500 }).toBe(1);
    // Back to Install, where it was, for the other journeys.
    await page.locator(`li[data-card="${wo}"] select[data-move-to]`).selectOption("install");
    await page.getByRole("button", { name: `Move ${wo} to Install` }).click();
    await waitForCard(page, wo, "install");
    await context.close();
  });

  it("a mouse drop into an empty column lands in the column under the pointer at 10 %, 50 % and 90 % of its width", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "owner");
    const wo = await firstCardIn(page, "wire");
    // Searching for the one work order empties every other column on screen.
    await page.goto(`${baseUrl()}/board?q=${encodeURIComponent(wo)}`);
    await waitForCard(page, wo, "wire");
    // Backward moves are always allowed, so each drop is decided by where the pointer is alone.
    for (const [stage, share] of [["install", 0.1], ["coating", 0.5], ["pressure_test", 0.9]] as const) {
      expect(await cardsIn(page, stage), `${stage} is empty on screen`).toEqual([]);
      const column = (await page.locator(`[data-drop-stage="${stage}"]`).boundingBox())!;
      await mouseDrag(page, wo, { x: column.x + column.width * share, y: column.y + 80 });
      await waitForCard(page, wo, stage);
      await page.locator("[data-move-toast]", { hasText: `Moved ${wo} to ${LABELS[stage]}` }).waitFor();
    }
    await page.reload();
    await waitForCard(page, wo, "pressure_test");
    // Back where it was: Wire & verify, its records unchanged.
    await page.locator(`li[data-card="${wo}"] select[data-move-to]`).selectOption("wire");
    await page.getByRole("button", { name: `Move ${wo} to Wire & verify` }).click();
    await waitForCard(page, wo, "wire");
    await context.close();
  });

  it("Right pressed from Fabricate visits every stage after it in order; Escape leaves the card where it was, focused", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "tech");
    const wo = await firstCardIn(page, "fabricate");
    await page.locator(`li[data-card="${wo}"] [data-drag-handle]`).focus();
    await page.keyboard.press("Space");
    await page.waitForTimeout(200);
    const news = page.locator("[data-drag-news]");
    const visited: string[] = [];
    for (const stage of ROUTE.slice(2)) {
      await page.keyboard.press("ArrowRight");
      await expect.poll(() => news.textContent()).toContain(`over ${LABELS[stage]},`);
      expect(await page.locator(`ul[data-stage="${stage}"].border-dashed`).count(), `${stage} is marked as the target`).toBe(1);
      visited.push(stage);
      if (stage === "install") await page.screenshot({ path: "screenshots/board-desk-keyboard-drag.png" });
    }
    expect(visited).toEqual(["pressure_test", "coating", "install", "wire", "ready"]);
    await page.keyboard.press("ArrowLeft");
    await expect.poll(() => news.textContent()).toContain("over Wire & verify,");
    await page.keyboard.press("Escape");
    await page.waitForTimeout(300);
    expect(await cardsIn(page, "fabricate")).toContain(wo);
    await expect.poll(() => focusedCard(page)).toBe(wo);
    await context.close();
  });

  it("after a keyboard drop the focus is on the moved card, in its new column", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "tech");
    const wo = await firstCardIn(page, "fabricate");
    await page.locator(`li[data-card="${wo}"] [data-drag-handle]`).focus();
    await page.keyboard.press("Space");
    await page.waitForTimeout(200);
    await page.keyboard.press("ArrowRight");
    await page.keyboard.press("ArrowDown");
    await page.keyboard.press("Space");
    await waitForCard(page, wo, "pressure_test");
    await expect.poll(() => focusedCard(page)).toBe(wo);
    await page.locator("[data-move-toast]", { hasText: `Moved ${wo} to Pressure test` }).waitFor();
    await page.reload();
    await waitForCard(page, wo, "pressure_test");
    await context.close();
  });

  it("a refused move stays put, says what it needs, and takes the focus", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "tech");
    // A Wire & verify job of this test's own, whose sign-off is not started, so nothing another test does can meet it.
    const wo = await wireJobWithoutSignOff(browser);
    await page.reload();
    await page.locator(`li[data-card="${wo}"] select[data-move-to]`).selectOption("ready");
    await page.getByRole("button", { name: `Move ${wo} to Ready for pickup` }).click();
    const alert = page.locator(`li[data-card="${wo}"] [role="alert"]`);
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/Needs before it can move to Ready for pickup/);
    expect(await alert.textContent()).toMatch(/sign-off/i);
    expect(await alert.textContent()).not.toMatch(/gate/i);
    await expect.poll(() => page.evaluate(() => document.activeElement?.hasAttribute("data-refusal") ?? false)).toBe(true);
    await waitForCard(page, wo, "wire");
    await shot(page, "board-refused");
    await context.close();
  });

  it("on a 390 px phone the first screen shows cards, the filters fold into one button, and a card moves with 'Move to…'", async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "tech");
    await page.screenshot({ path: "screenshots/board-phone-first-screen.png" });
    const firstCard = (await page.locator("li[data-card]").first().boundingBox())!;
    expect(firstCard.y + 80, "a card shows in the first screen").toBeLessThan(PHONE.viewport.height);
    expect(await page.locator("#board-filters").isVisible()).toBe(false);
    const filterButton = page.getByRole("button", { name: /^Filter/ });
    await filterButton.click();
    await page.getByLabel("Due").selectOption("overdue");
    await expect.poll(() => filterButton.textContent()).toBe("Filter · 1 on");
    await page.getByRole("button", { name: "Clear filters" }).click();
    await filterButton.click();

    // A queued job of its own whose quote is approved and deposit paid, so Fabricate has what it needs.
    const officeContext = await browser.newContext(DESK);
    const officePage = await signIn(officeContext, "office");
    const anyJob = (await (await officePage.request.get(`${baseUrl()}/api/jobs`)).json()).jobs[0] as { customerId: number; truckId: number };
    const created = (await (await officePage.request.post(`${baseUrl()}/api/jobs`, { headers: { origin: baseUrl() }, data: { customerId: anyJob.customerId, truckId: anyJob.truckId, scope: "fabrication", description: "Hose tray for the phone move" } })).json()).job as { id: number; workOrder: string };
    await readyForWork(officePage.request, created.id);
    await officeContext.close();
    await page.reload();
    const wo = created.workOrder;
    const card = page.locator(`ul[data-stage="queued"] > li[data-card="${wo}"]`);
    await card.locator("select").selectOption("fabricate");
    await card.getByRole("button", { name: `Move ${wo} to Fabricate` }).click();
    await waitForCard(page, wo, "fabricate");
    const toast = page.locator("[data-move-toast]");
    await toast.waitFor();
    await page.waitForTimeout(800);
    const moved = (await page.locator(`li[data-card="${wo}"]`).boundingBox())!;
    expect(moved.x, "the moved card is scrolled into view").toBeGreaterThanOrEqual(0);
    expect(moved.x + moved.width).toBeLessThanOrEqual(PHONE.viewport.width + 1);
    expect(moved.y).toBeLessThan(PHONE.viewport.height);
    await page.screenshot({ path: "screenshots/board-phone-moved.png" });
    // The confirmation covers none of the moved card's buttons, says the move without a stray
    // separator, and keeps Undo in reach.
    let toastBox = (await toast.boundingBox())!;
    for (const button of await page.locator(`li[data-card="${wo}"] button`).all()) {
      const b = (await button.boundingBox())!;
      expect(b.y + b.height <= toastBox.y || b.y >= toastBox.y + toastBox.height, `"${await button.textContent()}" is clear of the confirmation`).toBe(true);
    }
    expect(await toast.textContent()).toMatch(new RegExp(`^Moved ${wo} to FabricateUndo×$`));
    expect((await toast.getByRole("button", { name: /^Undo/ }).boundingBox())!.height).toBeGreaterThanOrEqual(44);
    // At the foot of the page every column ends above the confirmation, so any card can be scrolled clear of it.
    await page.evaluate(() => window.scrollTo(0, document.documentElement.scrollHeight));
    await page.waitForTimeout(300);
    toastBox = (await toast.boundingBox())!;
    const lowest = Math.max(...(await page.locator("section[data-drop-stage]").evaluateAll((els) => els.map((e) => e.getBoundingClientRect().bottom))));
    expect(lowest, "the columns end above the confirmation").toBeLessThanOrEqual(toastBox.y);
    await page.screenshot({ path: "screenshots/board-phone-moved-foot.png" });
    // The next tap elsewhere closes it (long before its own time is up).
    await page.locator(`li[data-card="${wo}"] article p`).first().tap();
    await toast.waitFor({ state: "detached", timeout: 2_000 });
    await context.close();
  });

  it("a touch drag carries a card two columns on a 390 px phone, the board stepping one column at a time at the edge", async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "tech");
    const wo = await firstCardIn(page, "install");
    await page.getByRole("link", { name: /^Install/ }).click();
    await page.waitForTimeout(800);
    const handle = (await page.locator(`li[data-card="${wo}"] [data-drag-handle]`).boundingBox())!;
    const start = { x: handle.x + handle.width / 2, y: handle.y + handle.height / 2 };
    const cdp = await context.newCDPSession(page);
    const touch = (type: "touchStart" | "touchMove" | "touchEnd", p?: { x: number; y: number }) => cdp.send("Input.dispatchTouchEvent", { type, touchPoints: p ? [{ x: p.x, y: p.y }] : [] });
    const stageAt = (x: number, y: number) =>
      page.evaluate(([px, py]) => {
        for (const el of document.elementsFromPoint(px, py)) {
          if (el.closest("[data-drag-overlay]")) continue;
          const s = el.closest<HTMLElement>("[data-drop-stage]");
          if (s) return s.dataset.dropStage ?? null;
        }
        return null;
      }, [x, y] as const);
    const middle = { x: PHONE.viewport.width / 2, y: start.y };
    // The page itself notes, every frame, which column is under the middle of the screen, so a slow test machine misses no step.
    await page.evaluate(([px, py]) => {
      const seen: string[] = [];
      (window as unknown as { __columnsSeen: string[] }).__columnsSeen = seen;
      const look = () => {
        for (const el of document.elementsFromPoint(px, py)) {
          if (el.closest("[data-drag-overlay]")) continue;
          const stage = el.closest<HTMLElement>("[data-drop-stage]")?.dataset.dropStage;
          if (stage) {
            if (seen.at(-1) !== stage) seen.push(stage);
            break;
          }
        }
        if (seen.length < 8) requestAnimationFrame(look);
      };
      look();
    }, [middle.x, middle.y] as const);
    const columnsSeen = () => page.evaluate(() => (window as unknown as { __columnsSeen: string[] }).__columnsSeen);
    await touch("touchStart", start);
    await page.waitForTimeout(300);
    for (let i = 1; i <= 10; i++) await touch("touchMove", { x: start.x - ((start.x - 8) * i) / 10, y: start.y });
    // Held at the left edge, the board steps back one column at a time: Outside coating, then Pressure test.
    await expect.poll(columnsSeen, { timeout: 15_000 }).toContain("pressure_test");
    // Off the edge, the board stops stepping; the card goes to the column under the finger.
    await touch("touchMove", middle);
    await page.waitForTimeout(700);
    const seen = await columnsSeen();
    expect(seen.slice(0, 3), "one column at a time").toEqual(["install", "coating", "pressure_test"]);
    const under = (await stageAt(middle.x, middle.y))!;
    // A slow machine may let one more step happen before the finger leaves the edge; either way the card goes where the finger is.
    expect(["pressure_test", "fabricate"]).toContain(under);
    await touch("touchEnd");
    await waitForCard(page, wo, under);
    await page.waitForTimeout(1000);
    await page.screenshot({ path: "screenshots/board-phone-touch-drop.png" });
    const dropped = (await page.locator(`li[data-card="${wo}"]`).boundingBox())!;
    expect(dropped.x, "the dropped card is in view").toBeGreaterThanOrEqual(0);
    expect(dropped.x + dropped.width).toBeLessThanOrEqual(PHONE.viewport.width + 1);
    expect(dropped.y).toBeGreaterThanOrEqual(0);
    expect(dropped.y).toBeLessThan(PHONE.viewport.height);
    await page.locator("[data-move-toast]").getByRole("button", { name: /^Undo/ }).click();
    await waitForCard(page, wo, "install");
    await context.close();
  });

  it("a tech sent away from an office page is told why on the board", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "tech");
    await page.goto(`${baseUrl()}/staff`);
    await page.waitForURL(/\/board\?denied=1/);
    expect(await page.getByRole("note").textContent()).toMatch(/for the office and the owner/);
    expect(await page.getByRole("link", { name: "New job" }).count()).toBe(0);
    await context.close();
  });

  it("axe finds nothing serious on the board at desk and phone size, with a move's confirmation and a refusal showing", async () => {
    for (const size of [DESK, PHONE]) {
      const context = await browser.newContext(size);
      const wo = await wireJobWithoutSignOff(browser);
      const page = await signIn(context, "owner");
      expect(await axeFindings(page)).toEqual([]);
      await page.locator(`li[data-card="${wo}"] select[data-move-to]`).selectOption("ready");
      await page.getByRole("button", { name: `Move ${wo} to Ready for pickup` }).click();
      await page.locator(`li[data-card="${wo}"] [role="alert"]`).waitFor();
      expect(await axeFindings(page)).toEqual([]);
      await page.getByRole("button", { name: "Dismiss" }).first().click();
      // A move back to Queued is always allowed, whatever the card's work.
      const back = await firstCardIn(page, "install");
      await page.locator(`li[data-card="${back}"] select[data-move-to]`).selectOption("queued");
      await page.getByRole("button", { name: `Move ${back} to Queued` }).click();
      const toast = page.locator("[data-move-toast]");
      await toast.waitFor();
      expect(await axeFindings(page)).toEqual([]);
      await toast.getByRole("button", { name: /^Undo/ }).click();
      await waitForCard(page, back, "install");
      await context.close();
    }
  });
});
