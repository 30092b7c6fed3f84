import { spawn, spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import { createDb, databasePath } from "@/db";
import { DEMO_PASSWORD_DEFAULT, DEMO_STAFF, seedDemo } from "@/db/seed";
import { migrateToLatest } from "@/migrations";

const port = process.env.PORT ?? "3000";
const db = createDb();
await migrateToLatest(db);
const staff = await db.selectFrom("staff").select("id").limit(1).executeTakeFirst();
if (!staff) {
  await seedDemo(db);
  console.log(`Seeded the demo shop into ${databasePath()}.`);
}
await db.destroy();

if (!existsSync(".next/BUILD_ID")) {
  console.log("Building Baywright (first run only, about a minute)…");
  const build = spawnSync("npx", ["next", "build"], { stdio: "inherit" });
  if (build.status !== 0) process.exit(build.status ?? 1);
}

// Without real keys the app talks to the local fake of the e-mail and upload services (fakes/README.md).
const fakesUrl = `http://127.0.0.1:${process.env.FAKES_PORT ?? "4010"}`;
const fakeEmail = process.env.RESEND_API_KEY ? {} : { RESEND_API_KEY: "re_local_fake", RESEND_BASE_URL: `${fakesUrl}/resend` };
const fakeUploads = process.env.UPLOADTHING_TOKEN
  ? {}
  : {
      UPLOADTHING_TOKEN: Buffer.from(JSON.stringify({ apiKey: "sk_local_coldcreek_fake", appId: "coldcreekdev", regions: ["local1"] })).toString("base64"),
      UPLOADTHING_INGEST_URL: fakesUrl,
      UPLOADTHING_API_URL: fakesUrl,
      UPLOADTHING_UFS_HOST: `localhost:${new URL(fakesUrl).port}`,
      UPLOADTHING_UFS_APP_ID_LOCATION: "path",
    };
const appUrl = process.env.APP_URL ?? `http://localhost:${port}`;
// Card payments: the fake takes the SDK's calls and posts signed webhook events back to the app.
const fakePayments = process.env.PAYMENTS_SECRET_KEY
  ? {}
  : { PAYMENTS_SECRET_KEY: "sk_local_fake", PAYMENTS_WEBHOOK_SECRET: "whsec_local_fake", PAYMENTS_API_URL: fakesUrl, PAYMENTS_WEBHOOK_URL: `${appUrl}/api/payments/webhook` };
const appEnv = { ...process.env, APP_URL: appUrl, ...fakeEmail, ...fakeUploads, ...fakePayments };

const children = [
  spawn("node", ["fakes/server.mjs"], { stdio: "inherit", env: { ...process.env, ...fakeUploads, ...fakePayments }, detached: true }),
  spawn("npx", ["next", "start", "-p", port], { stdio: "inherit", env: appEnv, detached: true }),
];

const password = process.env.DEMO_PASSWORD || DEMO_PASSWORD_DEFAULT;
console.log(`\nBaywright is starting on http://localhost:${port}\nDemo sign-ins (password ${password}):`);
for (const s of DEMO_STAFF.slice(0, 3)) console.log(`  ${s.role.padEnd(6)} ${s.email}`);
if (!process.env.RESEND_API_KEY) console.log(`Customer e-mail goes to the local fake: see what was sent at ${fakesUrl}/__fake/emails`);
if (!process.env.PAYMENTS_SECRET_KEY) console.log(`Card payments go to the local fake's checkout page: see them at ${fakesUrl}/__fake/payments`);
console.log("Press Ctrl+C to stop.\n");

// `next start` forks a next-server child: end each whole process group so the port and the
// database file are let go.
const stop = () => {
  for (const child of children) {
    try {
      if (child.pid) process.kill(-child.pid, "SIGTERM");
    } catch {
      // already gone
    }
  }
  process.exit(0);
};
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
