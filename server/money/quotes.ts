import "server-only";
import type { DB } from "@/db";
import type { LineKind, QuoteKind, QuoteStatus } from "@/db/tables/money";
import { ApiError } from "@/server/http/errors";
import { type QuoteLine, quoteLinesOf } from "./quote-lines";
import { fromThousandths } from "./totals";

export type { QuoteLine } from "./quote-lines";

/** A quote or change order as staff screens and the API show it. */
export interface Quote {
  id: number;
  jobId: number;
  version: number;
  kind: QuoteKind;
  status: QuoteStatus;
  supersedesId: number | null;
  lines: QuoteLine[];
  subtotalCents: number;
  taxableCents: number;
  taxRatePercent: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
  terms: string;
  note: string;
  createdByName: string;
  createdAt: string;
  updatedAt: string;
  sentAt: string | null;
  decidedAt: string | null;
  decidedName: string | null;
  decidedAddress: string | null;
  termsAccepted: boolean | null;
  declineReason: string | null;
}

const QUOTE_COLUMNS = [
  "quote.id",
  "quote.job_id",
  "quote.version",
  "quote.kind",
  "quote.status",
  "quote.supersedes_id",
  "quote.tax_millipercent",
  "quote.subtotal_cents",
  "quote.taxable_cents",
  "quote.tax_cents",
  "quote.total_cents",
  "quote.deposit_cents",
  "quote.terms",
  "quote.note",
  "quote.created_at",
  "quote.updated_at",
  "quote.sent_at",
  "quote.decided_at",
  "quote.decided_name",
  "quote.decided_address",
  "quote.terms_accepted",
  "quote.decline_reason",
  "staff.name as created_by_name",
] as const;

async function withLines(db: DB, rows: Awaited<ReturnType<typeof quoteRows>>): Promise<Quote[]> {
  if (!rows.length) return [];
  const byQuote = await quoteLinesOf(
    db,
    rows.map((r) => r.id),
  );
  return rows.map((r) => ({
    id: r.id,
    jobId: r.job_id,
    version: r.version,
    kind: r.kind,
    status: r.status,
    supersedesId: r.supersedes_id,
    lines: byQuote.get(r.id) ?? [],
    subtotalCents: r.subtotal_cents,
    taxableCents: r.taxable_cents,
    taxRatePercent: fromThousandths(r.tax_millipercent),
    taxCents: r.tax_cents,
    totalCents: r.total_cents,
    depositCents: r.deposit_cents,
    terms: r.terms,
    note: r.note,
    createdByName: r.created_by_name,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
    sentAt: r.sent_at,
    decidedAt: r.decided_at,
    decidedName: r.decided_name,
    decidedAddress: r.decided_address,
    termsAccepted: r.terms_accepted === null ? null : r.terms_accepted === 1,
    declineReason: r.decline_reason,
  }));
}

function quoteRows(db: DB, where: { jobId?: number; quoteId?: number }) {
  let q = db.selectFrom("quote").innerJoin("staff", "staff.id", "quote.created_by").select(QUOTE_COLUMNS);
  if (where.jobId !== undefined) q = q.where("quote.job_id", "=", where.jobId);
  if (where.quoteId !== undefined) q = q.where("quote.id", "=", where.quoteId);
  return q.orderBy("quote.version", "desc").execute();
}

/** Every quote and change order on a job, newest version first. */
export async function quotesForJob(db: DB, jobId: number): Promise<Quote[]> {
  return withLines(db, await quoteRows(db, { jobId }));
}

export async function findQuote(db: DB, quoteId: number): Promise<Quote | null> {
  return (await withLines(db, await quoteRows(db, { quoteId })))[0] ?? null;
}

export async function getQuote(db: DB, quoteId: number): Promise<Quote> {
  const quote = await findQuote(db, quoteId);
  if (!quote) throw new ApiError("not_found", "That quote was not found. Reload the job page.");
  return quote;
}

/** The approved quote and approved change orders: what the job's price is made of. */
export function approvedDocuments(quotes: readonly Quote[]): Quote[] {
  return quotes.filter((q) => q.status === "approved").sort((a, b) => a.version - b.version);
}

export const QUOTE_STATUS_WORDS: Record<QuoteStatus, string> = {
  draft: "Draft",
  sent: "Sent, waiting for the customer",
  approved: "Approved",
  declined: "Declined",
  superseded: "Replaced by a later version",
};

export const KIND_WORDS: Record<QuoteKind, string> = { quote: "Quote", change_order: "Change order" };
