import "server-only";

/**
 * Awaited at the start of a page section that reads its own records inside a Suspense boundary:
 * the section then waits for the next turn of the event loop, so the page's head (title, stage,
 * the move control) is sent before the section is rendered, rather than the whole page waiting
 * for its slowest part. SQLite answers within the same turn, so without this React would render
 * everything before sending anything.
 */
export function afterShell(): Promise<void> {
  return new Promise((resolve) => setImmediate(resolve));
}
