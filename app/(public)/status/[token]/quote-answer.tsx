"use client";

import { useRouter } from "next/navigation";
import { Fragment, useState } from "react";
import { type ApiFailure, ApiRequestError, api } from "@/components/api";
import { buttonClass, inputClass } from "@/components/styles";
import type { CustomerQuote } from "@/server/money/customer-quote";
import { figureRows, lineQuantityWords } from "@/server/money/document";
import { agreedPriceCents, formatCents } from "@/server/money/totals";
import { formatShopTime } from "@/server/records/calendar";

// Times in the shop's own time zone: the same on the server and on the customer's phone, wherever it is.
const when = (iso: string, timeZone: string) => formatShopTime(iso, timeZone, "d MMM, h:mm a");

function Lines({ quote, token }: { quote: CustomerQuote; token: string }) {
  return (
    <>
      <ul className="divide-y divide-line" aria-label={`Lines of version ${quote.version}`}>
        {quote.lines.map((l, i) => (
          <li key={i} className="flex justify-between gap-3 py-2">
            <span className="[overflow-wrap:anywhere]">
              {l.description}
              <span className="block text-sm text-ink-soft">
                {lineQuantityWords(l.quantity, l.unitPriceCents)}
                {l.taxable ? "" : " · no tax"}
              </span>
            </span>
            <span className="shrink-0 tabular-nums">{formatCents(l.amountCents)}</span>
          </li>
        ))}
      </ul>
      <dl className="mt-2 grid grid-cols-[1fr_auto] gap-x-3 gap-y-1 border-t-2 border-ink pt-2 tabular-nums">
        {figureRows({ ...quote, depositCents: quote.kind === "quote" ? quote.depositCents : undefined }).map((row) => (
          <Fragment key={row.label}>
            <dt className={row.strong ? "text-lg font-bold" : undefined}>{row.label}</dt>
            <dd className={`text-right ${row.strong ? "text-lg font-bold" : ""}`}>{row.value}</dd>
          </Fragment>
        ))}
      </dl>
      <p className="mt-1">
        <a className="inline-flex min-h-11 items-center font-semibold text-bay-700 underline" href={`/status/${token}/quote/${quote.id}/pdf`} download>
          Download PDF<span className="sr-only"> of {quote.kind === "quote" ? "quote" : "change order"} version {quote.version}</span>
        </a>
      </p>
    </>
  );
}

const KIND = { quote: "Quote", change_order: "Change order" } as const;

/** One version waiting for the customer's answer: its lines, terms, and approve or decline. */
function Waiting({ token, quote, timeZone, onAnswered }: { token: string; quote: CustomerQuote; timeZone: string; onAnswered: (quotes: CustomerQuote[], done: string) => void }) {
  const [mode, setMode] = useState<"approve" | "decline">("approve");
  const [failure, setFailure] = useState<ApiFailure | null>(null);
  const [pending, setPending] = useState(false);
  const what = quote.kind === "quote" ? "quote" : "change order";
  const idp = `q${quote.id}`;

  async function submit(e: React.FormEvent<HTMLFormElement>) {
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
      onAnswered(got.quotes, mode === "approve" ? "Thank you: your approval is with the shop." : "Thank you: the shop has your answer and will be in touch.");
    } catch (err) {
      if (err instanceof ApiRequestError) setFailure(err.failure);
      else throw err;
    } finally {
      setPending(false);
    }
  }

  const fieldError = (name: string) => failure?.fields[name]?.join(" ");
  return (
    <article aria-label={`${KIND[quote.kind]} version ${quote.version}`} className="rounded-lg border-2 border-bay-700 bg-panel p-4">
      <p className="font-bold">
        {KIND[quote.kind]} version {quote.version}, waiting for your answer
      </p>
      <p className="mb-2 text-sm text-ink-soft">Sent {when(quote.sentAt, timeZone)}</p>
      <Lines quote={quote} token={token} />
      {quote.terms && (
        <div className="mt-3 rounded-md bg-bay-50 px-3 py-2 text-sm">
          <p className="font-semibold">Terms</p>
          <p className="whitespace-pre-line">{quote.terms}</p>
        </div>
      )}
      <div className="mt-4 flex gap-2" role="group" aria-label={`Your answer to ${what} version ${quote.version}`}>
        <button type="button" aria-pressed={mode === "approve"} className={mode === "approve" ? buttonClass.primary : buttonClass.secondary} onClick={() => setMode("approve")}>
          Approve
        </button>
        <button type="button" aria-pressed={mode === "decline"} className={mode === "decline" ? buttonClass.primary : buttonClass.secondary} onClick={() => setMode("decline")}>
          Decline
        </button>
      </div>
      <form onSubmit={(e) => void submit(e)} noValidate className="mt-3 space-y-3" aria-label={mode === "approve" ? `Approve the ${what}` : `Decline the ${what}`}>
        {failure && (
          <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
            {failure.message}
          </p>
        )}
        {mode === "approve" ? (
          <>
            <div>
              <label htmlFor={`${idp}-name`} className="block font-semibold">
                Your full name
              </label>
              <input id={`${idp}-name`} name="name" autoComplete="name" className={inputClass} aria-invalid={Boolean(fieldError("name"))} aria-describedby={`${idp}-name-msg`} />
              <p id={`${idp}-name-msg`} aria-live="polite" className="text-sm text-stop-700">
                {fieldError("name") && `⚠ ${fieldError("name")}`}
              </p>
            </div>
            <label className="flex min-h-11 items-start gap-3">
              <input type="checkbox" name="acceptTerms" className="mt-1 size-6 shrink-0" aria-invalid={Boolean(fieldError("acceptTerms"))} />
              <span>I accept the terms above and approve {formatCents(quote.totalCents)}.</span>
            </label>
            {fieldError("acceptTerms") && <p className="text-sm text-stop-700">⚠ {fieldError("acceptTerms")}</p>}
            <button type="submit" className={`${buttonClass.primary} w-full`} disabled={pending}>
              {pending ? "Sending…" : `Approve ${formatCents(quote.totalCents)}`}
            </button>
          </>
        ) : (
          <>
            <div>
              <label htmlFor={`${idp}-reason`} className="block font-semibold">
                Why? The shop reads this before it calls you.
              </label>
              <textarea id={`${idp}-reason`} name="reason" rows={3} className={inputClass} aria-invalid={Boolean(fieldError("reason"))} aria-describedby={`${idp}-reason-msg`} />
              <p id={`${idp}-reason-msg`} aria-live="polite" className="text-sm text-stop-700">
                {fieldError("reason") && `⚠ ${fieldError("reason")}`}
              </p>
            </div>
            <button type="submit" className={`${buttonClass.danger} w-full`} disabled={pending}>
              {pending ? "Sending…" : `Decline this ${what}`}
            </button>
          </>
        )}
      </form>
    </article>
  );
}

/**
 * The customer's quotes and change orders on their status link: the job's price (the approved quote
 * plus approved change orders), then each version waiting for an answer, then the answered ones.
 */
export function QuoteAnswer({ token, initialQuotes, timeZone }: { token: string; initialQuotes: CustomerQuote[]; timeZone: string }) {
  const router = useRouter();
  const [quotes, setQuotes] = useState(initialQuotes);
  const [done, setDone] = useState<string | null>(null);
  if (!quotes.length) return null;
  const waiting = quotes.filter((q) => q.status === "sent").sort((a, b) => a.version - b.version);
  const answered = quotes.filter((q) => q.status !== "sent");
  const approved = quotes.filter((q) => q.status === "approved");
  const approvedChanges = approved.filter((q) => q.kind === "change_order").length;

  return (
    <section id="quote" aria-labelledby="quote-title" className="mt-6 scroll-mt-4 space-y-3">
      <h2 id="quote-title" className="text-xl font-bold">
        Price
      </h2>
      {done && (
        <p role="status" className="rounded-lg bg-ok-100 px-4 py-3 font-semibold text-ok-700">
          ✓ {done}
        </p>
      )}
      {approved.some((q) => q.kind === "quote") && (
        <p className="flex flex-wrap items-baseline justify-between gap-x-3 rounded-lg bg-bay-50 px-4 py-3" data-testid="job-price">
          <span>
            <span className="font-bold">Job price</span>
            <span className="block text-sm text-ink-soft">
              The approved quote{approvedChanges ? ` and ${approvedChanges === 1 ? "1 approved change order" : `${approvedChanges} approved change orders`}` : ""}, tax included
            </span>
          </span>
          <span className="text-lg font-bold tabular-nums">{formatCents(agreedPriceCents(quotes))}</span>
        </p>
      )}
      {waiting.map((q) => (
        <Waiting
          key={q.id}
          token={token}
          timeZone={timeZone}
          quote={q}
          onAnswered={(next, words) => {
            setQuotes(next);
            setDone(words);
            // An approval may bring a deposit to pay: the page's server part says so.
            router.refresh();
          }}
        />
      ))}
      {answered.map((q) => (
        <details key={q.id} className="rounded-lg border border-line bg-panel px-4 py-2" open={!waiting.length && q === answered[0]}>
          <summary className="flex min-h-11 cursor-pointer items-center font-semibold">
            {KIND[q.kind]} version {q.version}: {q.status === "approved" ? `approved${q.decidedName ? ` by ${q.decidedName}` : ""}` : "declined"}
            {q.decidedAt ? `, ${when(q.decidedAt, timeZone)}` : ""} · {formatCents(q.totalCents)}
          </summary>
          <div className="pb-2">
            <Lines quote={q} token={token} />
          </div>
        </details>
      ))}
    </section>
  );
}
