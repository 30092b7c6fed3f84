/**
 * A money document (quote, change order, invoice) as people read it: the figures and their words,
 * written once here and used by the job page, the customer's page, the e-mail and the PDF, so the
 * four can never show the same total two ways. Pure: no I/O.
 */
import type { LineKind } from "@/db/tables/money";
import { formatCents } from "./totals";

/** What each kind of line is called on every screen and document. */
export const LINE_KIND_WORDS: Record<LineKind, string> = {
  labour: "Labour",
  part: "Bought-in part",
  fabrication: "Fabricated part",
  coating: "Outside coating",
  fee: "Fee",
};

export interface DocumentFigures {
  subtotalCents: number;
  taxableCents: number;
  /** The rate as a percent (8.25). */
  taxRatePercent: number;
  taxCents: number;
  totalCents: number;
  /** Asked on approval of a quote; change orders and invoices ask none. */
  depositCents?: number;
  /** Money received against the document, newest last (invoices). */
  payments?: readonly { label: string; amountCents: number }[];
  /** What is still owed, when the document says so (invoices). */
  balanceCents?: number;
}

export interface FigureRow {
  label: string;
  value: string;
  /** The total and the balance stand out. */
  strong: boolean;
}

/** "Sales tax 8.25 % on $1,234.56". */
export function taxLabel(taxRatePercent: number, taxableCents: number): string {
  return `Sales tax ${taxRatePercent} % on ${formatCents(taxableCents)}`;
}

/** The figures under a document's lines, in order, as every screen, e-mail and PDF shows them. */
export function figureRows(doc: DocumentFigures): FigureRow[] {
  const rows: FigureRow[] = [
    { label: "Subtotal", value: formatCents(doc.subtotalCents), strong: false },
    { label: taxLabel(doc.taxRatePercent, doc.taxableCents), value: formatCents(doc.taxCents), strong: false },
    { label: "Total", value: formatCents(doc.totalCents), strong: true },
  ];
  // Nothing taxable and no tax: no "Sales tax 8.25 % on $0.00" row (each line already says "no tax").
  if (doc.taxableCents === 0 && doc.taxCents === 0) rows.splice(1, 1);
  if (doc.depositCents !== undefined && doc.depositCents > 0) rows.push({ label: "Deposit due on approval", value: formatCents(doc.depositCents), strong: false });
  for (const p of doc.payments ?? []) rows.push({ label: p.label, value: formatCents(-p.amountCents), strong: false });
  if (doc.balanceCents !== undefined) rows.push({ label: "Balance due", value: formatCents(doc.balanceCents), strong: true });
  return rows;
}

/** A line's quantity and price as the customer reads them: "2.5 × $125.00". */
export function lineQuantityWords(quantity: number, unitPriceCents: number): string {
  return `${quantity} × ${formatCents(unitPriceCents)}`;
}
