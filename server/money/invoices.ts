import "server-only";
import { sql, type Transaction } from "kysely";
import { z } from "zod";
import type { DB } from "@/db";
import type { Database } from "@/db/schema";
import { recordAudit, type AuditActor } from "@/server/audit/record";
import { queueInvoiceMessage } from "@/server/email/outbox";
import { ApiError } from "@/server/http/errors";
import { loadJobMoney } from "./job-money";
import { balanceDueCents } from "./state";
import { formatCents, fromThousandths } from "./totals";

/** The next invoice number of the year the invoice is made in: INV-26-0001, INV-26-0002… */
async function nextInvoiceNumber(trx: DB, at: string): Promise<string> {
  const prefix = `INV-${at.slice(2, 4)}-`;
  // Longest first: past 9999 in a year the numbers grow a digit, and "…-10000" sorts before "…-9999".
  const last = await trx.selectFrom("invoice").select("number").where("number", "like", `${prefix}%`).orderBy(sql`length(number)`, "desc").orderBy("number", "desc").limit(1).executeTakeFirst();
  const n = last ? Number(last.number.slice(prefix.length)) + 1 : 1;
  return `${prefix}${String(n).padStart(4, "0")}`;
}

/**
 * The job's invoice, made when it reaches Ready for pickup (in the move's transaction): the
 * approved quote and approved change orders, less what was received. None when nothing was
 * approved; the live one when it already has one (a job moved back and forward again keeps it).
 */
export async function issueInvoice(trx: Transaction<Database>, jobId: number, at: string, by: string | null): Promise<number | null> {
  const live = await trx.selectFrom("invoice").select("id").where("job_id", "=", jobId).where("status", "!=", "void").executeTakeFirst();
  if (live) return live.id;
  const m = (await loadJobMoney(trx, [jobId])).get(jobId)!;
  if (m.priceCents <= 0) return null;
  const settled = balanceDueCents(m) <= 0;
  const row = await trx
    .insertInto("invoice")
    .values({ job_id: jobId, number: await nextInvoiceNumber(trx, at), status: settled ? (m.onAccountCents > 0 ? "on_account" : "paid") : "open", total_cents: m.priceCents, created_by: by, created_at: at, sent_at: at, void_reason: null, voided_at: null })
    .returning("id")
    .executeTakeFirstOrThrow();
  // E-mailed at once to the contacts who get e-mail updates, with its PDF and the way to pay.
  await queueInvoiceMessage(trx, { jobId, invoiceId: row.id, requestedBy: by ?? "", at });
  return row.id;
}

export const voidInvoiceSchema = z.strictObject({
  reason: z.string({ error: "Say why the invoice is voided." }).trim().min(3, { error: "Say why the invoice is voided (3 characters or more)." }).max(500, { error: "The reason is at most 500 characters." }),
});

/**
 * The owner voids an invoice with a reason; it is never deleted. A new one is made when the job
 * next reaches Ready for pickup, or at once with "Make a new invoice".
 */
export async function voidInvoice(db: DB, actor: AuditActor, invoiceId: number, reason: string) {
  return db.transaction().execute(async (trx) => {
    const inv = await trx.selectFrom("invoice").innerJoin("job", "job.id", "invoice.job_id").select(["invoice.id", "invoice.number", "invoice.status", "invoice.total_cents", "invoice.job_id", "job.work_order"]).where("invoice.id", "=", invoiceId).executeTakeFirst();
    if (!inv) throw new ApiError("not_found", "That invoice was not found.");
    if (inv.status === "void") throw new ApiError("conflict", `Invoice ${inv.number} is already void.`);
    const at = new Date().toISOString();
    await trx.updateTable("invoice").set({ status: "void", void_reason: reason, voided_at: at, voided_by: actor.id }).where("id", "=", inv.id).execute();
    await recordAudit(trx, {
      kind: "invoice_voided",
      actor,
      at,
      subject: inv.work_order,
      summary: `${actor.name} voided invoice ${inv.number} (${formatCents(inv.total_cents)}): ${reason}`,
      details: { invoiceId: inv.id, number: inv.number, totalCents: inv.total_cents, reason },
    });
    return inv.job_id;
  });
}

/** Makes the job's invoice now (after a void, or for a job already past Ready); office and owner. */
export async function reissueInvoice(db: DB, actorId: string, jobId: number) {
  return db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select(["id", "stage"]).where("id", "=", jobId).executeTakeFirst();
    if (!job) throw new ApiError("not_found", "That job was not found.");
    if (job.stage !== "ready" && job.stage !== "delivered") throw new ApiError("conflict", "The invoice goes out when the job reaches Ready for pickup.");
    const id = await issueInvoice(trx, jobId, new Date().toISOString(), actorId);
    if (id === null) throw new ApiError("conflict", "Nothing approved to invoice: send a quote and have it approved first.");
    return id;
  });
}

export interface InvoiceView {
  id: number;
  number: string;
  status: "open" | "paid" | "on_account" | "void";
  createdAt: string;
  sentAt: string | null;
  voidReason: string | null;
  /** The approved quote and change orders it bills, each with its lines and totals. */
  documents: { version: number; kind: "quote" | "change_order"; lines: { description: string; quantity: number; unitPriceCents: number; amountCents: number }[]; subtotalCents: number; taxCents: number; taxRatePercent: number; totalCents: number }[];
  totalCents: number;
  depositsCents: number;
  paidCents: number;
  onAccountCents: number;
  balanceCents: number;
}

/** The job's invoices, newest first (voided ones too, for staff), with what they bill and what is owed. */
export async function jobInvoices(db: DB, jobId: number, opts: { includeVoid?: boolean } = {}): Promise<InvoiceView[]> {
  let q = db.selectFrom("invoice").selectAll().where("job_id", "=", jobId);
  if (!opts.includeVoid) q = q.where("status", "!=", "void");
  const rows = await q.orderBy("id", "desc").execute();
  if (!rows.length) return [];
  const docs = await db.selectFrom("quote").selectAll().where("job_id", "=", jobId).where("status", "=", "approved").orderBy("version").execute();
  const lines = docs.length ? await db.selectFrom("quote_line").selectAll().where("quote_id", "in", docs.map((d) => d.id)).orderBy("position").execute() : [];
  const pays = await db.selectFrom("payment").select(["purpose", "method", "amount_cents"]).where("job_id", "=", jobId).execute();
  const deposits = pays.filter((p) => p.purpose === "deposit" && p.method !== "on_account").reduce((s, p) => s + p.amount_cents, 0);
  const received = pays.filter((p) => p.method !== "on_account").reduce((s, p) => s + p.amount_cents, 0);
  const onAccount = pays.filter((p) => p.method === "on_account").reduce((s, p) => s + p.amount_cents, 0);
  const documents = docs.map((d) => ({
    version: d.version,
    kind: d.kind,
    lines: lines.filter((l) => l.quote_id === d.id).map((l) => ({ description: l.description, quantity: fromThousandths(l.quantity_milli), unitPriceCents: l.unit_price_cents, amountCents: l.amount_cents })),
    subtotalCents: d.subtotal_cents,
    taxCents: d.tax_cents,
    taxRatePercent: fromThousandths(d.tax_millipercent),
    totalCents: d.total_cents,
  }));
  return rows.map((r) => ({
    id: r.id,
    number: r.number,
    status: r.status,
    createdAt: r.created_at,
    sentAt: r.sent_at,
    voidReason: r.void_reason,
    documents,
    totalCents: r.total_cents,
    depositsCents: deposits,
    paidCents: received - deposits,
    onAccountCents: onAccount,
    balanceCents: r.total_cents - received - onAccount,
  }));
}
