import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { formatCents } from "@/components/money";
import { PrintButton } from "@/components/print-button";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { showStoredDate } from "@/server/http/calendar-date";
import { COST_ROLES } from "@/server/parts/mutations";
import { findPurchaseOrder } from "@/server/parts/queries";
import { BOUGHT_PART_KIND_LABELS, BOUGHT_PART_STATE_LABELS } from "@/server/parts/rules";
import { shopSettings } from "@/server/shop/queries";
import { ExpectedDateForm } from "./expected-date-form";

export const metadata: Metadata = { title: "Purchase order" };

const day = (iso: string) => showStoredDate(iso, "EEE d MMM yyyy");

/** A purchase order as it goes to the supplier: prints on one Letter page for a usual order. */
export default async function PurchaseOrderPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePageStaff(COST_ROLES);
  const raw = (await params).id;
  if (!/^[1-9]\d{0,9}$/.test(raw)) notFound();
  const db = getDb();
  const [po, shop] = await Promise.all([findPurchaseOrder(db, Number(raw)), shopSettings(db)]);
  if (!po) notFound();
  const open = po.lines.filter((l) => l.state === "ordered").length;
  return (
    <article className="mx-auto max-w-4xl space-y-4 rounded-lg border border-line bg-panel p-4 sm:p-6 print:border-0 print:p-0">
      <p className="no-print text-sm text-ink-soft"><Link href="/parts" className="underline">Parts desk</Link> / {po.number}</p>
      <header className="flex flex-wrap items-start justify-between gap-4 border-b-2 border-ink pb-3">
        <div>
          <p className="text-lg font-bold">{shop.name}</p>
          {shop.phone && <p>{shop.phone}</p>}
        </div>
        <div className="text-right">
          <h1 className="text-2xl font-bold">Purchase order {po.number}</h1>
          <p>Ordered {day(po.orderedOn)}{po.createdByName ? ` by ${po.createdByName}` : ""}</p>
          <p>{po.expectedOn ? `Expected ${day(po.expectedOn)}` : "No delivery date given"}</p>
        </div>
      </header>
      <p><span className="font-semibold">Supplier:</span> {po.supplier}</p>
      <div role="region" aria-label={`Lines of ${po.number} (table)`} tabIndex={0} className="overflow-x-auto print:overflow-visible">
      <table className="w-full text-left text-sm">
        <thead className="border-b border-ink">
          <tr><th className="py-1 pr-2">Job</th><th className="pr-2">Part</th><th className="pr-2">Part no.</th><th className="pr-2 text-right">Qty</th><th className="pr-2 text-right">Each</th><th className="pr-2 text-right">Amount</th><th className="no-print">State</th></tr>
        </thead>
        <tbody>
          {po.lines.map((l) => (
            <tr key={l.id} className="border-b border-line align-top">
              <td className="py-1 pr-2 whitespace-nowrap">{l.workOrder} · unit {l.unitNumber}</td>
              <td className="pr-2">{BOUGHT_PART_KIND_LABELS[l.kind]}: {l.description}</td>
              <td className="pr-2">{l.partNumber || "—"}</td>
              <td className="pr-2 text-right">{l.quantity}</td>
              <td className="pr-2 text-right">{l.costCents === null ? "to be priced" : formatCents(l.costCents)}</td>
              <td className="pr-2 text-right">{l.lineCents === null ? "—" : formatCents(l.lineCents)}</td>
              <td className="no-print">{l.state === "ordered" && l.receivedQuantity > 0 ? `${l.receivedQuantity} of ${l.quantity} received` : BOUGHT_PART_STATE_LABELS[l.state]}</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr>
            <td colSpan={5} className="pt-2 pr-2 text-right font-bold">Total</td>
            <td className="pt-2 pr-2 text-right font-bold" data-po-total>{formatCents(po.totalCents)}</td>
            <td className="no-print" />
          </tr>
        </tfoot>
      </table>
      </div>
      {po.unpriced > 0 && <p className="text-sm">{po.unpriced} {po.unpriced === 1 ? "line is" : "lines are"} to be priced by the supplier and not in the total.</p>}
      {po.notes && <p className="whitespace-pre-line">{po.notes}</p>}
      <div className="no-print flex flex-wrap items-end justify-between gap-3 border-t border-line pt-3">
        {open > 0 ? <ExpectedDateForm id={po.id} expectedOn={po.expectedOn} /> : <p className="text-ok-700">Everything on this order is received.</p>}
        <PrintButton label="Print purchase order" />
      </div>
    </article>
  );
}
