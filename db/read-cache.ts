import "server-only";
import { type DB, dataGeneration } from "./index";

/**
 * Answers that take real work to build (the shop's reports) and are read far more often than the
 * shop writes are kept per connection and key until anything is written, as the board's JSON is
 * (server/jobs/board-cache.ts). The value is shared between readers: treat it as read-only.
 */
const MAX_ENTRIES = 64;
const caches = new WeakMap<DB, Map<string, { generation: string; value: Promise<unknown> }>>();

export async function cachedUntilWrite<T>(db: DB, key: string, build: () => Promise<T>): Promise<T> {
  let cache = caches.get(db);
  if (!cache) caches.set(db, (cache = new Map()));
  const generation = dataGeneration();
  const hit = cache.get(key);
  if (hit && hit.generation === generation) return hit.value as Promise<T>;
  const value = build();
  // Readers arriving while it is built share the one build; a failed build is not kept.
  cache.delete(key);
  cache.set(key, { generation, value });
  if (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value!);
  try {
    const result = await value;
    // Written while it was built: the next reader builds afresh.
    if (dataGeneration() !== generation && cache.get(key)?.value === value) cache.delete(key);
    return result;
  } catch (error) {
    if (cache.get(key)?.value === value) cache.delete(key);
    throw error;
  }
}
