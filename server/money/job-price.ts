import "server-only";
import type { DB } from "@/db";
import { type QuoteLine, quoteLinesOf } from "./quote-lines";
import { agreedPriceCents } from "./totals";

export interface PricedDocument {
  id: number;
  kind: "quote" | "change_order";
  version: number;
  subtotalCents: number;
  taxCents: number;
  totalCents: number;
  depositCents: number;
  decidedAt: string | null;
  lines: QuoteLine[];
}

export interface JobPrice {
  /** The approved quote plus every approved change order, each with its own tax; 0 with none approved. */
  priceCents: number;
  /** The approved quote, or null while none is approved. */
  quote: PricedDocument | null;
  /** Approved change orders, oldest first. Declined, waiting and replaced ones are not part of the price. */
  changeOrders: PricedDocument[];
}

/**
 * What the customer has agreed to pay for the job, and the lines it is made of (an invoice lists
 * them): the approved quote and the approved change orders, nothing else.
 */
export async function jobPrice(db: DB, jobId: number): Promise<JobPrice> {
  const rows = await db
    .selectFrom("quote")
    .select(["id", "kind", "version", "status", "subtotal_cents", "tax_cents", "total_cents", "deposit_cents", "decided_at"])
    .where("job_id", "=", jobId)
    .where("status", "=", "approved")
    .orderBy("version")
    .execute();
  const lines = await quoteLinesOf(
    db,
    rows.map((r) => r.id),
  );
  const docs: PricedDocument[] = rows.map((r) => ({
    id: r.id,
    kind: r.kind,
    version: r.version,
    subtotalCents: r.subtotal_cents,
    taxCents: r.tax_cents,
    totalCents: r.total_cents,
    depositCents: r.deposit_cents,
    decidedAt: r.decided_at,
    lines: lines.get(r.id) ?? [],
  }));
  return { priceCents: agreedPriceCents(rows.map((r) => ({ status: r.status, totalCents: r.total_cents }))), quote: docs.find((d) => d.kind === "quote") ?? null, changeOrders: docs.filter((d) => d.kind === "change_order") };
}

/** The job's price in cents: the approved quote plus approved change orders. */
export async function jobPriceCents(db: DB, jobId: number): Promise<number> {
  return (await jobPrice(db, jobId)).priceCents;
}
