"use client";

import { Fragment, useState } from "react";
import { type ApiFailure, ApiRequestError, api } from "@/components/api";
import { FormAlert, buttonClass, inputClass } from "@/components/form";
import { LINE_KINDS, type LineKind } from "@/db/tables/money";
import { type DocumentFigures, figureRows } from "@/server/money/document";
import type { PriceItem } from "@/server/money/price-list";
import type { Quote } from "@/server/money/quotes";
import { centsToDollarsText, documentTotals, dollarsToCents, formatCents, fromThousandths, agreedPriceCents, lineAmountCents, toThousandths } from "@/server/money/totals";
import { formatShopTime } from "@/server/records/calendar";
import { KIND_WORDS } from "../../prices/words";
import { useCustomerMailRefresh } from "./customer-mail";

const STATUS_WORDS: Record<Quote["status"], string> = {
  draft: "Draft: not sent",
  sent: "Sent: waiting for the customer",
  approved: "Approved by the customer",
  declined: "Declined by the customer",
  superseded: "Replaced by a later version",
};

const STATUS_TONE: Record<Quote["status"], string> = {
  draft: "bg-bay-50 text-bay-900",
  sent: "bg-warn-100 text-warn-700",
  approved: "bg-ok-100 text-ok-700",
  declined: "bg-stop-100 text-stop-700",
  superseded: "bg-line text-ink",
};

// Times in the shop's own time zone, the same on the server and in any browser.
const when = (iso: string, timeZone: string) => formatShopTime(iso, timeZone, "d MMM yyyy, HH:mm");

interface DraftLine {
  key: number;
  kind: LineKind;
  description: string;
  quantity: string;
  price: string;
  taxable: boolean;
  priceItemId: number | null;
}

let nextKey = 1;
const fromQuoteLine = (l: { kind: LineKind; description: string; quantity: number; unitPriceCents: number; taxable: boolean; priceItemId: number | null }): DraftLine => ({
  key: nextKey++,
  kind: l.kind,
  description: l.description,
  quantity: String(l.quantity),
  price: centsToDollarsText(l.unitPriceCents),
  taxable: l.taxable,
  priceItemId: l.priceItemId,
});

function Totals(figures: DocumentFigures) {
  return (
    <dl className="ml-auto grid max-w-sm grid-cols-[1fr_auto] gap-x-4 gap-y-1 tabular-nums">
      {figureRows(figures).map((row) => (
        <Fragment key={row.label}>
          <dt className={row.strong ? "font-bold" : undefined}>{row.label}</dt>
          <dd className={`text-right ${row.strong ? "font-bold" : ""}`}>{row.value}</dd>
        </Fragment>
      ))}
    </dl>
  );
}

function QuoteLines({ quote }: { quote: Quote }) {
  return (
    <>
    <p className="mb-1 text-sm text-ink-soft sm:hidden">Slide the lines sideways for quantity, unit price and amount.</p>
    <div role="region" aria-label={`Lines of version ${quote.version} (table)`} tabIndex={0} className="overflow-x-auto">
      <table className="w-full min-w-[32rem] text-left">
        <caption className="sr-only">Lines of version {quote.version}</caption>
        <thead>
          <tr className="border-b border-line text-sm text-ink-soft">
            <th scope="col" className="py-1 pr-2">Line</th>
            <th scope="col" className="py-1 pr-2 text-right">Qty</th>
            <th scope="col" className="py-1 pr-2 text-right">Unit price</th>
            <th scope="col" className="py-1 text-right">Amount</th>
          </tr>
        </thead>
        <tbody>
          {quote.lines.map((l) => (
            <tr key={l.id} className="border-b border-line/60 align-top">
              <td className="py-1 pr-2">
                {l.description}
                <span className="block text-sm text-ink-soft">
                  {KIND_WORDS[l.kind]}
                  {l.taxable ? " · taxable" : " · not taxed"}
                </span>
              </td>
              <td className="py-1 pr-2 text-right tabular-nums">{l.quantity}</td>
              <td className="py-1 pr-2 text-right tabular-nums">{formatCents(l.unitPriceCents)}</td>
              <td className="py-1 text-right tabular-nums">{formatCents(l.amountCents)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
    </>
  );
}

/** The lines being written: typed figures stay text until saved, the amounts and totals follow as they are typed. */
function LineEditor({ lines, setLines, priceItems, taxMillipercent, fields }: { lines: DraftLine[]; setLines: (f: (l: DraftLine[]) => DraftLine[]) => void; priceItems: PriceItem[]; taxMillipercent: number; fields: Record<string, string[]> }) {
  const change = (key: number, patch: Partial<DraftLine>) => setLines((list) => list.map((l) => (l.key === key ? { ...l, ...patch } : l)));
  const priced = lines.map((l) => {
    const q = toThousandths(Number(l.quantity));
    const c = dollarsToCents(l.price);
    return { line: l, quantityMilli: l.quantity.trim() === "" ? null : q, cents: c };
  });
  const valid = priced.filter((p) => p.quantityMilli !== null && p.quantityMilli > 0 && p.cents !== null);
  const totals = documentTotals(
    valid.map((p) => ({ kind: p.line.kind, quantityMilli: p.quantityMilli!, unitPriceCents: p.cents!, taxable: p.line.taxable })),
    taxMillipercent,
  );
  return (
    <div className="space-y-3">
      <ol className="space-y-3" aria-label="Lines of the draft">
        {priced.map(({ line, quantityMilli, cents }, i) => {
          const err = (f: string) => fields[`lines.${i}.${f}`]?.join(" ");
          const amount = quantityMilli !== null && cents !== null ? formatCents(lineAmountCents(quantityMilli, cents)) : "—";
          return (
            <li key={line.key} className="rounded-md border border-line p-2">
              <div className="grid gap-2 sm:grid-cols-[10rem_minmax(0,1fr)] lg:grid-cols-[10rem_minmax(0,1fr)_6rem_8rem_auto_7rem_auto]">
                <label className="block text-sm font-semibold">
                  Kind
                  <select className={inputClass} value={line.kind} onChange={(e) => change(line.key, { kind: e.target.value as LineKind })}>
                    {LINE_KINDS.map((k) => (
                      <option key={k} value={k}>
                        {KIND_WORDS[k]}
                      </option>
                    ))}
                  </select>
                </label>
                <label className="block text-sm font-semibold">
                  Description
                  <input className={inputClass} value={line.description} aria-invalid={Boolean(err("description"))} onChange={(e) => change(line.key, { description: e.target.value })} />
                  {err("description") && <span className="block font-medium text-stop-700">⚠ {err("description")}</span>}
                </label>
                <label className="block text-sm font-semibold">
                  Qty
                  <input className={inputClass} inputMode="decimal" value={line.quantity} aria-invalid={Boolean(err("quantity")) || (line.quantity !== "" && quantityMilli === null)} onChange={(e) => change(line.key, { quantity: e.target.value })} />
                  {(err("quantity") || (line.quantity !== "" && quantityMilli === null)) && <span className="block font-medium text-stop-700">⚠ {err("quantity") ?? "At most three decimals."}</span>}
                </label>
                <label className="block text-sm font-semibold">
                  Unit price ($)
                  <input className={inputClass} inputMode="decimal" value={line.price} aria-invalid={Boolean(err("unitPriceCents")) || cents === null} onChange={(e) => change(line.key, { price: e.target.value })} />
                  {(err("unitPriceCents") || cents === null) && <span className="block font-medium text-stop-700">⚠ {err("unitPriceCents") ?? "Dollars and cents, e.g. 125.00."}</span>}
                </label>
                <label className="inline-flex min-h-11 items-center gap-2 self-end text-sm font-semibold">
                  <input type="checkbox" className="size-5" checked={line.taxable} onChange={(e) => change(line.key, { taxable: e.target.checked })} /> Taxable
                </label>
                <p className="self-end pb-2 text-right font-semibold tabular-nums" aria-label={`Amount of line ${i + 1}`}>
                  {amount}
                </p>
                <button type="button" className={`${buttonClass.secondary} self-end`} onClick={() => setLines((list) => list.filter((l) => l.key !== line.key))} aria-label={`Remove line ${i + 1}`}>
                  Remove
                </button>
              </div>
            </li>
          );
        })}
      </ol>
      <div className="flex flex-wrap items-end gap-2">
        <button type="button" className={buttonClass.secondary} onClick={() => setLines((list) => [...list, { key: nextKey++, kind: "labour", description: "", quantity: "1", price: "0.00", taxable: false, priceItemId: null }])}>
          Add a blank line
        </button>
        {priceItems.length > 0 && (
          <label className="block text-sm font-semibold">
            Add from the price list
            <select
              className={inputClass}
              value=""
              onChange={(e) => {
                const item = priceItems.find((p) => p.id === Number(e.target.value));
                if (item) setLines((list) => [...list, fromQuoteLine({ kind: item.kind, description: item.name, quantity: 1, unitPriceCents: item.unitPriceCents, taxable: item.taxable, priceItemId: item.id })]);
              }}
            >
              <option value="">Choose…</option>
              {priceItems.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name} — {formatCents(p.unitPriceCents)} / {p.unit}
                </option>
              ))}
            </select>
          </label>
        )}
      </div>
      <Totals {...totals} taxRatePercent={fromThousandths(taxMillipercent)} />
    </div>
  );
}

function useAction() {
  const [failure, setFailure] = useState<ApiFailure | null>(null);
  const [pending, setPending] = useState(false);
  async function run<T>(path: string, method: string, body: unknown): Promise<T | null> {
    setFailure(null);
    setPending(true);
    try {
      return await api<T>(path, { method, body });
    } catch (err) {
      if (err instanceof ApiRequestError) setFailure(err.failure);
      else throw err;
      return null;
    } finally {
      setPending(false);
    }
  }
  return { failure, setFailure, pending, run, fields: failure?.fields ?? {} };
}

export function QuotePanel({ jobId, initialQuotes, priceItems, taxMillipercent, kitSpecVersion, timeZone }: { jobId: number; initialQuotes: Quote[]; priceItems: PriceItem[]; taxMillipercent: number; kitSpecVersion: number | null; timeZone: string }) {
  const [quotes, setQuotes] = useState(initialQuotes);
  const draft = quotes.find((q) => q.status === "draft") ?? null;
  const approved = quotes.find((q) => q.kind === "quote" && q.status === "approved") ?? null;
  const [editing, setEditing] = useState<{ quoteId: number | null; updatedAt?: string; kind: Quote["kind"]; replacesId?: number } | null>(draft ? { quoteId: draft.id, updatedAt: draft.updatedAt, kind: draft.kind } : null);
  const [lines, setLines] = useState<DraftLine[]>(draft ? draft.lines.map(fromQuoteLine) : []);
  const [notice, setNotice] = useState<string | null>(null);
  const [unpriced, setUnpriced] = useState<string[]>([]);
  const action = useAction();
  const refreshMail = useCustomerMailRefresh(jobId);

  const put = (q: Quote) => setQuotes((list) => [q, ...list.filter((x) => x.id !== q.id)].sort((a, b) => b.version - a.version));
  const refresh = async () => {
    const got = await api<{ quotes: Quote[] }>(`/api/jobs/${jobId}/quotes`).catch(() => null);
    if (got) setQuotes(got.quotes);
  };

  function start(kind: Quote["kind"], from?: Quote) {
    setNotice(null);
    setUnpriced([]);
    action.setFailure(null);
    // A change order started from an earlier one replaces it; a new one is separate added work.
    setEditing({ quoteId: null, kind, ...(from && kind === "change_order" ? { replacesId: from.id } : {}) });
    setLines(from ? from.lines.map(fromQuoteLine) : []);
  }

  async function fromKitSpec() {
    setNotice(null);
    const got = await action.run<{ specVersion: number; lines: Parameters<typeof fromQuoteLine>[0][]; unpriced: string[] }>(`/api/jobs/${jobId}/quotes/kit-lines`, "GET", undefined);
    if (!got) return;
    setLines((list) => [...list, ...got.lines.map(fromQuoteLine)]);
    setUnpriced(got.unpriced);
    setNotice(`Lines from kit spec version ${got.specVersion} added. Add the labour, then save the draft.`);
  }

  function payload() {
    const bad = lines.findIndex((l) => dollarsToCents(l.price) === null);
    if (bad >= 0) {
      action.setFailure({ status: 400, code: "validation", message: `Line ${bad + 1}: write the unit price in dollars and cents, e.g. 125.00.`, fields: { [`lines.${bad}.unitPriceCents`]: ["Dollars and cents, e.g. 125.00."] } });
      return null;
    }
    return lines.map((l) => ({
      kind: l.kind,
      description: l.description,
      quantity: l.quantity.trim() === "" || !Number.isFinite(Number(l.quantity)) ? l.quantity : Number(l.quantity),
      unitPriceCents: dollarsToCents(l.price)!,
      taxable: l.taxable,
      ...(l.priceItemId ? { priceItemId: l.priceItemId } : {}),
    }));
  }

  async function save(): Promise<Quote | null> {
    if (!editing) return null;
    const body = payload();
    if (!body) return null;
    const got = editing.quoteId
      ? await action.run<{ quote: Quote }>(`/api/quotes/${editing.quoteId}`, "PUT", { lines: body, updatedAt: editing.updatedAt })
      : await action.run<{ quote: Quote }>(`/api/jobs/${jobId}/quotes`, "POST", { lines: body, kind: editing.kind, ...(editing.replacesId ? { replacesId: editing.replacesId } : {}) });
    if (!got) return null;
    put(got.quote);
    setEditing({ quoteId: got.quote.id, updatedAt: got.quote.updatedAt, kind: got.quote.kind });
    setLines(got.quote.lines.map(fromQuoteLine));
    return got.quote;
  }

  async function saveAndSend() {
    const saved = await save();
    if (!saved) return;
    const sent = await action.run<{ quote: Quote }>(`/api/quotes/${saved.id}/send`, "POST", {});
    if (!sent) return;
    setEditing(null);
    setLines([]);
    setUnpriced([]);
    await Promise.all([refresh(), refreshMail()]);
    setNotice(`Version ${sent.quote.version} sent for ${formatCents(sent.quote.totalCents)}. It is never changed now; a new version replaces it.`);
  }

  const newKind: Quote["kind"] = approved ? "change_order" : "quote";
  // A new version is offered of what is still open: the waiting or declined quote, or a waiting or declined change order.
  const latestOfKind = quotes.find((q) => q.kind === newKind && (q.status === "sent" || q.status === "declined"));
  const agreed = quotes.filter((q) => q.status === "approved");
  const agreedChanges = agreed.filter((q) => q.kind === "change_order").length;

  return (
    <div className="space-y-4">
      {approved && (
        <p className="flex flex-wrap items-baseline justify-between gap-x-4 rounded-md bg-bay-50 px-3 py-2" data-testid="job-price">
          <span>
            <span className="font-bold">Job price</span>
            <span className="block text-sm text-ink-soft">
              Quote version {approved.version}
              {agreedChanges ? ` and ${agreedChanges === 1 ? "1 approved change order" : `${agreedChanges} approved change orders`}` : ""}, tax included
            </span>
          </span>
          <span className="text-lg font-bold tabular-nums">{formatCents(agreedPriceCents(quotes))}</span>
        </p>
      )}
      {notice && (
        <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">
          ✓ {notice}
        </p>
      )}
      <FormAlert failure={action.failure} />
      {editing ? (
        <div className="space-y-3 rounded-md border-2 border-bay-600 p-3">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h3 className="font-bold">{editing.quoteId ? `${editing.kind === "quote" ? "Quote" : "Change order"} version ${quotes.find((q) => q.id === editing.quoteId)?.version} (draft)` : `New ${editing.kind === "quote" ? "quote" : "change order"}`}</h3>
            <button type="button" className={buttonClass.secondary} disabled={action.pending || kitSpecVersion === null} onClick={() => void fromKitSpec()} aria-describedby="kit-spec-hint">
              Start from the kit spec
            </button>
          </div>
          <p id="kit-spec-hint" className="text-sm text-ink-soft">
            {kitSpecVersion === null ? "No kit spec is saved on this job yet: save one in the Kit spec section to fill the PTO, pump, reservoir and hoses from it." : `Adds the PTO, pump, reservoir and hoses of kit spec version ${kitSpecVersion}, priced from the price list.`}
          </p>
          {unpriced.length > 0 && (
            <div role="alert" className="rounded-md bg-warn-100 px-3 py-2 text-sm text-warn-700">
              <p className="font-semibold">⚠ Not on the price list, so at $0.00: set their prices before sending.</p>
              <ul className="list-disc pl-5">
                {unpriced.map((u) => (
                  <li key={u}>{u}</li>
                ))}
              </ul>
            </div>
          )}
          <LineEditor lines={lines} setLines={setLines} priceItems={priceItems} taxMillipercent={taxMillipercent} fields={action.fields} />
          <div className="flex flex-wrap gap-2">
            <button type="button" className={buttonClass.secondary} disabled={action.pending || lines.length === 0} onClick={() => void save().then((q) => q && setNotice(`Draft version ${q.version} saved.`))}>
              Save the draft
            </button>
            <button type="button" className={buttonClass.primary} disabled={action.pending || lines.length === 0} onClick={() => void saveAndSend()}>
              {action.pending ? "Working…" : "Send to the customer"}
            </button>
            {!editing.quoteId && (
              <button type="button" className={buttonClass.secondary} onClick={() => setEditing(null)}>
                Cancel
              </button>
            )}
          </div>
          <p className="text-sm text-ink-soft">Once sent, a version is never changed: a new version replaces it, and the customer can approve only the newest.</p>
          {editing.quoteId && (
            <p>
              <a className="inline-flex min-h-11 items-center font-semibold text-bay-700 underline" href={`/api/quotes/${editing.quoteId}/pdf`} download>
                Download the saved draft as PDF
              </a>
            </p>
          )}
        </div>
      ) : (
        <div className="flex flex-wrap gap-2">
          <button type="button" className={buttonClass.primary} onClick={() => start(newKind)}>
            {approved ? "New change order" : quotes.length ? "New quote version" : "Write a quote"}
          </button>
          {kitSpecVersion !== null && (
            <button
              type="button"
              className={buttonClass.secondary}
              onClick={() => {
                start(newKind);
                void fromKitSpec();
              }}
            >
              Start from the kit spec
            </button>
          )}
          {latestOfKind && (
            <button type="button" className={buttonClass.secondary} onClick={() => start(newKind, latestOfKind)}>
              New version from version {latestOfKind.version}
            </button>
          )}
        </div>
      )}
      {quotes.length === 0 && !editing && <p className="text-ink-soft">No quote on this job yet.</p>}
      {quotes
        .filter((q) => q.status !== "draft")
        .map((q) => (
          <article key={q.id} aria-label={`${q.kind === "quote" ? "Quote" : "Change order"} version ${q.version}`} className="space-y-2 rounded-md border border-line p-3">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <h3 className="font-bold">
                {q.kind === "quote" ? "Quote" : "Change order"} version {q.version} · {formatCents(q.totalCents)}
              </h3>
              <span className={`rounded-full px-2.5 py-0.5 text-sm font-bold ${STATUS_TONE[q.status]}`}>{STATUS_WORDS[q.status]}</span>
            </div>
            <p className="text-sm text-ink-soft">
              Written by {q.createdByName}
              {q.sentAt ? ` · sent ${when(q.sentAt, timeZone)}` : ""}
              {q.decidedAt ? ` · answered ${when(q.decidedAt, timeZone)}${q.decidedName ? ` by “${q.decidedName}”` : ""}` : ""}
            </p>
            {q.status === "declined" && q.declineReason && <p className="rounded bg-stop-100 px-2 py-1 text-sm text-stop-700">Reason given: “{q.declineReason}”</p>}
            <details open={q.status === "sent" || q.status === "approved"}>
              <summary className="inline-flex min-h-11 cursor-pointer items-center font-semibold">{q.lines.length === 1 ? "1 line" : `${q.lines.length} lines`}</summary>
              <QuoteLines quote={q} />
            </details>
            <Totals {...q} depositCents={q.kind === "quote" ? q.depositCents : undefined} />
            <p>
              <a className="inline-flex min-h-11 items-center font-semibold text-bay-700 underline" href={`/api/quotes/${q.id}/pdf`} download>
                Download PDF<span className="sr-only"> of {q.kind === "quote" ? "quote" : "change order"} version {q.version}</span>
              </a>
            </p>
          </article>
        ))}
    </div>
  );
}


