"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { type ApiFailure, ApiRequestError, api } from "@/components/api";
import { buttonClass, inputClass } from "@/components/styles";
import type { CustomerQuote } from "@/server/money/customer-quote";
import { formatCents } from "@/server/money/totals";

const when = (iso: string) => new Date(iso).toLocaleString("en-US", { day: "numeric", month: "short", hour: "numeric", minute: "2-digit" });

function Lines({ quote }: { quote: CustomerQuote }) {
  return (
    <>
      <ul className="divide-y divide-line" aria-label={`Lines of version ${quote.version}`}>
        {quote.lines.map((l, i) => (
          <li key={i} className="flex justify-between gap-3 py-2">
            <span className="[overflow-wrap:anywhere]">
              {l.description}
              <span className="block text-sm text-ink-soft">
                {l.quantity} × {formatCents(l.unitPriceCents)}
                {l.taxable ? "" : " · no tax"}
              </span>
            </span>
            <span className="shrink-0 tabular-nums">{formatCents(l.amountCents)}</span>
          </li>
        ))}
      </ul>
      <dl className="mt-2 grid grid-cols-[1fr_auto] gap-x-3 gap-y-1 border-t-2 border-ink pt-2 tabular-nums">
        <dt>Subtotal</dt>
        <dd className="text-right">{formatCents(quote.subtotalCents)}</dd>
        <dt>
          Sales tax {quote.taxRatePercent} % on {formatCents(quote.taxableCents)}
        </dt>
        <dd className="text-right">{formatCents(quote.taxCents)}</dd>
        <dt className="text-lg font-bold">Total</dt>
        <dd className="text-right text-lg font-bold">{formatCents(quote.totalCents)}</dd>
        {quote.kind === "quote" && quote.depositCents > 0 && (
          <>
            <dt>Deposit due on approval</dt>
            <dd className="text-right font-semibold">{formatCents(quote.depositCents)}</dd>
          </>
        )}
      </dl>
    </>
  );
}

/** The customer's quotes on their status link: the one waiting for an answer first, with approve and decline. */
export function QuoteAnswer({ token, initialQuotes }: { token: string; initialQuotes: CustomerQuote[] }) {
  const router = useRouter();
  const [quotes, setQuotes] = useState(initialQuotes);
  const [mode, setMode] = useState<"approve" | "decline">("approve");
  const [failure, setFailure] = useState<ApiFailure | null>(null);
  const [pending, setPending] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  if (!quotes.length) return null;
  const waiting = quotes.find((q) => q.status === "sent") ?? null;

  async function submit(e: React.FormEvent<HTMLFormElement>, quote: CustomerQuote) {
    e.preventDefault();
    const v = new FormData(e.currentTarget);
    const body =
      mode === "approve"
        ? { decision: "approve", quoteId: quote.id, name: String(v.get("name") ?? ""), acceptTerms: v.get("acceptTerms") === "on" }
        : { decision: "decline", quoteId: quote.id, reason: String(v.get("reason") ?? "") };
    setFailure(null);
    setPending(true);
    try {
      const got = await api<{ quotes: CustomerQuote[] }>(`/status/${token}/quote`, { method: "POST", body });
      setQuotes(got.quotes);
      setDone(mode === "approve" ? "Thank you: your approval is with the shop." : "Thank you: the shop has your answer and will be in touch.");
      // An approval may bring a deposit to pay: the page's server part says so.
      if (mode === "approve") router.refresh();
    } catch (err) {
      if (err instanceof ApiRequestError) setFailure(err.failure);
      else throw err;
    } finally {
      setPending(false);
    }
  }

  const fieldError = (name: string) => failure?.fields[name]?.join(" ");
  const answered = quotes.filter((q) => q.status !== "sent");

  return (
    <section aria-labelledby="quote-title" className="mt-6 space-y-3">
      <h2 id="quote-title" className="text-xl font-bold">
        Price
      </h2>
      {done && (
        <p role="status" className="rounded-lg bg-ok-100 px-4 py-3 font-semibold text-ok-700">
          ✓ {done}
        </p>
      )}
      {waiting && (
        <article aria-label={`${waiting.kind === "quote" ? "Quote" : "Change order"} version ${waiting.version}`} className="rounded-lg border-2 border-bay-700 bg-panel p-4">
          <p className="font-bold">
            {waiting.kind === "quote" ? "Quote" : "Change order"} version {waiting.version}, waiting for your answer
          </p>
          <p className="mb-2 text-sm text-ink-soft">Sent {when(waiting.sentAt)}</p>
          <Lines quote={waiting} />
          {waiting.terms && (
            <div className="mt-3 rounded-md bg-bay-50 px-3 py-2 text-sm">
              <p className="font-semibold">Terms</p>
              <p className="whitespace-pre-line">{waiting.terms}</p>
            </div>
          )}
          <div className="mt-4 flex gap-2" role="group" aria-label="Your answer">
            <button type="button" aria-pressed={mode === "approve"} className={mode === "approve" ? buttonClass.primary : buttonClass.secondary} onClick={() => setMode("approve")}>
              Approve
            </button>
            <button type="button" aria-pressed={mode === "decline"} className={mode === "decline" ? buttonClass.primary : buttonClass.secondary} onClick={() => setMode("decline")}>
              Decline
            </button>
          </div>
          <form onSubmit={(e) => void submit(e, waiting)} noValidate className="mt-3 space-y-3" aria-label={mode === "approve" ? "Approve the quote" : "Decline the quote"}>
            {failure && (
              <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
                {failure.message}
              </p>
            )}
            {mode === "approve" ? (
              <>
                <div>
                  <label htmlFor="approve-name" className="block font-semibold">
                    Your full name
                  </label>
                  <input id="approve-name" name="name" autoComplete="name" className={inputClass} aria-invalid={Boolean(fieldError("name"))} aria-describedby="approve-name-msg" />
                  <p id="approve-name-msg" aria-live="polite" className="text-sm text-stop-700">
                    {fieldError("name") && `⚠ ${fieldError("name")}`}
                  </p>
                </div>
                <label className="flex min-h-11 items-start gap-3">
                  <input type="checkbox" name="acceptTerms" className="mt-1 size-6 shrink-0" aria-invalid={Boolean(fieldError("acceptTerms"))} />
                  <span>I accept the terms above and approve {formatCents(waiting.totalCents)}.</span>
                </label>
                {fieldError("acceptTerms") && <p className="text-sm text-stop-700">⚠ {fieldError("acceptTerms")}</p>}
                <button type="submit" className={`${buttonClass.primary} w-full`} disabled={pending}>
                  {pending ? "Sending…" : `Approve ${formatCents(waiting.totalCents)}`}
                </button>
              </>
            ) : (
              <>
                <div>
                  <label htmlFor="decline-reason" className="block font-semibold">
                    Why? The shop reads this before it calls you.
                  </label>
                  <textarea id="decline-reason" name="reason" rows={3} className={inputClass} aria-invalid={Boolean(fieldError("reason"))} aria-describedby="decline-reason-msg" />
                  <p id="decline-reason-msg" aria-live="polite" className="text-sm text-stop-700">
                    {fieldError("reason") && `⚠ ${fieldError("reason")}`}
                  </p>
                </div>
                <button type="submit" className={`${buttonClass.danger} w-full`} disabled={pending}>
                  {pending ? "Sending…" : "Decline this quote"}
                </button>
              </>
            )}
          </form>
        </article>
      )}
      {answered.map((q) => (
        <details key={q.id} className="rounded-lg border border-line bg-panel px-4 py-2" open={!waiting && q === answered[0]}>
          <summary className="flex min-h-11 cursor-pointer items-center font-semibold">
            {q.kind === "quote" ? "Quote" : "Change order"} version {q.version}: {q.status === "approved" ? `approved${q.decidedName ? ` by ${q.decidedName}` : ""}` : "declined"}
            {q.decidedAt ? `, ${when(q.decidedAt)}` : ""} · {formatCents(q.totalCents)}
          </summary>
          <div className="pb-2">
            <Lines quote={q} />
          </div>
        </details>
      ))}
    </section>
  );
}
