/** Next's start-up hook: starts the customer e-mail dispatcher in the Node server process. */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { startDispatcher } = await import("./server/email/loop");
  startDispatcher();
}
