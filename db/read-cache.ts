import "server-only";
import { type DB, dataGeneration } from "./index";

/**
 * Answers that take real work to build (the shop's reports) and are read far more often than the
 * shop writes are kept per connection and key until anything is written, as the board's JSON is
 * (server/jobs/board-cache.ts). The value is shared between readers: treat it as read-only.
 *
 * `refreshAfterMs` is for answers that also change with the clock alone (a running labour clock's
 * hours): once that old, with nothing written since, readers still get the kept answer at once and
 * one fresh build starts behind them; the next readers get the fresh one. After a write every
 * reader waits for a fresh build, as without the option.
 */
const MAX_ENTRIES = 64;
interface Entry { generation: string; value: Promise<unknown>; builtAt: number; refreshing: boolean }
const caches = new WeakMap<DB, Map<string, Entry>>();

export async function cachedUntilWrite<T>(db: DB, key: string, build: () => Promise<T>, options: { refreshAfterMs?: number; now?: () => number } = {}): Promise<T> {
  const now = options.now ?? Date.now;
  let cache = caches.get(db);
  if (!cache) caches.set(db, (cache = new Map()));
  const generation = dataGeneration();
  const hit = cache.get(key);
  if (hit && hit.generation === generation) {
    if (options.refreshAfterMs !== undefined && !hit.refreshing && now() - hit.builtAt >= options.refreshAfterMs) {
      hit.refreshing = true;
      void keep(cache, key, generation, build, now).catch(() => {
        // A failed refresh keeps the older answer; the next reader past the age tries again.
        hit.refreshing = false;
      });
    }
    return hit.value as Promise<T>;
  }
  return keep(cache, key, generation, build, now);
}

async function keep<T>(cache: Map<string, Entry>, key: string, generation: string, build: () => Promise<T>, now: () => number): Promise<T> {
  const value = build();
  const entry: Entry = { generation, value, builtAt: now(), refreshing: false };
  const previous = cache.get(key);
  // A refresh replaces the kept answer only once it is built; a first build is shared at once by
  // readers arriving while it runs. A failed build is not kept.
  const refreshing = previous?.generation === generation && previous.refreshing;
  if (!refreshing) set(cache, key, entry);
  try {
    const result = await value;
    if (refreshing && cache.get(key) === previous && dataGeneration() === generation) set(cache, key, entry);
    // Written while it was built: the next reader builds afresh.
    if (dataGeneration() !== generation && cache.get(key) === entry) cache.delete(key);
    return result;
  } catch (error) {
    if (cache.get(key) === entry) cache.delete(key);
    throw error;
  }
}

function set(cache: Map<string, Entry>, key: string, entry: Entry) {
  cache.delete(key);
  cache.set(key, entry);
  if (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value!);
}
