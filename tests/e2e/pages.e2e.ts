import AxeBuilder from "@axe-core/playwright";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DESK, PHONE, baseUrl, launch, shot, signIn } from "./browser";

const enabled = Boolean(baseUrl());

/**
 * Known findings in screens this suite does not own, each allowed for a named element only, so
 * anything else on the same page still fails. Remove an entry when its screen is fixed.
 */
const TEMPORARY_ALLOWANCES: { path: RegExp; rule: string; target: RegExp; why: string }[] = [];

interface PageCase {
  name: string;
  /** A path, or how to find one in the demo shop. */
  path: string | ((page: Page) => Promise<string>);
  /** A page that answers 404 on purpose. */
  notFound?: boolean;
}

async function firstJob(page: Page) {
  const res = await page.request.get(`${baseUrl()}/api/jobs`);
  expect(res.status()).toBe(200);
  const { jobs } = (await res.json()) as { jobs: { id: number; customerId: number; truckId: number }[] };
  expect(jobs.length).toBeGreaterThan(0);
  return jobs[0]!;
}

/** Every page a signed-in owner can open, the record pages on demo records. */
const PAGES: PageCase[] = [
  { name: "overview", path: "/" },
  { name: "reports", path: "/reports" },
  { name: "reports-throughput", path: "/reports?report=throughput" },
  { name: "reports-coaters", path: "/reports?report=coaters" },
  { name: "reports-workload", path: "/reports?report=workload" },
  { name: "board", path: "/board" },
  { name: "jobs", path: "/jobs" },
  { name: "jobs-search-empty", path: "/jobs?q=NO-SUCH-UNIT-ZZ" },
  { name: "jobs-past-due", path: "/jobs?due=late&sort=due" },
  { name: "job-new", path: "/jobs/new" },
  { name: "job", path: async (p) => `/jobs/${(await firstJob(p)).id}` },
  { name: "shop-sheet", path: async (p) => `/jobs/${(await firstJob(p)).id}/sheet` },
  { name: "customers", path: "/customers" },
  { name: "customer-new", path: "/customers/new" },
  { name: "customer", path: async (p) => `/customers/${(await firstJob(p)).customerId}` },
  { name: "trucks", path: "/trucks" },
  { name: "truck-new", path: "/trucks/new" },
  { name: "truck", path: async (p) => `/trucks/${(await firstJob(p)).truckId}` },
  { name: "coating", path: "/coating" },
  { name: "parts", path: "/parts" },
  { name: "job-costs", path: "/job-costs" },
  { name: "purchase-order", path: async (p) => `/purchase-orders/${(await (await p.request.get(`${baseUrl()}/api/parts-desk`)).json()).orders.at(-1).id}` },
  { name: "calculator", path: "/calculator" },
  { name: "staff", path: "/staff" },
  { name: "settings", path: "/settings" },
  { name: "prices", path: "/prices" },
  { name: "audit", path: "/audit" },
  { name: "account", path: "/account" },
  { name: "not-found-address", path: "/no-such-page", notFound: true },
  { name: "not-found-job", path: "/jobs/999999", notFound: true },
];

/**
 * Console errors, uncaught errors and failed or 4xx/5xx requests while a page loads and settles.
 * The router's own link prefetches (`_rsc`) that it cancels itself are not failures anyone sees;
 * a not-found page's own 404 is expected (its console line too), any other 404 is not.
 */
function watch(page: Page, expectedStatus: (url: string, status: number) => boolean, notFound = false) {
  const problems: string[] = [];
  page.on("console", (msg) => {
    if (msg.type() !== "error") return;
    if (notFound && /status of 404/.test(msg.text()) && !msg.location().url.match(/\.(png|ico|svg|js|css|webmanifest)/)) return;
    problems.push(`console: ${msg.text()}`);
  });
  page.on("pageerror", (err) => problems.push(`page error: ${err.message}`));
  page.on("requestfailed", (req) => {
    const text = req.failure()?.errorText ?? "";
    if (text === "net::ERR_ABORTED" && new URL(req.url()).searchParams.has("_rsc")) return;
    problems.push(`failed: ${req.url()} ${text}`);
  });
  page.on("response", (res) => {
    if (res.status() >= 400 && !expectedStatus(res.url(), res.status())) problems.push(`${res.status()}: ${res.url()}`);
  });
  return problems;
}

async function seriousViolations(page: Page, path: string) {
  const results = await new AxeBuilder({ page }).analyze();
  const found: string[] = [];
  for (const v of results.violations) {
    if (v.impact !== "serious" && v.impact !== "critical") continue;
    for (const node of v.nodes) {
      const target = node.target.join(" ");
      if (TEMPORARY_ALLOWANCES.some((a) => a.rule === v.id && a.path.test(path) && a.target.test(target))) continue;
      found.push(`${v.id} (${v.impact}) at ${target}: ${node.failureSummary?.split("\n")[1]?.trim() ?? v.help}`);
    }
  }
  return found;
}

for (const [size, options] of [["desk", DESK], ["phone", PHONE]] as const) {
  describe.skipIf(!enabled)(`every shop page at ${size} size`, () => {
    let browser: Browser;
    let context: BrowserContext;
    beforeAll(async () => {
      browser = await launch();
      context = await browser.newContext(options);
      await (await signIn(context, "owner")).close();
    });
    afterAll(async () => {
      await browser?.close();
    });

    for (const c of PAGES) {
      it(`${c.name}: no serious accessibility finding, console error or failed request; a skip link to the content`, async () => {
        const page = await context.newPage();
        const path = typeof c.path === "string" ? c.path : await c.path(page);
        const problems = watch(page, (url, status) => Boolean(c.notFound) && status === 404 && new URL(url).pathname === new URL(path, baseUrl()).pathname, c.notFound);
        const res = await page.goto(`${baseUrl()}${path}`);
        expect(res?.status()).toBe(c.notFound ? 404 : 200);
        await page.waitForLoadState("networkidle");
        expect(await page.title()).toMatch(/ · Baywright$/);
        await shot(page, `page-${c.name}-${size}`);

        expect(await seriousViolations(page, path)).toEqual([]);
        expect(problems).toEqual([]);
        // Nothing pushes a page sideways on a phone: wide tables scroll inside their own box.
        if (size === "phone") expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);

        // The skip link is the first thing a keyboard reaches and lands on the page's content.
        await page.keyboard.press("Tab");
        const skip = page.getByRole("link", { name: "Skip to main content" });
        expect(await skip.evaluate((el) => el === document.activeElement)).toBe(true);
        await page.keyboard.press("Enter");
        await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe("main");
        await page.close();
      });
    }

    it("the manifest and icons a phone needs to add the board to its home screen are served", async () => {
      const page = await context.newPage();
      const manifest = await page.request.get(`${baseUrl()}/manifest.webmanifest`);
      expect(manifest.status()).toBe(200);
      const body = (await manifest.json()) as { name: string; start_url: string; theme_color: string; icons: { src: string; sizes: string; purpose?: string }[] };
      expect(body.name).toBe("Baywright");
      expect(body.start_url).toBe("/board");
      // A launcher needs a 192 px and a 512 px icon, and a maskable one it may crop to a circle.
      expect(body.icons.map((i) => i.sizes)).toEqual(expect.arrayContaining(["192x192", "512x512"]));
      expect(body.icons.some((i) => i.purpose === "maskable")).toBe(true);
      for (const src of [...body.icons.map((i) => i.src), "/favicon.ico", "/apple-touch-icon.png"]) {
        const icon = await page.request.get(`${baseUrl()}${src}`);
        expect(icon.status(), src).toBe(200);
      }
      await page.close();
    });
  });
}

describe.skipIf(!enabled)("the menu on a 390 px phone", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const role of ["owner", "tech"] as const) {
    it(`reaches every item for the ${role} through one Menu button, each a 44 px target`, async () => {
      const context = await browser.newContext(PHONE);
      const page = await signIn(context, role);
      const menu = page.getByRole("button", { name: /^Menu/ });
      const nav = page.getByRole("navigation", { name: "Main" });
      // Closed, the list takes no room above the cards.
      expect(await nav.isVisible()).toBe(false);
      await menu.click();
      await shot(page, `menu-open-${role}-phone`);
      const labels = await nav.getByRole("link").allTextContents();
      expect(labels).toEqual([...(role === "owner" ? ["Overview"] : []), "Board", "Jobs", "Customers", "Trucks", "Coating", ...(role === "tech" ? [] : ["Parts", "Hours"]), "Calculator", ...(role === "tech" ? [] : ["Prices", "Reports"]), ...(role === "owner" ? ["Staff", "Settings", "Audit"] : [])]);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);

      for (const label of labels) {
        if (!(await nav.isVisible())) await menu.click();
        const link = nav.getByRole("link", { name: label, exact: true });
        const box = (await link.boundingBox())!;
        expect(box.height).toBeGreaterThanOrEqual(44);
        expect(box.x).toBeGreaterThanOrEqual(0);
        expect(box.x + box.width).toBeLessThanOrEqual(390);
        const href = (await link.getAttribute("href"))!;
        await link.click();
        await page.waitForURL((url) => url.pathname === href);
        await expect.poll(() => nav.isVisible()).toBe(false);
        expect(await menu.textContent()).toContain(label);
      }

      // The signed-in name in the menu leads to the person's own account page.
      await menu.click();
      await page.getByTestId("signed-in-as").click();
      await page.waitForURL(/\/account$/);

      // Escape closes the menu and gives focus back to its button; sign-out sits in the menu too.
      await menu.click();
      await page.keyboard.press("Escape");
      expect(await nav.isVisible()).toBe(false);
      expect(await menu.evaluate((el) => el === document.activeElement)).toBe(true);
      await menu.click();
      expect(await page.getByRole("button", { name: "Sign out", exact: true }).isVisible()).toBe(true);
      await context.close();
    });
  }
});
