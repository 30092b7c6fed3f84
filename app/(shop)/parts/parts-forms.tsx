"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { buttonClass, Field, FormAlert, inputClass, num, str, useApiForm } from "@/components/form";
import { formatCents } from "@/components/money";
import { touchLinkClass } from "@/components/styles";
import type { DeskLine } from "@/server/parts/desk";
import { BOUGHT_PART_KIND_LABELS, orderTotal } from "@/server/parts/rules";

export type OrderLine = Pick<DeskLine, "id" | "jobId" | "workOrder" | "unitNumber" | "kind" | "description" | "partNumber" | "quantity" | "costCents" | "lineCents">;

/** One supplier's lines to order: tick them, give the dates, and make one purchase order. */
export function OrderGroup({ supplier, lines, today, suppliers }: { supplier: string; lines: OrderLine[]; today: string; suppliers: string[] }) {
  const router = useRouter();
  const listId = useId();
  const [picked, setPicked] = useState<Set<number>>(() => new Set(supplier ? lines.map((l) => l.id) : []));
  const chosen = lines.filter((l) => picked.has(l.id));
  const total = orderTotal(chosen.map((l) => ({ quantity: l.quantity, unitCostCents: l.costCents })));
  const form = useApiForm(
    (v) => ({ path: "/api/purchase-orders", body: { supplier: str(v.supplier), partIds: [...picked], orderedOn: str(v.orderedOn), expectedOn: str(v.expectedOn) || null } }),
    (res: { purchaseOrder: { id: number } }) => router.push(`/purchase-orders/${res.purchaseOrder.id}`),
  );
  const toggle = (id: number) => setPicked((s) => {
    const next = new Set(s);
    if (next.has(id)) next.delete(id);
    else next.add(id);
    return next;
  });
  return (
    <form onSubmit={form.onSubmit} className="rounded-md border border-line p-3" aria-label={`Order from ${supplier || "a supplier"}`} data-order-group={supplier}>
      <h3 className="font-bold">{supplier || "Supplier not chosen yet"}</h3>
      <FormAlert failure={form.failure} />
      {/* A table at the desk; on a phone each line stacks into a card, no sideways scroll. */}
      <table className="w-full text-left text-sm">
        <thead className="border-b border-line text-ink-soft max-md:sr-only">
          <tr><th className="w-12 py-1"><span className="sr-only">Order</span></th><th className="pr-2">Job</th><th className="pr-2">Part</th><th className="pr-2">Part no.</th><th className="pr-2 text-right">Qty</th><th className="pr-2 text-right">Each</th><th className="text-right">Amount</th></tr>
        </thead>
        <tbody>
          {lines.map((l) => (
            <tr key={l.id} className="border-b border-line/60 max-md:grid max-md:grid-cols-[3rem_1fr] max-md:py-1">
              <td className="py-0.5 max-md:row-span-4">
                <label className="flex min-h-11 min-w-11 items-center justify-center">
                  <input type="checkbox" className="h-5 w-5" checked={picked.has(l.id)} onChange={() => toggle(l.id)} aria-label={`Order ${l.description} for ${l.workOrder}`} />
                </label>
              </td>
              <td className="pr-2 whitespace-nowrap"><a className={`font-semibold underline ${touchLinkClass}`} href={`/jobs/${l.jobId}#bought-parts`}>{l.workOrder}</a> <span className="text-ink-soft">· {l.unitNumber}</span></td>
              <td className="pr-2">{BOUGHT_PART_KIND_LABELS[l.kind]}: {l.description}</td>
              <td className="pr-2"><span className="text-ink-soft md:hidden">Part no. </span>{l.partNumber || "—"}</td>
              <td className="pr-2 text-right max-md:hidden">{l.quantity}</td>
              <td className="pr-2 text-right max-md:hidden">{l.costCents === null ? "not priced" : formatCents(l.costCents)}</td>
              <td className="text-right max-md:text-left">
                <span className="md:hidden">{l.quantity} × {l.costCents === null ? "not priced" : formatCents(l.costCents)} = </span>
                {l.lineCents === null ? "—" : formatCents(l.lineCents)}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="mt-3 grid items-start gap-3 sm:grid-cols-[1fr_auto_auto_auto]">
        <Field label="Supplier" name="supplier" errors={form.fields.supplier ?? form.fields.partIds}>
          {(p) => (
            <>
              <input {...p} defaultValue={supplier} list={listId} maxLength={120} className={inputClass} />
              <datalist id={listId}>{suppliers.map((s) => <option key={s} value={s} />)}</datalist>
            </>
          )}
        </Field>
        <Field label="Ordered on" name="orderedOn" errors={form.fields.orderedOn}>
          {(p) => <input {...p} type="date" defaultValue={today} className={inputClass} />}
        </Field>
        <Field label="Expected on" name="expectedOn" errors={form.fields.expectedOn} hint="As the supplier promised.">
          {(p) => <input {...p} type="date" className={inputClass} />}
        </Field>
        <div className="space-y-1 sm:pt-6">
          <button type="submit" className={buttonClass.primary} disabled={form.pending || chosen.length === 0}>
            {form.pending ? "Ordering…" : `Order ${chosen.length} ${chosen.length === 1 ? "line" : "lines"} on one PO`}
          </button>
          <p className="text-sm text-ink-soft" aria-live="polite">
            Total {formatCents(total.totalCents)}{total.unpriced ? `, ${total.unpriced} not priced` : ""}
          </p>
        </div>
      </div>
    </form>
  );
}

/** Receive what came of one line, from the desk. */
export function ReceiveButton({ line }: { line: Pick<DeskLine, "id" | "description" | "quantity" | "receivedQuantity" | "workOrder"> }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const outstanding = line.quantity - line.receivedQuantity;
  const form = useApiForm((v) => ({ path: `/api/bought-parts/${line.id}/receipts`, body: { quantity: num(v.quantity) } }), () => {
    setOpen(false);
    router.refresh();
  });
  if (!open) {
    return (
      <button type="button" className={buttonClass.secondary} onClick={() => setOpen(true)} aria-label={`Receive ${line.description} for ${line.workOrder}`}>
        Receive
      </button>
    );
  }
  return (
    <form onSubmit={form.onSubmit} className="flex flex-wrap items-end gap-2" aria-label={`Receive ${line.description} for ${line.workOrder}`}>
      <FormAlert failure={form.failure} />
      <Field label={`How many came (${outstanding} to come)`} name="quantity" errors={form.fields.quantity}>
        {(p) => <input {...p} defaultValue={outstanding} inputMode="numeric" className={`${inputClass} w-24`} />}
      </Field>
      <button type="submit" className={buttonClass.primary} disabled={form.pending}>{form.pending ? "Saving…" : "Record"}</button>
      <button type="button" className={buttonClass.secondary} onClick={() => setOpen(false)}>Cancel</button>
    </form>
  );
}
