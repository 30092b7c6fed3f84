import { existsSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { type Browser, type BrowserContext, type Page, chromium } from "playwright-core";
import { inject } from "vitest";

export function chromiumPath(): string | null {
  for (const candidate of [process.env.CHROMIUM_PATH, "/usr/bin/chromium", "/usr/bin/chromium-browser"]) {
    if (candidate && existsSync(candidate)) return candidate;
  }
  return null;
}

export function baseUrl() {
  return inject("baseUrl");
}

/** Chromium writes into HOME even with a temporary profile; give it a home of its own. */
export async function launch(): Promise<Browser> {
  const home = mkdtempSync(join(tmpdir(), "baywright-chromium-"));
  return chromium.launch({
    executablePath: chromiumPath()!,
    args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    env: { ...process.env, HOME: home, XDG_CONFIG_HOME: join(home, "config"), XDG_CACHE_HOME: join(home, "cache") },
  });
}

export const PHONE = { viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 };
export const DESK = { viewport: { width: 1440, height: 900 } };

export const DEMO = {
  owner: "owner@cold-creek.example",
  office: "office@cold-creek.example",
  tech: "tech@cold-creek.example",
  password: "upfit-demo-2026",
} as const;

export async function signIn(context: BrowserContext, role: keyof Omit<typeof DEMO, "password">): Promise<Page> {
  const page = await context.newPage();
  await page.goto(`${baseUrl()}/sign-in`);
  await page.getByLabel("E-mail").fill(DEMO[role]);
  await page.getByLabel("Password").fill(DEMO.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  // The office and owner land on the overview, a tech on the board; every journey starts from the board.
  await page.waitForURL((url) => url.pathname === "/" || url.pathname === "/board");
  if (new URL(page.url()).pathname !== "/board") await page.goto(`${baseUrl()}/board`);
  return page;
}

/** Screenshots go to screenshots/ (gitignored) so a person can look at them after the run. */
export async function shot(page: Page, name: string) {
  await page.screenshot({ path: join("screenshots", `${name}.png`), fullPage: true });
}
