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
