import { format, parseISO } from "date-fns";
import type { JobScope, Stage } from "@/db/schema";
import { CUSTOMER_STAGE_NAMES, whatComesNext, whatHappened } from "@/server/status/words";

/**
 * Where the status link goes in a stored message. The link's token is never stored: the
 * dispatcher puts the URL in at send time. Interpolated values cannot forge it (braces are
 * escaped in the HTML part and the marker is removed from values in the text part).
 */
export const LINK_MARK = "{{status_link}}";

export interface StageEmailInput {
  shop: { name: string; phone: string };
  truck: { unitNumber: string; description: string };
  customerName: string;
  from: Stage | null;
  to: Stage;
  scope: JobScope;
  /** The job's due date (YYYY-MM-DD), shown as the expected ready date. */
  readyBy: string | null;
  linkDays: number;
  /** Where replies go (EMAIL_REPLY_TO); without one the e-mail never invites a reply. */
  replyTo: string | null;
}

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

export function renderStageEmail(input: StageEmailInput): RenderedEmail {
  const unit = plain(input.truck.unitNumber);
  const shopName = plain(input.shop.name);
  const phone = plain(input.shop.phone);
  const customer = plain(input.customerName);
  const stageName = CUSTOMER_STAGE_NAMES[input.to];
  const happened = whatHappened(input.from, input.to, input.scope);
  const next = whatComesNext(input.to, input.scope, input.linkDays);
  const ready = readyDateWords(input.readyBy);
  const readyLine = input.to === "ready" || input.to === "delivered" ? null : ready ? `Expected ready date: ${ready}.` : "We will confirm the expected ready date soon.";
  const reach = reachWords(shopName, phone, Boolean(input.replyTo));

  const subject = `Unit ${unit}: ${stageName.toLowerCase()} (${shopName})`;

  const text = [
    `Hello ${customer},`,
    "",
    `Unit ${unit}${input.truck.description ? ` (${plain(input.truck.description)})` : ""}`,
    happened,
    next,
    ...(readyLine ? [readyLine] : []),
    "",
    "See the progress and photos of your truck here:",
    LINK_MARK,
    "",
    reach,
    "This link is for you and your team; anyone with it can see this truck's progress.",
    "",
    shopName,
  ].join("\n");

  const body = html`<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${subject}</title></head>
<body style="margin:0;padding:0;background:${PAPER};color:${INK};font-family:Helvetica,Arial,sans-serif;font-size:16px;line-height:1.5">
<div style="max-width:560px;margin:0 auto;padding:24px 16px">
<p style="margin:0 0 4px;font-size:14px;color:${INK_SOFT}">${shopName} · Unit ${unit}</p>
<h1 style="margin:0 0 16px;font-size:22px;line-height:1.3;color:${INK}">${stageName}</h1>
<p style="margin:0 0 12px">Hello ${customer},</p>
<p style="margin:0 0 12px">${happened}</p>
<p style="margin:0 0 12px">${next}</p>
${readyLine ? html`<p style="margin:0 0 20px"><strong>${readyLine}</strong></p>` : safe("")}
<p style="margin:0 0 24px"><a href="${safe(LINK_MARK)}" style="display:inline-block;background:${BAY};color:#ffffff;text-decoration:none;font-weight:bold;padding:12px 20px;border-radius:6px">See your truck's progress and photos</a></p>
<p style="margin:0 0 8px;font-size:14px;color:${INK_SOFT}">Or open this address: ${safe(LINK_MARK)}</p>
<hr style="border:none;border-top:1px solid ${LINE};margin:20px 0">
<p style="margin:0 0 8px;font-size:14px;color:${INK_SOFT}">${reach}</p>
<p style="margin:0;font-size:14px;color:${INK_SOFT}">This link is for you and your team; anyone with it can see this truck's progress.</p>
</div></body></html>`;

  return { subject, html: body.value, text };
}

/** The stored message with the status link put in; the URL is escaped for the HTML part. */
export function withStatusLink(message: { html: string; text: string }, url: string) {
  return { html: message.html.replaceAll(LINK_MARK, escapeHtml(url)), text: message.text.replaceAll(LINK_MARK, url) };
}
