import "server-only";
import { TZDate } from "@date-fns/tz";
import { format } from "date-fns";
import type { DB } from "@/db";
import { ApiError } from "@/server/http/errors";
import { LINE_KIND_WORDS } from "./document";
import { type MoneyDocument, renderMoneyPdf } from "./pdf";
import { quoteLinesOf } from "./quote-lines";
import { fromThousandths } from "./totals";

export interface QuotePdf {
  filename: string;
  content: Buffer;
  quote: { id: number; jobId: number; kind: "quote" | "change_order"; version: number; status: string };
}

/** "WO-26-0012-quote-v2.pdf": safe in any mail client and file system. */
export function quotePdfName(workOrder: string, kind: "quote" | "change_order", version: number): string {
  const wo = workOrder.replace(/[^A-Za-z0-9-]/g, "");
  return `${wo || "job"}-${kind === "quote" ? "quote" : "change-order"}-v${version}.pdf`;
}

/** The quote or change order with the shop's, customer's and job's names, ready for `renderMoneyPdf`. */
export async function quoteDocument(db: DB, quoteId: number): Promise<{ doc: MoneyDocument; meta: QuotePdf["quote"]; workOrder: string } | null> {
  const row = await db
    .selectFrom("quote")
    .innerJoin("job", "job.id", "quote.job_id")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .innerJoin("customer", "customer.id", "job.customer_id")
    .select([
      "quote.id",
      "quote.job_id",
      "quote.kind",
      "quote.version",
      "quote.status",
      "quote.subtotal_cents",
      "quote.taxable_cents",
      "quote.tax_millipercent",
      "quote.tax_cents",
      "quote.total_cents",
      "quote.deposit_cents",
      "quote.terms",
      "quote.sent_at",
      "quote.created_at",
      "job.work_order",
      "job.description",
      "truck.unit_number",
      "customer.name as customer_name",
    ])
    .where("quote.id", "=", quoteId)
    .executeTakeFirst();
  if (!row) return null;
  const [shop, lines] = await Promise.all([
    db.selectFrom("shop").select(["name", "address", "phone", "time_zone"]).where("id", "=", 1).executeTakeFirst(),
    quoteLinesOf(db, [row.id]),
  ]);
  const at = new Date(row.sent_at ?? row.created_at);
  const zone = shop?.time_zone || "UTC";
  const kind = row.kind;
  const doc: MoneyDocument = {
    title: kind === "quote" ? "Quote" : "Change order",
    number: `Version ${row.version}${row.status === "draft" ? " (draft, not sent)" : ""}`,
    dateWords: format(new TZDate(at, zone), "d MMMM yyyy"),
    shop: { name: shop?.name ?? "", address: shop?.address ?? "", phone: shop?.phone ?? "" },
    customer: { name: row.customer_name },
    job: { workOrder: row.work_order, description: row.description, unitNumber: row.unit_number },
    lines: (lines.get(row.id) ?? []).map((l) => ({ description: l.description, kindWords: LINE_KIND_WORDS[l.kind], quantity: l.quantity, unitPriceCents: l.unitPriceCents, amountCents: l.amountCents, taxable: l.taxable })),
    subtotalCents: row.subtotal_cents,
    taxableCents: row.taxable_cents,
    taxRatePercent: fromThousandths(row.tax_millipercent),
    taxCents: row.tax_cents,
    totalCents: row.total_cents,
    depositCents: kind === "quote" ? row.deposit_cents : undefined,
    terms: row.terms,
    createdAt: at,
  };
  return { doc, meta: { id: row.id, jobId: row.job_id, kind, version: row.version, status: row.status }, workOrder: row.work_order };
}

/** The PDF of a quote or change order; 404 when there is none. */
export async function quotePdf(db: DB, quoteId: number): Promise<QuotePdf> {
  const found = await quoteDocument(db, quoteId);
  if (!found) throw new ApiError("not_found", "That quote was not found. Reload the job page.");
  return { filename: quotePdfName(found.workOrder, found.meta.kind, found.meta.version), content: await renderMoneyPdf(found.doc), quote: found.meta };
}

/** The answer that downloads a PDF: never cached, named for the file it is. */
export function pdfResponse(pdf: { filename: string; content: Buffer }): Response {
  return new Response(new Uint8Array(pdf.content), {
    status: 200,
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `attachment; filename="${pdf.filename}"`,
      "Cache-Control": "no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
}
