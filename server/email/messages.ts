import "server-only";
import { randomUUID } from "node:crypto";
import type { DB } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import { parsePayload } from "./dispatcher";
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
      "email_message.subject",
      "email_message.to_addresses",
    ])
    .where("outbox.job_id", "=", jobId)
    .orderBy("outbox.created_at", "desc")
    .orderBy("outbox.id", "desc")
    .execute();
  return rows.map((r) => {
    const payload = parsePayload(r.payload);
    const state: DeliveryState = r.status === "pending" ? (r.attempts > 0 && r.lastError ? "retrying" : "waiting") : r.status;
    return {
      id: r.id,
      from: payload?.from ?? null,
      to: payload?.to ?? null,
      resendOf: payload?.resendOf ?? null,
      state,
      attempts: r.attempts,
      nextAttemptAt: r.status === "pending" ? r.nextAttemptAt : null,
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
  const original = await db.selectFrom("outbox").select(["id", "job_id", "kind", "payload"]).where("id", "=", outboxId).executeTakeFirst();
  if (!original) throw new ApiError("not_found", "That message was not found.");
  const payload = parsePayload(original.payload);
  if (original.kind !== "stage_changed" || !payload) throw new ApiError("conflict", "That message cannot be sent again.");
  const { emailOff, to } = await recipientsFor(db, original.job_id);
  if (emailOff) throw new ApiError("conflict", "E-mail is off for this job: switch it on under E-mail settings, then send again.");
  if (to.length === 0) throw new ApiError("conflict", "Nobody on this job receives e-mail: choose a contact with an e-mail address first.");
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
