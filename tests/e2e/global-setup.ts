import { type ChildProcess, spawn } from "node:child_process";
import { existsSync, mkdtempSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { TestProject } from "vitest/node";
import { startFakes } from "../../fakes/server.mjs";
import { chromiumPath } from "./browser";

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
    srv.on("error", reject);
  });
}

async function waitFor(url: string, ms: number) {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    try {
      const res = await fetch(url);
      if (res.ok) return;
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`${url} did not answer within ${ms} ms`);
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv) {
  return new Promise<void>((resolve, reject) => {
    const child = spawn(cmd, args, { env, stdio: "inherit" });
    child.on("exit", (code) => (code === 0 ? resolve() : reject(new Error(`${cmd} ${args.join(" ")} exited ${code}`))));
  });
}

export default async function setup(project: TestProject) {
  const browser = chromiumPath();
  if (!browser) {
    const banner = "\n!!! Chromium was not found (set CHROMIUM_PATH or apt-get install chromium): BROWSER TESTS ARE SKIPPED !!!\n";
    if (process.env.REQUIRE_BROWSER === "1") throw new Error(banner + "REQUIRE_BROWSER=1, so this is a failure.");
    console.warn(banner);
    project.provide("baseUrl", "");
    project.provide("emptyShopUrl", "");
    return;
  }
  if (!existsSync(".next/BUILD_ID")) throw new Error("Build first: npm run build (npm test does this for you).");

  const dir = mkdtempSync(join(tmpdir(), "baywright-e2e-"));
  const port = await freePort();
  // The e-mail and upload services' local fake, in this process; the app reaches it through env (fakes/README.md).
  // Card payments too: its signed webhook events go to the demo server's webhook route.
  const fakes = await startFakes({ port: 0, dataDir: join(dir, "fakes"), paymentsWebhookUrl: `http://127.0.0.1:${port}/api/payments/webhook`, paymentsWebhookSecret: "whsec_local_fake" });
  const fakesPort = new URL(fakes.url).port;
  const env = {
    ...process.env,
    DATABASE_PATH: join(dir, "e2e.db"),
    PORT: String(port),
    NODE_ENV: "production" as const,
    DEMO_PASSWORD: "upfit-demo-2026",
    APP_URL: `http://127.0.0.1:${port}`,
    PHOTOS_DIR: join(dir, "photos"),
    OUTBOX_POLL_MS: "1000",
    // Stage e-mails wait this long after a move (the shop's 3 minutes would outlast every test).
    EMAIL_QUIET_SECONDS: "3",
    RESEND_API_KEY: "re_local_fake",
    RESEND_BASE_URL: `${fakes.url}/resend`,
    UPLOADTHING_TOKEN: Buffer.from(JSON.stringify({ apiKey: "sk_local_coldcreek_fake", appId: "coldcreekdev", regions: ["local1"] })).toString("base64"),
    UPLOADTHING_INGEST_URL: fakes.url,
    UPLOADTHING_API_URL: fakes.url,
    UPLOADTHING_UFS_HOST: `localhost:${fakesPort}`,
    UPLOADTHING_UFS_APP_ID_LOCATION: "path",
    UPLOADTHING_LOG_LEVEL: "Error",
    PAYMENTS_SECRET_KEY: "sk_local_fake",
    PAYMENTS_WEBHOOK_SECRET: "whsec_local_fake",
    PAYMENTS_API_URL: fakes.url,
  };
  // A second shop on its own database with the tables and nothing in them, as a new shop starts:
  // the same build, fakes and settings, only its own port, address, database and photos.
  const emptyPort = await freePort();
  const emptyEnv = {
    ...env,
    DATABASE_PATH: join(dir, "empty-shop.db"),
    PORT: String(emptyPort),
    APP_URL: `http://127.0.0.1:${emptyPort}`,
    PHOTOS_DIR: join(dir, "empty-shop-photos"),
  };
  await Promise.all([run("npx", ["tsx", "scripts/seed.ts"], env), run("npx", ["tsx", "scripts/migrate.ts"], emptyEnv)]);
  const start = (e: typeof env) => spawn("npx", ["next", "start", "-p", e.PORT, "-H", "127.0.0.1"], { env: e, stdio: ["ignore", "inherit", "inherit"], detached: true });
  const servers: ChildProcess[] = [start(env), start(emptyEnv)];
  const baseUrl = `http://127.0.0.1:${port}`;
  const emptyShopUrl = emptyEnv.APP_URL;
  await Promise.all([waitFor(`${baseUrl}/api/health`, 60_000), waitFor(`${emptyShopUrl}/api/health`, 60_000)]);
  project.provide("baseUrl", baseUrl);
  project.provide("databasePath", env.DATABASE_PATH);
  project.provide("fakesUrl", fakes.url);
  project.provide("emptyShopUrl", emptyShopUrl);

  return async () => {
    // next start forks a next-server child: end the whole process group so the port and database are freed.
    for (const server of servers) {
      try {
        if (server.pid) process.kill(-server.pid, "SIGTERM");
      } catch {
        // already gone
      }
    }
    await fakes.close();
    rmSync(dir, { recursive: true, force: true });
  };
}

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
    databasePath: string;
    fakesUrl: string;
    /** A second server on a database with the tables and no rows: a shop on its first day. */
    emptyShopUrl: string;
  }
}
