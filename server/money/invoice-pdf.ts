import "server-only";
import { TZDate } from "@date-fns/tz";
import { format } from "date-fns";
import type { DB } from "@/db";
import { LINE_KIND_WORDS } from "./document";
import type { MoneyDocument } from "./pdf";
import { quoteLinesOf } from "./quote-lines";
import { fromThousandths } from "./totals";

/** "WO-26-0012-invoice-INV-26-0004.pdf": safe in any mail client and file system. */
export function invoicePdfName(workOrder: string, number: string): string {
  const clean = (s: string) => s.replace(/[^A-Za-z0-9-]/g, "");
  return `${clean(workOrder) || "job"}-invoice-${clean(number) || "draft"}.pdf`;
}

/**
 * The invoice as a document for `renderMoneyPdf`: every line of the approved quote and approved
 * change orders, their figures added up (each was taxed once on its own), the deposit and other
 * money received, and the balance.
 */
export async function invoiceDocument(db: DB, invoiceId: number): Promise<{ doc: MoneyDocument; number: string; workOrder: string; status: string } | null> {
  const inv = await db
    .selectFrom("invoice")
    .innerJoin("job", "job.id", "invoice.job_id")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .innerJoin("customer", "customer.id", "job.customer_id")
    .select(["invoice.id", "invoice.job_id", "invoice.number", "invoice.status", "invoice.total_cents", "invoice.created_at", "job.work_order", "job.description", "truck.unit_number", "customer.name as customer_name"])
    .where("invoice.id", "=", invoiceId)
    .executeTakeFirst();
  if (!inv) return null;
  const [shop, docs, pays] = await Promise.all([
    db.selectFrom("shop").select(["name", "address", "phone", "time_zone"]).where("id", "=", 1).executeTakeFirst(),
    db.selectFrom("quote").selectAll().where("job_id", "=", inv.job_id).where("status", "=", "approved").orderBy("version").execute(),
    db.selectFrom("payment").select(["purpose", "method", "amount_cents"]).where("job_id", "=", inv.job_id).execute(),
  ]);
  const lines = await quoteLinesOf(db, docs.map((d) => d.id));
  const sum = (pick: (d: (typeof docs)[number]) => number) => docs.reduce((s, d) => s + pick(d), 0);
  const deposits = pays.filter((p) => p.purpose === "deposit" && p.method !== "on_account").reduce((s, p) => s + p.amount_cents, 0);
  const since = pays.filter((p) => p.purpose === "invoice" && p.method !== "on_account").reduce((s, p) => s + p.amount_cents, 0);
  const onAccount = pays.filter((p) => p.method === "on_account").reduce((s, p) => s + p.amount_cents, 0);
  const at = new Date(inv.created_at);
  const doc: MoneyDocument = {
    title: "Invoice",
    number: inv.number,
    dateWords: format(new TZDate(at, shop?.time_zone || "UTC"), "d MMMM yyyy"),
    shop: { name: shop?.name ?? "", address: shop?.address ?? "", phone: shop?.phone ?? "" },
    customer: { name: inv.customer_name },
    job: { workOrder: inv.work_order, description: inv.description, unitNumber: inv.unit_number },
    lines: docs.flatMap((d) =>
      (lines.get(d.id) ?? []).map((l) => ({ description: d.kind === "change_order" ? `${l.description} (change order v${d.version})` : l.description, kindWords: LINE_KIND_WORDS[l.kind], quantity: l.quantity, unitPriceCents: l.unitPriceCents, amountCents: l.amountCents, taxable: l.taxable })),
    ),
    subtotalCents: sum((d) => d.subtotal_cents),
    taxableCents: sum((d) => d.taxable_cents),
    taxRatePercent: fromThousandths(docs[0]?.tax_millipercent ?? 0),
    taxCents: sum((d) => d.tax_cents),
    totalCents: inv.total_cents,
    payments: [
      ...(deposits ? [{ label: "Deposit received", amountCents: deposits }] : []),
      ...(since ? [{ label: "Paid since", amountCents: since }] : []),
      ...(onAccount ? [{ label: "On your account", amountCents: onAccount }] : []),
    ],
    balanceCents: Math.max(0, inv.total_cents - deposits - since - onAccount),
    createdAt: at,
  };
  return { doc, number: inv.number, workOrder: inv.work_order, status: inv.status };
}
