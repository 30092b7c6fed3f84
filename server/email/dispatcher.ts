import "server-only";
import type { DB } from "@/db";
import type { EmailMessageTable } from "@/db/tables/messaging";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { emailLinkFor, retryLinkFor, workingLink } from "@/server/status/links";
import { jobRoute } from "@/server/status/route";
import { statusUrl, tokenFor } from "@/server/status/tokens";
import { emailEnv } from "./env";
import { recipientsFor } from "./recipients";
import { REPLACED_BY_LATER_MOVE } from "./outbox";
import { quoteDocument, quotePdfName } from "@/server/money/quote-pdf";
import { renderMoneyPdf } from "@/server/money/pdf";
import { fromThousandths } from "@/server/money/totals";
import { invoiceDocument, invoicePdfName } from "@/server/money/invoice-pdf";
import { METHOD_LABELS } from "@/server/money/payments";
import { formatShopTime } from "@/server/records/calendar";
import {
  type InvoiceSentPayload,
  type LinkIssuedPayload,
  type PaymentReceivedPayload,
  type QuoteSentPayload,
  type StageChangedPayload,
  parseInvoicePayload,
  parseLinkPayload,
  parsePayload,
  parseQuotePayload,
  parseReceiptPayload,
} from "./payload";
import { renderInvoiceEmail, renderLinkEmail, renderQuoteEmail, renderReceiptEmail, renderStageEmail, withStatusLink } from "./render";
import type { EmailSender, SendResult } from "./sender";
import { notifySettings } from "./settings";

/** A claimed row is someone's for this long; a process that dies mid-send gives it back when it runs out. */
export const LEASE_MS = 2 * 60_000;
export const MAX_ATTEMPTS = 10;
export const BATCH = 20;

/**
 * The wait after a failed attempt: 30 s, 1 min, 2 min … doubling, never more than an hour. The 10
 * attempts span 3 h 3 min 30 s from the first to the last (30 s + 1 + 2 + 4 + 8 + 16 + 32 min
 * + 1 h + 1 h), so a service outage of up to three hours costs no e-mail.
 */
export function backoffMs(attempts: number): number {
  return Math.min(30_000 * 2 ** Math.max(0, attempts - 1), 60 * 60_000);
}

export { parsePayload, type StageChangedPayload } from "./payload";

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

export const GAVE_UP_MID_SEND = "the last one never finished (the server stopped while sending).";

/**
 * Claiming a row counts as an attempt, whether or not the attempt gets to settle: a row whose
 * send takes the process down each time is claimed at most MAX_ATTEMPTS times, then failed here.
 */
async function claimDue(db: DB, now: Date, limit: number): Promise<{ rows: ClaimedRow[]; abandoned: number }> {
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
    let abandoned = 0;
    for (const row of due) {
      if (row.attempts >= MAX_ATTEMPTS) {
        const failed = await trx
          .updateTable("outbox")
          .set({ status: "failed", last_error: `Gave up after ${row.attempts} attempts: ${GAVE_UP_MID_SEND}` })
          .where("id", "=", row.id)
          .where("status", "=", "pending")
          .where("attempts", "=", row.attempts)
          .executeTakeFirst();
        abandoned += Number(failed.numUpdatedRows);
        continue;
      }
      const claimed = await trx
        .updateTable("outbox")
        .set({ attempts: row.attempts + 1, next_attempt_at: leaseUntil })
        .where("id", "=", row.id)
        .where("status", "=", "pending")
        .where("attempts", "=", row.attempts)
        .executeTakeFirst();
      if (Number(claimed.numUpdatedRows) === 1) mine.push({ ...row, attempts: row.attempts + 1 });
    }
    return { rows: mine, abandoned };
  });
}

function fromAddress(shopName: string, configured: string): string {
  if (configured.includes("<")) return configured;
  const name = shopName.replace(/["\\<>\r\n]/g, "").trim();
  return name ? `"${name}" <${configured}>` : configured;
}

type StoredMessage = Pick<EmailMessageTable, "from_address" | "to_addresses" | "reply_to" | "subject" | "html" | "text" | "status_link_id" | "revision">;

type Prepared = { skip: string } | { message: StoredMessage; token: string };

/**
 * The idempotency key a message is sent under: the outbox id as first rendered, the id and the
 * revision once re-rendered. A new key for a new rendering is required: the service refuses a key
 * used again with a different body, and that refusal reads as "an earlier attempt got through".
 */
export function idempotencyKeyFor(outboxId: string, revision: number): string {
  return revision === 0 ? outboxId : `${outboxId}:r${revision}`;
}

export const LINK_TURNED_OFF = "The office turned off the status link before this e-mail went out; issue a new link, then send the message again.";

function sameAddresses(a: string[], b: string[]) {
  return a.length === b.length && [...a].sort().join("\n") === [...b].sort().join("\n");
}

export const NEW_LINK_TURNED_OFF = "The office turned off this status link before the e-mail went out; issue a new link to send one.";

type Work =
  | { kind: "stage_changed"; payload: StageChangedPayload }
  | { kind: "link_issued"; payload: LinkIssuedPayload }
  | { kind: "quote_sent"; payload: QuoteSentPayload }
  | { kind: "invoice_sent"; payload: InvoiceSentPayload }
  | { kind: "payment_received"; payload: PaymentReceivedPayload };

/** A file made for a message before its first rendering (outside any transaction) and stored with it. */
interface NewAttachment {
  filename: string;
  contentType: string;
  content: Buffer;
}

export const QUOTE_REPLACED = "The office sent a newer version before this e-mail went out; that version has its own e-mail.";

function readWork(row: ClaimedRow): Work | null {
  if (row.kind === "stage_changed") {
    const payload = parsePayload(row.payload);
    return payload ? { kind: "stage_changed", payload } : null;
  }
  if (row.kind === "link_issued") {
    const payload = parseLinkPayload(row.payload);
    return payload ? { kind: "link_issued", payload } : null;
  }
  if (row.kind === "quote_sent") {
    const payload = parseQuotePayload(row.payload);
    return payload ? { kind: "quote_sent", payload } : null;
  }
  if (row.kind === "invoice_sent") {
    const payload = parseInvoicePayload(row.payload);
    return payload ? { kind: "invoice_sent", payload } : null;
  }
  if (row.kind === "payment_received") {
    const payload = parseReceiptPayload(row.payload);
    return payload ? { kind: "payment_received", payload } : null;
  }
  return null;
}

/** The link issued for a link e-mail, exactly that one: a link the office turned off since is not sent. */
async function issuedLink(trx: Parameters<typeof workingLink>[0], jobId: number, linkId: number): Promise<{ id: number; token: string } | "turned_off"> {
  const link = await trx.selectFrom("status_link").select(["id", "nonce", "token_hash", "revoked_at"]).where("id", "=", linkId).where("job_id", "=", jobId).executeTakeFirst();
  const token = link && !link.revoked_at ? tokenFor(link) : null;
  return link && token ? { id: link.id, token } : "turned_off";
}

/**
 * Decides on every attempt whether the row's e-mail still goes and to whom. The first attempt
 * renders and stores it; a later one sends what is stored, under the same key, unless the job's
 * recipients or its status link changed since: then it is rendered again as a new revision.
 */
async function prepare(db: DB, row: ClaimedRow, work: Work, at: string, attachment: NewAttachment | null): Promise<Prepared> {
  const env = emailEnv();
  return db.transaction().execute(async (trx): Promise<Prepared> => {
    const stored = await trx
      .selectFrom("email_message")
      .select(["from_address", "to_addresses", "reply_to", "subject", "html", "text", "status_link_id", "revision"])
      .where("outbox_id", "=", row.id)
      .executeTakeFirst();
    const job = await trx
      .selectFrom("job")
      .innerJoin("truck", "truck.id", "job.truck_id")
      .select(["job.scope", "job.due_on", "job.stage", "job.work_order", "job.description", "truck.unit_number"])
      .where("job.id", "=", row.job_id)
      .executeTakeFirst();
    if (!job) return { skip: "The job no longer exists." };
    const { emailOff, to, names } = await recipientsFor(trx, row.job_id);
    if (emailOff) return { skip: "E-mail is off for this job." };
    const settings = await notifySettings(trx);
    // Checked before the first rendering only: a retry already decided this stage's news goes out.
    if (work.kind === "stage_changed" && !stored && !work.payload.resendOf) {
      const payload = work.payload;
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
      if (later.some((l) => !parsePayload(l.payload)?.resendOf)) return { skip: REPLACED_BY_LATER_MOVE };
    }
    const quote =
      work.kind === "quote_sent"
        ? await trx
            .selectFrom("quote")
            .select(["kind", "version", "status", "subtotal_cents", "taxable_cents", "tax_millipercent", "tax_cents", "total_cents", "deposit_cents"])
            .where("id", "=", work.payload.quoteId)
            .where("job_id", "=", row.job_id)
            .executeTakeFirst()
        : undefined;
    if (work.kind === "quote_sent") {
      if (!quote || quote.status === "draft") return { skip: "The quote this e-mail was for no longer exists." };
      if (quote.status === "superseded" && !stored) return { skip: QUOTE_REPLACED };
    }
    const invoice = work.kind === "invoice_sent" ? await invoiceDocument(trx, work.payload.invoiceId) : null;
    if (work.kind === "invoice_sent" && (!invoice || invoice.status === "void")) return { skip: "The invoice this e-mail was for was voided before it went out." };
    const payment =
      work.kind === "payment_received"
        ? await trx.selectFrom("payment").select(["amount_cents", "method", "at"]).where("id", "=", work.payload.paymentId).where("job_id", "=", row.job_id).executeTakeFirst()
        : undefined;
    if (work.kind === "payment_received" && !payment) return { skip: "The payment this receipt was for is no longer on the job." };
    if (to.length === 0) return { skip: "Nobody on this job gets e-mail updates: choose a contact with an e-mail address." };

    const link =
      work.kind === "link_issued"
        ? await issuedLink(trx, row.job_id, work.payload.linkId)
        : stored
          ? await retryLinkFor(trx, row.job_id, stored.status_link_id, at)
          : await emailLinkFor(trx, row.job_id, at);
    if (link === "turned_off") return { skip: work.kind === "link_issued" ? NEW_LINK_TURNED_OFF : LINK_TURNED_OFF };
    if (stored && link.id === stored.status_link_id && sameAddresses(JSON.parse(stored.to_addresses) as string[], to)) return { message: stored, token: link.token };

    const [shopRow, parts, shared] = await Promise.all([
      trx.selectFrom("shop").select(["name", "phone", "time_zone"]).where("id", "=", 1).executeTakeFirst(),
      trx.selectFrom("part").select(["needs_leak_test", "needs_coating"]).where("job_id", "=", row.job_id).execute(),
      trx.selectFrom("photo").select("id").where("job_id", "=", row.job_id).where("customer_visible", "=", 1).limit(1).executeTakeFirst(),
    ]);
    const shop = shopRow ? { name: shopRow.name, phone: shopRow.phone } : { name: "Your upfit shop", phone: "" };
    const common = {
      shop,
      job: { workOrder: job.work_order, description: job.description, unitNumber: job.unit_number },
      contactNames: names,
      photosShared: Boolean(shared),
      route: jobRoute(job.scope, parts.map((p) => ({ needsLeakTest: p.needs_leak_test === 1, needsCoating: p.needs_coating === 1 }))),
      linkDays: settings.statusLinkDays,
      replyTo: env.EMAIL_REPLY_TO ?? null,
    };
    const rendered =
      work.kind === "link_issued"
        ? renderLinkEmail({ ...common, stage: job.stage })
        : work.kind === "quote_sent" && quote
          ? renderQuoteEmail({
              ...common,
              pdfName: quotePdfName(job.work_order, quote.kind, quote.version),
              quote: {
                kind: quote.kind,
                version: quote.version,
                subtotalCents: quote.subtotal_cents,
                taxableCents: quote.taxable_cents,
                taxRatePercent: fromThousandths(quote.tax_millipercent),
                taxCents: quote.tax_cents,
                totalCents: quote.total_cents,
                depositCents: quote.deposit_cents,
              },
            })
          : work.kind === "invoice_sent" && invoice
            ? renderInvoiceEmail({ ...common, pdfName: invoicePdfName(invoice.workOrder, invoice.number), invoice: { number: invoice.number, figures: invoice.doc } })
          : work.kind === "payment_received" && payment
            ? renderReceiptEmail({
                ...common,
                receipt: {
                  amountCents: payment.amount_cents,
                  paidFor: work.payload.paidFor,
                  methodLabel: METHOD_LABELS[payment.method],
                  // The day the money came in on the shop's clock, not the server's.
                  dateWords: formatShopTime(payment.at, shopRow?.time_zone || "UTC", "EEEE d MMMM yyyy"),
                  balanceAfterCents: work.payload.balanceAfterCents,
                  onAccountCents: work.payload.onAccountCents,
                },
              })
          : work.kind === "stage_changed"
            ? renderStageEmail({ ...common, from: work.payload.from, to: work.payload.to, readyBy: job.due_on })
            : null;
    if (!rendered) return { skip: "Cannot render this message." };
    const message: StoredMessage = {
      from_address: fromAddress(shop.name, env.EMAIL_FROM),
      to_addresses: JSON.stringify(to),
      reply_to: env.EMAIL_REPLY_TO ?? null,
      subject: rendered.subject,
      html: rendered.html,
      text: rendered.text,
      status_link_id: link.id,
      revision: stored ? stored.revision + 1 : 0,
    };
    if (stored) await trx.updateTable("email_message").set({ ...message, provider_id: null }).where("outbox_id", "=", row.id).execute();
    else await trx.insertInto("email_message").values({ outbox_id: row.id, job_id: row.job_id, ...message, provider_id: null, created_at: at }).execute();
    if (attachment && !stored) {
      await trx.insertInto("email_attachment").values({ outbox_id: row.id, position: 0, filename: attachment.filename, content_type: attachment.contentType, content: attachment.content }).onConflict((oc) => oc.doNothing()).execute();
    }
    return { message, token: link.token };
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
  const work = readWork(row);
  if (!work) {
    await db.updateTable("outbox").set({ status: "failed", last_error: `Cannot send a message of kind "${row.kind}" with this content.` }).where("id", "=", row.id).execute();
    return "failed";
  }
  const at = now.toISOString();
  // The PDF is drawn before the transaction (never slow work inside one), once: a retry sends the stored bytes.
  let attachment: NewAttachment | null = null;
  if (work.kind === "quote_sent") {
    const already = await db.selectFrom("email_attachment").select("position").where("outbox_id", "=", row.id).executeTakeFirst();
    const found = already ? null : await quoteDocument(db, work.payload.quoteId);
    if (found) attachment = { filename: quotePdfName(found.workOrder, found.meta.kind, found.meta.version), contentType: "application/pdf", content: await renderMoneyPdf(found.doc) };
  }
  if (work.kind === "invoice_sent") {
    const already = await db.selectFrom("email_attachment").select("position").where("outbox_id", "=", row.id).executeTakeFirst();
    const found = already ? null : await invoiceDocument(db, work.payload.invoiceId);
    if (found && found.status !== "void") attachment = { filename: invoicePdfName(found.workOrder, found.number), contentType: "application/pdf", content: await renderMoneyPdf(found.doc) };
  }
  const prepared = await prepare(db, row, work, at, attachment);
  if ("skip" in prepared) {
    await db.updateTable("outbox").set({ status: "skipped", last_error: prepared.skip }).where("id", "=", row.id).execute();
    return "skipped";
  }
  const { message, token } = prepared;
  const body = withStatusLink(message, statusUrl(token));
  // Nothing is held open while the service is called: the row is leased, not locked.
  const attachments = await db.selectFrom("email_attachment").select(["filename", "content_type", "content"]).where("outbox_id", "=", row.id).orderBy("position").execute();
  const result = await sender.send(
    {
      from: message.from_address,
      to: JSON.parse(message.to_addresses) as string[],
      subject: message.subject,
      html: body.html,
      text: body.text,
      ...(message.reply_to ? { replyTo: message.reply_to } : {}),
      ...(attachments.length ? { attachments: attachments.map((a) => ({ filename: a.filename, contentType: a.content_type, content: Buffer.from(a.content) })) } : {}),
    },
    idempotencyKeyFor(row.id, message.revision),
  );
  return settle(db, row, result, now);
}

/**
 * Sends every outbox row that is due at `now`, once. Safe to run from several places at once:
 * each row is claimed with a lease first. Used by the start-up loop and called directly by tests.
 */
export async function dispatchDueOutbox(db: DB, now: Date, sender: EmailSender, opts: { limit?: number } = {}): Promise<DispatchSummary> {
  const { rows, abandoned } = await claimDue(db, now, opts.limit ?? BATCH);
  const summary: DispatchSummary = { claimed: rows.length, sent: 0, retrying: 0, failed: abandoned, skipped: 0 };
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
