/**
 * Where a job stands with its money, and what that lets it do. Pure: the loader
 * (`server/money/job-money.ts`) fills `JobMoney`, tests build it by hand. Amounts in cents.
 */
import type { QuoteStatus } from "@/db/tables/money";
import { formatCents } from "./totals";

export interface JobMoney {
  /** The shop's "Money checks before work and delivery" setting. */
  checksOn: boolean;
  /** The newest version of the job's quote (not change orders), replaced versions left out. */
  quoteStatus: Exclude<QuoteStatus, "superseded"> | null;
  /** Deposit asked with the approved quote (0 when the shop asks none). */
  depositAskedCents: number;
  /** Deposit received (card, cash, check) or put on account by the owner. */
  depositReceivedCents: number;
  /** The approved quote plus approved change orders. */
  priceCents: number;
  /** Everything received (card, cash, check), less refunds. */
  receivedCents: number;
  /** What the owner put on the customer's account. */
  onAccountCents: number;
  /** The job's invoice, when one is out (a voided one is left out). */
  invoice: { number: string; status: "open" | "paid" | "on_account"; totalCents: number } | null;
}

export const NO_MONEY: JobMoney = { checksOn: false, quoteStatus: null, depositAskedCents: 0, depositReceivedCents: 0, priceCents: 0, receivedCents: 0, onAccountCents: 0, invoice: null };

/** Still owed: the price less what was received or put on account. */
export const balanceDueCents = (m: JobMoney): number => m.priceCents - m.receivedCents - m.onAccountCents;

/**
 * The invoice bills other than the work now approved: a change order was approved (or replaced)
 * after the invoice was made. An invoice's total is fixed when it is made, so it is voided and made
 * again; until then it asks no payment and the job does not leave.
 */
export const invoiceOutOfDate = (m: JobMoney): boolean => m.invoice !== null && m.invoice.totalCents !== m.priceCents;

/** What the office and the customer read about an out-of-date invoice. */
export function outOfDateWords(invoice: { number: string; totalCents: number }, priceCents: number): string {
  return `Invoice ${invoice.number} bills ${formatCents(invoice.totalCents)}, but the approved work is now ${formatCents(priceCents)} after a change order`;
}

export const depositOwedCents = (m: JobMoney): number => (m.quoteStatus === "approved" ? Math.max(0, m.depositAskedCents - m.depositReceivedCents) : 0);

/** What the job needs before work starts (into Fabricate, or into Install for install-only work). */
export function moneyBeforeWorkUnmet(m: JobMoney): string[] {
  if (!m.checksOn) return [];
  if (m.quoteStatus !== "approved") {
    const now =
      m.quoteStatus === null
        ? "no quote yet; make one under Quote and send it"
        : m.quoteStatus === "draft"
          ? "the quote is a draft; send it to the customer"
          : m.quoteStatus === "sent"
            ? "the quote is sent and waiting for the customer's answer"
            : "the customer declined the quote; send a new version";
    return [`An approved quote: ${now}.`];
  }
  const owed = depositOwedCents(m);
  return owed > 0 ? [`Deposit: ${formatCents(owed)} not paid yet; the customer pays on the status link, or record cash or a check under Money.`] : [];
}

/** What the job needs before it leaves the shop: the invoice settled or on account. */
export function moneyBeforeDeliveryUnmet(m: JobMoney): string[] {
  if (!m.checksOn) return [];
  if (!m.invoice) return m.priceCents > 0 ? ["Invoice: none yet; it goes out when the job reaches Ready for pickup."] : ["Invoice: no approved quote to invoice; make and send a quote first."];
  if (invoiceOutOfDate(m)) return [`${outOfDateWords(m.invoice, m.priceCents)}: the owner voids it under Money, then make the new invoice there.`];
  if (m.invoice.status === "paid" || m.invoice.status === "on_account") return [];
  const due = balanceDueCents(m);
  return due > 0 ? [`Invoice ${m.invoice.number}: balance due ${formatCents(due)}; the customer pays on the status link, or record a payment under Money.`] : [];
}

/** The money state in words, for the card and the job page ("Deposit paid", "Balance due $1,234.00"). */
export function moneyWords(m: JobMoney): string | null {
  if (m.invoice) {
    if (invoiceOutOfDate(m)) return "Invoice out of date";
    if (m.invoice.status === "on_account") return "Invoice on account";
    const due = balanceDueCents(m);
    if (m.invoice.status === "paid" || due <= 0) return "Paid in full";
    return `Balance due ${formatCents(due)}`;
  }
  switch (m.quoteStatus) {
    case null:
      return null;
    case "draft":
      return "Quote draft";
    case "sent":
      return "Quote sent";
    case "declined":
      return "Quote declined";
    case "approved":
      if (m.depositAskedCents <= 0) return "Quote approved";
      return depositOwedCents(m) > 0 ? `Deposit due ${formatCents(depositOwedCents(m))}` : "Deposit paid";
  }
}
