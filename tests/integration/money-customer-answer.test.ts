import { describe, expect, it } from "vitest";
import * as answerRoute from "@/app/(public)/status/[token]/quote/route";
import * as jobQuotes from "@/app/api/jobs/[id]/quotes/route";
import * as sendRoute from "@/app/api/quotes/[id]/send/route";
import { issueStatusLink, revokeStatusLink } from "@/server/status/links";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

const LINES = [
  { kind: "part", description: "PTO", quantity: 1, unitPriceCents: 148_900, taxable: true },
  { kind: "labour", description: "Install", quantity: 4, unitPriceCents: 12_500, taxable: false },
];

async function setUp() {
  await ensureShop(db());
  await db().updateTable("shop").set({ sales_tax_millipercent: 8_250 }).where("id", "=", 1).execute();
  const office = await makeStaff(db(), "office");
  const cookie = await sessionCookieFor(office.id);
  const job = await makeJob(db());
  const actor = { id: office.id, name: office.name, email: office.email, role: office.role };
  const link = await issueStatusLink(db(), actor, job.id);
  const token = link.url.split("/status/")[1];
  const sendNew = async () => {
    const created = (await readBody(await jobQuotes.POST(request(`/api/jobs/${job.id}/quotes`, { cookie, body: { lines: LINES } }), params({ id: String(job.id) })))).quote;
    await sendRoute.POST(request(`/api/quotes/${created.id}/send`, { cookie, body: {} }), params({ id: String(created.id) }));
    return created.id as number;
  };
  return { job, token, sendNew, actor, linkId: link.id };
}

const answer = (token: string, body: unknown, headers: Record<string, string> = {}) => answerRoute.POST(request(`/status/${token}/quote`, { body, headers }), params({ token }));

describe("the customer's answer on the status link", () => {
  it("approves with a typed name and the terms ticked; the name, time and version are kept and an audit line written", async () => {
    const { job, token, sendNew } = await setUp();
    const id = await sendNew();
    const noTick = await answer(token, { decision: "approve", quoteId: id, name: "Dana Reyes", acceptTerms: false });
    expect(noTick.status).toBe(400);
    expect((await readBody(noTick)).error.details.fields.acceptTerms[0]).toMatch(/Tick/);
    const noName = await answer(token, { decision: "approve", quoteId: id, name: " ", acceptTerms: true });
    expect(noName.status).toBe(400);
    expect((await db().selectFrom("quote").select("status").where("id", "=", id).executeTakeFirstOrThrow()).status).toBe("sent");

    const ok = await answer(token, { decision: "approve", quoteId: id, name: "Dana Reyes", acceptTerms: true });
    expect(ok.status).toBe(200);
    const row = await db().selectFrom("quote").select(["status", "decided_name", "decided_at", "terms_accepted", "version"]).where("id", "=", id).executeTakeFirstOrThrow();
    expect(row).toMatchObject({ status: "approved", decided_name: "Dana Reyes", terms_accepted: 1, version: 1 });
    expect(row.decided_at).toBeTruthy();
    const audit = await db().selectFrom("audit_event").select(["kind", "actor_id", "summary"]).where("subject", "=", job.work_order).where("kind", "=", "quote_approved").executeTakeFirstOrThrow();
    expect(audit.actor_id).toBeNull();
    expect(audit.summary).toMatch(/^“Dana Reyes” approved quote version 1 for \$2,111\.84 on the status link/);
    // By hand: 1489.00 × 8.25 % = 122.8425 → 122.84; 1489.00 + 4 × 125.00 + 122.84 = 2111.84.
    const again = await answer(token, { decision: "approve", quoteId: id, name: "Dana Reyes", acceptTerms: true });
    expect(again.status).toBe(409);
  });

  it("declines with a reason; only the newest sent version can be answered", async () => {
    const { token, sendNew } = await setUp();
    const v1 = await sendNew();
    const v2 = await sendNew();
    const old = await answer(token, { decision: "decline", quoteId: v1, reason: "Too dear" });
    expect(old.status).toBe(409);
    expect((await readBody(old)).error.message).toMatch(/newer version/);
    const noReason = await answer(token, { decision: "decline", quoteId: v2, reason: "" });
    expect(noReason.status).toBe(400);
    const ok = await answer(token, { decision: "decline", quoteId: v2, reason: "Going with a smaller tank" });
    expect(ok.status).toBe(200);
    expect((await readBody(ok)).quotes.map((q: { version: number; status: string }) => [q.version, q.status])).toEqual([[2, "declined"]]);
  });

  it("a wrong, turned-off or other job's link answers 404 and changes nothing; a cross-site post is refused", async () => {
    const a = await setUp();
    const b = await setUp();
    const id = await a.sendNew();
    const body = { decision: "approve", quoteId: id, name: "Dana Reyes", acceptTerms: true };
    expect((await answer("not-a-live-link-0000000000000000000000000", body)).status).toBe(404);
    expect((await answer(b.token, body)).status).toBe(404);
    expect((await answer(a.token, body, { origin: "https://elsewhere.example" })).status).toBe(403);
    await revokeStatusLink(db(), a.actor, a.linkId);
    expect((await answer(a.token, body)).status).toBe(404);
    expect((await db().selectFrom("quote").select("status").where("id", "=", id).executeTakeFirstOrThrow()).status).toBe("sent");
  });
});
