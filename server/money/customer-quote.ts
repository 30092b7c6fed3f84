import "server-only";
import { z } from "zod";
import type { DB } from "@/db";
import type { QuoteKind, QuoteStatus } from "@/db/tables/money";
import { recordAudit } from "@/server/audit/record";
import { ApiError } from "@/server/http/errors";
import { type QuotePdf, quotePdf } from "./quote-pdf";
import { quoteLinesOf } from "./quote-lines";
import { formatCents, fromThousandths } from "./totals";

/** What the truck owner sees of a quote on the status link: the priced lines and terms, nothing of the shop's own notes. */
export interface CustomerQuote {
  id: number;
  version: number;
  kind: QuoteKind;
  status: Exclude<QuoteStatus, "draft" | "superseded">;
  lines: { description: string; quantity: number; unitPriceCents: number; amountCents: number; taxable: boolean }[];
  subtotalCents: number;
  taxableCents: number;
  taxRatePercent: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
  terms: string;
  sentAt: string;
  decidedAt: string | null;
  decidedName: string | null;
  declineReason: string | null;
}

/** Sent, approved and declined versions of the job's quote and change orders, newest first. Drafts and replaced versions are the shop's own. */
export async function customerQuotes(db: DB, jobId: number): Promise<CustomerQuote[]> {
  const rows = await db
    .selectFrom("quote")
    .select(["id", "version", "kind", "status", "subtotal_cents", "taxable_cents", "tax_millipercent", "tax_cents", "total_cents", "deposit_cents", "terms", "sent_at", "decided_at", "decided_name", "decline_reason"])
    .where("job_id", "=", jobId)
    .where("status", "in", ["sent", "approved", "declined"])
    .orderBy("version", "desc")
    .execute();
  if (!rows.length) return [];
  const lines = await quoteLinesOf(
    db,
    rows.map((r) => r.id),
  );
  return rows.map((r) => ({
    id: r.id,
    version: r.version,
    kind: r.kind,
    status: r.status as CustomerQuote["status"],
    lines: (lines.get(r.id) ?? []).map((l) => ({ description: l.description, quantity: l.quantity, unitPriceCents: l.unitPriceCents, amountCents: l.amountCents, taxable: l.taxable })),
    subtotalCents: r.subtotal_cents,
    taxableCents: r.taxable_cents,
    taxRatePercent: fromThousandths(r.tax_millipercent),
    taxCents: r.tax_cents,
    totalCents: r.total_cents,
    depositCents: r.deposit_cents,
    terms: r.terms,
    sentAt: r.sent_at ?? "",
    decidedAt: r.decided_at,
    decidedName: r.decided_name,
    declineReason: r.decline_reason,
  }));
}

export const quoteAnswerSchema = z.discriminatedUnion(
  "decision",
  [
    z.strictObject({
      decision: z.literal("approve"),
      quoteId: z.number({ error: "quoteId must be the quote's number." }).int().positive().max(2 ** 31),
      name: z.string({ error: "Type your name to approve." }).trim().min(2, { error: "Type your full name to approve." }).max(120, { error: "Your name is at most 120 characters." }),
      acceptTerms: z.literal(true, { error: "Tick that you accept the terms to approve." }),
    }),
    z.strictObject({
      decision: z.literal("decline"),
      quoteId: z.number({ error: "quoteId must be the quote's number." }).int().positive().max(2 ** 31),
      reason: z.string({ error: "Say why, so the shop can answer." }).trim().min(2, { error: "Say why, so the shop can answer." }).max(1000, { error: "The reason is at most 1000 characters." }),
    }),
  ],
  { error: "Choose to approve or decline the quote." },
);
export type QuoteAnswer = z.infer<typeof quoteAnswerSchema>;

/**
 * The truck owner's answer on the status link. Only the newest sent version can be answered, and
 * only once; the typed name, the terms ticked, the time and the address are kept on the quote and
 * in the audit trail.
 */
export async function answerQuote(db: DB, jobId: number, answer: QuoteAnswer, address: string | null): Promise<void> {
  await db.transaction().execute(async (trx) => {
    const quote = await trx
      .selectFrom("quote")
      .innerJoin("job", "job.id", "quote.job_id")
      .select(["quote.id", "quote.version", "quote.kind", "quote.status", "quote.total_cents", "job.work_order"])
      .where("quote.id", "=", answer.quoteId)
      .where("quote.job_id", "=", jobId)
      .executeTakeFirst();
    if (!quote || quote.status === "draft") throw new ApiError("not_found", "That quote was not found on this work order. Reload the page.");
    if (quote.status === "superseded") throw new ApiError("conflict", "The shop sent a newer version of this quote. Reload the page to see it.");
    if (quote.status !== "sent") throw new ApiError("conflict", `This version was already ${quote.status}. Call the shop to change it.`);
    const now = new Date().toISOString();
    const what = quote.kind === "quote" ? "quote" : "change order";
    if (answer.decision === "approve") {
      await trx
        .updateTable("quote")
        .set({ status: "approved", decided_at: now, decided_name: answer.name, decided_address: address ?? "", terms_accepted: 1, updated_at: now })
        .where("id", "=", quote.id)
        .execute();
      await recordAudit(trx, {
        kind: "quote_approved",
        actor: null,
        address,
        subject: quote.work_order,
        summary: `“${answer.name}” approved ${what} version ${quote.version} for ${formatCents(quote.total_cents)} on the status link, accepting the terms.`,
        details: { quoteId: quote.id, version: quote.version, name: answer.name, totalCents: quote.total_cents },
      });
    } else {
      await trx
        .updateTable("quote")
        .set({ status: "declined", decided_at: now, decided_address: address ?? "", decline_reason: answer.reason, updated_at: now })
        .where("id", "=", quote.id)
        .execute();
      await recordAudit(trx, {
        kind: "quote_declined",
        actor: null,
        address,
        subject: quote.work_order,
        summary: `The customer declined ${what} version ${quote.version} on the status link: “${answer.reason}”.`,
        details: { quoteId: quote.id, version: quote.version, reason: answer.reason },
      });
    }
  });
}

/**
 * The customer's PDF of a quote or change order on their job: only versions the shop sent (sent,
 * approved, declined); a draft, a replaced version or another job's quote is "not found".
 */
export async function customerQuotePdf(db: DB, jobId: number, quoteId: number): Promise<QuotePdf> {
  const row = await db.selectFrom("quote").select(["id"]).where("id", "=", quoteId).where("job_id", "=", jobId).where("status", "in", ["sent", "approved", "declined"]).executeTakeFirst();
  if (!row) throw new ApiError("not_found", "That quote is not on this status link. Reload the page.");
  return quotePdf(db, row.id);
}
