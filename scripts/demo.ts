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

const children = [
  spawn("node", ["fakes/server.mjs"], { stdio: "inherit", env: process.env, detached: true }),
  spawn("npx", ["next", "start", "-p", port], { stdio: "inherit", env: process.env, detached: true }),
];

const password = process.env.DEMO_PASSWORD || DEMO_PASSWORD_DEFAULT;
console.log(`\nBaywright is starting on http://localhost:${port}\nDemo sign-ins (password ${password}):`);
for (const s of DEMO_STAFF.slice(0, 3)) console.log(`  ${s.role.padEnd(6)} ${s.email}`);
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
