import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { withCheckDigit } from "@/server/vehicles/vin";
import { DEMO, DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";

const enabled = Boolean(baseUrl());
let serial = Date.now() % 100_000;

/** A fabrication job with one untested round reservoir, made through the API as the office would. */
async function jobWithTank(page: Page) {
  const n = ++serial;
  const post = async (path: string, data: unknown) => {
    const res = await page.request.post(`${baseUrl()}${path}`, { data, headers: { origin: baseUrl() } });
    expect(res.status(), `${path}: ${await res.text()}`).toBe(201);
    return res.json();
  };
  const { customer } = await post("/api/customers", { kind: "company", name: `Procedure Fleet ${n}` });
  const { truck } = await post("/api/trucks", { customerId: customer.id, unitNumber: `PF-${n}`, vin: withCheckDigit(`1PF5T3X20RK${String(n).padStart(6, "0")}`), year: 2024 });
  const { job } = await post("/api/jobs", { customerId: customer.id, truckId: truck.id, scope: "fabrication", description: "Wet kit: 40 gal round tank" });
  const { part } = await post(`/api/jobs/${job.id}/parts`, {
    name: "40 gal round reservoir", kind: "reservoir", material: "aluminum", needsLeakTest: true, needsCoating: true, geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 36.5 },
  });
  return { job, part };
}

describe.skipIf(!enabled)("records forms in Chromium", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("shows the procedure's flags as numbers are typed, saves the test as invalid, and offers a retest without the wrong gauge", async () => {
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "office");
    const { job } = await jobWithTank(page);
    await page.goto(`${baseUrl()}/jobs/${job.id}`);
    await page.getByRole("button", { name: "Record a leak test" }).click();
    const form = page.getByRole("form", { name: /Leak test of 40 gal round reservoir/ });
    await form.waitFor();
    // Focus goes into the form when it opens.
    await expect.poll(() => page.evaluate(() => Boolean(document.activeElement?.closest("form[aria-label^='Leak test']")))).toBe(true);

    await form.getByLabel("Test pressure (psig)").fill("3");
    await form.getByLabel("Hold (minutes)").fill("10");
    // Before saving: the hold's flag under its field and in the summary.
    await expect.poll(() => form.getByText(/Outside the procedure: Pressure was held 10 min; hold at least 15 min/).count()).toBe(1);
    await form.getByLabel("Hold (minutes)").fill("20");
    await expect.poll(() => form.getByText(/Pressure was held/).count()).toBe(0);
    await form.getByLabel("Gauge full scale (psi)").fill("30");
    await expect.poll(() => form.getByTestId("procedure-flags").textContent()).toMatch(/between 4\.5 and 12 psi/);
    expect(await form.getByRole("button", { name: "Record as invalid" }).count()).toBe(1);

    // The shop's today (its own time zone) is the date field's latest allowed value.
    const shopToday = (await form.getByLabel("Gauge last calibrated").getAttribute("max"))!;
    await form.getByLabel("Gauge last calibrated").fill(shopToday);
    await form.getByRole("textbox", { name: "Start pressure (psig)" }).fill("3");
    await form.getByRole("textbox", { name: "End pressure (psig)" }).fill("3");
    await form.getByRole("textbox", { name: "Start temperature (°F)" }).fill("70");
    await form.getByRole("textbox", { name: "End temperature (°F)" }).fill("70");
    for (const group of await form.getByRole("radiogroup").all()) await group.getByText("No bubbles").click();
    await shot(page, "leak-test-flags-phone");
    await form.getByRole("button", { name: "Record as invalid" }).click();

    const result = page.getByTestId("leak-test-result");
    await result.waitFor();
    expect(await result.textContent()).toMatch(/Invalid — 40 gal round reservoir/);
    expect(await result.textContent()).not.toMatch(/\bPass\b/);
    // Focus moves to the result after saving.
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute("data-testid"))).toBe("leak-test-result");
    await shot(page, "leak-test-invalid-phone");

    await result.getByRole("button", { name: "Test again" }).click();
    const again = page.getByRole("form", { name: /Leak test of 40 gal round reservoir/ });
    await again.waitFor();
    // The out-of-range gauge is not carried into the retest; the calibration date is.
    expect(await again.getByLabel("Gauge full scale (psi)").inputValue()).toBe("");
    expect(await again.getByLabel("Gauge last calibrated").inputValue()).toBe(shopToday);
    await again.getByRole("button", { name: "Cancel" }).click();

    await page.reload();
    expect(await page.getByText(/Last leak test invalid/).count()).toBeGreaterThan(0);
    await context.close();
  });

  it("adds a D-shaped reservoir with its dimensions from the form, and its leak test starts as a flat-walled one", async () => {
    for (const [device, name] of [[PHONE, "phone"], [DESK, "desk"]] as const) {
      const context = await browser.newContext(device);
      const page = await signIn(context, "office");
      const { job } = await jobWithTank(page);
      await page.goto(`${baseUrl()}/jobs/${job.id}`);
      await page.getByRole("button", { name: "+ Add a part" }).click();
      const form = page.getByRole("form", { name: "Add a part" });
      await form.getByLabel("Part", { exact: true }).fill("D tank, left rail");
      await form.getByLabel("Shape").selectOption({ label: "D-shaped (flat side on the rail)" });
      expect(await form.getByText(/half round outboard/).count()).toBe(1);
      await form.getByLabel("Length (in)").fill("40");
      await form.getByLabel("Width, rail to crown (in)").fill("14");
      await form.getByLabel("Height of the flat side (in)").fill("20");
      await shot(page, `part-form-d-shaped-${name}`);
      await form.getByRole("button", { name: "Add the part" }).click();

      const line = page.locator("li[data-part='D tank, left rail']");
      await line.waitFor();
      // End area 20 × (14 − 10) + π × 20² / 8 = 237.08 in², × 40 in = 9,483 in³ = 41.05 US gal (231 in³).
      expect(await line.textContent()).toMatch(/D-shaped · 40 × 14 × 20 in \(length × width × height\), about 41\.1 gal total/);
      await line.getByRole("button", { name: "Record a leak test" }).click();
      const test = page.getByRole("form", { name: /Leak test of D tank, left rail/ });
      await test.waitFor();
      expect(await test.getByRole("radio", { name: /Soap solution only/ }).isChecked()).toBe(true);
      expect(await test.getByText(/For a D-shaped tank \(flat walls: the box tank's band\): 1\.5–3 psig \(UL 142 §42\.2\.1\)/).count()).toBe(1);
      await test.getByRole("radio", { name: /Soap and pressure decay/ }).check();
      expect(await test.getByText(/A D-shaped tank's flat walls flex/).count()).toBe(1);
      await shot(page, `leak-test-d-shaped-${name}`);
      await context.close();
    }
  });

  it("Add staff empties after saving, its hint follows the role, and deactivating asks first", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "owner");
    await page.goto(`${baseUrl()}/staff`);
    const add = page.getByRole("form", { name: "Add a staff member" });
    const role = add.getByLabel("Role");
    expect(await add.getByText(/A tech moves cards/).count()).toBe(1);
    await role.selectOption("office");
    expect(await add.getByText(/The office also adds customers/).count()).toBe(1);
    expect(await add.getByText(/A tech moves cards/).count()).toBe(0);

    const n = ++serial;
    await add.getByLabel("Name").fill(`Ines Marlow ${n}`);
    await add.getByLabel("E-mail").fill(`ines${n}@shop.example`);
    await add.getByLabel("First password").fill("first-password-123");
    await add.getByRole("button", { name: "Add office" }).click();
    await page.getByText(new RegExp(`Ines Marlow ${n} added as office`)).waitFor();
    expect(await add.getByLabel("Name").inputValue()).toBe("");
    expect(await add.getByLabel("E-mail").inputValue()).toBe("");
    expect(await add.getByLabel("First password").inputValue()).toBe("");
    expect(await role.inputValue()).toBe("tech");
    await shot(page, "staff-added-desk");

    const row = page.getByRole("listitem").filter({ hasText: `Ines Marlow ${n}` });
    await row.getByRole("button", { name: "Deactivate" }).click();
    await row.getByText(/Deactivate Ines Marlow .* They are signed out on every device/).waitFor();
    await row.getByRole("button", { name: "Keep as is" }).click();
    expect(await row.getByText("Deactivated").count()).toBe(0);
    await context.close();
  });

  it("the owner's reset shows a temporary password on the page; its holder must choose their own on /account", async () => {
    const ownerContext = await browser.newContext(DESK);
    const owner = await signIn(ownerContext, "owner");
    let dialogs = 0;
    owner.on("dialog", (d) => {
      dialogs++;
      void d.dismiss();
    });
    const n = ++serial;
    const email = `reset${n}@shop.example`;
    const made = await owner.request.post(`${baseUrl()}/api/staff`, { data: { name: `Rory Vance ${n}`, email, role: "tech", password: "first-password-123" }, headers: { origin: baseUrl() } });
    expect(made.status()).toBe(201);
    await owner.goto(`${baseUrl()}/staff`);
    const row = owner.getByRole("listitem").filter({ hasText: `Rory Vance ${n}` });
    await row.getByRole("button", { name: "Reset password" }).click();
    await row.getByRole("group").getByRole("button", { name: "Reset password" }).click();
    const temporary = (await row.getByTestId("temporary-password").textContent())!.trim();
    expect(temporary).toMatch(/^[a-z2-9]{4}(-[a-z2-9]{4}){3}$/);
    expect(await row.getByRole("button", { name: "Copy" }).count()).toBe(1);
    expect(dialogs).toBe(0);
    await shot(owner, "staff-reset-desk");

    const techContext = await browser.newContext(PHONE);
    const tech = await techContext.newPage();
    await tech.goto(`${baseUrl()}/sign-in`);
    await tech.getByLabel("E-mail").fill(email);
    await tech.getByLabel("Password").fill(temporary);
    await tech.getByRole("button", { name: "Sign in" }).click();
    await tech.waitForURL(/\/account/);
    // Any other page sends them back to choose a password.
    await tech.goto(`${baseUrl()}/board`);
    await tech.waitForURL(/\/account/);
    await shot(tech, "account-must-change-phone");
    await tech.getByLabel("Temporary password").fill(temporary);
    await tech.getByLabel("New password", { exact: true }).fill("my-own-bench-pass");
    await tech.getByLabel("New password again").fill("my-own-bench-pass");
    await tech.getByRole("button", { name: "Change password" }).click();
    await tech.waitForURL(/\/board/);
    await ownerContext.close();
    await techContext.close();
  });

  it("a staff member changes their own password on /account and their other device is signed out", async () => {
    const n = ++serial;
    const email = `own${n}@shop.example`;
    const ownerContext = await browser.newContext(DESK);
    const owner = await signIn(ownerContext, "owner");
    const made = await owner.request.post(`${baseUrl()}/api/staff`, { data: { name: `Tove Acker ${n}`, email, role: "office", password: "first-password-123" }, headers: { origin: baseUrl() } });
    expect(made.status()).toBe(201);
    await ownerContext.close();

    const signInAs = async (options: typeof DESK | typeof PHONE) => {
      const context = await browser.newContext(options);
      const page = await context.newPage();
      await page.goto(`${baseUrl()}/sign-in`);
      await page.getByLabel("E-mail").fill(email);
      await page.getByLabel("Password").fill("first-password-123");
      await page.getByRole("button", { name: "Sign in" }).click();
      await page.waitForURL((url) => url.pathname === "/" || url.pathname === "/board");
      return { context, page };
    };
    const phone = await signInAs(PHONE);
    const desk = await signInAs(DESK);
    await desk.page.goto(`${baseUrl()}/account`);
    expect(await desk.page.getByText("(this device)").count()).toBe(1);
    expect(await desk.page.locator("#devices").getByRole("listitem").count()).toBe(2);

    await desk.page.getByLabel("Current password").fill("first-password-123");
    await desk.page.getByLabel("New password", { exact: true }).fill("a-longer-office-pass");
    await desk.page.getByLabel("New password again").fill("a-different-office-pass");
    await desk.page.getByRole("button", { name: "Change password" }).click();
    await desk.page.getByText(/The two new passwords differ/).first().waitFor();

    await desk.page.getByLabel("New password again").fill("a-longer-office-pass");
    await desk.page.getByRole("button", { name: "Change password" }).click();
    await desk.page.getByText(/Password changed\. 1 other device was signed out; this one stays signed in\./).waitFor();
    expect(await desk.page.getByLabel("Current password").inputValue()).toBe("");
    await shot(desk.page, "account-changed-desk");

    expect((await phone.page.request.get(`${baseUrl()}/api/me`)).status()).toBe(401);
    expect((await desk.page.request.get(`${baseUrl()}/api/me`)).status()).toBe(200);
    await phone.context.close();
    await desk.context.close();
  });
});

describe.skipIf(!enabled)("the owner's leak-test procedure in Chromium", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("the owner changes the shortest hold on Settings and the leak-test form follows it", async () => {
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "owner");
    await page.getByRole("link", { name: "Settings" }).click();
    await page.waitForURL(/\/settings/);
    const form = page.getByRole("form", { name: "Leak-test procedure" });
    const hold = form.getByLabel("Shortest hold (min)");
    expect(await hold.inputValue()).toBe("15");
    await hold.fill("20");
    await form.getByRole("button", { name: "Save the procedure" }).click();
    await page.getByText(/Procedure saved/).waitFor();
    await shot(page, "settings-procedure-desk");
    try {
      const { job } = await jobWithTank(page);
      await page.goto(`${baseUrl()}/jobs/${job.id}`);
      await page.getByRole("button", { name: "Record a leak test" }).click();
      const test = page.getByRole("form", { name: /Leak test of/ });
      await test.getByText("At least 20 min before examining (the shop's procedure).").waitFor();
      await test.getByLabel("Hold (minutes)").fill("15");
      await test.getByText(/hold at least 20 min/).first().waitFor();
    } finally {
      const reset = await page.request.patch(`${baseUrl()}/api/shop-settings/leak-test-procedure`, { data: { minHoldMinutes: 15 }, headers: { origin: baseUrl() } });
      expect(reset.status()).toBe(200);
    }
    // The signed-in name leads to the account page.
    await page.getByTestId("signed-in-as").click();
    await page.waitForURL(/\/account/);
    await context.close();
  });
});

void DEMO;
