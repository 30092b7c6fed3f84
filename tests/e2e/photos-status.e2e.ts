import { mkdirSync } from "node:fs";
import { join } from "node:path";
import Database from "better-sqlite3";
import type { Browser, Page } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { formatShopTime } from "@/server/records/calendar";
import { DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";

const enabled = Boolean(baseUrl());

type Mail = { to: string[]; subject: string; text: string; html: string; createdAt: string };

/** A job in Install with a part, whose customer has contacts who receive e-mail: moving it to Wire & verify passes no gate. */
function pickJob() {
  const sqlite = new Database(inject("databasePath"), { readonly: true, fileMustExist: true });
  try {
    return sqlite
      .prepare(
        `select job.id, job.version, job.work_order as workOrder, job.description, truck.unit_number as unit from job join truck on truck.id = job.truck_id
         where job.stage = 'install' and exists (select 1 from contact where contact.customer_id = job.customer_id and contact.receives_email = 1 and contact.email != '')
         and exists (select 1 from part where part.job_id = job.id)
         order by job.id limit 1`,
      )
      .get() as { id: number; version: number; workOrder: string; description: string; unit: string };
  } finally {
    sqlite.close();
  }
}

/** A picture with something in it: a tank outline and a label, drawn and saved as a phone-sized JPEG. */
function shopPhoto(label: string, tint: string) {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="1600" height="1200">
    <rect width="1600" height="1200" fill="${tint}"/>
    <rect x="300" y="420" width="1000" height="420" rx="200" fill="#c9d1d3" stroke="#44545b" stroke-width="18"/>
    <rect x="720" y="330" width="160" height="110" fill="#8a979b"/>
    <text x="800" y="1040" font-family="sans-serif" font-size="90" text-anchor="middle" fill="#ffffff">${label}</text>
  </svg>`;
  return sharp(Buffer.from(svg)).jpeg({ quality: 82 }).toBuffer();
}

async function sectionShot(page: Page, selector: string, name: string) {
  mkdirSync("screenshots", { recursive: true });
  await page.locator(selector).screenshot({ path: join("screenshots", `${name}.png`) });
}

async function pickPhoto(page: Page, caption: string, name: string, bytes: Buffer, part?: string) {
  const photos = page.locator("#photos");
  await photos.getByLabel("Part (optional)").selectOption(part ? { label: part } : { value: "" });
  await photos.getByLabel("Caption (optional)").fill(caption);
  await photos.getByTestId("photo-pick").setInputFiles({ name, mimeType: "image/jpeg", buffer: bytes });
  await photos.getByText("✓ Saved").first().waitFor({ timeout: 30_000 });
  await photos.locator(`img[alt="${caption}"]`).waitFor({ timeout: 10_000 });
}

async function mailFor(job: { workOrder: string; unit: string }, since: string): Promise<Mail> {
  const until = Date.now() + 30_000;
  while (Date.now() < until) {
    const mails = (await (await fetch(`${inject("fakesUrl")}/__fake/emails`)).json()) as Mail[];
    const found = mails.find((m) => m.subject.startsWith(`Wiring and run test · Work order ${job.workOrder} · Unit ${job.unit}`) && m.createdAt >= since);
    if (found) return found;
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`No e-mail about ${job.workOrder} reached the fake within 30 s`);
}

describe.skipIf(!enabled)("photos, the stage e-mail and the customer's status page", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("a tech uploads two photos and shares one; a move e-mails the customer, whose link shows that photo and not the other", { timeout: 150_000 }, async () => {
    const job = pickJob();
    const secretNote = "Internal: customer still owes for the last kit, do not release keys";
    const context = await browser.newContext(PHONE);
    const page = await signIn(context, "tech");
    await page.goto(`${baseUrl()}/jobs/${job.id}`);
    await page.locator("#photos").scrollIntoViewIfNeeded();

    const partName = (await page.locator("#photos").getByLabel("Part (optional)").locator("option").nth(1).textContent())!.trim();
    await pickPhoto(page, "Pump on the PTO", "pump.jpg", await shopPhoto("PUMP ON THE PTO", "#2c4a52"), partName);
    await pickPhoto(page, "Frame rail before paint touch-up", "rail.jpg", await shopPhoto("FRAME RAIL", "#5a3b2c"));
    const cards = page.locator("#photos [data-testid=photo-card]");
    expect(await cards.count()).toBe(2);
    // The card names its part, and gives its time on the shop's clock (the demo shop is on US/Central).
    const tagged = cards.filter({ has: page.locator('img[alt="Pump on the PTO"]') });
    expect(await tagged.getByTestId("photo-part").textContent()).toBe(`Part: ${partName}`);
    expect(await cards.filter({ has: page.locator('img[alt="Frame rail before paint touch-up"]') }).getByTestId("photo-part").count()).toBe(0);
    const taken = tagged.locator("time");
    expect(await taken.textContent()).toBe(formatShopTime((await taken.getAttribute("datetime"))!, "US/Central", "d MMM, HH:mm"));

    const shared = cards.filter({ has: page.locator('img[alt="Pump on the PTO"]') });
    await shared.getByRole("button", { name: "Staff only: show to customer" }).click();
    await shared.getByRole("button", { name: "✓ Customer sees this" }).waitFor();
    await page.waitForLoadState("networkidle");
    await sectionShot(page, "#photos", "job-photos-phone");

    // The tech writes an internal note, then the job moves on.
    const current = await (await page.request.get(`${baseUrl()}/api/jobs/${job.id}`)).json();
    const noted = await page.request.patch(`${baseUrl()}/api/jobs/${job.id}`, { headers: { origin: baseUrl() }, data: { version: current.job.version, notes: secretNote } });
    expect(noted.status()).toBe(200);
    const since = new Date().toISOString();
    const moved = await page.request.post(`${baseUrl()}/api/jobs/${job.id}/moves`, { headers: { origin: baseUrl() }, data: { toStage: "wire", version: (await noted.json()).job.version } });
    expect(moved.status()).toBe(200);

    const mail = await mailFor(job, since);
    // The subject and the first line name the job: work order, unit and the work description as written.
    expect(mail.subject).toBe(`Wiring and run test · Work order ${job.workOrder} · Unit ${job.unit} · ${job.description}`);
    expect(mail.text.split("\n")[0]).toBe(`Work order ${job.workOrder} · Unit ${job.unit} · ${job.description}`);
    // One photo is shared with the customer, so the e-mail may speak of photos.
    expect(mail.text).toContain("See the progress and photos of your truck here:");
    expect(mail.text).toContain("We are wiring and run-testing the kit.");
    expect(mail.text).toContain("When the run test is signed off, your truck is ready for pickup.");
    // No reply-to is set for this server, so the e-mail gives the shop's phone and invites no reply.
    expect(mail.text).toContain("Questions? Call Cold Creek Upfit at (555) 010-4417.");
    expect(`${mail.text}${mail.html}`).not.toMatch(/reply/i);
    const link = mail.text.match(new RegExp(`${baseUrl()}/status/[A-Za-z0-9_-]{43}`))?.[0];
    expect(link, "the status link in the e-mail").toBeTruthy();
    await context.close();

    const customer = await browser.newContext(PHONE);
    const status = await customer.newPage();
    const response = await status.goto(link!);
    expect(response?.status()).toBe(200);
    expect(response?.headers()["cache-control"]).toContain("no-store");
    await status.getByTestId("where-now").waitFor();
    expect(await status.getByTestId("where-now").textContent()).toBe("We are wiring and run-testing the kit.");
    expect(await status.getByTestId("what-next").textContent()).toBe("When the run test is signed off, your truck is ready for pickup.");
    expect(await status.title()).toBe(`Unit ${job.unit} · ${job.workOrder} · Cold Creek Upfit`);
    const heading = await status.getByTestId("job-heading").textContent();
    expect(heading).toContain(job.workOrder);
    expect(heading).toContain(job.description);
    // A customer who prints the page keeps the truck's heading on paper.
    await status.emulateMedia({ media: "print" });
    expect(await status.getByTestId("job-heading").isVisible()).toBe(true);
    await status.emulateMedia({ media: "screen" });
    const photo = status.locator('img[alt="Pump on the PTO"]');
    await photo.scrollIntoViewIfNeeded();
    await expect.poll(() => photo.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBeGreaterThan(0);
    expect(await status.locator('meta[name="robots"]').getAttribute("content")).toContain("noindex");
    expect(await status.locator('meta[name="referrer"]').getAttribute("content")).toBe("no-referrer");
    const html = await status.content();
    expect(html).not.toContain("Frame rail before paint touch-up");
    expect(html).not.toContain("customer still owes");
    await shot(status, "status-page-phone");

    // The office turns the link off: the same URL now gets a plain page with the shop's phone.
    const officeContext = await browser.newContext(DESK);
    const officePage = await signIn(officeContext, "office");
    await officePage.goto(`${baseUrl()}/jobs/${job.id}`);
    await officePage.locator("#photos").scrollIntoViewIfNeeded();
    await sectionShot(officePage, "#photos", "job-photos-desk");
    await sectionShot(officePage, "#messages", "job-messages-desk");
    officePage.once("dialog", (d) => d.accept());
    await officePage.locator("#messages").getByRole("button", { name: "Turn link off" }).click();
    await officePage.locator("#messages").getByText("No working link").waitFor();
    await officeContext.close();

    const revoked = await status.goto(link!);
    expect(revoked?.status()).toBe(404);
    await status.getByText("This status link no longer works").waitFor();
    expect(await status.title()).toBe("Status link not working · Cold Creek Upfit");
    expect(await status.content()).toContain("(555) 010-4417");
    await shot(status, "status-link-off-phone");
    await customer.close();
  });

  it("the status page sends no-referrer and noindex headers (served by the next.config.ts headers rule for /status)", async () => {
    const res = await fetch(`${baseUrl()}/status/${"A".repeat(43)}`);
    expect(res.status).toBe(404);
    expect(res.headers.get("referrer-policy")).toBe("no-referrer");
    expect(res.headers.get("x-robots-tag")).toContain("noindex");
  });
});
