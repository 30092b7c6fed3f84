import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import * as customerPdf from "@/app/(public)/status/[token]/quote/[quoteId]/pdf/route";
import * as jobQuotes from "@/app/api/jobs/[id]/quotes/route";
import * as staffPdf from "@/app/api/quotes/[id]/pdf/route";
import * as sendRoute from "@/app/api/quotes/[id]/send/route";
import * as resendRoute from "@/app/api/messages/[id]/resend/route";
import { type Fakes, startFakes } from "@/fakes/server.mjs";
import { dispatchDueOutbox } from "@/server/email/dispatcher";
import { type EmailSender, resendSender } from "@/server/email/sender";
import { issueStatusLink } from "@/server/status/links";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { pdfPages } from "../support/pdf-text";

const { db } = useFreshDatabase();
const dataDir = mkdtempSync(path.join(tmpdir(), "baywright-quote-mail-"));
let fake: Fakes;
let sender: EmailSender;

type FakeMail = { subject: string; text: string; html: string; to: string[]; attachments: { filename: string; content: string; content_type?: string }[] | null; idempotencyKey: string | null };

const LINES = [
  { kind: "part", description: "PTO, 6-bolt, air shift", quantity: 1, unitPriceCents: 148_900, taxable: true },
  { kind: "labour", description: "Install and plumb", quantity: 4, unitPriceCents: 12_500, taxable: false },
];

beforeAll(async () => {
  fake = await startFakes({ port: 0, dataDir });
  sender = resendSender("re_test_quote", `${fake.url}/resend`);
  process.env.APP_URL = "https://status.cold-creek.example";
  process.env.EMAIL_FROM = "updates@cold-creek.example";
  // Stage e-mails wait ten minutes here: a quote's e-mail must not.
  process.env.EMAIL_QUIET_SECONDS = "600";
  await ensureShop(db());
  await db().updateTable("shop").set({ name: "Cold Creek Upfit", address: "400 Mill Race Road, Cold Creek", phone: "555-0142", sales_tax_millipercent: 8_250, deposit_kind: "percent", deposit_percent: 50, quote_terms: "Deposit before parts are ordered." }).where("id", "=", 1).execute();
});
afterAll(async () => {
  await fake.close();
  rmSync(dataDir, { recursive: true, force: true });
});
beforeEach(async () => {
  await fetch(`${fake.url}/__fake/reset`, { method: "POST" });
  await db().updateTable("outbox").set({ status: "sent" }).where("status", "=", "pending").execute();
});

const mails = async (): Promise<FakeMail[]> => (await fetch(`${fake.url}/__fake/emails`)).json();

async function setUp(opts: { contacts?: boolean } = {}) {
  const customer = await makeCustomer(db(), "Harlan Ridge Heavy Haul");
  const truck = await makeTruck(db(), customer.id);
  if (opts.contacts !== false) {
    await db().insertInto("contact").values({ customer_id: customer.id, name: "Dana", email: `dana-${customer.id}@fleet.example`, phone: "", receives_email: 1 }).execute();
    await db().insertInto("contact").values({ customer_id: customer.id, name: "Accounts", email: `accounts-${customer.id}@fleet.example`, phone: "", receives_email: 0 }).execute();
  }
  const job = await makeJob(db(), { customerId: customer.id, truckId: truck.id });
  await db().updateTable("job").set({ description: "Wet kit: 35 gal stainless tank, PTO pump" }).where("id", "=", job.id).execute();
  const office = await makeStaff(db(), "office");
  const cookie = await sessionCookieFor(office.id);
  const create = async (lines: unknown = LINES) => (await readBody(await jobQuotes.POST(request(`/api/jobs/${job.id}/quotes`, { cookie, body: { lines } }), params({ id: String(job.id) })))).quote;
  const send = (id: number) => sendRoute.POST(request(`/api/quotes/${id}/send`, { cookie, body: {} }), params({ id: String(id) }));
  return { job, truck, customer, office, cookie, create, send };
}

describe("the quote e-mail", () => {
  it("goes at once to the contacts who get e-mail updates, names the job and the total, links to the quote and carries the PDF", async () => {
    const { job, truck, create, send } = await setUp();
    const draft = await create();
    const res = await send(draft.id);
    expect(res.status).toBe(200);
    const { quote, outboxId } = await readBody(res);
    // By hand: 1 × 1,489.00 (taxable) + 4 × 125.00 = 1,989.00; tax 8.25 % of 1,489.00 = 122.8425 → 122.84;
    // total 2,111.84; deposit 50 % = 1,055.92.
    expect(quote).toMatchObject({ status: "sent", subtotalCents: 198_900, taxCents: 12_284, totalCents: 211_184, depositCents: 105_592 });

    const row = await db().selectFrom("outbox").selectAll().where("id", "=", outboxId).executeTakeFirstOrThrow();
    expect(row).toMatchObject({ kind: "quote_sent", status: "pending", job_id: job.id });
    // No quiet period: due the moment it was sent.
    expect(Date.parse(row.next_attempt_at)).toBeLessThanOrEqual(Date.now());

    const summary = await dispatchDueOutbox(db(), new Date(), sender);
    expect(summary.sent).toBe(1);
    const [mail] = await mails();
    expect(mail.to).toEqual([expect.stringMatching(/^dana-/)]);
    expect(mail.subject).toBe(`Quote $2,111.84 · Work order ${job.work_order} · Unit ${truck.unit_number} · Wet kit: 35 gal stainless tank, PTO pump`);
    for (const part of [mail.text, mail.html]) {
      expect(part).toContain(`Work order ${job.work_order} · Unit ${truck.unit_number} · Wet kit: 35 gal stainless tank, PTO pump`);
      expect(part).toContain("$2,111.84");
      expect(part).toContain("$1,055.92");
      expect(part).toMatch(/https:\/\/status\.cold-creek\.example\/status\/[A-Za-z0-9_-]+#quote/);
    }
    expect(mail.text).toContain("Hello Dana,");
    expect(mail.text).toContain("Total: $2,111.84");
    expect(mail.text).toContain(`${job.work_order}-quote-v1.pdf`);

    expect(mail.attachments).toHaveLength(1);
    const [att] = mail.attachments!;
    expect(att.filename).toBe(`${job.work_order}-quote-v1.pdf`);
    expect(att.content_type).toBe("application/pdf");
    const bytes = Buffer.from(att.content, "base64");
    expect(bytes.subarray(0, 5).toString()).toBe("%PDF-");
    const stored = await db().selectFrom("email_attachment").select(["filename", "content"]).where("outbox_id", "=", outboxId).executeTakeFirstOrThrow();
    expect(Buffer.from(stored.content).equals(bytes)).toBe(true);

    const [page] = await pdfPages(bytes);
    for (const words of ["Cold Creek Upfit", "400 Mill Race Road, Cold Creek", "Phone 555-0142", "Quote", "Version 1", "For Harlan Ridge Heavy Haul", job.work_order, `Unit ${truck.unit_number}`, "PTO, 6-bolt, air shift", "4 × $125.00", "$500.00"]) {
      expect(page).toContain(words);
    }
    expect(page).toMatch(/Subtotal \$1,989\.00/);
    expect(page).toMatch(/Sales tax 8\.25 % on \$1,489\.00 \$122\.84/);
    expect(page).toMatch(/Total \$2,111\.84/);
    expect(page).toMatch(/Deposit due on approval \$1,055\.92/);
    expect(page).toContain("Deposit before parts are ordered.");
  });

  it("a failed first send is retried with the very same PDF under the same key", async () => {
    const { create, send } = await setUp();
    const { outboxId } = await readBody(await send((await create()).id));
    await fetch(`${fake.url}/__fake/fail-emails`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ count: 1, status: 503 }) });
    const first = await dispatchDueOutbox(db(), new Date(), sender);
    expect(first.retrying).toBe(1);
    const stored = await db().selectFrom("email_attachment").select("content").where("outbox_id", "=", outboxId).executeTakeFirstOrThrow();
    // The shop's name changes before the retry: the PDF already made is what goes.
    await db().updateTable("shop").set({ name: "Cold Creek Upfit and Hydraulics" }).where("id", "=", 1).execute();
    const second = await dispatchDueOutbox(db(), new Date(Date.now() + 10 * 60_000), sender);
    expect(second.sent).toBe(1);
    await db().updateTable("shop").set({ name: "Cold Creek Upfit" }).where("id", "=", 1).execute();
    const sent = await mails();
    expect(sent).toHaveLength(1);
    expect(Buffer.from(sent[0].attachments![0].content, "base64").equals(Buffer.from(stored.content))).toBe(true);
    expect(sent[0].idempotencyKey).toBe(outboxId);
  });

  it("a refused e-mail can be sent again from the job's messages, with its PDF, until a newer version replaces it", async () => {
    const { cookie, create, send } = await setUp();
    const first = (await readBody(await send((await create()).id))).outboxId as string;
    await fetch(`${fake.url}/__fake/fail-emails`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ count: 1, status: 422 }) });
    expect((await dispatchDueOutbox(db(), new Date(), sender)).failed).toBe(1);
    const again = await resendRoute.POST(request(`/api/messages/${first}/resend`, { cookie, body: {} }), params({ id: first }));
    expect(again.status).toBe(201);
    const { message } = await readBody(again);
    expect(message.kind).toBe("quote_sent");
    expect((await dispatchDueOutbox(db(), new Date(), sender)).sent).toBe(1);
    const [mail] = await mails();
    expect(mail.idempotencyKey).toBe(message.id);
    expect(mail.attachments?.[0].filename).toMatch(/-quote-v1\.pdf$/);

    await send((await create()).id);
    const refused = await resendRoute.POST(request(`/api/messages/${first}/resend`, { cookie, body: {} }), params({ id: first }));
    expect(refused.status).toBe(409);
    expect((await readBody(refused)).error.message).toMatch(/replaced by a newer version/);
  });

  it("with nobody getting e-mail updates the quote is still sent and its e-mail is skipped with the reason", async () => {
    const { create, send } = await setUp({ contacts: false });
    const res = await send((await create()).id);
    expect(res.status).toBe(200);
    const { outboxId } = await readBody(res);
    await dispatchDueOutbox(db(), new Date(), sender);
    const row = await db().selectFrom("outbox").select(["status", "last_error"]).where("id", "=", outboxId).executeTakeFirstOrThrow();
    expect(row.status).toBe("skipped");
    expect(row.last_error).toMatch(/Nobody on this job gets e-mail updates/);
    expect(await mails()).toEqual([]);
  });

  it("a version replaced before its e-mail went is not e-mailed; the newer one is", async () => {
    const { create, send } = await setUp();
    const v1 = (await readBody(await send((await create()).id))).outboxId;
    const v2 = (await readBody(await send((await create()).id))).outboxId;
    await dispatchDueOutbox(db(), new Date(), sender);
    const rows = await db().selectFrom("outbox").select(["id", "status", "last_error"]).where("id", "in", [v1, v2]).execute();
    expect(rows.find((r) => r.id === v1)).toMatchObject({ status: "skipped" });
    expect(rows.find((r) => r.id === v2)).toMatchObject({ status: "sent" });
    expect((await mails()).map((m) => m.attachments?.[0].filename)).toEqual([expect.stringMatching(/-quote-v2\.pdf$/)]);
  });
});

describe("Download PDF", () => {
  it("office gets any version as a PDF; a tech is refused; a bad id is 400", async () => {
    const { create } = await setUp();
    const draft = await create();
    const office = await staffPdf.GET(request(`/api/quotes/${draft.id}/pdf`, { cookie: await sessionCookieFor((await makeStaff(db(), "owner")).id) }), params({ id: String(draft.id) }));
    expect(office.status).toBe(200);
    expect(office.headers.get("content-type")).toBe("application/pdf");
    expect(office.headers.get("content-disposition")).toMatch(/attachment; filename=".+-quote-v\d+\.pdf"/);
    const [page] = await pdfPages(new Uint8Array(await office.arrayBuffer()));
    expect(page).toContain("draft, not sent");
    const tech = await staffPdf.GET(request(`/api/quotes/${draft.id}/pdf`, { cookie: await sessionCookieFor((await makeStaff(db(), "tech")).id) }), params({ id: String(draft.id) }));
    expect(tech.status).toBe(403);
    const bad = await staffPdf.GET(request(`/api/quotes/abc/pdf`, { cookie: await sessionCookieFor((await makeStaff(db(), "office")).id) }), params({ id: "abc" }));
    expect(bad.status).toBe(400);
  });

  it("the customer gets the versions the shop sent them, on their own link only", async () => {
    const a = await setUp();
    const b = await setUp();
    const draft = await a.create();
    const actor = { id: a.office.id, name: a.office.name, email: a.office.email, role: a.office.role };
    const tokenA = (await issueStatusLink(db(), actor, a.job.id)).url.split("/status/")[1];
    const tokenB = (await issueStatusLink(db(), actor, b.job.id)).url.split("/status/")[1];
    const get = (token: string, id: number) => customerPdf.GET(request(`/status/${token}/quote/${id}/pdf`), params({ token, quoteId: String(id) }));
    expect((await get(tokenA, draft.id)).status).toBe(404);
    await a.send(draft.id);
    const ok = await get(tokenA, draft.id);
    expect(ok.status).toBe(200);
    const [page] = await pdfPages(new Uint8Array(await ok.arrayBuffer()));
    expect(page).toMatch(/Total \$2,111\.84/);
    expect(page).not.toContain("draft");
    expect((await get(tokenB, draft.id)).status).toBe(404);
    expect((await get("not-a-live-link-0000000000000000000000000", draft.id)).status).toBe(404);
  });
});
