import "server-only";
import { randomUUID } from "node:crypto";
import type { Transaction } from "kysely";
import type { Database, Stage } from "@/db/schema";
import { type PaymentReceivedPayload, parsePayload } from "./payload";
import { quietSeconds } from "./settings";

type Trx = Transaction<Database>;

export const REPLACED_BY_LATER_MOVE = "A later move replaced this update before it was sent.";
export const BACK_WHERE_TOLD = "The job moved back to where the last e-mail left it before this one went out: nothing new to tell.";

/**
 * What the customer was last told: the stage of the newest message that went out, or is on its
 * way (an attempt was made, so it may have reached them). Messages replaced or skipped told nothing.
 */
async function lastTold(trx: Trx, jobId: number): Promise<Stage | null> {
  const row = await trx
    .selectFrom("outbox")
    .select("payload")
    .where("job_id", "=", jobId)
    .where("kind", "=", "stage_changed")
    .where((eb) => eb.or([eb("status", "=", "sent"), eb.and([eb("status", "=", "pending"), eb("attempts", ">", 0)])]))
    .orderBy("created_at", "desc")
    .orderBy("id", "desc")
    .limit(1)
    .executeTakeFirst();
  return row ? (parsePayload(row.payload)?.to ?? null) : null;
}

export interface QueuedStageMessage {
  /** The message waiting to send, or null when the move leaves nothing new to tell. */
  outboxId: string | null;
  dueAt: string | null;
}

/**
 * The customer's message about a stage change, in the move's own transaction. It waits the quiet
 * period (EMAIL_QUIET_SECONDS, else the shop's setting) before it is due, so:
 * - a further move of the same job inside that time replaces the waiting message (one message,
 *   naming the last stage, told from where the customer last heard);
 * - a job back where the last sent message left it sends nothing;
 * - a reorder inside a column (from = to) sends nothing.
 * Once the dispatcher has tried a message it is no longer replaced: it may have arrived. From then
 * on the outbox's retry, idempotency and lease rules (dispatcher.ts) apply to it as to any row.
 */
export async function queueStageMessage(trx: Trx, move: { jobId: number; from: Stage; to: Stage; at: string }): Promise<QueuedStageMessage> {
  if (move.from === move.to) return { outboxId: null, dueAt: null };
  const waiting = (
    await trx
      .selectFrom("outbox")
      .select(["id", "payload"])
      .where("job_id", "=", move.jobId)
      .where("kind", "=", "stage_changed")
      .where("status", "=", "pending")
      .where("attempts", "=", 0)
      .where("replaced_at", "is", null)
      .orderBy("created_at")
      .orderBy("id")
      .execute()
  ).filter((row) => {
    const payload = parsePayload(row.payload);
    // A message the office asked to send again is its own decision, not the move's.
    return payload !== null && !payload.resendOf;
  });
  const told = await lastTold(trx, move.jobId);
  const before = told ?? (waiting.length ? parsePayload(waiting[0].payload)!.from : move.from);

  if (waiting.length) {
    await trx
      .updateTable("outbox")
      .set({ status: "skipped", replaced_at: move.at, last_error: before === move.to ? BACK_WHERE_TOLD : REPLACED_BY_LATER_MOVE })
      .where("id", "in", waiting.map((w) => w.id))
      .where("attempts", "=", 0)
      .execute();
  }
  if (before === move.to) return { outboxId: null, dueAt: null };

  const dueAt = new Date(Date.parse(move.at) + (await quietSeconds(trx)) * 1000).toISOString();
  const id = randomUUID();
  await trx
    .insertInto("outbox")
    .values({ id, job_id: move.jobId, kind: "stage_changed", payload: JSON.stringify({ from: before, to: move.to }), status: "pending", attempts: 0, next_attempt_at: dueAt, last_error: null, created_at: move.at, sent_at: null })
    .execute();
  return { outboxId: id, dueAt };
}

/**
 * A message the office asked for goes at once (no quiet period): the outbox row is written in the
 * transaction that made what it carries, so it is sent exactly when that commits.
 */
async function queueAtOnce(trx: Trx, input: { jobId: number; at: string }, kind: "link_issued" | "quote_sent" | "invoice_sent" | "payment_received", payload: Record<string, unknown>): Promise<string> {
  const id = randomUUID();
  await trx
    .insertInto("outbox")
    .values({ id, job_id: input.jobId, kind, payload: JSON.stringify(payload), status: "pending", attempts: 0, next_attempt_at: input.at, last_error: null, created_at: input.at, sent_at: null })
    .execute();
  return id;
}

/** The e-mail carrying a status link the office just issued. */
export function queueLinkMessage(trx: Trx, input: { jobId: number; linkId: number; requestedBy: string; at: string }): Promise<string> {
  return queueAtOnce(trx, input, "link_issued", { linkId: input.linkId, requestedBy: input.requestedBy });
}

/** The e-mail carrying a quote or change order the office just sent. */
export function queueQuoteMessage(trx: Trx, input: { jobId: number; quoteId: number; requestedBy: string; at: string }): Promise<string> {
  return queueAtOnce(trx, input, "quote_sent", { quoteId: input.quoteId, requestedBy: input.requestedBy });
}

/** The invoice's e-mail, in the transaction that made the invoice. */
export function queueInvoiceMessage(trx: Trx, input: { jobId: number; invoiceId: number; requestedBy: string; at: string }): Promise<string> {
  return queueAtOnce(trx, input, "invoice_sent", { invoiceId: input.invoiceId, requestedBy: input.requestedBy });
}

/** The receipt for a payment, in the transaction that applied or recorded it. */
export function queueReceiptMessage(trx: Trx, input: { jobId: number; at: string; payload: PaymentReceivedPayload }): Promise<string> {
  return queueAtOnce(trx, input, "payment_received", { ...input.payload });
}
