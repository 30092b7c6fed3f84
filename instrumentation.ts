/** Next's start-up hook: starts the customer e-mail dispatcher and the hourly removal of expired sessions in the Node server process. */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { startDispatcher } = await import("./server/email/loop");
  startDispatcher();
  const { getDb } = await import("./db");
  const { startSessionCleanup } = await import("./server/auth/session-cleanup");
  startSessionCleanup(getDb);
}
