import "server-only";
import type { DB } from "@/db";

/*
 * "Last opened" on a status link, written off the request path: a view only notes the link in
 * memory; the writes are made together a second later, in one transaction, at most once an hour
 * per link. A customer reloading the page costs no disk write and never waits for one. A server
 * stopped inside that second loses at most that note (it is a courtesy to the office, not a record
 * of the job).
 */
export const OPENED_EVERY_MS = 60 * 60_000;
const FLUSH_AFTER_MS = 1000;

interface Pending {
  db: DB;
  at: Map<number, string>;
  /** When each link was last noted, so a link is written at most once an hour from this process. */
  noted: Map<number, number>;
  timer: ReturnType<typeof setTimeout> | null;
  flushing: Promise<void> | null;
}

// On globalThis: the page and the route handlers are bundled apart but share one process.
const holder = globalThis as unknown as { __baywrightLinkOpens?: Pending };

export function queueLinkOpened(db: DB, link: { linkId: number; lastOpenedAt: string | null }, now = new Date()) {
  const pending = (holder.__baywrightLinkOpens ??= { db, at: new Map(), noted: new Map(), timer: null, flushing: null });
  pending.db = db;
  const last = Math.max(pending.noted.get(link.linkId) ?? 0, link.lastOpenedAt ? Date.parse(link.lastOpenedAt) : 0);
  if (now.getTime() - last < OPENED_EVERY_MS) return;
  pending.noted.set(link.linkId, now.getTime());
  pending.at.set(link.linkId, now.toISOString());
  if (!pending.timer) {
    pending.timer = setTimeout(() => void flushLinkOpens().catch((err) => console.error("Could not note status links as opened; they are noted on the next view.", err)), FLUSH_AFTER_MS);
    pending.timer.unref?.();
  }
}

/**
 * Writes the queued "opened" notes now (the timer does this by itself; tests and shutdown call
 * it). Flushes run one after another, and the promise settles once this one and any before it
 * have written.
 */
export function flushLinkOpens(): Promise<void> {
  const pending = holder.__baywrightLinkOpens;
  if (!pending) return Promise.resolve();
  if (pending.timer) clearTimeout(pending.timer);
  pending.timer = null;
  const previous = pending.flushing ?? Promise.resolve();
  const mine = previous.catch(() => undefined).then(() => writeNotes(pending));
  pending.flushing = mine;
  return mine.finally(() => {
    if (pending.flushing === mine) pending.flushing = null;
  });
}

async function writeNotes(pending: Pending) {
  if (pending.at.size === 0) return;
  const batch = [...pending.at];
  pending.at.clear();
  const cutoff = Date.now() - OPENED_EVERY_MS;
  for (const [id, t] of pending.noted) if (t < cutoff) pending.noted.delete(id);
  try {
    await pending.db.transaction().execute(async (trx) => {
      for (const [id, at] of batch) {
        await trx
          .updateTable("status_link")
          .set({ last_opened_at: at })
          .where("id", "=", id)
          .where((eb) => eb.or([eb("last_opened_at", "is", null), eb("last_opened_at", "<", at)]))
          .execute();
      }
    });
  } catch (err) {
    // Not written: forget the notes so the next view queues them again.
    for (const [id] of batch) pending.noted.delete(id);
    throw err;
  }
}
