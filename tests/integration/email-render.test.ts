import { describe, expect, it } from "vitest";
import { STAGES, type Stage } from "@/db/schema";
import { parseReceiptPayload } from "@/server/email/payload";
import { LINK_MARK, escapeHtml, renderLinkEmail, renderReceiptEmail, renderStageEmail, withStatusLink } from "@/server/email/render";
import { CUSTOMER_STAGE_NAMES, whatComesNext, whatHappened, whereItIsNow } from "@/server/status/words";
import { classifySendError } from "@/server/email/sender";

// Every step on the route: a tank that is leak-tested and goes out for powder coat.
const FULL_ROUTE: Stage[] = [...STAGES];
const INSTALL_ROUTE: Stage[] = ["queued", "install", "wire", "ready", "delivered"];

const base = {
  shop: { name: "Cold Creek Upfit", phone: "(555) 010-4417" },
  job: { workOrder: "WO-26-0012", description: "Wet kit: 35 gal stainless tank, PTO pump", unitNumber: "HR-27" },
  contactNames: ["Dana Whitcombe"],
  photosShared: true,
  route: FULL_ROUTE,
  readyBy: "2031-05-16",
  linkDays: 60,
  replyTo: null,
};

describe("stage e-mail text", () => {
  it("gives every stage its own subject and first line, with what comes next", () => {
    const rendered = STAGES.map((to, i) => renderStageEmail({ ...base, from: i === 0 ? null : STAGES[i - 1], to }));
    expect(new Set(rendered.map((r) => r.subject)).size).toBe(STAGES.length);
    expect(new Set(rendered.map((r) => r.text.split("\n")[4])).size).toBe(STAGES.length);
    for (const r of rendered) {
      expect(r.text).toContain(LINK_MARK);
      expect(r.html).toContain(`href="${LINK_MARK}"`);
      expect(r.text).toContain("Questions? Call Cold Creek Upfit at (555) 010-4417");
    }
    expect(rendered[STAGES.indexOf("ready")].text).not.toContain("Expected ready date");
    expect(rendered[STAGES.indexOf("delivered")].text).toContain("keeps working for 60 days");
    expect(renderStageEmail({ ...base, from: "queued", to: "install", route: INSTALL_ROUTE }).text).toContain("Work has started. We are installing the kit on your truck.");
    expect(renderStageEmail({ ...base, from: "wire", to: "install", readyBy: null }).text).toContain("Your job has gone back to the install step for more work. We are installing the kit on your truck.");
    expect(renderStageEmail({ ...base, from: "queued", to: "fabricate", readyBy: null }).text).toContain("We will confirm the expected ready date soon.");
  });

  it("says only what the stage itself tells: no test passed, no parts gone or back, no tank or PTO the job may not have", () => {
    // An owner's override moves a card past a gate, and a job may be a bracket with no tank: the words must hold for both.
    const claims = /\bpassed\b|tank|reservoir|\bPTO\b|dash|gone out|have left|(?<!when the )parts are back|is built|sump|weld/i;
    const routes: Stage[][] = [FULL_ROUTE, INSTALL_ROUTE, ["queued", "fabricate", "install", "wire", "ready", "delivered"], ["queued", "fabricate", "pressure_test", "install", "wire", "ready", "delivered"]];
    for (const route of routes) {
      for (const to of route) {
        const sentences = [CUSTOMER_STAGE_NAMES[to], whereItIsNow(to), whatComesNext(to, route), ...[null, ...route].filter((from): from is Stage | null => from !== to).map((from) => whatHappened(from, to, route))];
        for (const sentence of sentences) expect(sentence, `${route.join(",")} → ${to}`).not.toMatch(claims);
      }
    }
    const override = renderStageEmail({ ...base, job: { ...base.job, description: "Hose carrier and breakaway bracket" }, from: "pressure_test", to: "coating" });
    expect(override.text).toContain("Your job is at powder coat: the fabricated parts go to an outside coater and come back before install.");
    expect(override.text).toContain("When the parts are back from the coater, we install the kit on your truck.");
    expect(override.subject).toBe("Powder coat · Work order WO-26-0012 · Unit HR-27 · Hose carrier and breakaway bracket");
    const built = renderStageEmail({ ...base, from: "fabricate", to: "pressure_test" });
    expect(built.text).toContain("The fabricated parts are being pressure-tested for leaks.");
    expect(built.text).toContain("Next, the parts go to an outside coater for powder coat.");
    expect(renderStageEmail({ ...base, from: "pressure_test", to: "fabricate" }).text).toContain("Your job has gone back to the fabrication step for more work. We are building the fabricated parts for your truck.");
    expect(whereItIsNow("wire")).toBe("We are wiring and run-testing the kit.");
    expect(whereItIsNow("delivered")).toBe("Picked up — thank you.");
  });

  it("invites a reply only when replies go somewhere; otherwise it gives the shop's name and phone", () => {
    const noReplyTo = STAGES.map((to) => renderStageEmail({ ...base, from: null, to }));
    for (const r of noReplyTo) {
      expect(r.text).toContain("Questions? Call Cold Creek Upfit at (555) 010-4417.");
      expect(r.html).toContain("Questions? Call Cold Creek Upfit at (555) 010-4417.");
      expect(`${r.text}\n${r.html}`).not.toMatch(/reply/i);
    }
    const withReplyTo = renderStageEmail({ ...base, from: null, to: "install", replyTo: "office@cold-creek.example" });
    expect(withReplyTo.text).toContain("Questions? Call Cold Creek Upfit at (555) 010-4417, or reply to this e-mail.");
    const noPhone = renderStageEmail({ ...base, shop: { name: "Cold Creek Upfit", phone: "" }, from: null, to: "install" });
    expect(noPhone.text).toContain("Questions? Get in touch with Cold Creek Upfit.");
    expect(noPhone.text).not.toMatch(/reply/i);
    expect(renderStageEmail({ ...base, shop: { name: "Cold Creek Upfit", phone: "" }, from: null, to: "install", replyTo: "office@cold-creek.example" }).text).toContain("Questions? Reply to this e-mail.");
  });

  it("escapes every value in the HTML part, and no value can forge the link's place", () => {
    const hostile = renderStageEmail({
      ...base,
      from: "queued",
      to: "fabricate",
      contactNames: [`<img src=x onerror=alert(1)> ${LINK_MARK}`],
      shop: { name: `Shop "&" <Co>`, phone: "555'0100" },
      job: { workOrder: "WO-<1>", description: `<script>x</script> ${LINK_MARK}`, unitNumber: "<U1>" },
    });
    expect(hostile.html).not.toMatch(/<img|<U1>|<Co>|<script>|WO-<1>/);
    expect(hostile.html).toContain("Hello &lt;img src=x onerror=alert(1)&gt;,");
    expect(hostile.html).toContain("Shop &quot;&amp;&quot; &lt;Co&gt;");
    expect(hostile.text.split(LINK_MARK)).toHaveLength(2);
    const filled = withStatusLink(hostile, "https://status.shop.example/status/abc?x=1&y=2");
    expect(filled.html).toContain('href="https://status.shop.example/status/abc?x=1&amp;y=2"');
    expect(filled.html.match(/status\.shop\.example/g)).toHaveLength(2);
    expect(filled.text.match(/status\.shop\.example/g)).toHaveLength(1);
    expect(escapeHtml(`a'b{}`)).toBe("a&#39;b&#123;&#125;");
  });
});

describe("every e-mail names the job and greets the people it goes to", () => {
  it("puts the work order, the work description as written and the unit in the subject and the first line of both parts", () => {
    const mail = renderStageEmail({ ...base, from: "queued", to: "fabricate" });
    expect(mail.subject).toBe("Fabrication · Work order WO-26-0012 · Unit HR-27 · Wet kit: 35 gal stainless tank, PTO pump");
    expect(mail.text.split("\n")[0]).toBe("Work order WO-26-0012 · Unit HR-27 · Wet kit: 35 gal stainless tank, PTO pump");
    const firstHtmlLine = mail.html.match(/<body[^>]*>\s*<div[^>]*>\s*<p[^>]*>([^<]*)<\/p>/)?.[1];
    expect(firstHtmlLine).toBe("Work order WO-26-0012 · Unit HR-27 · Wet kit: 35 gal stainless tank, PTO pump");
    // Two open jobs on one unit read as two jobs.
    const other = renderStageEmail({ ...base, job: { workOrder: "WO-26-0019", description: "Rear camera and work lights", unitNumber: "HR-27" }, from: "queued", to: "install", route: INSTALL_ROUTE });
    expect(other.subject).toBe("Install · Work order WO-26-0019 · Unit HR-27 · Rear camera and work lights");
    const link = renderLinkEmail({ ...base, stage: "install" });
    expect(link.subject).toBe("New status link · Work order WO-26-0012 · Unit HR-27 · Wet kit: 35 gal stainless tank, PTO pump");
    expect(link.text.split("\n")[0]).toBe("Work order WO-26-0012 · Unit HR-27 · Wet kit: 35 gal stainless tank, PTO pump");
    expect(link.text).toContain("The link we sent before no longer works");
  });

  it("greets the contacts by name, never the company", () => {
    expect(renderStageEmail({ ...base, from: "queued", to: "fabricate" }).text).toContain("\nHello Dana Whitcombe,\n");
    expect(renderStageEmail({ ...base, contactNames: ["Dana", "Lee"], from: "queued", to: "fabricate" }).text).toContain("\nHello Dana and Lee,\n");
    expect(renderStageEmail({ ...base, contactNames: ["Dana", "Lee", "Sam"], from: "queued", to: "fabricate" }).html).toContain(">Hello Dana, Lee and Sam,<");
    expect(renderStageEmail({ ...base, contactNames: [], from: "queued", to: "fabricate" }).text).toContain("\nHello,\n");
  });

  it("mentions photos only when some are shared with the customer", () => {
    const none = renderStageEmail({ ...base, photosShared: false, from: "queued", to: "fabricate" });
    expect(`${none.text}${none.html}`).not.toMatch(/photo/i);
    expect(none.text).toContain("See the progress of your truck here:");
    const some = renderStageEmail({ ...base, photosShared: true, from: "queued", to: "fabricate" });
    expect(some.text).toContain("See the progress and photos of your truck here:");
    expect(some.html).toContain("See your truck&#39;s progress and photos");
  });

  it("lets the long link break, so the mail fits a 360 px phone", () => {
    const filled = withStatusLink(renderStageEmail({ ...base, from: "queued", to: "fabricate" }), `https://status.shop.example/status/${"A".repeat(43)}`);
    const address = filled.html.match(/<p style="([^"]*)">Or open this address:/)?.[1] ?? "";
    expect(address).toMatch(/word-break:break-all/);
    expect(filled.html).toMatch(/<body style="[^"]*overflow-wrap:anywhere/);
  });
});

describe("reading the e-mail service's answers", () => {
  it("retries outages and rate limits, gives up on refusals, and treats a reused key as already sent", () => {
    expect(classifySendError({ name: "application_error", message: "fetch failed", statusCode: null })).toMatchObject({ kind: "retry" });
    expect(classifySendError({ name: "internal_server_error", message: "x", statusCode: 503 })).toMatchObject({ kind: "retry", reason: "x (HTTP 503)" });
    expect(classifySendError({ name: "rate_limit_exceeded", message: "slow down", statusCode: 429 })).toMatchObject({ kind: "retry" });
    expect(classifySendError({ name: "concurrent_idempotent_requests", message: "busy", statusCode: 409 })).toMatchObject({ kind: "retry" });
    expect(classifySendError({ name: "validation_error", message: "bad from", statusCode: 422 })).toMatchObject({ kind: "permanent" });
    expect(classifySendError({ name: "invalid_api_key", message: "no", statusCode: 403 })).toMatchObject({ kind: "permanent" });
    expect(classifySendError({ name: "invalid_idempotent_request", message: "changed", statusCode: 409 })).toMatchObject({ kind: "already_sent" });
  });
});

describe("the payment receipt", () => {
  const receipt = { amountCents: 123_456, paidFor: { kind: "deposit" as const, quoteVersion: 2 }, methodLabel: "Cash", dateWords: "Thursday 5 March 2026", balanceAfterCents: 87_728, onAccountCents: 0 };

  it("names the job, the amount, what it paid for, the method, the day and what is still owed", () => {
    const mail = renderReceiptEmail({ ...base, receipt });
    expect(mail.subject).toBe("Payment received $1,234.56 · Work order WO-26-0012 · Unit HR-27 · Wet kit: 35 gal stainless tank, PTO pump");
    expect(mail.text.split("\n")[0]).toBe("Work order WO-26-0012 · Unit HR-27 · Wet kit: 35 gal stainless tank, PTO pump");
    expect(mail.text).toContain("Hello Dana Whitcombe,");
    expect(mail.text).toContain("Thank you: we received your payment of $1,234.56 for the deposit on quote v2.");
    for (const row of ["Amount paid: $1,234.56", "For: Deposit on quote v2", "Paid by: Cash", "Date: Thursday 5 March 2026", "Still owed on the job: $877.28"]) expect(mail.text).toContain(row);
    expect(mail.text.split(LINK_MARK)).toHaveLength(2);
    expect(mail.html).toContain("Cold Creek Upfit");
  });

  it("says Paid in full at $0.00, and names an amount on account apart from what was paid", () => {
    const full = renderReceiptEmail({ ...base, receipt: { ...receipt, paidFor: { kind: "invoice", invoiceNumber: "INV-26-0003" }, balanceAfterCents: 0 } });
    expect(full.text).toContain("For: Invoice INV-26-0003");
    expect(full.text).toContain("Still owed on the job: Paid in full");
    expect(full.text).toContain("toward invoice INV-26-0003");
    const onAccount = renderReceiptEmail({ ...base, receipt: { ...receipt, paidFor: { kind: "invoice", invoiceNumber: "INV-26-0003" }, balanceAfterCents: 0, onAccountCents: 25_000 } });
    expect(onAccount.text).not.toContain("Paid in full");
    expect(onAccount.text).toContain("Still owed on the job: $0.00");
    expect(onAccount.text).toContain("On your account: $250.00");
  });

  it("escapes what it paid for in the HTML part, and it cannot forge the link's place", () => {
    const hostile = renderReceiptEmail({ ...base, receipt: { ...receipt, paidFor: { kind: "invoice", invoiceNumber: `<b>INV</b> ${LINK_MARK}` } } });
    expect(hostile.html).not.toContain("<b>INV</b>");
    expect(hostile.html).toContain("&lt;b&gt;INV&lt;/b&gt;");
    expect(hostile.text.split(LINK_MARK)).toHaveLength(2);
  });

  it("reads back only a well-formed receipt message", () => {
    const good = { paymentId: 7, paidFor: { kind: "deposit", quoteVersion: 2 }, balanceAfterCents: 100, onAccountCents: 0, requestedBy: "" };
    expect(parseReceiptPayload(JSON.stringify(good))).toEqual(good);
    expect(parseReceiptPayload(JSON.stringify({ ...good, paidFor: { kind: "invoice", invoiceNumber: "INV-26-0003" }, resendOf: "abc" }))).toMatchObject({ resendOf: "abc" });
    for (const bad of [
      "not json",
      JSON.stringify({ ...good, paymentId: "7" }),
      JSON.stringify({ ...good, balanceAfterCents: -1 }),
      JSON.stringify({ ...good, balanceAfterCents: 1.5 }),
      JSON.stringify({ ...good, paidFor: { kind: "refund" } }),
      JSON.stringify({ ...good, paidFor: { kind: "invoice", invoiceNumber: "" } }),
      JSON.stringify({ ...good, requestedBy: undefined }),
    ]) expect(parseReceiptPayload(bad), bad).toBeNull();
  });
});
