import "server-only";
import { randomUUID } from "node:crypto";
import { z } from "zod";
import type { DB } from "@/db";
import type { Transaction } from "kysely";
import type { Database, Role } from "@/db/schema";
import { recordAudit, type AuditActor } from "@/server/audit/record";
import { queueReceiptMessage } from "@/server/email/outbox";
import type { ReceiptPaidFor } from "@/server/email/payload";
import { recipientsFor } from "@/server/email/recipients";
import { ApiError } from "@/server/http/errors";
import { appOrigin } from "@/server/http/origin";
import { createCheckoutSession, PaymentServiceError, paymentsEnv } from "@/server/payments/service";
import { loadJobMoney } from "./job-money";
import { balanceDueCents, depositOwedCents, invoiceOutOfDate, type JobMoney, outOfDateWords } from "./state";
import { formatCents, MAX_CENTS } from "./totals";

export type Purpose = "deposit" | "invoice";

async function jobMoney(db: DB, jobId: number): Promise<JobMoney> {
  return (await loadJobMoney(db, [jobId])).get(jobId)!;
}

/** What the customer is asked to pay now for this purpose (0 when nothing is owed). */
export function amountOwed(m: JobMoney, purpose: Purpose): number {
  if (purpose === "deposit") return m.invoice ? 0 : depositOwedCents(m);
  // An out-of-date invoice asks nothing until it is made again with the change order on it.
  return m.invoice?.status === "open" && !invoiceOutOfDate(m) ? Math.max(0, balanceDueCents(m)) : 0;
}

/**
 * Starts a hosted checkout for what the job owes now (the deposit, or the invoice's balance) and
 * answers the service's page to send the customer to. The service is asked before anything is
 * written (never a slow call inside a transaction); the checkout row then remembers what was asked.
 */
export async function startCheckout(db: DB, jobId: number, purpose: Purpose, token: string): Promise<{ url: string }> {
  const job = await db.selectFrom("job").select(["id", "work_order"]).where("id", "=", jobId).executeTakeFirst();
  if (!job) throw new ApiError("not_found", "Not found.");
  const m = await jobMoney(db, jobId);
  if (purpose === "invoice" && invoiceOutOfDate(m)) {
    throw new ApiError("conflict", `The shop is making invoice ${m.invoice!.number} again with your approved change on it; the new invoice comes by e-mail. Nothing was charged.`);
  }
  const amount = amountOwed(m, purpose);
  if (amount <= 0) {
    throw new ApiError("conflict", purpose === "deposit" ? "No deposit is owed on this work order now. Reload the page." : "Nothing is owed on this invoice now. Reload the page.");
  }
  if (amount < 50) throw new ApiError("conflict", `${formatCents(amount)} is below what can be paid online; pay it at the shop.`);
  const reference = `${jobId}-${purpose}-${randomUUID()}`;
  const back = `${appOrigin()}/status/${encodeURIComponent(token)}`;
  let session;
  try {
    session = await createCheckoutSession({
      amountCents: amount,
      description: purpose === "deposit" ? `Deposit, work order ${job.work_order}` : `Invoice ${m.invoice!.number}, work order ${job.work_order}`,
      successUrl: `${back}?paid=${purpose}#pay`,
      cancelUrl: `${back}?checkout=cancelled#pay`,
      reference,
      idempotencyKey: reference,
    });
  } catch (err) {
    if (err instanceof PaymentServiceError) {
      console.warn(`payments: checkout for job ${jobId} not started: ${err.message}`);
      throw new ApiError("conflict", "The payment service did not answer. Nothing was charged; try again in a minute, or call the shop.");
    }
    throw err;
  }
  const invoiceId = purpose === "invoice" ? ((await db.selectFrom("invoice").select("id").where("job_id", "=", jobId).where("status", "=", "open").executeTakeFirst())?.id ?? null) : null;
  const quoteId =
    purpose === "deposit"
      ? ((await db.selectFrom("quote").select("id").where("job_id", "=", jobId).where("kind", "=", "quote").where("status", "=", "approved").orderBy("version", "desc").executeTakeFirst())?.id ?? null)
      : null;
  await db
    .insertInto("checkout")
    .values({ job_id: jobId, purpose, quote_id: quoteId, invoice_id: invoiceId, amount_cents: amount, currency: session.currency, session_id: session.sessionId, status: "open", created_at: new Date().toISOString() })
    .execute();
  return { url: session.url };
}

/** What the webhook needs of an event: its id and type, and the checkout session it carries. */
export interface PaymentEvent {
  id: string;
  type: string;
  data: { object: { id?: unknown; amount_total?: unknown; currency?: unknown; payment_status?: unknown; object?: unknown } };
}

export type EventOutcome = { outcome: "applied" | "already" } | { outcome: "refused"; reason: string };

const PAID_TYPES = new Set(["checkout.session.completed", "checkout.session.async_payment_succeeded"]);

/** Sets an open invoice paid once nothing is owed; answers the job's money after the payment (for its receipt). */
async function settleInvoiceIfPaid(trx: DB, jobId: number): Promise<JobMoney> {
  const m = await jobMoney(trx, jobId);
  if (m.invoice?.status === "open" && balanceDueCents(m) <= 0) {
    await trx.updateTable("invoice").set({ status: m.receivedCents >= m.priceCents ? "paid" : "on_account" }).where("job_id", "=", jobId).where("status", "=", "open").execute();
  }
  return m;
}

/**
 * The customer's receipt, in the transaction that took the payment (after the invoice is settled, so
 * the balance is the one after this payment). Only money received gets one; nothing is written when
 * nobody on the job gets e-mail updates. The quote version (deposit) and invoice number are those
 * the payment went against, kept in the message so a later change does not rewrite the receipt.
 */
async function queueReceipt(
  trx: Transaction<Database>,
  input: { jobId: number; paymentId: number; purpose: Purpose; quoteId: number | null; requestedBy: string; at: string },
  afterPayment?: JobMoney,
): Promise<string | null> {
  const { emailOff, to } = await recipientsFor(trx, input.jobId);
  if (emailOff || to.length === 0) return null;
  // The money as settling the invoice read it, after this payment; a deposit reads it here.
  const m = afterPayment ?? (await jobMoney(trx, input.jobId));
  let paidFor: ReceiptPaidFor;
  if (input.purpose === "invoice") {
    paidFor = { kind: "invoice", invoiceNumber: m.invoice?.number ?? "" };
    if (!paidFor.invoiceNumber) return null;
  } else {
    const quote = await trx
      .selectFrom("quote")
      .select("version")
      .where("job_id", "=", input.jobId)
      .where("kind", "=", "quote")
      .$if(input.quoteId !== null, (q) => q.where("id", "=", input.quoteId!))
      .$if(input.quoteId === null, (q) => q.where("status", "=", "approved"))
      .orderBy("version", "desc")
      .executeTakeFirst();
    paidFor = { kind: "deposit", quoteVersion: quote?.version ?? null };
  }
  return queueReceiptMessage(trx, {
    jobId: input.jobId,
    at: input.at,
    payload: { paymentId: input.paymentId, paidFor, balanceAfterCents: Math.max(0, balanceDueCents(m)), onAccountCents: m.onAccountCents, requestedBy: input.requestedBy },
  });
}

/**
 * Applies one verified webhook event, once: the event id is the key, so a second delivery of the
 * same event changes nothing. A payment is taken only when the amount and currency are those the
 * checkout asked; anything else is refused and kept with its reason.
 */
export async function applyPaymentEvent(db: DB, event: PaymentEvent): Promise<EventOutcome> {
  return db.transaction().execute(async (trx) => {
    const seen = await trx.selectFrom("payment_event").select(["outcome", "reason"]).where("event_id", "=", event.id).executeTakeFirst();
    if (seen) return seen.outcome === "applied" ? { outcome: "already" } : { outcome: "refused", reason: `event seen before and refused: ${seen.reason}` };
    const now = new Date().toISOString();
    const keep = async (outcome: "applied" | "refused", reason = "") => {
      await trx.insertInto("payment_event").values({ event_id: event.id, type: event.type.slice(0, 100), outcome, reason, received_at: now }).execute();
    };
    const refuse = async (reason: string): Promise<EventOutcome> => {
      await keep("refused", reason);
      return { outcome: "refused", reason };
    };
    const session = event.data?.object ?? {};
    const sessionId = typeof session.id === "string" ? session.id : "";
    if (!event.type.startsWith("checkout.session.") || !sessionId) return refuse(`not an event the shop uses (${event.type.slice(0, 60)})`);
    const checkout = await trx.selectFrom("checkout").selectAll().where("session_id", "=", sessionId).executeTakeFirst();
    if (!checkout) return refuse(`no checkout of this shop has session ${sessionId.slice(0, 80)}`);
    if (event.type === "checkout.session.expired") {
      if (checkout.status === "open") await trx.updateTable("checkout").set({ status: "expired" }).where("id", "=", checkout.id).execute();
      await keep("applied");
      return { outcome: "applied" };
    }
    if (!PAID_TYPES.has(event.type)) return refuse(`not an event the shop uses (${event.type.slice(0, 60)})`);
    if (session.payment_status !== "paid") return refuse(`checkout ${checkout.id} is not paid yet (${String(session.payment_status).slice(0, 30)})`);
    if (checkout.status === "paid") {
      await keep("refused", `checkout ${checkout.id} was already paid`);
      return { outcome: "already" };
    }
    if (session.amount_total !== checkout.amount_cents || session.currency !== checkout.currency) {
      return refuse(`amount ${String(session.amount_total).slice(0, 20)} ${String(session.currency).slice(0, 10)} is not the ${checkout.amount_cents} ${checkout.currency} asked`);
    }
    const payment = await trx
      .insertInto("payment")
      .values({ job_id: checkout.job_id, purpose: checkout.purpose, method: "card", amount_cents: checkout.amount_cents, reference: "Paid online", checkout_id: checkout.id, recorded_by: null, at: now })
      .returning("id")
      .executeTakeFirstOrThrow();
    await trx.updateTable("checkout").set({ status: "paid" }).where("id", "=", checkout.id).execute();
    await keep("applied");
    const job = await trx.selectFrom("job").select("work_order").where("id", "=", checkout.job_id).executeTakeFirstOrThrow();
    await recordAudit(trx, {
      kind: "payment_received",
      actor: null,
      subject: job.work_order,
      summary: `The customer paid ${formatCents(checkout.amount_cents)} online (${checkout.purpose === "deposit" ? "deposit" : "invoice"}).`,
      details: { paymentId: payment.id, checkoutId: checkout.id, amountCents: checkout.amount_cents, eventId: event.id },
    });
    const settled = checkout.purpose === "invoice" ? await settleInvoiceIfPaid(trx, checkout.job_id) : undefined;
    await queueReceipt(trx, { jobId: checkout.job_id, paymentId: payment.id, purpose: checkout.purpose, quoteId: checkout.quote_id, requestedBy: "", at: now }, settled);
    return { outcome: "applied" };
  });
}

export const METHOD_LABELS = { card: "Card (online)", cash: "Cash", check: "Check", on_account: "On account", refund: "Refund" } as const;

export const recordPaymentSchema = z.strictObject({
  purpose: z.enum(["deposit", "invoice"], { error: "Say whether this pays the deposit or the invoice." }),
  method: z.enum(["cash", "check", "on_account"], { error: "Choose cash, check or on account." }),
  amountCents: z
    .number({ error: "Type the amount received." })
    .int({ error: "The amount is whole cents." })
    .positive({ error: "The amount must be more than $0.00." })
    .max(MAX_CENTS, { error: "That amount is larger than any job; check the figure." }),
  reference: z.string({ error: "Type a reference." }).trim().max(120, { error: "The reference is at most 120 characters." }),
});
export type RecordPaymentInput = z.infer<typeof recordPaymentSchema>;

/**
 * The office records money taken at the counter (cash, a check) with a reference; only the owner
 * puts an amount on the customer's account. Never more than is owed for that purpose.
 */
export async function recordPayment(db: DB, actor: AuditActor & { role: Role }, jobId: number, input: RecordPaymentInput) {
  if (input.method === "on_account" && actor.role !== "owner") throw new ApiError("forbidden", "Only the owner puts a job on the customer's account.");
  if (input.method === "check" && input.reference.length < 1) throw new ApiError("validation", "Type the check number as the reference.", { fields: { reference: ["Type the check number."] } });
  return db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select(["id", "work_order"]).where("id", "=", jobId).executeTakeFirst();
    if (!job) throw new ApiError("not_found", "That job was not found.");
    const m = await jobMoney(trx, jobId);
    if (input.purpose === "deposit" && m.quoteStatus !== "approved") throw new ApiError("conflict", "There is no approved quote to take a deposit on yet.");
    if (input.purpose === "invoice" && invoiceOutOfDate(m)) throw new ApiError("conflict", `${outOfDateWords(m.invoice!, m.priceCents)}. The owner voids it and a new one is made before payment is taken against it.`);
    if (input.purpose === "invoice" && m.invoice?.status !== "open") throw new ApiError("conflict", "There is no open invoice on this job; it goes out when the job reaches Ready for pickup.");
    const owed = amountOwed(m, input.purpose);
    if (input.amountCents > owed) {
      throw new ApiError("validation", `That is more than is owed (${formatCents(owed)}). Record ${formatCents(owed)} or less.`, { fields: { amountCents: [`At most ${formatCents(owed)}.`] } });
    }
    const now = new Date().toISOString();
    const payment = await trx
      .insertInto("payment")
      .values({ job_id: jobId, purpose: input.purpose, method: input.method, amount_cents: input.amountCents, reference: input.reference, checkout_id: null, recorded_by: actor.id, at: now })
      .returning("id")
      .executeTakeFirstOrThrow();
    await recordAudit(trx, {
      kind: "payment_recorded",
      actor,
      subject: job.work_order,
      summary: `${actor.name} recorded ${formatCents(input.amountCents)} ${METHOD_LABELS[input.method].toLowerCase()} for the ${input.purpose}${input.reference ? ` (${input.reference})` : ""}.`,
      details: { paymentId: payment.id, purpose: input.purpose, method: input.method, amountCents: input.amountCents, reference: input.reference },
    });
    const settled = input.purpose === "invoice" ? await settleInvoiceIfPaid(trx, jobId) : undefined;
    // On account is owed, not paid: the customer gets no receipt for it.
    if (input.method !== "on_account") await queueReceipt(trx, { jobId, paymentId: payment.id, purpose: input.purpose, quoteId: null, requestedBy: actor.name, at: now }, settled);
    return payment.id;
  });
}

export interface PaymentLine {
  id: number;
  purpose: Purpose;
  method: keyof typeof METHOD_LABELS;
  amountCents: number;
  reference: string;
  recordedBy: string | null;
  at: string;
}

/** The job's payments, oldest first, as the money section lists them. */
export async function listPayments(db: DB, jobId: number): Promise<PaymentLine[]> {
  const rows = await db
    .selectFrom("payment")
    .leftJoin("staff", "staff.id", "payment.recorded_by")
    .select(["payment.id", "payment.purpose", "payment.method", "payment.amount_cents", "payment.reference", "payment.at", "staff.name as staff_name"])
    .where("payment.job_id", "=", jobId)
    .orderBy("payment.at")
    .orderBy("payment.id")
    .execute();
  return rows.map((r) => ({ id: r.id, purpose: r.purpose, method: r.method, amountCents: r.amount_cents, reference: r.reference, recordedBy: r.staff_name, at: r.at }));
}

/** Currency of the shop's online payments, for what is shown beside an amount. */
export const paymentCurrency = () => paymentsEnv().PAYMENTS_CURRENCY;
