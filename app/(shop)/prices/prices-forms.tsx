"use client";

import { useState } from "react";
import { type ApiFailure, ApiRequestError, api } from "@/components/api";
import { Field, FormAlert, buttonClass, inputClass } from "@/components/form";
import { KIT_USES, LINE_KINDS } from "@/db/tables/money";
import type { PriceItem } from "@/server/money/price-list";
import type { MoneySettings } from "@/server/money/settings";
import { centsToDollarsText, dollarsToCents, formatCents, formatRate } from "@/server/money/totals";
import { KIT_USE_WORDS, KIND_WORDS } from "./words";

/** A submit that may refuse before sending (a price that is not dollars and cents) and shows the server's refusals beside the fields. */
function useSubmit() {
  const [failure, setFailure] = useState<ApiFailure | null>(null);
  const [pending, setPending] = useState(false);
  async function run<T>(build: () => { path: string; method: string; body: unknown } | ApiFailure, done: (r: T) => void) {
    setFailure(null);
    const req = build();
    if ("code" in req) {
      setFailure(req);
      return;
    }
    setPending(true);
    try {
      done(await api<T>(req.path, { method: req.method, body: req.body }));
    } catch (err) {
      if (err instanceof ApiRequestError) setFailure(err.failure);
      else throw err;
    } finally {
      setPending(false);
    }
  }
  return { failure, pending, run, fields: failure?.fields ?? {} };
}

const localRefusal = (field: string, message: string): ApiFailure => ({ status: 400, code: "validation", message, fields: { [field]: [message] } });

function Notice({ text }: { text: string | null }) {
  if (!text) return null;
  return (
    <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">
      ✓ {text}
    </p>
  );
}

export function MoneySettingsForm({ initial }: { initial: MoneySettings }) {
  const [saved, setSaved] = useState(initial);
  const [kind, setKind] = useState(initial.depositKind);
  const [notice, setNotice] = useState<string | null>(null);
  const form = useSubmit();
  function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const v = Object.fromEntries(new FormData(e.currentTarget).entries()) as Record<string, string>;
    setNotice(null);
    void form.run<{ settings: MoneySettings }>(
      () => {
        const rate = v.taxRatePercent.trim() === "" ? Number.NaN : Number(v.taxRatePercent);
        const fixed = kind === "fixed" ? dollarsToCents(v.depositFixed ?? "") : saved.depositFixedCents;
        if (fixed === null) return localRefusal("depositFixedCents", "Write the fixed deposit in dollars and cents, e.g. 500.00.");
        const percent = kind === "percent" ? Number(v.depositPercent) : saved.depositPercent;
        return {
          path: "/api/shop-settings/money",
          method: "PUT",
          body: { taxRatePercent: Number.isFinite(rate) ? rate : v.taxRatePercent, depositKind: kind, depositPercent: Number.isFinite(percent) ? percent : v.depositPercent, depositFixedCents: fixed, quoteTerms: v.quoteTerms ?? "" },
        };
      },
      ({ settings }) => {
        setSaved(settings);
        setNotice(`Saved: sales tax ${formatRate(settings.taxMillipercent)}. Quotes already sent keep the figures they were sent with.`);
      },
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Sales tax and deposit">
      <FormAlert failure={form.failure} />
      <Notice text={notice} />
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Sales tax rate (%)" name="taxRatePercent" errors={form.fields.taxRatePercent} hint="Charged on taxable lines, worked out once per quote and rounded half-up to the cent.">
          {(p) => <input {...p} type="text" inputMode="decimal" autoComplete="off" defaultValue={String(saved.taxRatePercent)} className={inputClass} />}
        </Field>
        <fieldset className="space-y-2">
          <legend className="text-sm font-semibold">Deposit asked when the customer approves</legend>
          <div className="flex flex-wrap gap-4">
            {(["percent", "fixed"] as const).map((k) => (
              <label key={k} className="inline-flex min-h-11 items-center gap-2">
                <input type="radio" name="depositKind" value={k} checked={kind === k} onChange={() => setKind(k)} className="size-5" />
                {k === "percent" ? "A percent of the quote" : "A fixed amount"}
              </label>
            ))}
          </div>
          {kind === "percent" ? (
            <Field label="Deposit (% of the quote's total)" name="depositPercent" errors={form.fields.depositPercent} hint="0 asks no deposit.">
              {(p) => <input {...p} type="text" inputMode="numeric" autoComplete="off" defaultValue={String(saved.depositPercent)} className={inputClass} />}
            </Field>
          ) : (
            <Field label="Deposit ($)" name="depositFixed" errors={form.fields.depositFixedCents} hint="Never more than the quote itself.">
              {(p) => <input {...p} type="text" inputMode="decimal" autoComplete="off" defaultValue={centsToDollarsText(saved.depositFixedCents)} className={inputClass} />}
            </Field>
          )}
        </fieldset>
      </div>
      <Field label="Terms printed on every quote" name="quoteTerms" errors={form.fields.quoteTerms} hint="The customer ticks that they accept these when approving.">
        {(p) => <textarea {...p} rows={4} defaultValue={saved.quoteTerms} className={inputClass} />}
      </Field>
      <button type="submit" className={buttonClass.primary} disabled={form.pending}>
        {form.pending ? "Saving…" : "Save tax and deposit"}
      </button>
    </form>
  );
}

function PriceItemForm({ item, onSaved, onCancel }: { item?: PriceItem; onSaved: (item: PriceItem) => void; onCancel?: () => void }) {
  const form = useSubmit();
  const [use, setUse] = useState<string>(item?.kitUse ?? "");
  function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const el = e.currentTarget;
    const v = Object.fromEntries(new FormData(el).entries()) as Record<string, string>;
    void form.run<{ item: PriceItem }>(
      () => {
        const cents = dollarsToCents(v.price ?? "");
        if (cents === null) return localRefusal("unitPriceCents", "Write the price in dollars and cents, e.g. 125.00.");
        const size = use === "hose" ? Number(v.sizeIn) : null;
        const body = {
          kind: v.kind,
          name: v.name,
          unit: v.unit,
          unitPriceCents: cents,
          taxable: v.taxable === "on",
          kitUse: use === "" ? null : use,
          sizeIn: size === null ? null : Number.isFinite(size) && v.sizeIn.trim() !== "" ? size : v.sizeIn,
        };
        return item ? { path: `/api/price-items/${item.id}`, method: "PATCH", body } : { path: "/api/price-items", method: "POST", body };
      },
      ({ item: saved }) => {
        if (!item) el.reset();
        setUse(item ? (saved.kitUse ?? "") : "");
        onSaved(saved);
      },
    );
  }
  const label = item ? `Change ${item.name}` : "Add a price";
  return (
    <form onSubmit={onSubmit} noValidate aria-label={label} className="space-y-3 rounded-md border border-line p-3">
      {!item && <h3 className="font-bold">Add a price</h3>}
      <FormAlert failure={form.failure} />
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Field label="What" name="name" errors={form.fields.name} hint="As the customer reads it on a quote.">
          {(p) => <input {...p} type="text" autoComplete="off" defaultValue={item?.name} className={inputClass} />}
        </Field>
        <Field label="Kind" name="kind" errors={form.fields.kind}>
          {(p) => (
            <select {...p} defaultValue={item?.kind ?? "part"} className={inputClass}>
              {LINE_KINDS.map((k) => (
                <option key={k} value={k}>
                  {KIND_WORDS[k]}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Price ($)" name="price" errors={form.fields.unitPriceCents}>
          {(p) => <input {...p} type="text" inputMode="decimal" autoComplete="off" defaultValue={item ? centsToDollarsText(item.unitPriceCents) : ""} className={inputClass} />}
        </Field>
        <Field label="Per (unit)" name="unit" errors={form.fields.unit} hint="hour, each, ft…">
          {(p) => <input {...p} type="text" autoComplete="off" defaultValue={item?.unit ?? "each"} className={inputClass} />}
        </Field>
        <Field label="Fills this kit spec line" name="kitUse" errors={form.fields.kitUse} hint="Used by “Start from the kit spec”.">
          {(p) => (
            <select {...p} value={use} onChange={(e) => setUse(e.target.value)} className={inputClass}>
              <option value="">None</option>
              {KIT_USES.map((k) => (
                <option key={k} value={k}>
                  {KIT_USE_WORDS[k]}
                </option>
              ))}
            </select>
          )}
        </Field>
        {use === "hose" && (
          <Field label="Hose inside diameter (in)" name="sizeIn" errors={form.fields.sizeIn}>
            {(p) => <input {...p} type="text" inputMode="decimal" autoComplete="off" defaultValue={item?.sizeIn ?? ""} className={inputClass} />}
          </Field>
        )}
        <label className="inline-flex min-h-11 items-center gap-2 self-end font-semibold">
          <input type="checkbox" name="taxable" defaultChecked={item?.taxable ?? true} className="size-5" /> Taxable
        </label>
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="submit" className={buttonClass.primary} disabled={form.pending}>
          {form.pending ? "Saving…" : item ? "Save the change" : "Add to the price list"}
        </button>
        {onCancel && (
          <button type="button" className={buttonClass.secondary} onClick={onCancel}>
            Cancel
          </button>
        )}
      </div>
    </form>
  );
}

export function PriceList({ initial }: { initial: PriceItem[] }) {
  const [items, setItems] = useState(initial);
  const [editing, setEditing] = useState<number | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const toggle = useSubmit();
  const put = (saved: PriceItem) => setItems((list) => (list.some((i) => i.id === saved.id) ? list.map((i) => (i.id === saved.id ? saved : i)) : [...list, saved]));
  return (
    <div className="space-y-4">
      <Notice text={notice} />
      <FormAlert failure={toggle.failure} />
      {items.length === 0 ? (
        <p className="text-ink-soft">Nothing priced yet. Add the shop&apos;s labour rates first, then the parts and services you quote most.</p>
      ) : (
        <ul className="divide-y divide-line" aria-label="Price list">
          {items.map((i) => (
            <li key={i.id} className={`py-2 ${i.active ? "" : "text-ink-soft"}`}>
              {editing === i.id ? (
                <PriceItemForm
                  item={i}
                  onSaved={(saved) => {
                    put(saved);
                    setEditing(null);
                    setNotice(`${saved.name} saved at ${formatCents(saved.unitPriceCents)} per ${saved.unit}.`);
                  }}
                  onCancel={() => setEditing(null)}
                />
              ) : (
                <div className="flex flex-wrap items-center justify-between gap-2">
                  <div>
                    <p className="font-semibold">
                      {i.name} {!i.active && <span className="rounded bg-line px-1.5 text-sm font-bold">Off the list</span>}
                    </p>
                    <p className="text-sm text-ink-soft">
                      {KIND_WORDS[i.kind]} · {i.taxable ? "taxable" : "not taxed"}
                      {i.kitUse ? ` · kit spec: ${KIT_USE_WORDS[i.kitUse]}${i.sizeIn ? ` ${i.sizeIn} in` : ""}` : ""}
                    </p>
                  </div>
                  <div className="flex flex-wrap items-center gap-2">
                    <span className="font-semibold tabular-nums">
                      {formatCents(i.unitPriceCents)} <span className="font-normal text-ink-soft">/ {i.unit}</span>
                    </span>
                    <button type="button" className={buttonClass.secondary} onClick={() => setEditing(i.id)} aria-label={`Change ${i.name}`}>
                      Change
                    </button>
                    <button
                      type="button"
                      className={buttonClass.secondary}
                      disabled={toggle.pending}
                      aria-label={`${i.active ? "Take off the list" : "Put back on the list"}: ${i.name}`}
                      onClick={() =>
                        void toggle.run<{ item: PriceItem }>(
                          () => ({ path: `/api/price-items/${i.id}`, method: "PATCH", body: { active: !i.active } }),
                          ({ item }) => {
                            put(item);
                            setNotice(item.active ? `${item.name} is back on the list.` : `${item.name} is off the list; quotes already written keep it.`);
                          },
                        )
                      }
                    >
                      {i.active ? "Take off" : "Put back"}
                    </button>
                  </div>
                </div>
              )}
            </li>
          ))}
        </ul>
      )}
      <PriceItemForm
        onSaved={(saved) => {
          put(saved);
          setNotice(`${saved.name} added at ${formatCents(saved.unitPriceCents)} per ${saved.unit}.`);
        }}
      />
    </div>
  );
}
