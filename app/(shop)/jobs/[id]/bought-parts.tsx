"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { ApiRequestError, api, type ApiFailure } from "@/components/api";
import { buttonClass, Field, FormActions, FormAlert, inputClass, num, str, useApiForm } from "@/components/form";
import { IconCheck, IconClock, IconWarn } from "@/components/icons";
import { formatCents, parseDollars } from "@/components/money";
import { BOUGHT_PART_KINDS, type BoughtPartKind } from "@/db/tables/bought-parts";
import { showStoredDate } from "@/server/http/stored-date";
import type { BoughtPartView } from "@/server/parts/queries";
import { BOUGHT_PART_KIND_LABELS, BOUGHT_PART_STATE_LABELS, isWaiting } from "@/server/parts/rules";
import { formatShopTime } from "@/server/records/calendar";

type Panel = { mode: "add" } | { mode: "edit" | "receive"; id: number } | null;

/** A job's bought-in parts: what is to order, on order, received and installed, with fit checks. */
export function BoughtParts({
  jobId,
  parts,
  canCost,
  hasKitSpec,
  hasApprovedQuote,
  timeZone,
  suppliers,
}: {
  jobId: number;
  parts: BoughtPartView[];
  canCost: boolean;
  hasKitSpec: boolean;
  hasApprovedQuote: boolean;
  timeZone: string;
  /** Suppliers the shop already uses, offered as the supplier is typed. */
  suppliers: string[];
}) {
  const router = useRouter();
  const [panel, setPanel] = useState<Panel>(null);
  const [failure, setFailure] = useState<ApiFailure | null>(null);
  const [busy, setBusy] = useState(false);
  const waiting = parts.filter((p) => isWaiting(p.state));
  const done = () => {
    setPanel(null);
    router.refresh();
  };
  async function act(path: string, method: string, body?: unknown) {
    setBusy(true);
    setFailure(null);
    try {
      await api(path, { method, body: body ?? {} });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiRequestError) setFailure(err.failure);
      else throw err;
    } finally {
      setBusy(false);
    }
  }
  return (
    <div className="space-y-3">
      <p className={waiting.length ? "font-semibold text-warn-700" : "text-ink-soft"} data-bought-summary>
        {parts.length === 0
          ? "No bought-in parts listed yet. List the PTO, pump, valve, hoses and fittings this job needs, so they are here before Install."
          : waiting.length
            ? <><IconWarn /> Waiting on {waiting.length} {waiting.length === 1 ? "part" : "parts"} before Install: {waiting.map((p) => p.description).join(", ")}</>
            : <><IconCheck /> Every bought-in part is here.</>}
      </p>
      <FormAlert failure={failure} />
      {parts.length > 0 && (
        <ul className="divide-y divide-line rounded-md border border-line">
          {parts.map((p) => (
            <li key={p.id} className="space-y-1 p-3" data-bought-part={p.description}>
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <p className="font-semibold">
                  <span className="mr-1 rounded bg-bay-50 px-1.5 text-xs font-bold uppercase text-bay-900">{BOUGHT_PART_KIND_LABELS[p.kind]}</span>
                  {p.quantity} × {p.description}
                  {p.partNumber && <span className="font-normal text-ink-soft"> · part no. {p.partNumber}</span>}
                </p>
                <StateBadge part={p} />
              </div>
              <p className="text-sm text-ink-soft">
                {p.supplier ? `From ${p.supplier}` : "Supplier not chosen"}
                {canCost && <> · {p.costCents === null ? "cost not entered" : `${formatCents(p.costCents)} each, ${formatCents(p.lineCents!)}`}</>}
                {p.purchaseOrder && (
                  <>
                    {" · "}
                    {canCost ? <Link className="underline" href={`/purchase-orders/${p.purchaseOrder.id}`}>{p.purchaseOrder.number}</Link> : p.purchaseOrder.number}
                    {p.expectedOn && p.state === "ordered" ? `, expected ${showStoredDate(p.expectedOn, "EEE d MMM")}` : ""}
                  </>
                )}
                {p.kind === "pto" && (p.fitsTransmission || p.ratioPercent !== null) && <> · fits {p.fitsTransmission || "?"}, ratio {p.ratioPercent ?? "?"} %</>}
                {p.kind === "pump" && p.displacementCuIn !== null && <> · {p.displacementCuIn} cu in/rev</>}
              </p>
              {p.fit.map((f) => (
                <p key={f.code} className="text-sm font-semibold text-warn-700" data-fit-flag={f.code}><IconWarn /> Check the fit: {f.message}</p>
              ))}
              {p.receipts.length > 0 && (
                <p className="text-sm text-ink-soft">
                  Received: {p.receipts.map((r) => `${r.quantity} by ${r.byName}, ${formatShopTime(r.at, timeZone, "d MMM HH:mm")}`).join("; ")}
                  {p.installedAt && ` · installed ${formatShopTime(p.installedAt, timeZone, "d MMM")}${p.installedByName ? ` by ${p.installedByName}` : ""}`}
                </p>
              )}
              <div className="flex flex-wrap gap-2 pt-1 no-print">
                {isWaiting(p.state) && (
                  <button type="button" className={buttonClass.secondary} onClick={() => setPanel({ mode: "receive", id: p.id })} aria-label={`Receive ${p.description}`}>Receive</button>
                )}
                {p.state === "received" && (
                  <button type="button" className={buttonClass.secondary} disabled={busy} onClick={() => act(`/api/bought-parts/${p.id}`, "PATCH", { installed: true })}>Mark installed</button>
                )}
                {p.state === "installed" && (
                  <button type="button" className={buttonClass.secondary} disabled={busy} onClick={() => act(`/api/bought-parts/${p.id}`, "PATCH", { installed: false })}>Not installed after all</button>
                )}
                <button type="button" className={buttonClass.secondary} onClick={() => setPanel({ mode: "edit", id: p.id })} aria-label={`Edit ${p.description}`}>Edit</button>
                {canCost && p.receivedQuantity === 0 && (
                  <button
                    type="button"
                    className={buttonClass.secondary}
                    disabled={busy}
                    onClick={() => {
                      if (window.confirm(`Remove ${p.description} from this job? The audit trail keeps a line.`)) void act(`/api/bought-parts/${p.id}`, "DELETE");
                    }}
                  >
                    Remove
                  </button>
                )}
              </div>
              {panel?.mode === "receive" && panel.id === p.id && <ReceiveForm part={p} onDone={done} onCancel={() => setPanel(null)} />}
              {panel?.mode === "edit" && panel.id === p.id && <BoughtPartForm jobId={jobId} part={p} canCost={canCost} suppliers={suppliers} onDone={done} onCancel={() => setPanel(null)} />}
            </li>
          ))}
        </ul>
      )}
      {panel?.mode === "add" ? (
        <BoughtPartForm jobId={jobId} canCost={canCost} suppliers={suppliers} onDone={done} onCancel={() => setPanel(null)} />
      ) : (
        <div className="flex flex-wrap gap-2 no-print">
          <button type="button" className={buttonClass.primary} onClick={() => setPanel({ mode: "add" })}>Add a bought-in part</button>
          {hasKitSpec && (
            <button type="button" className={buttonClass.secondary} disabled={busy} onClick={() => act(`/api/jobs/${jobId}/bought-parts/from-kit-spec`, "POST")}>
              List the PTO and pump from the kit spec
            </button>
          )}
          {hasApprovedQuote && (
            <button type="button" className={buttonClass.secondary} disabled={busy} onClick={() => act(`/api/jobs/${jobId}/bought-parts/from-quote`, "POST")}>
              List from the quote
            </button>
          )}
          {canCost && waiting.some((p) => p.state === "needed") && <Link href="/parts" className={buttonClass.secondary}>Order on the parts desk</Link>}
        </div>
      )}
    </div>
  );
}

function StateBadge({ part }: { part: BoughtPartView }) {
  const label = part.state === "ordered" && part.receivedQuantity > 0 ? `${part.receivedQuantity} of ${part.quantity} received, rest on order` : BOUGHT_PART_STATE_LABELS[part.state];
  const tone = part.state === "needed" ? "bg-warn-100 text-warn-700" : part.state === "ordered" ? "bg-bay-50 text-bay-900" : "bg-ok-100 text-ok-700";
  return (
    <span className={`rounded-full px-2 py-0.5 text-sm font-bold ${tone}`} data-state={part.state}>
      {part.state === "received" || part.state === "installed" ? <IconCheck /> : <IconClock />} {label}
    </span>
  );
}

function ReceiveForm({ part, onDone, onCancel }: { part: BoughtPartView; onDone: () => void; onCancel: () => void }) {
  const outstanding = part.quantity - part.receivedQuantity;
  const form = useApiForm((v) => ({ path: `/api/bought-parts/${part.id}/receipts`, body: { quantity: num(v.quantity) } }), onDone);
  return (
    <form onSubmit={form.onSubmit} className="mt-2 space-y-2 rounded-md bg-bay-50 p-3" aria-label={`Receive ${part.description}`}>
      <FormAlert failure={form.failure} />
      <Field label={`How many came (${outstanding} outstanding)`} name="quantity" errors={form.fields.quantity}>
        {(p) => <input {...p} defaultValue={outstanding} inputMode="numeric" className={inputClass} />}
      </Field>
      <FormActions pending={form.pending} label="Record the receipt" pendingLabel="Saving…" onCancel={onCancel} />
    </form>
  );
}

function BoughtPartForm({ jobId, part, canCost, suppliers, onDone, onCancel }: { jobId: number; part?: BoughtPartView; canCost: boolean; suppliers: string[]; onDone: () => void; onCancel: () => void }) {
  const supplierListId = useId();
  const [kind, setKind] = useState<BoughtPartKind>(part?.kind ?? "pto");
  const form = useApiForm(
    (v) => {
      const body: Record<string, unknown> = {
        kind: str(v.kind),
        description: str(v.description),
        partNumber: str(v.partNumber),
        quantity: num(v.quantity),
        supplier: str(v.supplier),
      };
      if (kind === "pto") {
        body.fitsTransmission = str(v.fitsTransmission);
        body.ratioPercent = num(v.ratioPercent) ?? null;
      }
      if (kind === "pump") body.displacementCuIn = num(v.displacementCuIn) ?? null;
      if (canCost) body.costCents = parseDollars(str(v.cost)) ?? null;
      return part ? { path: `/api/bought-parts/${part.id}`, method: "PATCH", body } : { path: `/api/jobs/${jobId}/bought-parts`, body };
    },
    onDone,
  );
  const f = form.fields;
  return (
    <form onSubmit={form.onSubmit} className="mt-2 grid gap-3 rounded-md border border-line bg-paper p-3 sm:grid-cols-2" aria-label={part ? `Edit ${part.description}` : "Add a bought-in part"}>
      <div className="sm:col-span-2"><FormAlert failure={form.failure} /></div>
      <Field label="Kind" name="kind" errors={f.kind}>
        {(p) => (
          <select {...p} value={kind} onChange={(e) => setKind(e.target.value as BoughtPartKind)} className={inputClass}>
            {BOUGHT_PART_KINDS.map((k) => <option key={k} value={k}>{BOUGHT_PART_KIND_LABELS[k]}</option>)}
          </select>
        )}
      </Field>
      <Field label="Quantity" name="quantity" errors={f.quantity}>
        {(p) => <input {...p} defaultValue={part?.quantity ?? 1} inputMode="numeric" className={inputClass} />}
      </Field>
      <div className="sm:col-span-2">
        <Field label="What it is (as the supplier writes it)" name="description" errors={f.description}>
          {(p) => <input {...p} defaultValue={part?.description} maxLength={200} className={inputClass} placeholder="10-bolt PTO, air shift" />}
        </Field>
      </div>
      <Field label="Part number" name="partNumber" errors={f.partNumber}>
        {(p) => <input {...p} defaultValue={part?.partNumber} maxLength={80} autoComplete="off" className={inputClass} />}
      </Field>
      <Field label="Supplier" name="supplier" errors={f.supplier} hint={part?.purchaseOrder ? "Set by its purchase order." : undefined}>
        {(p) => (
          <>
            <input {...p} defaultValue={part?.supplier} list={supplierListId} maxLength={120} autoComplete="off" readOnly={Boolean(part?.purchaseOrder)} className={inputClass} />
            <datalist id={supplierListId}>{suppliers.map((s) => <option key={s} value={s} />)}</datalist>
          </>
        )}
      </Field>
      {canCost && (
        <Field label="Cost of one ($)" name="cost" errors={f.costCents} hint="Leave empty until the supplier prices it.">
          {(p) => <input {...p} defaultValue={part?.costCents != null ? (part.costCents / 100).toFixed(2) : ""} inputMode="decimal" className={inputClass} placeholder="845.00" />}
        </Field>
      )}
      {kind === "pto" && (
        <>
          <Field label="Transmission it fits" name="fitsTransmission" errors={f.fitsTransmission} hint="Checked against the truck's transmission.">
            {(p) => <input {...p} defaultValue={part?.fitsTransmission} maxLength={80} className={inputClass} placeholder="18-speed manual" />}
          </Field>
          <Field label="Ratio (% of engine speed)" name="ratioPercent" errors={f.ratioPercent} hint="Checked against the kit spec.">
            {(p) => <input {...p} defaultValue={part?.ratioPercent ?? ""} inputMode="decimal" className={inputClass} placeholder="122" />}
          </Field>
        </>
      )}
      {kind === "pump" && (
        <Field label="Displacement (cu in/rev)" name="displacementCuIn" errors={f.displacementCuIn} hint="Checked against the kit spec.">
          {(p) => <input {...p} defaultValue={part?.displacementCuIn ?? ""} inputMode="decimal" className={inputClass} placeholder="3.2" />}
        </Field>
      )}
      <div className="sm:col-span-2">
        <FormActions pending={form.pending} label={part ? "Save the part" : "Add the part"} pendingLabel="Saving…" onCancel={onCancel} />
      </div>
    </form>
  );
}
