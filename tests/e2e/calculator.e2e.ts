import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";

const enabled = Boolean(baseUrl());

async function flowText(page: Page) {
  return (await page.getByTestId("result-flowGpm").textContent())?.trim() ?? "";
}

async function numberIn(text: string) {
  return Number(text.replace(/[^0-9.]/g, ""));
}

describe.skipIf(!enabled)("the wet-kit calculator in Chromium", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("owner at the desk: changing the pump displacement changes the flow, and formulas open on a click", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "owner");
    await page.goto(`${baseUrl()}/calculator`);
    await page.getByRole("heading", { name: "Wet-kit calculator" }).waitFor();
    const before = await flowText(page);
    // Shop demo kit: 1200 rpm × 115 % × 3.5 in³ × 0.90 / 231 = 18.8 gpm.
    expect(before).toMatch(/^18\.8\s*gpm/);
    await shot(page, "calculator-desk");
    // Printed, the calculator keeps its title.
    await page.emulateMedia({ media: "print" });
    expect(await page.getByRole("heading", { name: "Wet-kit calculator" }).isVisible()).toBe(true);
    await page.emulateMedia({ media: "screen" });

    const displacement = page.getByLabel("Pump displacement, in³/rev");
    await displacement.fill("4.5");
    await expect.poll(() => flowText(page), { timeout: 10_000 }).not.toBe(before);
    // 1200 × 1.15 × 4.5 × 0.90 / 231 = 24.2 gpm
    expect(await numberIn(await flowText(page))).toBeCloseTo(24.2, 1);
    await page.getByText("= 73.7 cm³/rev").waitFor();

    await page.getByTestId("result-flowGpm").click();
    await page.getByText("gpm = theoretical gpm × volumetric efficiency").waitFor();
    await page.getByText("L/min = gpm × 3.785411784").waitFor();
    await page.getByText(/Where the velocity ranges come from/).waitFor();
    await shot(page, "calculator-desk-formula-open");

    // A 1 in suction line at 24.2 gpm moves oil near 10 ft/s: the page says, in words, that the pump may starve.
    await page.getByLabel("Suction ID, in").fill("1");
    const warning = page.locator('[data-warning="suction_velocity_high"]');
    await warning.waitFor({ timeout: 10_000 });
    expect(await warning.textContent()).toMatch(/may starve and cavitate/);
    expect(await page.locator('[data-line="suction"]').getByText("Too fast").count()).toBe(1);
    await context.close();
  });

  it("on a phone: the form sits above the results, a bad box is named beside it, a box tank draws", async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "tech");
    await page.goto(`${baseUrl()}/calculator`);
    await page.getByTestId("result-flowGpm").waitFor();
    await shot(page, "calculator-phone");

    const formTop = (await page.getByRole("region", { name: "Kit inputs" }).boundingBox())!.y;
    const resultsTop = (await page.getByRole("region", { name: "Kit results" }).boundingBox())!.y;
    expect(formTop).toBeLessThan(resultsTop);

    await page.getByLabel("Oil depth, in").fill("25");
    await page.getByText(/Fill depth \(25 in\) cannot be more than the tank's inside diameter \(20 in\)/).waitFor();
    await page.getByText(/Fix the marked boxes/).waitFor();
    await page.getByLabel("Oil depth, in").fill("");

    await page.getByText("▭ Box").click();
    await page.getByRole("img", { name: /Box, side view/ }).waitFor({ timeout: 10_000 });
    await shot(page, "calculator-phone-box");

    // Every button and box the form offers is big enough for a gloved thumb.
    const small = await page.evaluate(() =>
      [...document.querySelectorAll<HTMLElement>("main input:not(.sr-only), main button, main summary, main label:has(> input[type=radio])")]
        .filter((el) => el.offsetParent !== null)
        .map((el) => ({ text: el.textContent?.trim().slice(0, 30) || el.getAttribute("name"), h: el.getBoundingClientRect().height }))
        .filter((el) => el.h < 44),
    );
    expect(small).toEqual([]);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await context.close();
  });

  it("the office saves a kit spec on a demo job; a tech sees it read-only", async () => {
    const office = await browser.newContext(DESK);
    const page = await signIn(office, "office");
    const board = await (await page.request.get(`${baseUrl()}/api/board`)).json();
    type Card = { id: number; stage: string; description: string };
    const card = board.cards.find((c: Card) => /wet kit/i.test(c.description) && c.stage === "queued") ?? board.cards.find((c: Card) => /wet kit/i.test(c.description)) ?? board.cards[0];
    expect(card).toBeTruthy();
    await page.goto(`${baseUrl()}/jobs/${card.id}`);
    const section = page.locator("#kit-spec");
    await section.getByRole("button", { name: /Edit kit spec|Work out a kit spec/ }).click();
    // The form opens at the truck's work engine speed; set the drive so the flow is known: 1200 × 115 % × 4 × 0.90 / 231.
    await section.getByLabel("Engine speed at work, rpm").fill("1200");
    await section.getByLabel("PTO ratio, % of engine speed").fill("115");
    await section.getByLabel("Pump displacement, in³/rev").fill("4");
    await section.getByLabel("Relief setting, psi").fill("2900");
    await expect.poll(async () => (await section.getByTestId("result-flowGpm").textContent())?.trim(), { timeout: 10_000 }).toMatch(/^21\.5/);
    await shot(page, "job-kit-spec-editing-desk");
    await section.getByRole("button", { name: /Save kit spec/ }).click();
    await section.getByText(/✓ Saved version \d+/).waitFor({ timeout: 10_000 });
    const versionText = (await section.getByTestId("kit-spec-version").textContent()) ?? "";
    expect(versionText).toMatch(/Version \d+ · saved by/);
    const api = await (await page.request.get(`${baseUrl()}/api/jobs/${card.id}/kit-spec`)).json();
    expect(api.spec.inputs.pumpDisplacementCuIn).toBe(4);
    expect(api.spec.inputs.reliefPressurePsi).toBe(2900);
    expect(await section.getByTestId("spec-flow").textContent()).toContain(api.spec.results.flowGpm.toFixed(1));
    await shot(page, "job-kit-spec-saved-desk");
    // The shop sheet: the saved spec prints, the editor and its buttons do not.
    await page.emulateMedia({ media: "print" });
    expect(await section.getByRole("button", { name: "Edit kit spec" }).isVisible()).toBe(false);
    expect(await section.getByTestId("spec-flow").isVisible()).toBe(true);
    await shot(page, "job-kit-spec-print");
    await page.emulateMedia({ media: "screen" });
    await office.close();

    const tech = await browser.newContext(PHONE);
    const techPage = await signIn(tech, "tech");
    await techPage.goto(`${baseUrl()}/jobs/${card.id}`);
    const techSection = techPage.locator("#kit-spec");
    await techSection.getByTestId("spec-flow").waitFor();
    expect(await techSection.getByTestId("kit-spec-version").textContent()).toBe(versionText);
    expect(await techSection.getByRole("button", { name: /Edit kit spec|Save kit spec/ }).count()).toBe(0);
    expect(await techSection.locator("input").count()).toBe(0);
    await techSection.scrollIntoViewIfNeeded();
    await shot(techPage, "job-kit-spec-tech-phone");
    const refused = await techPage.request.put(`${baseUrl()}/api/jobs/${card.id}/kit-spec`, { data: { inputs: api.spec.inputs }, headers: { origin: baseUrl() } });
    expect(refused.status()).toBe(403);
    await tech.close();
  });

  it("more about this kit: ratings, duty and a D-shaped tank change the checks, each with its formula and source", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "office");
    await page.goto(`${baseUrl()}/calculator`);
    await page.getByTestId("result-flowGpm").waitFor();
    // The shop's demo kit fills in every added box, so the added checks show from the start, and calmly.
    await page.getByRole("region", { name: "Heat" }).getByText(/no cooler needed/).waitFor();
    await page.getByTestId("suction-inlet").getByText("Cold start").waitFor();
    await page.locator('[data-rating="trailer"]').waitFor();

    await page.getByTestId("more-about-kit").locator("summary").click();
    await page.getByLabel("PTO intermittent torque, lb·ft").waitFor();
    await shot(page, "calculator-desk-more-open");

    // 2750 psi × 3.5 in³ / 2π / 0.9 / 12 = 141.8 lb·ft at relief, over a 120 lb·ft intermittent rating.
    await page.getByLabel("PTO intermittent torque, lb·ft").fill("120");
    const torque = page.locator('[data-warning="relief_torque_above_pto_intermittent"]');
    await torque.waitFor({ timeout: 10_000 });
    expect(await torque.textContent()).toMatch(/141\.8 lb·ft/);

    // Hoses rated under the relief: the table shows the negative room and the warning says what to do.
    await page.getByLabel("Hose rated pressure, psi").fill("2500");
    await page.locator('[data-warning="relief_above_hose_rating"]').waitFor({ timeout: 10_000 });
    expect(await page.locator('[data-rating="hose"]').textContent()).toMatch(/-250 psi/);

    // Half the time at working pressure: more heat than the tank sheds, and the cooler size to close the gap.
    await page.getByLabel("Time at working pressure, %").fill("50");
    await page.locator('[data-warning="cooler_advised"]').waitFor({ timeout: 10_000 });
    await page.getByTestId("result-heat.generatedBtuPerHr").click();
    await page.getByText(/share at working pressure × \(input hp − hydraulic hp\)/).waitFor();

    // A D-shaped tank draws from its end and its volume is worked out by its own geometry.
    await page.getByText("◗ D-shape").click();
    await page.getByRole("img", { name: /D-shaped tank, end view/ }).waitFor({ timeout: 10_000 });
    await page.getByTestId("result-tank.totalGal").click();
    await page.getByText(/D: \(\(W − h\/2\) h \+ π h²\/8\) L/).waitFor();
    await shot(page, "calculator-desk-d-tank");

    // A bad added box is named beside it, and the fold stays open so it can be seen.
    await page.getByLabel("Oil viscosity cold, cSt").fill("10");
    await page.getByText(/Cold oil is thicker than warm oil/).waitFor({ timeout: 10_000 });
    await context.close();
  });

  it("more about this kit on a phone: the fold opens, fits the width, and every box is big enough for a thumb", async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "tech");
    await page.goto(`${baseUrl()}/calculator`);
    await page.getByTestId("result-flowGpm").waitFor();
    await page.getByTestId("more-about-kit").locator("summary").click();
    await page.getByLabel("Cylinder bore, in").scrollIntoViewIfNeeded();
    await shot(page, "calculator-phone-more-open");
    await page.getByText("◗ D-shape").click();
    await page.getByRole("img", { name: /D-shaped tank, end view/ }).waitFor({ timeout: 10_000 });
    await page.getByRole("region", { name: "Heat" }).scrollIntoViewIfNeeded();
    await shot(page, "calculator-phone-heat");
    const small = await page.evaluate(() =>
      [...document.querySelectorAll<HTMLElement>("main input:not(.sr-only), main button, main summary, main label:has(> input[type=radio])")]
        .filter((el) => el.offsetParent !== null)
        .map((el) => ({ text: el.textContent?.trim().slice(0, 30) || el.getAttribute("name"), h: el.getBoundingClientRect().height }))
        .filter((el) => el.h < 44),
    );
    expect(small).toEqual([]);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await context.close();
  });
});
