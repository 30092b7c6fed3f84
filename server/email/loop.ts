import "server-only";
import { getDb } from "@/db";
import { BATCH, dispatchDueOutbox } from "./dispatcher";
import { emailEnv } from "./env";
import { type EmailSender, senderFromEnv } from "./sender";

interface Dispatcher {
  stop(): Promise<void>;
  wake(): void;
}

// On globalThis: the start-up hook and the route handlers are bundled apart but share one process.
const holder = globalThis as unknown as { __baywrightDispatcher?: Dispatcher };

/**
 * Polls the outbox in the server process and sends what is due. Rows left unsent by a stopped or
 * crashed server are picked up on the next start (their lease runs out).
 */
export function startDispatcher(options: { intervalMs?: number; sender?: EmailSender | null } = {}): Dispatcher {
  if (holder.__baywrightDispatcher) return holder.__baywrightDispatcher;
  let intervalMs: number;
  let sender: EmailSender | null;
  try {
    intervalMs = options.intervalMs ?? emailEnv().OUTBOX_POLL_MS;
    sender = options.sender === undefined ? senderFromEnv() : options.sender;
  } catch (err) {
    // A bad setting must not stop the shop's server; it is said loudly and e-mail waits.
    console.error(err instanceof Error ? err.message : err);
    return { stop: async () => undefined, wake: () => undefined };
  }
  if (!sender) console.warn("Customer e-mail is not set up (RESEND_API_KEY is unset): stage e-mails wait in the outbox until it is.");

  let running: Promise<void> | null = null;
  let stopped = false;
  const tick = () => {
    if (running || stopped || !sender) return;
    const run = async () => {
      try {
        // Keep going while batches come back full, so a backlog after an outage drains in one tick.
        for (let round = 0; round < 50 && !stopped; round++) {
          const summary = await dispatchDueOutbox(getDb(), new Date(), sender);
          if (summary.claimed < BATCH) break;
        }
      } catch (err) {
        console.error("Sending customer e-mail failed; the outbox is tried again shortly.", err);
      }
    };
    running = run().finally(() => {
      running = null;
    });
  };
  const timer = setInterval(tick, intervalMs);
  timer.unref();
  tick();

  const dispatcher: Dispatcher = {
    async stop() {
      stopped = true;
      clearInterval(timer);
      await running;
      if (holder.__baywrightDispatcher === dispatcher) holder.__baywrightDispatcher = undefined;
    },
    wake: tick,
  };
  holder.__baywrightDispatcher = dispatcher;
  return dispatcher;
}

/** Sends at once what was just queued (a resend), instead of waiting for the next poll. */
export function wakeDispatcher() {
  holder.__baywrightDispatcher?.wake();
}
