import "server-only";
import { dataGeneration } from "@/db";

/**
 * The board is read far more often than it changes (every open board polls it), so its JSON is
 * kept per filter and day until anything is written. Small and bounded: old entries fall out.
 */
const MAX_ENTRIES = 64;
const cache = new Map<string, { generation: string; body: Uint8Array }>();
const encoder = new TextEncoder();

/** The board's JSON, already encoded, so a repeat read costs neither a query nor a copy. */
export async function cachedBoardJson(key: string, build: () => Promise<unknown>): Promise<Uint8Array> {
  const generation = dataGeneration();
  const hit = cache.get(key);
  if (hit && hit.generation === generation) return hit.body;
  const body = encoder.encode(JSON.stringify(await build()));
  // Only keep it if nothing was written while it was built.
  if (dataGeneration() === generation) {
    cache.delete(key);
    cache.set(key, { generation, body });
    if (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value!);
  }
  return body;
}
