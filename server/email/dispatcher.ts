import "server-only";
import type { DB } from "@/db";
import type { Stage } from "@/db/schema";
import { STAGE_LABELS, isStage } from "@/server/jobs/stages";
import { emailLinkFor, liveLinkToken } from "@/server/status/links";
import { statusUrl } from "@/server/status/tokens";
import { emailEnv } from "./env";
import { recipientsFor } from "./recipients";
import { renderStageEmail, withStatusLink } from "./render";
import type { EmailSender, SendResult } from "./sender";
import { notifySettings } from "./settings";

/** A claimed row is someone's for this long; a process that dies mid-send gives it back when it runs out. */
export const LEASE_MS = 2 * 60_000;
export const MAX_ATTEMPTS = 8;
export const BATCH = 20;

/** 30 s, 1 min, 2 min … capped at an hour: eight attempts span about two hours of an outage. */
export function backoffMs(attempts: number): number {
  return Math.min(30_000 * 2 ** Math.max(0, attempts - 1), 60 * 60_000);
}

export interface StageChangedPayload {
  from: Stage | null;
  to: Stage;
  /** Set when the office asked for a message to go again. */
  resendOf?: string;
  requestedBy?: string;
}

export function parsePayload(raw: string): StageChangedPayload | null {
  try {
    const p = JSON.parse(raw) as Partial<StageChangedPayload>;
    if (typeof p.to !== "string" || !isStage(p.to)) return null;
    if (p.from !== null && (typeof p.from !== "string" || !isStage(p.from))) return null;
    return { from: p.from, to: p.to, resendOf: typeof p.resendOf === "string" ? p.resendOf : undefined, requestedBy: typeof p.requestedBy === "string" ? p.requestedBy : undefined };
  } catch {
    return null;
  }
}

export interface DispatchSummary {
  claimed: number;
  sent: number;
  retrying: number;
  failed: number;
  skipped: number;
}

interface ClaimedRow {
  id: string;
  job_id: number;
  kind: string;
  payload: string;
  attempts: number;
  created_at: string;
}

async function claimDue(db: DB, now: Date, limit: number): Promise<ClaimedRow[]> {
  const nowIso = now.toISOString();
  const leaseUntil = new Date(now.getTime() + LEASE_MS).toISOString();
  return db.transaction().execute(async (trx) => {
    const due = await trx
      .selectFrom("outbox")
      .select(["id", "job_id", "kind", "payload", "attempts", "created_at"])
      .where("status", "=", "pending")
      .where("next_attempt_at", "<=", nowIso)
      .orderBy("created_at")
      .orderBy("id")
      .limit(limit)
      .execute();
    const mine: ClaimedRow[] = [];
    for (const row of due) {
      const claimed = await trx
        .updateTable("outbox")
        .set({ attempts: row.attempts + 1, next_attempt_at: leaseUntil })
        .where("id", "=", row.id)
        .where("status", "=", "pending")
        .where("attempts", "=", row.attempts)
        .executeTakeFirst();
      if (Number(claimed.numUpdatedRows) === 1) mine.push({ ...row, attempts: row.attempts + 1 });
    }
    return mine;
  });
}

function fromAddress(shopName: string, configured: string): string {
  if (configured.includes("<")) return configured;
  const name = shopName.replace(/["\\<>\r\n]/g, "").trim();
  return name ? `"${name}" <${configured}>` : configured;
}

type Prepared = { skip: string } | { message: { from_address: string; to_addresses: string; reply_to: string | null; subject: string; html: string; text: string; status_link_id: number | null } };

/**
 * Renders the row's e-mail once and stores it, or decides it is not to be sent. Later attempts
 * reuse what is stored, so a retry sends the same message under the same idempotency key.
 */
async function prepare(db: DB, row: ClaimedRow, payload: StageChangedPayload, at: string): Promise<Prepared> {
  const stored = await db
    .selectFrom("email_message")
    .select(["from_address", "to_addresses", "reply_to", "subject", "html", "text", "status_link_id"])
    .where("outbox_id", "=", row.id)
    .executeTakeFirst();
  if (stored) return { message: stored };

  const env = emailEnv();
  return db.transaction().execute(async (trx): Promise<Prepared> => {
    const job = await trx
      .selectFrom("job")
      .innerJoin("customer", "customer.id", "job.customer_id")
      .innerJoin("truck", "truck.id", "job.truck_id")
      .select(["job.scope", "job.due_on", "customer.name as customerName", "truck.unit_number", "truck.description"])
      .where("job.id", "=", row.job_id)
      .executeTakeFirst();
    if (!job) return { skip: "The job no longer exists." };
    const { emailOff, to } = await recipientsFor(trx, row.job_id);
    if (emailOff) return { skip: "E-mail is off for this job." };
    const settings = await notifySettings(trx);
    if (!payload.resendOf) {
      if (!settings.notifyStages.includes(payload.to)) return { skip: `The shop does not e-mail customers when a job reaches ${STAGE_LABELS[payload.to]}.` };
      const later = await trx
        .selectFrom("outbox")
        .select(["id", "payload"])
        .where("job_id", "=", row.job_id)
        .where("kind", "=", "stage_changed")
        .where("status", "=", "pending")
        .where("id", "!=", row.id)
        .where("created_at", ">", row.created_at)
        .execute();
      // A card dragged on and straight back should not send two e-mails a minute apart.
      if (later.some((l) => !parsePayload(l.payload)?.resendOf)) return { skip: "A later move replaced this update before it was sent." };
    }
    if (to.length === 0) return { skip: "Nobody on this job receives e-mail: choose a contact with an e-mail address." };

    const shop = (await trx.selectFrom("shop").select(["name", "phone"]).where("id", "=", 1).executeTakeFirst()) ?? { name: "Your upfit shop", phone: "" };
    const rendered = renderStageEmail({
      shop,
      truck: { unitNumber: job.unit_number, description: job.description },
      customerName: job.customerName,
      from: payload.from,
      to: payload.to,
      scope: job.scope,
      readyBy: job.due_on,
      linkDays: settings.statusLinkDays,
    });
    const link = await emailLinkFor(trx, row.job_id, at);
    const message = {
      from_address: fromAddress(shop.name, env.EMAIL_FROM),
      to_addresses: JSON.stringify(to),
      reply_to: env.EMAIL_REPLY_TO ?? null,
      subject: rendered.subject,
      html: rendered.html,
      text: rendered.text,
      status_link_id: link.id,
    };
    await trx.insertInto("email_message").values({ outbox_id: row.id, job_id: row.job_id, ...message, provider_id: null, created_at: at }).execute();
    return { message };
  });
}

/** The status link's token for the stored message; a link turned off since is replaced. */
async function linkTokenFor(db: DB, row: ClaimedRow, linkId: number | null, at: string): Promise<string> {
  const token = linkId ? await liveLinkToken(db, linkId) : null;
  if (token) return token;
  return db.transaction().execute(async (trx) => {
    const link = await emailLinkFor(trx, row.job_id, at);
    await trx.updateTable("email_message").set({ status_link_id: link.id }).where("outbox_id", "=", row.id).execute();
    return link.token;
  });
}

async function settle(db: DB, row: ClaimedRow, result: SendResult, now: Date): Promise<keyof Omit<DispatchSummary, "claimed">> {
  const nowIso = now.toISOString();
  if (result.ok || result.kind === "already_sent") {
    await db
      .updateTable("outbox")
      .set({ status: "sent", sent_at: nowIso, last_error: result.ok ? null : `An earlier attempt got through (${result.reason}).` })
      .where("id", "=", row.id)
      .execute();
    if (result.ok && result.id) await db.updateTable("email_message").set({ provider_id: result.id }).where("outbox_id", "=", row.id).execute();
    return "sent";
  }
  if (result.kind === "permanent" || row.attempts >= MAX_ATTEMPTS) {
    const reason = result.kind === "permanent" ? result.reason : `Gave up after ${row.attempts} attempts: ${result.reason}`;
    await db.updateTable("outbox").set({ status: "failed", last_error: reason }).where("id", "=", row.id).execute();
    return "failed";
  }
  await db
    .updateTable("outbox")
    .set({ next_attempt_at: new Date(now.getTime() + backoffMs(row.attempts)).toISOString(), last_error: result.reason })
    .where("id", "=", row.id)
    .execute();
  return "retrying";
}

async function deliver(db: DB, row: ClaimedRow, now: Date, sender: EmailSender): Promise<keyof Omit<DispatchSummary, "claimed">> {
  const payload = row.kind === "stage_changed" ? parsePayload(row.payload) : null;
  if (!payload) {
    await db.updateTable("outbox").set({ status: "failed", last_error: `Cannot send a message of kind "${row.kind}" with this content.` }).where("id", "=", row.id).execute();
    return "failed";
  }
  const at = now.toISOString();
  const prepared = await prepare(db, row, payload, at);
  if ("skip" in prepared) {
    await db.updateTable("outbox").set({ status: "skipped", last_error: prepared.skip }).where("id", "=", row.id).execute();
    return "skipped";
  }
  const { message } = prepared;
  const token = await linkTokenFor(db, row, message.status_link_id, at);
  const body = withStatusLink(message, statusUrl(token));
  // Nothing is held open while the service is called: the row is leased, not locked.
  const result = await sender.send(
    { from: message.from_address, to: JSON.parse(message.to_addresses) as string[], subject: message.subject, html: body.html, text: body.text, ...(message.reply_to ? { replyTo: message.reply_to } : {}) },
    row.id,
  );
  return settle(db, row, result, now);
}

/**
 * Sends every outbox row that is due at `now`, once. Safe to run from several places at once:
 * each row is claimed with a lease first. Used by the start-up loop and called directly by tests.
 */
export async function dispatchDueOutbox(db: DB, now: Date, sender: EmailSender, opts: { limit?: number } = {}): Promise<DispatchSummary> {
  const rows = await claimDue(db, now, opts.limit ?? BATCH);
  const summary: DispatchSummary = { claimed: rows.length, sent: 0, retrying: 0, failed: 0, skipped: 0 };
  for (const row of rows) {
    let outcome: keyof Omit<DispatchSummary, "claimed">;
    try {
      outcome = await deliver(db, row, now, sender);
    } catch (err) {
      outcome = await settle(db, row, { ok: false, kind: "retry", reason: err instanceof Error ? err.message : String(err) }, now);
    }
    summary[outcome] += 1;
  }
  return summary;
}
