import { describe, expect, it } from "vitest";
import { type JobScope, STAGES, type Stage } from "@/db/schema";
import { LINK_MARK, escapeHtml, renderStageEmail, withStatusLink } from "@/server/email/render";
import { stagesFor } from "@/server/jobs/stages";
import { CUSTOMER_STAGE_NAMES, whatComesNext, whatHappened, whereItIsNow } from "@/server/status/words";
import { classifySendError } from "@/server/email/sender";

const base = {
  shop: { name: "Cold Creek Upfit", phone: "(555) 010-4417" },
  truck: { unitNumber: "HR-27", description: "Sleeper tractor" },
  customerName: "Harlan Ridge Heavy Haul",
  scope: "fabrication" as const,
  readyBy: "2031-05-16",
  linkDays: 60,
  replyTo: null,
};

describe("stage e-mail text", () => {
  it("gives every stage its own subject and first line, with what comes next", () => {
    const rendered = STAGES.map((to, i) => renderStageEmail({ ...base, from: i === 0 ? null : STAGES[i - 1], to }));
    expect(new Set(rendered.map((r) => r.subject)).size).toBe(STAGES.length);
    expect(new Set(rendered.map((r) => r.text.split("\n")[3])).size).toBe(STAGES.length);
    for (const r of rendered) {
      expect(r.text).toContain(LINK_MARK);
      expect(r.html).toContain(`href="${LINK_MARK}"`);
      expect(r.text).toContain("Questions? Call Cold Creek Upfit at (555) 010-4417");
    }
    expect(rendered[STAGES.indexOf("ready")].text).not.toContain("Expected ready date");
    expect(rendered[STAGES.indexOf("delivered")].text).toContain("keeps working for 60 days");
    expect(renderStageEmail({ ...base, from: "queued", to: "install", scope: "install_only" }).text).toContain("Work has started. We are installing the kit on your truck.");
    expect(renderStageEmail({ ...base, from: "wire", to: "install", readyBy: null }).text).toContain("Your job has gone back to the install step for more work. We are installing the kit on your truck.");
    expect(renderStageEmail({ ...base, from: "queued", to: "fabricate", readyBy: null }).text).toContain("We will confirm the expected ready date soon.");
  });

  it("says only what the stage itself tells: no test passed, no parts gone or back, no tank or PTO the job may not have", () => {
    // An owner's override moves a card past a gate, and a job may be a bracket with no tank: the words must hold for both.
    const claims = /\bpassed\b|tank|reservoir|\bPTO\b|dash|gone out|have left|(?<!when the )parts are back|is built|sump|weld/i;
    const scopes: JobScope[] = ["fabrication", "install_only"];
    for (const scope of scopes) {
      const route = stagesFor(scope);
      for (const to of route) {
        const sentences = [CUSTOMER_STAGE_NAMES[to], whereItIsNow(to), whatComesNext(to, scope), ...[null, ...route].filter((from): from is Stage | null => from !== to).map((from) => whatHappened(from, to, scope))];
        for (const sentence of sentences) expect(sentence, `${scope} → ${to}`).not.toMatch(claims);
      }
    }
    const override = renderStageEmail({ ...base, truck: { unitNumber: "HR-27", description: "Hose carrier and breakaway bracket" }, from: "pressure_test", to: "coating" });
    expect(override.text).toContain("Your job is at powder coat: the fabricated parts go to an outside coater and come back before install.");
    expect(override.text).toContain("When the parts are back from the coater, we install the kit on your truck.");
    expect(override.subject).toBe("Unit HR-27: powder coat (Cold Creek Upfit)");
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
      customerName: `<img src=x onerror=alert(1)> ${LINK_MARK}`,
      shop: { name: `Shop "&" <Co>`, phone: "555'0100" },
      truck: { unitNumber: "<U1>", description: "" },
    });
    expect(hostile.html).not.toMatch(/<img|<U1>|<Co>/);
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
