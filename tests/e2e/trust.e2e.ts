import Database from "better-sqlite3";
import type { Browser, Page } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { DEMO, DESK, PHONE, baseUrl, launch, signIn } from "./browser";

const enabled = Boolean(baseUrl());

/** Every CSP violation the page reports, from the browser's own event and its console. */
async function watchPolicy(page: Page) {
  const seen: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy|Refused to (load|execute|connect|apply)/i.test(m.text())) seen.push(m.text());
  });
  page.on("pageerror", (e) => seen.push(`page error: ${e.message}`));
  await page.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (e) => console.error(`Content Security Policy violation: ${e.violatedDirective} ${e.blockedURI}`));
  });
  return seen;
}

function tankPhoto() {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="800" height="600"><rect width="800" height="600" fill="#2c4a52"/><rect x="150" y="210" width="500" height="210" rx="100" fill="#c9d1d3"/></svg>`;
  return sharp(Buffer.from(svg)).jpeg({ quality: 80 }).toBuffer();
}

describe.skipIf(!enabled)("the app under its Content-Security-Policy", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("the board moves a card, the calculator computes and a photo uploads with no policy violation", { timeout: 120_000 }, async () => {
    const context = await browser.newContext(DESK);
    const page = await context.newPage();
    const seen = await watchPolicy(page);
    const signedIn = await signIn(context, "tech");
    const seenAfter = await watchPolicy(signedIn);
    await page.close();

    // Board: move the first Fabricate card one column right with the keyboard (a drag through dnd-kit).
    await signedIn.goto(`${baseUrl()}/board`);
    const wo = await signedIn.locator('ul[data-stage="fabricate"] > li[data-card]').first().getAttribute("data-card");
    await signedIn.locator(`li[data-card="${wo}"] button[aria-label^="Drag"]`).focus();
    await signedIn.keyboard.press("Space");
    await signedIn.waitForTimeout(200);
    await signedIn.keyboard.press("ArrowRight");
    await signedIn.waitForTimeout(300);
    await signedIn.keyboard.press("Space");
    await signedIn.locator(`ul[data-stage="pressure_test"] > li[data-card="${wo}"]`).waitFor({ timeout: 10_000 });

    // Calculator: its inputs recompute in the browser.
    await signedIn.goto(`${baseUrl()}/calculator`);
    await signedIn.getByLabel("Pump displacement, in³/rev").fill("4.5");
    await signedIn.getByText("= 73.7 cm³/rev").waitFor();

    // Photos: the browser sends the file to the upload service's host, which the policy names.
    const jobHref = await (await fetch(`${baseUrl()}/api/jobs`, { headers: { cookie: (await context.cookies()).map((c) => `${c.name}=${c.value}`).join("; ") } })).json();
    const jobId = (jobHref.jobs as { id: number; stage: string }[]).find((j) => j.stage === "install")!.id;
    await signedIn.goto(`${baseUrl()}/jobs/${jobId}`);
    const photos = signedIn.locator("#photos");
    await photos.scrollIntoViewIfNeeded();
    await photos.getByLabel("Caption (optional)").fill("Tank under the policy");
    await photos.getByTestId("photo-pick").setInputFiles({ name: "tank.jpg", mimeType: "image/jpeg", buffer: await tankPhoto() });
    await photos.getByText("✓ Saved").first().waitFor({ timeout: 30_000 });
    await photos.locator('img[alt="Tank under the policy"]').waitFor({ timeout: 10_000 });

    expect([...seen, ...seenAfter]).toEqual([]);
    await context.close();
  });

  it("the sign-in page and the status page run on a phone with no policy violation", async () => {
    const context = await browser.newContext(PHONE);
    const page = await context.newPage();
    const seen = await watchPolicy(page);
    await page.goto(`${baseUrl()}/sign-in`);
    await page.getByLabel("E-mail").fill("nobody@shop.example");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByText(/do not match/).waitFor();
    await page.goto(`${baseUrl()}/status/${"A".repeat(43)}`);
    expect(seen).toEqual([]);
    await context.close();
  });

  it("pages carry the policy with a fresh nonce, and the other security headers", async () => {
    const a = await fetch(`${baseUrl()}/sign-in`);
    const b = await fetch(`${baseUrl()}/sign-in`);
    const csp = a.headers.get("content-security-policy") ?? "";
    expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
    expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("form-action 'self'");
    expect(csp).toMatch(/connect-src 'self' http:\/\/127\.0\.0\.1:\d+/);
    expect(b.headers.get("content-security-policy")).not.toBe(csp);
    const nonce = /'nonce-([^']+)'/.exec(csp)![1];
    const html = await a.text();
    const inline = [...html.matchAll(/<script(?![^>]*\bsrc=)([^>]*)>/g)];
    expect(inline.length).toBeGreaterThan(0);
    for (const m of inline) expect(m[1]).toContain(`nonce="${nonce}"`);
    for (const res of [a, await fetch(`${baseUrl()}/api/health`), await fetch(`${baseUrl()}/api/me`)]) {
      expect(res.headers.get("x-content-type-options")).toBe("nosniff");
      expect(res.headers.get("x-frame-options")).toBe("DENY");
      expect(res.headers.get("referrer-policy")).toBeTruthy();
      expect(res.headers.get("x-powered-by")).toBeNull();
      // Served over plain HTTP here: no HSTS.
      expect(res.headers.get("strict-transport-security")).toBeNull();
    }
    expect((await fetch(`${baseUrl()}/api/me`)).headers.get("cache-control")).toBe("no-store");
  });

  it("a due date that is not a real day, written straight into the database, breaks neither the jobs list nor the job page", async () => {
    const sqlite = new Database(inject("databasePath"));
    const job = sqlite.prepare("select id, due_on from job order by id limit 1").get() as { id: number; due_on: string | null };
    sqlite.prepare("update job set due_on = '2026-02-31' where id = ?").run(job.id);
    try {
      const signedIn = await fetch(`${baseUrl()}/api/session`, { method: "POST", headers: { "content-type": "application/json", origin: baseUrl() }, body: JSON.stringify({ email: DEMO.office, password: DEMO.password }) });
      const cookie = (signedIn.headers.get("set-cookie") ?? "").split(";")[0];
      for (const path of ["/jobs?sort=due", `/jobs/${job.id}`, "/board"]) {
        const res = await fetch(`${baseUrl()}${path}`, { headers: { cookie } });
        expect(res.status, path).toBe(200);
        if (path !== "/board") expect(await res.text(), path).toContain("2026-02-31 (not a real date: correct it)");
      }
    } finally {
      sqlite.prepare("update job set due_on = ? where id = ?").run(job.due_on, job.id);
      sqlite.close();
    }
  });

  it("a server action from another site is refused with 403, with or without a forged Origin", async () => {
    const tries: Record<string, string>[] = [{ "sec-fetch-site": "cross-site" }, { origin: "https://elsewhere.example" }, { origin: "not a url" }, {}];
    for (const headers of tries) {
      const res = await fetch(`${baseUrl()}/first-run`, { method: "POST", headers: { ...headers, "next-action": "0".repeat(40), "content-type": "text/plain;charset=UTF-8" }, body: "[]" });
      expect(res.status, JSON.stringify(headers)).toBe(403);
    }
  });

  it("a path with a broken %-escape answers 400, not 500", async () => {
    for (const path of ["/api/jobs/%", "/status/%", "/api/jobs/%E0%A4%A", "/jobs/%zz", "/api/customers/%/x"]) {
      const res = await fetch(`${baseUrl()}${path}`);
      expect(res.status, path).toBe(400);
    }
  });
});
