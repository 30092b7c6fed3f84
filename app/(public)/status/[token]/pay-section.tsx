"use client";

import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { ApiRequestError, api } from "@/components/api";
import { buttonClass } from "@/components/styles";
import type { CustomerPayment } from "@/server/money/customer-payment";
import { formatCents } from "@/server/money/totals";

/**
 * The truck owner pays the deposit or the invoice on the payment service's own page, and comes
 * back here. The page says paid only once the service's signed message has reached the shop, so
 * on the way back it looks again every two seconds for up to a minute.
 */
export function PaySection({ token, payment, returned }: { token: string; payment: CustomerPayment; returned: "deposit" | "invoice" | "cancelled" | null }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const [tries, setTries] = useState(0);
  const depositDone = payment.deposit !== null && payment.deposit.owedCents === 0;
  const invoiceDone = payment.invoice !== null && payment.invoice.status !== "open";
  const waiting = (returned === "deposit" && !depositDone) || (returned === "invoice" && !invoiceDone);

  useEffect(() => {
    if (!waiting || tries >= 30) return;
    const t = setTimeout(() => {
      setTries((n) => n + 1);
      router.refresh();
    }, 2000);
    return () => clearTimeout(t);
  }, [waiting, tries, router]);

  async function pay(purpose: "deposit" | "invoice") {
    setError(null);
    setPending(true);
    try {
      const { url } = await api<{ url: string }>(`/status/${token}/checkout`, { method: "POST", body: { purpose } });
      window.location.assign(url);
    } catch (err) {
      setPending(false);
      if (err instanceof ApiRequestError) setError(err.failure.message);
      else throw err;
    }
  }

  // A quote that asked no deposit and no invoice yet: nothing to say about paying.
  if (!payment.invoice && !payment.deposit && !returned) return null;

  const payButton = (purpose: "deposit" | "invoice", cents: number, words: string) =>
    payment.online ? (
      <button type="button" className={`${buttonClass.primary} mt-3 w-full`} disabled={pending} onClick={() => void pay(purpose)}>
        {pending ? "Opening the payment page…" : `${words} ${formatCents(cents)}`}
      </button>
    ) : (
      <p className="mt-2 text-sm text-ink-soft">Pay the shop by check or at the counter; online payment is not set up.</p>
    );

  return (
    <section id="pay" aria-labelledby="pay-title" className="mt-6 scroll-mt-4 space-y-3" data-testid="payment">
      <h2 id="pay-title" className="text-xl font-bold">
        Payment
      </h2>
      {returned === "cancelled" && (
        <p role="status" className="rounded-lg bg-bay-50 px-4 py-3">
          You left the payment page: nothing was charged.
        </p>
      )}
      {waiting && (
        <p role="status" className="rounded-lg bg-bay-50 px-4 py-3 font-semibold">
          {tries >= 30 ? "The payment service has not confirmed your payment yet. Reload this page in a few minutes, or call the shop." : "Waiting for the payment service to confirm your payment…"}
        </p>
      )}
      {error && (
        <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
          {error}
        </p>
      )}
      {payment.invoice ? (
        <div className="rounded-lg border-2 border-bay-700 bg-panel p-4">
          <p className="font-bold">Invoice {payment.invoice.number}</p>
          <dl className="mt-2 grid grid-cols-[1fr_auto] gap-x-3 gap-y-1 tabular-nums">
            <dt>Total</dt>
            <dd className="text-right">{formatCents(payment.invoice.totalCents)}</dd>
            <dt>Received, deposit included</dt>
            <dd className="text-right">{formatCents(payment.invoice.receivedCents)}</dd>
            <dt className="text-lg font-bold">Balance due</dt>
            <dd className="text-right text-lg font-bold">{formatCents(payment.invoice.balanceCents)}</dd>
          </dl>
          {payment.invoice.outOfDate ? (
            <p className="mt-2 rounded-md bg-warn-100 px-3 py-2 font-semibold text-warn-700" data-testid="invoice-out-of-date">
              You approved a change after this invoice was made. The shop is making a new invoice with the change on it; it comes by e-mail, and you pay that one.
            </p>
          ) : payment.invoice.status === "open" ? (
            payButton("invoice", payment.invoice.balanceCents, "Pay the balance")
          ) : (
            <p className="mt-2 rounded-md bg-ok-100 px-3 py-2 font-semibold text-ok-700">
              ✓ {payment.invoice.status === "paid" ? "Paid in full. Thank you." : "On your account with the shop."}
            </p>
          )}
        </div>
      ) : payment.deposit ? (
        <div className="rounded-lg border-2 border-bay-700 bg-panel p-4">
          {depositDone ? (
            <>
              <p className="font-semibold text-ok-700">✓ Deposit paid: {formatCents(payment.deposit.askedCents)}. Thank you.</p>
              {payment.deposit.restCents > 0 && (
                <p className="mt-1 text-sm text-ink-soft" data-testid="rest-at-pickup">
                  The rest, {formatCents(payment.deposit.restCents)}, is invoiced when the truck is ready for pickup.
                </p>
              )}
            </>
          ) : (
            <>
              <p className="font-bold">Deposit due: {formatCents(payment.deposit.owedCents)}</p>
              <p className="text-sm text-ink-soft">The shop orders parts and starts work once the deposit is paid.</p>
              {payButton("deposit", payment.deposit.owedCents, "Pay the deposit")}
            </>
          )}
        </div>
      ) : null}
    </section>
  );
}
