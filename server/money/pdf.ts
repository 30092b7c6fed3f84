/**
 * Any money document as a PDF: a quote, a change order, an invoice. The caller gathers the figures
 * (stored cents, never worked out here); the words under the lines come from `figureRows`, the same
 * function the screens and e-mails use, so the PDF cannot disagree with them.
 *
 * Drawn with pdfkit and its built-in Helvetica (no font file to ship). Helvetica's WinAnsi set has no
 * minus sign (U+2212), so a negative amount prints with the ASCII hyphen; other characters outside
 * the set (typed into a description) print as "?" rather than vanish.
 */
import PDFDocument from "pdfkit";
import { type DocumentFigures, figureRows, lineQuantityWords } from "./document";
import { formatCents } from "./totals";

export interface MoneyDocumentLine {
  description: string;
  /** "Labour", "Bought-in part"… shown small under the description. */
  kindWords?: string;
  quantity: number;
  unitPriceCents: number;
  amountCents: number;
  taxable: boolean;
}

export interface MoneyDocument extends DocumentFigures {
  /** "Quote", "Change order", "Invoice". */
  title: string;
  /** "Version 3", "INV-26-0004". */
  number: string;
  /** The document's date as people read it ("3 December 2026"). */
  dateWords: string;
  shop: { name: string; address: string; phone: string };
  customer: { name: string };
  job: { workOrder: string; description: string; unitNumber: string };
  lines: readonly MoneyDocumentLine[];
  terms?: string;
  /** Set as the PDF's creation date, so the same document renders to the same bytes. */
  createdAt: Date;
}

// Theme tokens of app/globals.css, for print.
const INK = "#16252b";
const INK_SOFT = "#44545b";
const LINE = "#b9c0bc";

// Characters Helvetica's WinAnsi encoding carries beyond ASCII (ISO-8859-1's upper half plus the
// CP1252 extras pdfkit maps); anything else is replaced so the reader sees a mark, not a gap.
const CP1252_EXTRAS = "€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ";
function printable(text: string): string {
  return text.replaceAll("−", "-").replace(/[^\n\x20-\x7e\xa0-\xff]/gu, (c) => (CP1252_EXTRAS.includes(c) ? c : "?"));
}

/** The document as PDF bytes. */
export async function renderMoneyPdf(doc: MoneyDocument): Promise<Buffer> {
  const pdf = new PDFDocument({
    size: "LETTER",
    margin: 54,
    info: { Title: printable(`${doc.title} ${doc.number} · ${doc.job.workOrder}`), Author: printable(doc.shop.name), Creator: "Baywright", CreationDate: doc.createdAt, ModDate: doc.createdAt },
  });
  const chunks: Buffer[] = [];
  pdf.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    pdf.on("end", () => resolve(Buffer.concat(chunks)));
    pdf.on("error", reject);
  });

  const left = pdf.page.margins.left;
  const right = pdf.page.width - pdf.page.margins.right;
  const width = right - left;
  const t = printable;

  // Shop on the left, the document's name and number on the right.
  const top = pdf.y;
  pdf.fillColor(INK).font("Helvetica-Bold").fontSize(16).text(t(doc.shop.name), left, top, { width: width * 0.6 });
  pdf.font("Helvetica").fontSize(10).fillColor(INK_SOFT);
  if (doc.shop.address) pdf.text(t(doc.shop.address), { width: width * 0.6 });
  if (doc.shop.phone) pdf.text(t(`Phone ${doc.shop.phone}`), { width: width * 0.6 });
  const leftEnd = pdf.y;
  pdf.fillColor(INK).font("Helvetica-Bold").fontSize(20).text(t(doc.title), left + width * 0.6, top, { width: width * 0.4, align: "right" });
  pdf.font("Helvetica").fontSize(10).text(t(doc.number), { width: width * 0.4, align: "right" });
  pdf.fillColor(INK_SOFT).text(t(doc.dateWords), { width: width * 0.4, align: "right" });
  pdf.y = Math.max(leftEnd, pdf.y) + 18;

  pdf.x = left;
  pdf.fillColor(INK).font("Helvetica-Bold").fontSize(11).text(t(`For ${doc.customer.name}`), left, pdf.y, { width });
  pdf.font("Helvetica").fontSize(10).text(t([`Work order ${doc.job.workOrder}`, `Unit ${doc.job.unitNumber}`, doc.job.description].filter(Boolean).join(" · ")), { width });
  pdf.moveDown(1);

  // Lines: description (with its kind and tax), quantity × unit price, amount.
  const col = { desc: left, qty: left + width * 0.56, amount: left + width * 0.8 };
  const rule = (y: number, color = LINE) => pdf.moveTo(left, y).lineTo(right, y).lineWidth(0.75).strokeColor(color).stroke();
  pdf.font("Helvetica-Bold").fontSize(9).fillColor(INK_SOFT);
  const headY = pdf.y;
  pdf.text("Description", col.desc, headY, { width: width * 0.54 });
  pdf.text("Qty × unit price", col.qty, headY, { width: width * 0.22, align: "right" });
  pdf.text("Amount", col.amount, headY, { width: width * 0.2, align: "right" });
  pdf.y = headY + 14;
  rule(pdf.y - 2, INK);
  for (const line of doc.lines) {
    const note = [line.kindWords, line.taxable ? "taxable" : "not taxed"].filter(Boolean).join(" · ");
    const descHeight = pdf.font("Helvetica").fontSize(10).heightOfString(t(line.description), { width: width * 0.54 }) + 12;
    if (pdf.y + descHeight + 8 > pdf.page.height - pdf.page.margins.bottom) pdf.addPage();
    const y = pdf.y + 4;
    pdf.fillColor(INK).font("Helvetica").fontSize(10).text(t(line.description), col.desc, y, { width: width * 0.54 });
    pdf.fillColor(INK_SOFT).fontSize(8).text(t(note), { width: width * 0.54 });
    const after = pdf.y;
    pdf.fillColor(INK).fontSize(10).text(t(lineQuantityWords(line.quantity, line.unitPriceCents)), col.qty, y, { width: width * 0.22, align: "right" });
    pdf.text(t(formatCents(line.amountCents)), col.amount, y, { width: width * 0.2, align: "right" });
    pdf.y = after + 4;
    rule(pdf.y);
  }
  pdf.moveDown(0.8);

  // The figures, right-aligned, from the one function every screen uses.
  for (const row of figureRows(doc)) {
    if (pdf.y + 20 > pdf.page.height - pdf.page.margins.bottom) pdf.addPage();
    const y = pdf.y;
    pdf.fillColor(INK).font(row.strong ? "Helvetica-Bold" : "Helvetica").fontSize(row.strong ? 12 : 10);
    pdf.text(t(row.label), left + width * 0.3, y, { width: width * 0.48, align: "right" });
    pdf.text(t(row.value), col.amount, y, { width: width * 0.2, align: "right" });
    pdf.y = Math.max(pdf.y, y + 14) + 2;
  }

  if (doc.terms?.trim()) {
    pdf.moveDown(1.5);
    pdf.x = left;
    pdf.fillColor(INK).font("Helvetica-Bold").fontSize(10).text("Terms", left, pdf.y, { width });
    pdf.font("Helvetica").fontSize(9).fillColor(INK_SOFT).text(t(doc.terms.trim()), { width });
  }
  pdf.end();
  return done;
}
