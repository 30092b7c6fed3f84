import "server-only";
import type { DB } from "@/db";

/** Removes sessions past their shift-long lifetime; returns how many went. */
export async function deleteExpiredSessions(db: DB, now = new Date()): Promise<number> {
  const res = await db.deleteFrom("session").where("expires_at", "<=", Math.floor(now.getTime() / 1000)).executeTakeFirst();
  return Number(res.numDeletedRows);
}

const EVERY_MS = 60 * 60 * 1000;
let timer: NodeJS.Timeout | undefined;

/**
 * Expired sessions are refused at once, but their rows would stay forever; once an hour (and at
 * start-up) they are deleted. Started from instrumentation.ts in the server process.
 */
export function startSessionCleanup(db: () => DB) {
  if (timer) return;
  const run = () => {
    deleteExpiredSessions(db()).catch((err) => console.error("Deleting expired sessions failed:", err));
  };
  run();
  timer = setInterval(run, EVERY_MS);
  timer.unref();
}
