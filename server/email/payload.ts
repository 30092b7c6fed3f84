import type { Stage } from "@/db/schema";
import { isStage } from "@/server/jobs/stages";

export interface StageChangedPayload {
  /** Where the customer last heard the job was (or the stage it left, for a first message). */
  from: Stage | null;
  to: Stage;
  /** Set when the office asked for a message to go again. */
  resendOf?: string;
  requestedBy?: string;
}

export interface LinkIssuedPayload {
  linkId: number;
  requestedBy: string;
}

/** A quote or change order the office sent: the e-mail names it and carries its PDF. */
export interface QuoteSentPayload {
  quoteId: number;
  requestedBy: string;
}

/** An invoice made when the job reached Ready for pickup: the e-mail carries its PDF and the way to pay. */
export interface InvoiceSentPayload {
  invoiceId: number;
  requestedBy: string;
}

export function parseInvoicePayload(raw: string): InvoiceSentPayload | null {
  try {
    const p = JSON.parse(raw) as Partial<InvoiceSentPayload>;
    if (typeof p.invoiceId !== "number" || !Number.isInteger(p.invoiceId) || typeof p.requestedBy !== "string") return null;
    return { invoiceId: p.invoiceId, requestedBy: p.requestedBy };
  } catch {
    return null;
  }
}

export function parseQuotePayload(raw: string): QuoteSentPayload | null {
  try {
    const p = JSON.parse(raw) as Partial<QuoteSentPayload>;
    if (typeof p.quoteId !== "number" || !Number.isInteger(p.quoteId) || typeof p.requestedBy !== "string") return null;
    return { quoteId: p.quoteId, requestedBy: p.requestedBy };
  } catch {
    return null;
  }
}

export function parsePayload(raw: string): StageChangedPayload | null {
  try {
    const p = JSON.parse(raw) as Partial<StageChangedPayload>;
    if (typeof p.to !== "string" || !isStage(p.to)) return null;
    if (p.from !== null && (typeof p.from !== "string" || !isStage(p.from))) return null;
    return { from: p.from, to: p.to, resendOf: typeof p.resendOf === "string" ? p.resendOf : undefined, requestedBy: typeof p.requestedBy === "string" ? p.requestedBy : undefined };
  } catch {
    return null;
  }
}

export function parseLinkPayload(raw: string): LinkIssuedPayload | null {
  try {
    const p = JSON.parse(raw) as Partial<LinkIssuedPayload>;
    if (typeof p.linkId !== "number" || !Number.isInteger(p.linkId) || typeof p.requestedBy !== "string") return null;
    return { linkId: p.linkId, requestedBy: p.requestedBy };
  } catch {
    return null;
  }
}

/** What a payment receipt paid for, as it stood when the money came in. */
export type ReceiptPaidFor = { kind: "deposit"; quoteVersion: number | null } | { kind: "invoice"; invoiceNumber: string };

/**
 * A payment the customer made (online) or the office recorded: the receipt reads the payment row for
 * the amount, method and date, and keeps here what the job still owed right after it, so a later
 * payment does not change what this receipt says.
 */
export interface PaymentReceivedPayload {
  paymentId: number;
  paidFor: ReceiptPaidFor;
  /** Still owed on the job after this payment (never below 0). */
  balanceAfterCents: number;
  /** Put on the customer's account by the owner (owed, not received). */
  onAccountCents: number;
  requestedBy: string;
  resendOf?: string;
}

const wholeCents = (v: unknown): v is number => typeof v === "number" && Number.isSafeInteger(v) && v >= 0;

export function parseReceiptPayload(raw: string): PaymentReceivedPayload | null {
  try {
    const p = JSON.parse(raw) as Partial<PaymentReceivedPayload> & { paidFor?: Partial<{ kind: string; quoteVersion: unknown; invoiceNumber: unknown }> };
    if (typeof p.paymentId !== "number" || !Number.isInteger(p.paymentId) || typeof p.requestedBy !== "string") return null;
    if (!wholeCents(p.balanceAfterCents) || !wholeCents(p.onAccountCents)) return null;
    const f = p.paidFor;
    let paidFor: ReceiptPaidFor;
    if (f?.kind === "deposit" && (f.quoteVersion === null || (typeof f.quoteVersion === "number" && Number.isInteger(f.quoteVersion)))) paidFor = { kind: "deposit", quoteVersion: f.quoteVersion };
    else if (f?.kind === "invoice" && typeof f.invoiceNumber === "string" && f.invoiceNumber.length > 0) paidFor = { kind: "invoice", invoiceNumber: f.invoiceNumber };
    else return null;
    return {
      paymentId: p.paymentId,
      paidFor,
      balanceAfterCents: p.balanceAfterCents,
      onAccountCents: p.onAccountCents,
      requestedBy: p.requestedBy,
      ...(typeof p.resendOf === "string" ? { resendOf: p.resendOf } : {}),
    };
  } catch {
    return null;
  }
}
