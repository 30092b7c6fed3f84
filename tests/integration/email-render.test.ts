import { describe, expect, it } from "vitest";
import { STAGES } from "@/db/schema";
import { LINK_MARK, escapeHtml, renderStageEmail, withStatusLink } from "@/server/email/render";
import { classifySendError } from "@/server/email/sender";

const base = {
  shop: { name: "Cold Creek Upfit", phone: "(555) 010-4417" },
  truck: { unitNumber: "HR-27", description: "Sleeper tractor" },
  customerName: "Harlan Ridge Heavy Haul",
  scope: "fabrication" as const,
  readyBy: "2031-05-16",
  linkDays: 60,
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
    expect(renderStageEmail({ ...base, from: "queued", to: "install", scope: "install_only" }).text).toContain("Work has started: the kit is going on your truck.");
    expect(renderStageEmail({ ...base, from: "wire", to: "install", readyBy: null }).text).toContain('gone back a step to "installing the kit"');
    expect(renderStageEmail({ ...base, from: "queued", to: "fabricate", readyBy: null }).text).toContain("We will confirm the expected ready date soon.");
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
