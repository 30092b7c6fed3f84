import jsQR from "jsqr";
import sharp from "sharp";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demoKitCalcInput } from "@/server/kit-calc/demo";
import { pdfPages } from "../support/pdf-text";
import { DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";

const enabled = Boolean(baseUrl());
const calibratedOn = new Date(Date.now() - 60 * 86_400_000).toISOString().slice(0, 10);

describe.skipIf(!enabled)("the shop sheet", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("prints a job with four parts, its bought-in parts and kit spec on at most two Letter pages, with a QR code of the job's page", async () => {
    const suffix = Date.now().toString(36).slice(-4).toUpperCase();
    const context = await browser.newContext(DESK);
    const page = await signIn(context, "office");
    const post = async (path: string, data: unknown, method: "post" | "put" = "post") => {
      const res = await page.request[method](`${baseUrl()}${path}`, { headers: { origin: baseUrl() }, data });
      expect(res.status(), await res.text()).toBeLessThan(300);
      return res.json();
    };
    // A new job on a demo truck, like the demo's wet kits: four parts, two bought-in lines and a kit spec.
    const { jobs } = await (await page.request.get(`${baseUrl()}/api/jobs`)).json();
    const truck = jobs.find((j: { customerName: string }) => j.customerName === "Harlan Ridge Heavy Haul");
    const job = (
      await post("/api/jobs", {
        customerId: truck.customerId, truckId: truck.truckId, scope: "fabrication", priority: "rush",
        description: `Wet kit ${suffix}: 40 gal round aluminum reservoir between the rails, 3.5 in³ direct-mount pump, breakaways at the back of the cab`,
        notes: "Customer brings the trailer on the day of pickup for the run test.",
      })
    ).job as { id: number; workOrder: string };
    const parts = [
      { name: `40 gal round reservoir ${suffix}`, kind: "reservoir", material: "aluminum", needsLeakTest: true, needsCoating: true, shape: "round" },
      { name: "Valve box", kind: "box", material: "aluminum", needsLeakTest: false, needsCoating: true },
      { name: "Reservoir saddle brackets", kind: "bracket", material: "carbon_steel", needsLeakTest: false, needsCoating: true },
      { name: "Hose carrier", kind: "other", material: "carbon_steel", needsLeakTest: false, needsCoating: false },
    ];
    const made = [];
    for (const part of parts) made.push((await post(`/api/jobs/${job.id}/parts`, part)).part);
    await post(`/api/parts/${made[0].id}/leak-tests`, {
      method: "both", testPressurePsig: 4, gaugeFullScalePsi: 10, gaugeCalibratedOn: calibratedOn, holdMinutes: 20, startPressurePsig: 4,
      endPressurePsig: 4, startTempF: 70, endTempF: 70, seams: [{ location: "Sump to shell", result: "pass" }], tester: "Tobin Reyes",
    });
    await post(`/api/jobs/${job.id}/bought-parts`, { kind: "pto", description: "10-bolt PTO, air shift", quantity: 1, partNumber: "PTO-10B" });
    await post(`/api/jobs/${job.id}/bought-parts`, { kind: "hose", description: "1-1/4 in suction hose", quantity: 2 });
    await post(`/api/jobs/${job.id}/kit-spec`, { inputs: demoKitCalcInput, expectedVersion: 0 }, "put");

    // "Print shop sheet" on the job page opens the sheet.
    await page.goto(`${baseUrl()}/jobs/${job.id}`);
    await page.getByRole("link", { name: "Print shop sheet" }).click();
    await page.waitForURL(`${baseUrl()}/jobs/${job.id}/sheet`);
    const sheet = page.getByRole("article", { name: `Shop sheet for work order ${job.workOrder}` });
    await sheet.waitFor();
    await shot(page, "shop-sheet-desk");

    // The QR code, read back from the screen by an independent decoder, is the job page's address.
    const qr = sheet.getByRole("img", { name: /^QR code of the job's page/ });
    const png = await qr.screenshot({ scale: "device" });
    const padded = await sharp(png).extend({ top: 16, bottom: 16, left: 16, right: 16, background: "#ffffff" }).resize({ width: 400, kernel: "nearest" }).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
    const decoded = jsQR(new Uint8ClampedArray(padded.data), padded.info.width, padded.info.height);
    expect(decoded?.data).toBe(`${baseUrl()}/jobs/${job.id}`);

    const pdf = await page.pdf({ format: "Letter", printBackground: true });
    await sharp(png).toFile("screenshots/shop-sheet-qr.png");
    const pages = await pdfPages(pdf);
    expect(pages.length).toBeGreaterThanOrEqual(1);
    expect(pages.length).toBeLessThanOrEqual(2);
    // Headings print in capitals (CSS), so words are compared without case.
    const text = pages.join(" ").toLowerCase();
    const vin = (await (await page.request.get(`${baseUrl()}/api/jobs/${job.id}`)).json()).job.vin as string;
    for (const words of [`Work order ${job.workOrder}`, vin, "PTO opening", "Transmission", "Kit spec", ...parts.map((p) => p.name), "10-bolt PTO, air shift", "Passed", "Signed off by"]) {
      expect(text).toContain(words.toLowerCase());
    }
    // Printed, the shell's menu and the page's own buttons stay off the paper.
    expect(text).not.toContain("sign out");
    expect(text).not.toContain("back to");

    const phone = await context.browser()!.newContext(PHONE);
    const bench = await signIn(phone, "tech");
    await bench.goto(`${baseUrl()}/jobs/${job.id}/sheet`);
    await bench.getByRole("article", { name: `Shop sheet for work order ${job.workOrder}` }).waitFor();
    await shot(bench, "shop-sheet-phone");
    await phone.close();
    await context.close();
  });
});
