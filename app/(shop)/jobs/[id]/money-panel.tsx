"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { type ApiFailure, ApiRequestError, api } from "@/components/api";
import { buttonClass, inputClass } from "@/components/styles";
import type { Role, Stage } from "@/db/schema";
import type { InvoiceView } from "@/server/money/invoices";
import type { PaymentLine } from "@/server/money/payments";
import { dollarsToCents, formatCents } from "@/server/money/totals";
import { formatShopTime } from "@/server/records/calendar";
import { useCustomerMailRefresh } from "./customer-mail";

const METHOD_WORDS: Record<PaymentLine["method"], string> = { card: "Card, paid online", cash: "Cash", check: "Check", on_account: "On account", refund: "Refund" };
// Times in the shop's own time zone, the same on the server and in any browser.
const when = (iso: string, timeZone: string) => formatShopTime(iso, timeZone, "d MMM yyyy, HH:mm");

export function MoneyPanel(props: {
  jobId: number;
  timeZone: string;
  role: Role;
  stage: Stage;
  words: string | null;
  /** Why the live invoice no longer bills the approved work, when it does not. */
  outOfDate: string | null;
  checksOn: boolean;
  owed: { deposit: number; invoice: number };
  payments: PaymentLine[];
  invoices: InvoiceView[];
}) {
  const router = useRouter();
  const refreshMail = useCustomerMailRefresh(props.jobId);
  const [failure, setFailure] = useState<ApiFailure | null>(null);
  const [pending, setPending] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const live = props.invoices.find((i) => i.status !== "void") ?? null;
  const purpose: "deposit" | "invoice" | null = props.owed.invoice > 0 ? "invoice" : props.owed.deposit > 0 ? "deposit" : null;
  const owed = purpose ? props.owed[purpose] : 0;

  async function send(path: string, body: unknown, message: string) {
    setFailure(null);
    setDone(null);
    setPending(true);
    try {
      await api(path, { method: "POST", body });
      setDone(message);
      router.refresh();
      // An invoice made or a payment taken e-mails the customer.
      await refreshMail();
      return true;
    } catch (err) {
      if (err instanceof ApiRequestError) setFailure(err.failure);
      else throw err;
      return false;
    } finally {
      setPending(false);
    }
  }

  async function record(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const v = new FormData(form);
    const cents = dollarsToCents(String(v.get("amount") ?? ""));
    if (cents === null) {
      setFailure({ status: 400, code: "validation", message: "Type the amount as dollars and cents, such as 500 or 1,250.00.", fields: { amountCents: ["Type dollars and cents."] } });
      return;
    }
    const ok = await send(`/api/jobs/${props.jobId}/payments`, { purpose, method: String(v.get("method")), amountCents: cents, reference: String(v.get("reference") ?? "") }, `Recorded ${formatCents(cents)}.`);
    if (ok) form.reset();
  }

  async function voidInvoice(e: React.FormEvent<HTMLFormElement>, invoice: InvoiceView) {
    e.preventDefault();
    const reason = String(new FormData(e.currentTarget).get("reason") ?? "");
    await send(`/api/invoices/${invoice.id}/void`, { reason }, `Invoice ${invoice.number} voided.`);
  }

  const fieldError = (name: string) => failure?.fields?.[name]?.join(" ");

  return (
    <div className="space-y-4">
      <p className="text-lg font-semibold" data-testid="money-words">
        {props.words ?? "No quote yet."}
        {!props.checksOn && <span className="block text-sm font-normal text-ink-soft">The shop's money checks before work and delivery are off (Prices).</span>}
      </p>
      {done && (
        <p role="status" className="rounded-md bg-ok-100 px-3 py-2 font-semibold text-ok-700">
          ✓ {done}
        </p>
      )}
      {failure && (
        <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
          {failure.message}
        </p>
      )}

      {live && (
        <div className="rounded-md border border-line p-3" data-testid="invoice">
          <p className="font-bold">
            Invoice {live.number} · {live.status === "open" ? "open" : live.status === "paid" ? "paid" : "on account"}
          </p>
          <dl className="mt-1 grid grid-cols-[1fr_auto] gap-x-3 tabular-nums">
            <dt>Approved work</dt>
            <dd className="text-right">{formatCents(live.totalCents)}</dd>
            <dt>Deposits received</dt>
            <dd className="text-right">{formatCents(live.depositsCents)}</dd>
            <dt>Paid since</dt>
            <dd className="text-right">{formatCents(live.paidCents)}</dd>
            {live.onAccountCents > 0 && (
              <>
                <dt>On account</dt>
                <dd className="text-right">{formatCents(live.onAccountCents)}</dd>
              </>
            )}
            <dt className="font-bold">Balance due</dt>
            <dd className="text-right font-bold">{formatCents(Math.max(0, live.balanceCents))}</dd>
          </dl>
          {props.outOfDate && (
            <p className="mt-2 rounded bg-warn-100 px-2 py-1 text-sm font-semibold text-warn-700" data-testid="invoice-out-of-date">
              ⚑ {props.outOfDate}. It takes no payment and the job cannot be delivered until it is made again:{" "}
              {props.role === "owner" ? "void it below, then make the new invoice." : "ask the owner to void it, then make the new invoice here."}
            </p>
          )}
          {props.role === "owner" && (
            <details className="mt-2" open={props.outOfDate !== null}>
              <summary className="flex min-h-11 cursor-pointer items-center text-sm font-semibold text-bay-700 underline">Void this invoice</summary>
              <form onSubmit={(e) => void voidInvoice(e, live)} className="mt-2 space-y-2" noValidate>
                <label htmlFor="void-reason" className="block font-semibold">
                  Why? Kept with the invoice and in the audit trail.
                </label>
                <input id="void-reason" name="reason" className={inputClass} />
                <button type="submit" className={buttonClass.danger} disabled={pending}>
                  Void invoice {live.number}
                </button>
              </form>
            </details>
          )}
        </div>
      )}
      {!live && (props.stage === "ready" || props.stage === "delivered") && (
        <button type="button" className={buttonClass.secondary} disabled={pending} onClick={() => void send(`/api/jobs/${props.jobId}/invoice`, {}, "Invoice made.")}>
          Make the invoice
        </button>
      )}

      <div>
        <h3 className="font-bold">Payments</h3>
        {props.payments.length === 0 ? (
          <p className="text-ink-soft">None yet.</p>
        ) : (
          <ul className="divide-y divide-line" aria-label="Payments">
            {props.payments.map((p) => (
              <li key={p.id} className="flex justify-between gap-3 py-2">
                <span>
                  {METHOD_WORDS[p.method]} · {p.purpose === "deposit" ? "deposit" : "invoice"}
                  <span className="block text-sm text-ink-soft">
                    {when(p.at, props.timeZone)}
                    {p.reference ? ` · ${p.reference}` : ""}
                    {p.recordedBy ? ` · recorded by ${p.recordedBy}` : ""}
                  </span>
                </span>
                <span className="shrink-0 tabular-nums">{formatCents(p.amountCents)}</span>
              </li>
            ))}
          </ul>
        )}
      </div>
      {purpose && (
        <form onSubmit={(e) => void record(e)} noValidate className="space-y-2 rounded-md bg-bay-50 p-3" aria-label="Record a payment">
          <p className="font-semibold">
            Record a payment at the counter: {formatCents(owed)} {purpose === "deposit" ? "deposit" : "balance"} owed
          </p>
          <div className="grid gap-2 sm:grid-cols-3">
            <div>
              <label htmlFor="pay-method" className="block text-sm font-semibold">
                How
              </label>
              <select id="pay-method" name="method" className={inputClass} defaultValue="check">
                <option value="check">Check</option>
                <option value="cash">Cash</option>
                {props.role === "owner" && <option value="on_account">On account (owner)</option>}
              </select>
            </div>
            <div>
              <label htmlFor="pay-amount" className="block text-sm font-semibold">
                Amount
              </label>
              <input id="pay-amount" name="amount" inputMode="decimal" className={inputClass} defaultValue={(owed / 100).toFixed(2)} aria-invalid={Boolean(fieldError("amountCents"))} />
            </div>
            <div>
              <label htmlFor="pay-reference" className="block text-sm font-semibold">
                Reference (check number, account)
              </label>
              <input id="pay-reference" name="reference" className={inputClass} aria-invalid={Boolean(fieldError("reference"))} />
            </div>
          </div>
          <button type="submit" className={buttonClass.primary} disabled={pending}>
            {pending ? "Recording…" : "Record payment"}
          </button>
        </form>
      )}
      {props.invoices
        .filter((i) => i.status === "void")
        .map((i) => (
          <p key={i.id} className="text-sm text-ink-soft">
            Invoice {i.number} ({formatCents(i.totalCents)}) voided: {i.voidReason}
          </p>
        ))}
    </div>
  );
}
