import { format, parseISO } from "date-fns";
import type { Stage } from "@/db/schema";
import { type DocumentFigures, type FigureRow, figureRows } from "@/server/money/document";
import { formatCents } from "@/server/money/totals";
import type { ReceiptPaidFor } from "./payload";
import { CUSTOMER_STAGE_NAMES, whatComesNext, whatHappened, whereItIsNow } from "@/server/status/words";

/**
 * Where the status link goes in a stored message. The link's token is never stored: the
 * dispatcher puts the URL in at send time. Interpolated values cannot forge it (braces are
 * escaped in the HTML part and the marker is removed from values in the text part).
 */
export const LINK_MARK = "{{status_link}}";

/** Which job a message is about: every subject, first line and status page heading carries all three. */
export interface JobNaming {
  workOrder: string;
  /** The work description as the office wrote it. */
  description: string;
  unitNumber: string;
}

interface CommonEmailInput {
  shop: { name: string; phone: string };
  job: JobNaming;
  /** The names of the contacts the e-mail goes to; the greeting uses them, never the company. */
  contactNames: string[];
  /** Whether any photo is shared with the customer; only then does the e-mail mention photos. */
  photosShared: boolean;
  /** Where replies go (EMAIL_REPLY_TO); without one the e-mail never invites a reply. */
  replyTo: string | null;
}

export interface StageEmailInput extends CommonEmailInput {
  from: Stage | null;
  to: Stage;
  /** The job's route (server/status/route.ts): "Next, …" names the next step on it. */
  route: readonly Stage[];
  /** The job's due date (YYYY-MM-DD), shown as the expected ready date. */
  readyBy: string | null;
  linkDays: number;
}

export type LinkEmailInput = CommonEmailInput & { stage: Stage; route: readonly Stage[]; linkDays: number };

export interface RenderedEmail {
  subject: string;
  html: string;
  text: string;
}

const HTML_ESCAPES: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;", "{": "&#123;", "}": "&#125;" };

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"'{}]/g, (c) => HTML_ESCAPES[c]);
}

function plain(value: string): string {
  return value.replaceAll(LINK_MARK, "").replace(/[\r\n]+/g, " ").trim();
}

/** A tagged template whose every interpolation is escaped; only `safe()` values pass as they are. */
class SafeHtml {
  constructor(readonly value: string) {}
}
const safe = (value: string) => new SafeHtml(value);
function html(strings: TemplateStringsArray, ...values: (string | SafeHtml)[]): SafeHtml {
  let out = strings[0];
  values.forEach((v, i) => {
    out += (v instanceof SafeHtml ? v.value : escapeHtml(String(v))) + strings[i + 1];
  });
  return new SafeHtml(out);
}

export function readyDateWords(readyBy: string | null): string | null {
  if (!readyBy) return null;
  const date = parseISO(readyBy);
  return Number.isNaN(date.getTime()) ? null : format(date, "EEEE d MMMM yyyy");
}

// The palette is the app's theme tokens (app/globals.css), written out because mail clients ignore stylesheets.
const INK = "#16252b";
const INK_SOFT = "#44545b";
const BAY = "#0e5a54";
const PAPER = "#f5f3ee";
const LINE = "#d5d9d6";

/** How the customer reaches the shop: a reply is offered only when replies go somewhere. */
export function reachWords(shopName: string, phone: string, repliesRead: boolean): string {
  if (phone) return repliesRead ? `Questions? Call ${shopName} at ${phone}, or reply to this e-mail.` : `Questions? Call ${shopName} at ${phone}.`;
  return repliesRead ? "Questions? Reply to this e-mail." : `Questions? Get in touch with ${shopName}.`;
}

/** "Work order WO-26-0012 · Unit HR-21 · Wet kit: 35 gal stainless tank, PTO pump". */
export function jobLine(job: JobNaming): string {
  const description = plain(job.description);
  return [`Work order ${plain(job.workOrder)}`, `Unit ${plain(job.unitNumber)}`, ...(description ? [description] : [])].join(" · ");
}

/** "Hello Dana,", "Hello Dana and Lee,", "Hello Dana, Lee and Sam,"; "Hello," when no name is known. */
export function greeting(names: string[]): string {
  const clean = [...new Set(names.map(plain).filter(Boolean))];
  if (clean.length === 0) return "Hello,";
  if (clean.length === 1) return `Hello ${clean[0]},`;
  return `Hello ${clean.slice(0, -1).join(", ")} and ${clean.at(-1)},`;
}

interface FrameParts {
  subject: string;
  heading: string;
  lines: string[];
  strong: string | null;
  linkIntro: string;
  button: string;
  /** Figures shown as a small table under the lines (a quote's totals). */
  figures?: FigureRow[];
  /** Added to the status link (a "#quote" fragment opens the page at the quote). */
  linkSuffix?: string;
}

function frame(input: CommonEmailInput, parts: FrameParts): RenderedEmail {
  const link = LINK_MARK + (parts.linkSuffix ?? "");
  const figures = parts.figures ?? [];
  const shopName = plain(input.shop.name);
  const reach = reachWords(shopName, plain(input.shop.phone), Boolean(input.replyTo));
  const line = jobLine(input.job);
  const hello = greeting(input.contactNames);
  const text = [
    line,
    "",
    hello,
    "",
    ...parts.lines,
    ...(parts.strong ? [parts.strong] : []),
    ...(figures.length ? ["", ...figures.map((f) => `${f.label}: ${f.value}`)] : []),
    "",
    parts.linkIntro,
    link,
    "",
    reach,
    "This link is for you and your team; anyone with it can see this truck's progress.",
    "",
    shopName,
  ].join("\n");

  // The address is one long word: it must be allowed to break, or a phone shows the mail wider than its screen.
  const body = html`<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${parts.subject}</title></head>
<body style="margin:0;padding:0;background:${PAPER};color:${INK};font-family:Helvetica,Arial,sans-serif;font-size:16px;line-height:1.5;overflow-wrap:anywhere;word-wrap:break-word">
<div style="max-width:560px;margin:0 auto;padding:24px 16px">
<p style="margin:0 0 4px;font-size:15px;font-weight:bold;color:${INK}">${line}</p>
<p style="margin:0 0 4px;font-size:14px;color:${INK_SOFT}">${shopName}</p>
<h1 style="margin:0 0 16px;font-size:22px;line-height:1.3;color:${INK}">${parts.heading}</h1>
<p style="margin:0 0 12px">${hello}</p>
${safe(parts.lines.map((l) => html`<p style="margin:0 0 12px">${l}</p>`.value).join("\n"))}
${parts.strong ? html`<p style="margin:0 0 20px"><strong>${parts.strong}</strong></p>` : safe("")}
${figures.length ? html`<table role="presentation" style="width:100%;max-width:360px;border-collapse:collapse;margin:0 0 20px">${safe(figures.map((f) => html`<tr><td style="padding:2px 8px 2px 0;${safe(f.strong ? "font-weight:bold;" : "")}">${f.label}</td><td style="padding:2px 0;text-align:right;white-space:nowrap;${safe(f.strong ? "font-weight:bold;" : "")}">${f.value}</td></tr>`.value).join(""))}</table>` : safe("")}
<p style="margin:0 0 24px"><a href="${safe(link)}" style="display:inline-block;max-width:100%;box-sizing:border-box;background:${BAY};color:#ffffff;text-decoration:none;font-weight:bold;padding:12px 20px;border-radius:6px">${parts.button}</a></p>
<p style="margin:0 0 8px;font-size:14px;color:${INK_SOFT};word-break:break-all;overflow-wrap:anywhere">Or open this address: ${safe(link)}</p>
<hr style="border:none;border-top:1px solid ${LINE};margin:20px 0">
<p style="margin:0 0 8px;font-size:14px;color:${INK_SOFT}">${reach}</p>
<p style="margin:0;font-size:14px;color:${INK_SOFT}">This link is for you and your team; anyone with it can see this truck's progress.</p>
</div></body></html>`;
  return { subject: parts.subject, html: body.value, text };
}

function linkWords(photosShared: boolean) {
  return photosShared
    ? { linkIntro: "See the progress and photos of your truck here:", button: "See your truck's progress and photos" }
    : { linkIntro: "See the progress of your truck here:", button: "See your truck's progress" };
}

export function renderStageEmail(input: StageEmailInput): RenderedEmail {
  const stageName = CUSTOMER_STAGE_NAMES[input.to];
  const ready = readyDateWords(input.readyBy);
  const readyLine = input.to === "ready" || input.to === "delivered" ? null : ready ? `Expected ready date: ${ready}.` : "We will confirm the expected ready date soon.";
  return frame(input, {
    subject: `${stageName} · ${jobLine(input.job)}`,
    heading: stageName,
    lines: [whatHappened(input.from, input.to, input.route), whatComesNext(input.to, input.route, input.linkDays)],
    strong: readyLine,
    ...linkWords(input.photosShared),
  });
}

export interface InvoiceEmailInput extends CommonEmailInput {
  invoice: { number: string; figures: DocumentFigures };
  pdfName: string;
}

/** The invoice when the job is ready for pickup: the figures, the PDF, and where to pay the balance. */
export function renderInvoiceEmail(input: InvoiceEmailInput): RenderedEmail {
  const due = input.invoice.figures.balanceCents ?? 0;
  return frame(input, {
    subject: `Invoice ${input.invoice.number} · balance ${formatCents(due)} · ${jobLine(input.job)}`,
    heading: `Invoice ${input.invoice.number}`,
    lines: [
      "Your truck is ready for pickup. Here is the invoice for the approved work, with the deposit and anything paid since taken off.",
      `The invoice is attached as a PDF (${input.pdfName}).`,
      due > 0 ? "You can pay the balance by card on your truck's status page, or by check or at the counter when you collect it." : "Nothing is owed: thank you.",
    ],
    strong: null,
    figures: figureRows(input.invoice.figures),
    linkIntro: due > 0 ? "See the invoice and pay the balance here:" : "See the invoice here:",
    button: due > 0 ? `Pay ${formatCents(due)}` : "See the invoice",
    linkSuffix: "",
  });
}

/** The e-mail that carries a status link the office just issued in place of the old one. */
export function renderLinkEmail(input: LinkEmailInput): RenderedEmail {
  return frame(input, {
    subject: `New status link · ${jobLine(input.job)}`,
    heading: "Your new status link",
    lines: ["We have issued a new status link for this job. The link we sent before no longer works; use this one from now on.", whereItIsNow(input.stage), whatComesNext(input.stage, input.route, input.linkDays)],
    strong: null,
    ...linkWords(input.photosShared),
  });
}

/** The stored message with the status link put in; the URL is escaped for the HTML part. */
export function withStatusLink(message: { html: string; text: string }, url: string) {
  return { html: message.html.replaceAll(LINK_MARK, escapeHtml(url)), text: message.text.replaceAll(LINK_MARK, url) };
}

export interface QuoteEmailInput extends CommonEmailInput {
  quote: {
    kind: "quote" | "change_order";
    version: number;
    subtotalCents: number;
    taxableCents: number;
    taxRatePercent: number;
    taxCents: number;
    totalCents: number;
    depositCents: number;
  };
  /** The attached PDF's file name, named in the e-mail so the customer knows to look for it. */
  pdfName: string;
}

/** The e-mail a sent quote or change order goes out as: the figures, the PDF, and the link to answer it. */
export function renderQuoteEmail(input: QuoteEmailInput): RenderedEmail {
  const q = input.quote;
  const what = q.kind === "quote" ? "quote" : "change order";
  const What = q.kind === "quote" ? "Quote" : "Change order";
  const deposit = q.kind === "quote" && q.depositCents > 0;
  return frame(input, {
    subject: `${What} ${formatCents(q.totalCents)} · ${jobLine(input.job)}`,
    heading: `${What} version ${q.version}`,
    lines: [
      q.kind === "quote" ? "Here is our price for the work on your truck." : "Here is the price of work added to your job since you approved the quote.",
      `The ${what} is attached as a PDF (${input.pdfName}). You can approve or decline it on your truck's status page: type your name and tick the terms to approve, or tell us why not.`,
      ...(deposit ? ["When you approve, we ask the deposit shown below before we order parts and start work."] : []),
    ],
    strong: null,
    figures: figureRows({ ...q, depositCents: q.kind === "quote" ? q.depositCents : undefined }),
    linkIntro: `See the ${what} and answer it here:`,
    button: `See the ${what} and answer it`,
    linkSuffix: "#quote",
  });
}

export interface ReceiptEmailInput extends CommonEmailInput {
  receipt: {
    amountCents: number;
    paidFor: ReceiptPaidFor;
    /** The method in the shop's words (METHOD_LABELS: "Card (online)", "Check"…). */
    methodLabel: string;
    /** The day of the payment on the shop's clock, in words ("Thursday 3 December 2026"). */
    dateWords: string;
    /** Still owed on the job after this payment. */
    balanceAfterCents: number;
    /** Owed on the customer's account (the owner put it there; not money received). */
    onAccountCents: number;
  };
}

/** "Deposit on quote v2", "Invoice INV-26-0003". */
export function paidForWords(paidFor: ReceiptPaidFor): string {
  if (paidFor.kind === "invoice") return `Invoice ${plain(paidFor.invoiceNumber)}`;
  return paidFor.quoteVersion === null ? "Deposit" : `Deposit on quote v${paidFor.quoteVersion}`;
}

/** The receipt for a payment: what was paid, for what, how, when, and what the job still owes. */
export function renderReceiptEmail(input: ReceiptEmailInput): RenderedEmail {
  const r = input.receipt;
  const amount = formatCents(r.amountCents);
  const owed = Math.max(0, r.balanceAfterCents);
  const forWhat =
    r.paidFor.kind === "invoice" ? `toward invoice ${plain(r.paidFor.invoiceNumber)}` : r.paidFor.quoteVersion === null ? "for the deposit" : `for the deposit on quote v${r.paidFor.quoteVersion}`;
  const figures: FigureRow[] = [
    { label: "Amount paid", value: amount, strong: true },
    { label: "For", value: paidForWords(r.paidFor), strong: false },
    { label: "Paid by", value: r.methodLabel, strong: false },
    { label: "Date", value: r.dateWords, strong: false },
    owed > 0 ? { label: "Still owed on the job", value: formatCents(owed), strong: true } : { label: "Still owed on the job", value: r.onAccountCents > 0 ? formatCents(0) : "Paid in full", strong: true },
    ...(r.onAccountCents > 0 ? [{ label: "On your account", value: formatCents(r.onAccountCents), strong: false }] : []),
  ];
  const after =
    owed > 0
      ? r.paidFor.kind === "deposit"
        ? `The rest of the agreed price, ${formatCents(owed)}, is invoiced when your truck is ready for pickup.`
        : `${formatCents(owed)} is still owed on this job.`
      : r.onAccountCents > 0
        ? `Nothing more is owed now; ${formatCents(r.onAccountCents)} is on your account.`
        : "Paid in full: nothing more is owed on this job.";
  return frame(input, {
    subject: `Payment received ${amount} · ${jobLine(input.job)}`,
    heading: "Payment received",
    lines: [`Thank you: we received your payment of ${amount} ${forWhat}. This e-mail is your receipt.`, after],
    strong: null,
    figures,
    linkIntro: "See your truck's progress and what is paid here:",
    button: "See your truck's progress",
    linkSuffix: "",
  });
}
