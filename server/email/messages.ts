import "server-only";
import { randomUUID } from "node:crypto";
import type { DB } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import { parsePayload } from "./dispatcher";
import { queueQuoteMessage, queueReceiptMessage } from "./outbox";
import { parseQuotePayload, parseReceiptPayload } from "./payload";
import { recipientsFor } from "./recipients";

export type DeliveryState = "sent" | "waiting" | "retrying" | "failed" | "skipped";

/** Every customer message of a job, newest first, with where its delivery stands. */
export async function listMessages(db: DB, jobId: number) {
  const rows = await db
    .selectFrom("outbox")
    .leftJoin("email_message", "email_message.outbox_id", "outbox.id")
    .select([
      "outbox.id",
      "outbox.kind",
      "outbox.payload",
      "outbox.status",
      "outbox.attempts",
      "outbox.next_attempt_at as nextAttemptAt",
      "outbox.last_error as lastError",
      "outbox.created_at as createdAt",
      "outbox.sent_at as sentAt",
      "outbox.replaced_at as replacedAt",
      "email_message.subject",
      "email_message.to_addresses",
    ])
    .where("outbox.job_id", "=", jobId)
    .orderBy("outbox.created_at", "desc")
    .orderBy("outbox.id", "desc")
    .execute();
  return rows.map((r) => {
    const payload = r.kind === "stage_changed" ? parsePayload(r.payload) : null;
    const receipt = r.kind === "payment_received" ? parseReceiptPayload(r.payload) : null;
    const state: DeliveryState = r.status === "pending" ? (r.attempts > 0 && r.lastError ? "retrying" : "waiting") : r.status;
    return {
      id: r.id,
      kind: r.kind,
      from: payload?.from ?? null,
      to: payload?.to ?? null,
      resendOf: payload?.resendOf ?? receipt?.resendOf ?? null,
      state,
      attempts: r.attempts,
      nextAttemptAt: r.status === "pending" ? r.nextAttemptAt : null,
      /** Not tried yet and waiting out the quiet period: when it goes unless the card moves again. */
      goesOutAt: r.status === "pending" && r.attempts === 0 ? r.nextAttemptAt : null,
      /** A later move replaced it before it went: it is never sent again. */
      replaced: r.replacedAt !== null,
      reason: r.lastError,
      createdAt: r.createdAt,
      sentAt: r.sentAt,
      subject: r.subject,
      recipients: r.to_addresses ? (JSON.parse(r.to_addresses) as string[]) : [],
    };
  });
}
export type MessageRow = Awaited<ReturnType<typeof listMessages>>[number];

/**
 * Queues the message again as a new outbox row: a new id is a new idempotency key, so the
 * service really sends it again, rendered with today's recipients, date and link.
 */
export async function resendMessage(db: DB, actor: StaffUser, outboxId: string) {
  const original = await db.selectFrom("outbox").select(["id", "job_id", "kind", "payload", "replaced_at"]).where("id", "=", outboxId).executeTakeFirst();
  if (!original) throw new ApiError("not_found", "That message was not found.");
  if (original.kind === "link_issued") throw new ApiError("conflict", "A status link e-mail is not sent again: issue a new link and choose to e-mail it to the contacts.");
  if (original.kind === "quote_sent") return resendQuoteMessage(db, actor, original);
  if (original.kind === "payment_received") return resendReceipt(db, actor, original);
  const payload = parsePayload(original.payload);
  if (original.kind !== "stage_changed" || !payload) throw new ApiError("conflict", "That message cannot be sent again.");
  if (original.replaced_at) throw new ApiError("conflict", "A later move replaced this message, so it is not sent again: it no longer says where the job is. Send the newest message again instead.");
  const { emailOff, to } = await recipientsFor(db, original.job_id);
  if (emailOff) throw new ApiError("conflict", "E-mail is off for this job: switch it on under E-mail settings, then send again.");
  if (to.length === 0) throw new ApiError("conflict", "Nobody on this job gets e-mail updates: choose a contact with an e-mail address first.");
  const at = new Date().toISOString();
  const row = {
    id: randomUUID(),
    job_id: original.job_id,
    kind: "stage_changed" as const,
    payload: JSON.stringify({ from: payload.from, to: payload.to, resendOf: original.id, requestedBy: actor.id }),
    status: "pending" as const,
    attempts: 0,
    next_attempt_at: at,
    last_error: null,
    created_at: at,
    sent_at: null,
  };
  await db.insertInto("outbox").values(row).execute();
  return (await listMessages(db, original.job_id)).find((m) => m.id === row.id)!;
}

/**
 * A quote's e-mail sent again (the customer lost it, or the service refused it): a new row, so a new
 * key, with the PDF drawn again. Only while that version is the one the customer can see: a version
 * replaced by a newer one is not sent again.
 */
async function resendQuoteMessage(db: DB, actor: StaffUser, original: { id: string; job_id: number; payload: string }) {
  const payload = parseQuotePayload(original.payload);
  if (!payload) throw new ApiError("conflict", "That message cannot be sent again.");
  const quote = await db.selectFrom("quote").select(["status", "version"]).where("id", "=", payload.quoteId).where("job_id", "=", original.job_id).executeTakeFirst();
  if (!quote || quote.status === "draft") throw new ApiError("conflict", "The quote this e-mail was for no longer exists.");
  if (quote.status === "superseded") throw new ApiError("conflict", `Version ${quote.version} was replaced by a newer version; send the newest one's e-mail again instead.`);
  const { emailOff, to } = await recipientsFor(db, original.job_id);
  if (emailOff) throw new ApiError("conflict", "E-mail is off for this job: switch it on under E-mail settings, then send again.");
  if (to.length === 0) throw new ApiError("conflict", "Nobody on this job gets e-mail updates: choose a contact with an e-mail address first.");
  const id = await db.transaction().execute((trx) => queueQuoteMessage(trx, { jobId: original.job_id, quoteId: payload.quoteId, requestedBy: actor.name, at: new Date().toISOString() }));
  return (await listMessages(db, original.job_id)).find((m) => m.id === id)!;
}

/**
 * A receipt sent again (the customer lost it): a new row with the same figures as the first, since
 * it is the receipt for that payment as it stood, not a new statement of the job's balance.
 */
async function resendReceipt(db: DB, actor: StaffUser, original: { id: string; job_id: number; payload: string }) {
  const payload = parseReceiptPayload(original.payload);
  if (!payload) throw new ApiError("conflict", "That message cannot be sent again.");
  const payment = await db.selectFrom("payment").select("id").where("id", "=", payload.paymentId).where("job_id", "=", original.job_id).executeTakeFirst();
  if (!payment) throw new ApiError("conflict", "The payment this receipt was for is no longer on the job.");
  const { emailOff, to } = await recipientsFor(db, original.job_id);
  if (emailOff) throw new ApiError("conflict", "E-mail is off for this job: switch it on under E-mail settings, then send again.");
  if (to.length === 0) throw new ApiError("conflict", "Nobody on this job gets e-mail updates: choose a contact with an e-mail address first.");
  const id = await db
    .transaction()
    .execute((trx) => queueReceiptMessage(trx, { jobId: original.job_id, at: new Date().toISOString(), payload: { ...payload, resendOf: payload.resendOf ?? original.id, requestedBy: actor.name } }));
  return (await listMessages(db, original.job_id)).find((m) => m.id === id)!;
}

/**
 * Sends a message waiting out its quiet period now, instead of at its time. Only a message not yet
 * tried: one already on its way follows the retry schedule.
 */
export async function sendNow(db: DB, outboxId: string) {
  const row = await db.selectFrom("outbox").select(["id", "job_id", "status", "attempts", "replaced_at"]).where("id", "=", outboxId).executeTakeFirst();
  if (!row) throw new ApiError("not_found", "That message was not found.");
  if (row.replaced_at) throw new ApiError("conflict", "A later move replaced this message; the newest one on the list is the one that goes.");
  if (row.status !== "pending") throw new ApiError("conflict", "This message is no longer waiting to send; use Send again to send it once more.");
  if (row.attempts > 0) throw new ApiError("conflict", "This message is already on its way; it is retried on its own schedule.");
  const at = new Date().toISOString();
  const updated = await db.updateTable("outbox").set({ next_attempt_at: at }).where("id", "=", outboxId).where("status", "=", "pending").where("attempts", "=", 0).where("replaced_at", "is", null).executeTakeFirst();
  if (Number(updated.numUpdatedRows) !== 1) throw new ApiError("conflict", "The message changed while you asked (the card moved or it started sending); look at the list again.");
  return (await listMessages(db, row.job_id)).find((m) => m.id === outboxId)!;
}
