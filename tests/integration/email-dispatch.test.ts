import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import * as emailSettings from "@/app/api/jobs/[id]/email-settings/route";
import * as jobMessages from "@/app/api/jobs/[id]/messages/route";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as jobLinks from "@/app/api/jobs/[id]/status-links/route";
import * as resend from "@/app/api/messages/[id]/resend/route";
import * as linkItem from "@/app/api/status-links/[id]/route";
import { closeDb, getDb } from "@/db";
import type { Role, Stage } from "@/db/schema";
import { type Fakes, startFakes } from "@/fakes/server.mjs";
import { LEASE_MS, MAX_ATTEMPTS, backoffMs, dispatchDueOutbox } from "@/server/email/dispatcher";
import { startDispatcher } from "@/server/email/loop";
import { BACK_WHERE_TOLD } from "@/server/email/outbox";
import { type EmailSender, resendSender } from "@/server/email/sender";
import { openStatusLink } from "@/server/status/queries";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { moneyChecksOff } from "../support/money";

const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));
const dataDir = mkdtempSync(path.join(tmpdir(), "baywright-email-fakes-"));
let fake: Fakes;
let sender: EmailSender;

type StoredEmail = { id: string; from: string; to: string[]; subject: string; html: string; text: string; idempotencyKey: string | null };

beforeAll(async () => {
  fake = await startFakes({ port: 0, dataDir });
  sender = resendSender("re_test_dispatch", `${fake.url}/resend`);
  process.env.APP_URL = "https://status.cold-creek.example";
  process.env.EMAIL_FROM = "updates@cold-creek.example";
  // These tests are about sending; the quiet period after a move has its own tests, which set it.
  process.env.EMAIL_QUIET_SECONDS = "0";
  await ensureShop(db());
});
afterAll(async () => {
  await fake.close();
  rmSync(dataDir, { recursive: true, force: true });
});
beforeEach(async () => {
  await fetch(`${fake.url}/__fake/reset`, { method: "POST" });
  // Each test sends only its own rows: older ones are settled as if long sent.
  await db().updateTable("outbox").set({ status: "sent" }).where("status", "=", "pending").execute();
});

async function emails(): Promise<StoredEmail[]> {
  return (await fetch(`${fake.url}/__fake/emails`)).json();
}

async function as(role: Role) {
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

/** A customer with two contacts who receive e-mail and one who does not, and a job of theirs. */
async function customerJob(opts: { name?: string; stage?: Stage; dueOn?: string | null } = {}) {
  const customer = await makeCustomer(db(), opts.name);
  const truck = await makeTruck(db(), customer.id);
  const contact = (name: string, email: string, receives: number) =>
    db().insertInto("contact").values({ customer_id: customer.id, name, email, phone: "", receives_email: receives }).returning("id").executeTakeFirstOrThrow();
  const dispatch = await contact("Dispatch desk", `dispatch-${customer.id}@fleet.example`, 1);
  const fleet = await contact("Fleet manager", `fleet-${customer.id}@fleet.example`, 1);
  const accounts = await contact("Accounts", `accounts-${customer.id}@fleet.example`, 0);
  const job = await makeJob(db(), { customerId: customer.id, truckId: truck.id, stage: opts.stage ?? "queued" });
  await db().updateTable("job").set({ due_on: opts.dueOn === undefined ? "2031-05-16" : opts.dueOn }).where("id", "=", job.id).execute();
  return { job, truck, contacts: { dispatch: dispatch.id, fleet: fleet.id, accounts: accounts.id }, customerId: customer.id };
}

const tech = async () => (await as("tech")).cookie;

async function move(cookie: string, jobId: number, toStage: Stage) {
  const version = (await db().selectFrom("job").select("version").where("id", "=", jobId).executeTakeFirstOrThrow()).version;
  const res = await moves.POST(request(`/api/jobs/${jobId}/moves`, { cookie, body: { toStage, version } }), params({ id: String(jobId) }));
  expect(res.status).toBe(200);
}

async function outbox(jobId: number) {
  return db().selectFrom("outbox").selectAll().where("job_id", "=", jobId).orderBy("created_at").orderBy("id").execute();
}

async function failNextEmails(count: number, status = 503) {
  await fetch(`${fake.url}/__fake/fail-emails`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ count, status }) });
}

/** A move whose first send attempt fails, so the row waits for its retry. */
async function moveThatMustRetry(jobId: number) {
  await move(await tech(), jobId, "fabricate");
  await failNextEmails(1);
  expect(await dispatchDueOutbox(db(), new Date(), sender)).toMatchObject({ claimed: 1, retrying: 1 });
  const [row] = await outbox(jobId);
  expect(row.status).toBe("pending");
  return { row, retryAt: new Date(row.next_attempt_at) };
}

function linkIn(text: string) {
  const match = text.match(/https:\/\/status\.cold-creek\.example\/status\/([A-Za-z0-9_-]{43})/);
  expect(match, "status link in the e-mail").not.toBeNull();
  return match![1];
}

describe("stage e-mails through the outbox", () => {
  it("a move e-mails the job's contacts once: plain words, expected date, escaped HTML, a text part and a working status link", async () => {
    const { job, truck, customerId } = await customerJob({ name: `Ridge & <b>Sons</b> "Haul"` });
    await db().updateTable("job").set({ description: `Wet kit: <b>35 gal</b> & "PTO" pump` }).where("id", "=", job.id).execute();
    await move(await tech(), job.id, "fabricate");
    const [row] = await outbox(job.id);
    expect(row.status).toBe("pending");

    const summary = await dispatchDueOutbox(db(), new Date(), sender);
    expect(summary).toMatchObject({ claimed: 1, sent: 1 });
    const sent = await emails();
    expect(sent).toHaveLength(1);
    const mail = sent[0];
    expect(mail.idempotencyKey).toBe(row.id);
    expect(mail.from).toBe('"Test Upfit" <updates@cold-creek.example>');
    expect([...mail.to].sort()).toEqual([`dispatch-${customerId}@fleet.example`, `fleet-${customerId}@fleet.example`]);
    expect(mail.subject).toBe(`Fabrication · Work order ${job.work_order} · Unit ${truck.unit_number} · Wet kit: <b>35 gal</b> & "PTO" pump`);
    expect(mail.text.split("\n")[0]).toBe(`Work order ${job.work_order} · Unit ${truck.unit_number} · Wet kit: <b>35 gal</b> & "PTO" pump`);
    // The contacts it goes to are greeted by name, not the company.
    expect(mail.text).toContain("Hello Dispatch desk and Fleet manager,");
    expect(mail.text).not.toContain("Ridge");
    expect(mail.text).toContain("Work has started. We are building the fabricated parts for your truck.");
    // The job's one part is a bracket needing no leak test or coating: install is the next step on its route.
    expect(mail.text).toContain("Next, we install the kit on your truck.");
    expect(mail.text).toContain("Expected ready date: Friday 16 May 2031.");
    expect(mail.html).toContain("Wet kit: &lt;b&gt;35 gal&lt;/b&gt; &amp; &quot;PTO&quot; pump");
    expect(mail.html).not.toContain("<b>35 gal</b>");
    // No photo is shared with the customer yet, so none is promised.
    expect(`${mail.text}${mail.html}`).not.toMatch(/photo/i);

    const token = linkIn(mail.text);
    expect(mail.html).toContain(`href="https://status.cold-creek.example/status/${token}"`);
    expect(await openStatusLink(db(), token)).toMatchObject({ state: "active", jobId: job.id });
    const stored = await db().selectFrom("status_link").selectAll().where("job_id", "=", job.id).execute();
    expect(stored).toHaveLength(1);
    expect(stored[0].issued_by).toBeNull();
    expect(JSON.stringify(await db().selectFrom("email_message").selectAll().where("outbox_id", "=", row.id).execute())).not.toContain(token);

    const [after] = await outbox(job.id);
    expect(after).toMatchObject({ status: "sent", attempts: 1, last_error: null });
    expect((await dispatchDueOutbox(db(), new Date(Date.now() + 86_400_000), sender)).claimed).toBe(0);
    expect(await emails()).toHaveLength(1);
  });

  it("each stage says its own thing, and later e-mails carry the same link until the office issues a new one", async () => {
    const { job } = await customerJob({ stage: "queued" });
    const cookie = await tech();
    const subjects: string[] = [];
    const tokens: string[] = [];
    for (const stage of ["fabricate", "pressure_test", "fabricate", "pressure_test", "coating"] as const) {
      await move(cookie, job.id, stage);
      await dispatchDueOutbox(db(), new Date(), sender);
      const latest = (await emails()).at(-1)!;
      subjects.push(latest.subject);
      tokens.push(linkIn(latest.text));
    }
    const texts = (await emails()).map((e) => e.text);
    expect(texts[2]).toContain("Your job has gone back to the fabrication step for more work.");
    // The stage is all the move tells: the e-mail claims no test result and no trip to the coater.
    expect(texts[4]).toContain("Your job is at powder coat: the fabricated parts go to an outside coater and come back before install.");
    expect(texts.join("\n")).not.toMatch(/passed|tank|have gone out/i);
    expect(new Set(tokens).size).toBe(1);

    const office = await as("office");
    const reissued = await readBody(await jobLinks.POST(request(`/api/jobs/${job.id}/status-links`, { method: "POST", cookie: office.cookie }), params({ id: String(job.id) })));
    await move(cookie, job.id, "install");
    await dispatchDueOutbox(db(), new Date(), sender);
    const newest = linkIn((await emails()).at(-1)!.text);
    expect(`https://status.cold-creek.example/status/${newest}`).toBe(reissued.link.url);
    expect(await openStatusLink(db(), tokens[0])).toMatchObject({ state: "revoked" });
  });

  it("invites replies only when EMAIL_REPLY_TO is set, and then sends with that reply-to; otherwise it gives the shop's phone", async () => {
    const before = process.env.EMAIL_REPLY_TO;
    const cookie = await tech();
    try {
      delete process.env.EMAIL_REPLY_TO;
      const plain = await customerJob();
      await move(cookie, plain.job.id, "fabricate");
      await dispatchDueOutbox(db(), new Date(), sender);
      const [noReply] = (await emails()) as (StoredEmail & { replyTo: string[] | null })[];
      expect(noReply.replyTo ?? []).toEqual([]);
      expect(noReply.text).toContain("Questions? Call Test Upfit at (555) 010-0000.");
      expect(`${noReply.text}${noReply.html}`).not.toMatch(/reply/i);

      process.env.EMAIL_REPLY_TO = "office@cold-creek.example";
      const replied = await customerJob();
      await move(cookie, replied.job.id, "fabricate");
      await dispatchDueOutbox(db(), new Date(), sender);
      const withReply = (await emails()).at(-1) as StoredEmail & { replyTo: string[] | null };
      expect(withReply.replyTo).toEqual(["office@cold-creek.example"]);
      expect(withReply.text).toContain("Questions? Call Test Upfit at (555) 010-0000, or reply to this e-mail.");
    } finally {
      if (before === undefined) delete process.env.EMAIL_REPLY_TO;
      else process.env.EMAIL_REPLY_TO = before;
    }
  });
});

describe("reliability", () => {
  it("the service fails three times: the e-mail still goes out exactly once, after backing off", async () => {
    const { job } = await customerJob();
    await move(await tech(), job.id, "fabricate");
    await fetch(`${fake.url}/__fake/fail-emails`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ count: 3, status: 503 }) });

    let now = new Date();
    const seen: string[] = [];
    for (let i = 0; i < 4; i++) {
      const summary = await dispatchDueOutbox(db(), now, sender);
      const [row] = await outbox(job.id);
      seen.push(`${summary.sent ? "sent" : "retrying"}:${row.attempts}`);
      if (row.status === "sent") break;
      expect(row.last_error).toMatch(/HTTP 503/);
      expect(Date.parse(row.next_attempt_at) - now.getTime()).toBe(backoffMs(row.attempts));
      // Nothing goes before its time.
      expect((await dispatchDueOutbox(db(), new Date(Date.parse(row.next_attempt_at) - 1000), sender)).claimed).toBe(0);
      now = new Date(row.next_attempt_at);
    }
    expect(seen).toEqual(["retrying:1", "retrying:2", "retrying:3", "sent:4"]);
    expect(await emails()).toHaveLength(1);
    expect((await outbox(job.id))[0]).toMatchObject({ status: "sent", last_error: null });
  });

  it("the server restarts with unsent outbox rows and sends them", async () => {
    const { job } = await customerJob();
    const cookie = await tech();
    await move(cookie, job.id, "fabricate");
    const other = await customerJob();
    await move(cookie, other.job.id, "install");
    // The server goes down before its dispatcher ran; a new process opens the same database.
    await closeDb();
    const dispatcher = startDispatcher({ intervalMs: 50, sender });
    try {
      await vi.waitFor(async () => expect((await emails()).length).toBe(2), { timeout: 10_000, interval: 100 });
    } finally {
      await dispatcher.stop();
    }
    const rows = await getDb().selectFrom("outbox").select(["job_id", "status"]).where("job_id", "in", [job.id, other.job.id]).execute();
    expect(rows.map((r) => r.status)).toEqual(["sent", "sent"]);
  });

  it("a crash between sending and marking sent does not send twice: the retry reuses the idempotency key", async () => {
    const { job } = await customerJob();
    await move(await tech(), job.id, "fabricate");
    const [row] = await outbox(job.id);
    // The process sends, then dies before it can write "sent": its promise never settles.
    const dying: EmailSender = {
      async send(message, key) {
        await sender.send(message, key);
        return new Promise(() => undefined);
      },
    };
    const start = new Date();
    void dispatchDueOutbox(db(), start, dying);
    await vi.waitFor(async () => expect(await emails()).toHaveLength(1), { timeout: 5_000, interval: 50 });
    expect((await outbox(job.id))[0]).toMatchObject({ status: "pending", attempts: 1 });

    // Restarted: the lease of the dead process runs out, and the row is tried again.
    expect((await dispatchDueOutbox(db(), new Date(start.getTime() + LEASE_MS - 1000), sender)).claimed).toBe(0);
    const summary = await dispatchDueOutbox(db(), new Date(start.getTime() + LEASE_MS + 1000), sender);
    expect(summary).toMatchObject({ claimed: 1, sent: 1 });
    const sent = await emails();
    expect(sent).toHaveLength(1);
    expect(sent[0].idempotencyKey).toBe(row.id);
    expect((await outbox(job.id))[0]).toMatchObject({ status: "sent", attempts: 2 });
    const message = await db().selectFrom("email_message").select("provider_id").where("outbox_id", "=", row.id).executeTakeFirstOrThrow();
    expect(message.provider_id).toBe(sent[0].id);
  });

  it("a refusal that retrying cannot fix fails at once with the reason; an outage gives up after the last attempt", async () => {
    const { job } = await customerJob();
    const cookie = await tech();
    await move(cookie, job.id, "fabricate");
    await fetch(`${fake.url}/__fake/fail-emails`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ count: 1, status: 422 }) });
    expect(await dispatchDueOutbox(db(), new Date(), sender)).toMatchObject({ failed: 1 });
    expect((await outbox(job.id))[0]).toMatchObject({ status: "failed", attempts: 1, last_error: expect.stringMatching(/HTTP 422/) });

    await move(cookie, job.id, "pressure_test");
    const down: EmailSender = { send: async () => ({ ok: false, kind: "retry", reason: "connection refused" }) };
    let now = new Date();
    for (let i = 0; i < MAX_ATTEMPTS; i++) {
      await dispatchDueOutbox(db(), now, down);
      now = new Date(now.getTime() + 2 * 60 * 60_000);
    }
    const last = (await outbox(job.id))[1];
    expect(last).toMatchObject({ status: "failed", attempts: MAX_ATTEMPTS, last_error: `Gave up after ${MAX_ATTEMPTS} attempts: connection refused` });
    expect(await emails()).toHaveLength(0);
  });
});

describe("who gets e-mail, and when none goes", () => {
  it("the office chooses the job's contacts and can switch e-mail off; a tech cannot", async () => {
    const { job, contacts, customerId } = await customerJob();
    const office = await as("office");
    const put = (cookie: string, body: unknown) => emailSettings.PUT(request(`/api/jobs/${job.id}/email-settings`, { method: "PUT", cookie, body }), params({ id: String(job.id) }));
    expect((await put(await tech(), { emailOff: false, contactIds: [contacts.fleet] })).status).toBe(403);
    const saved = await put(office.cookie, { emailOff: false, contactIds: [contacts.fleet, contacts.accounts] });
    expect(saved.status).toBe(200);
    expect((await readBody(saved)).settings.contacts.filter((c: { gets: boolean }) => c.gets).map((c: { id: number }) => c.id)).toEqual([contacts.fleet, contacts.accounts]);

    await move(await tech(), job.id, "fabricate");
    await dispatchDueOutbox(db(), new Date(), sender);
    expect((await emails()).map((e) => [...e.to].sort())).toEqual([[`accounts-${customerId}@fleet.example`, `fleet-${customerId}@fleet.example`]]);

    const stranger = await customerJob();
    const wrong = await put(office.cookie, { emailOff: false, contactIds: [stranger.contacts.dispatch] });
    expect(wrong.status).toBe(400);
    expect((await readBody(wrong)).error.details.fields.contactIds).toBeDefined();

    expect((await put(office.cookie, { emailOff: true, contactIds: [contacts.fleet] })).status).toBe(200);
    await move(await tech(), job.id, "pressure_test");
    expect(await dispatchDueOutbox(db(), new Date(), sender)).toMatchObject({ skipped: 1, sent: 0 });
    expect((await outbox(job.id)).at(-1)).toMatchObject({ status: "skipped", last_error: "E-mail is off for this job." });
    expect(await emails()).toHaveLength(1);
  });

  it("skips stages the shop does not notify, moves replaced before sending, and jobs nobody receives e-mail for", async () => {
    const { job } = await customerJob();
    const cookie = await tech();
    await db().insertInto("message_setting").values({ id: 1, notify_stages: "ready,delivered", status_link_days: 60, updated_at: new Date().toISOString(), updated_by: null }).execute();
    try {
      await move(cookie, job.id, "fabricate");
      await dispatchDueOutbox(db(), new Date(), sender);
      expect((await outbox(job.id))[0]).toMatchObject({ status: "skipped", last_error: "The shop does not e-mail customers when a job reaches Fabricate." });
    } finally {
      await db().deleteFrom("message_setting").execute();
    }

    // Nobody was told about Fabricate (the shop's choice), so on and straight back tells nothing new.
    await move(cookie, job.id, "pressure_test");
    await move(cookie, job.id, "fabricate");
    await dispatchDueOutbox(db(), new Date(), sender);
    const rows = await outbox(job.id);
    expect(rows.slice(1).map((r) => [r.status, r.last_error])).toEqual([["skipped", BACK_WHERE_TOLD]]);

    const lonely = await makeJob(db());
    await move(cookie, lonely.id, "fabricate");
    await dispatchDueOutbox(db(), new Date(), sender);
    expect((await outbox(lonely.id))[0]).toMatchObject({ status: "skipped", last_error: expect.stringMatching(/^Nobody on this job gets e-mail updates/) });
    expect(await emails()).toHaveLength(0);
  });
});

describe("the job's messages and resending", () => {
  it("lists every message with its delivery state; the office resends one as a new message", async () => {
    const { job } = await customerJob();
    const cookie = await tech();
    await move(cookie, job.id, "fabricate");
    await dispatchDueOutbox(db(), new Date(), sender);
    await fetch(`${fake.url}/__fake/fail-emails`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ count: 1, status: 500 }) });
    await move(cookie, job.id, "pressure_test");
    await dispatchDueOutbox(db(), new Date(), sender);

    const listed = await readBody(await jobMessages.GET(request(`/api/jobs/${job.id}/messages`, { cookie }), params({ id: String(job.id) })));
    expect(listed.messages.map((m: { state: string; to: string }) => [m.to, m.state])).toEqual([
      ["pressure_test", "retrying"],
      ["fabricate", "sent"],
    ]);
    expect(listed.messages[0].reason).toMatch(/HTTP 500/);
    expect(listed.messages[1].recipients).toHaveLength(2);

    const sentId = listed.messages[1].id as string;
    const again = (c: string, id = sentId) => resend.POST(request(`/api/messages/${id}/resend`, { method: "POST", cookie: c }), params({ id }));
    expect((await again(cookie)).status).toBe(403);
    const office = await as("office");
    const res = await again(office.cookie);
    expect(res.status).toBe(201);
    const queued = (await readBody(res)).message;
    expect(queued).toMatchObject({ to: "fabricate", resendOf: sentId, state: "waiting" });
    await dispatchDueOutbox(db(), new Date(Date.now() + 60 * 60_000), sender);
    const all = await emails();
    expect(all.map((e) => e.idempotencyKey)).toEqual([sentId, expect.any(String), queued.id]);
    expect(all[2].subject).toBe(all[0].subject);

    expect((await again(office.cookie, "not-a-uuid")).status).toBe(400);
    expect((await again(office.cookie, "00000000-0000-4000-8000-000000000000")).status).toBe(404);
  });
});

describe("a retry sends what is true when it goes", () => {
  const putSettings = (cookie: string, jobId: number, body: unknown) =>
    emailSettings.PUT(request(`/api/jobs/${jobId}/email-settings`, { method: "PUT", cookie, body }), params({ id: String(jobId) }));

  async function storedMessage(outboxId: string) {
    return db().selectFrom("email_message").selectAll().where("outbox_id", "=", outboxId).executeTakeFirstOrThrow();
  }

  it("goes only to the contacts the job has now, re-rendered under a new idempotency key", async () => {
    const { job, contacts, customerId } = await customerJob();
    const dispatch = `dispatch-${customerId}@fleet.example`;
    const { row, retryAt } = await moveThatMustRetry(job.id);
    expect((JSON.parse((await storedMessage(row.id)).to_addresses) as string[]).sort()).toEqual([dispatch, `fleet-${customerId}@fleet.example`]);

    const office = await as("office");
    expect((await putSettings(office.cookie, job.id, { emailOff: false, contactIds: [contacts.dispatch] })).status).toBe(200);
    expect(await dispatchDueOutbox(db(), retryAt, sender)).toMatchObject({ claimed: 1, sent: 1 });

    const sent = await emails();
    expect(sent.map((e) => e.to)).toEqual([[dispatch]]);
    expect(sent[0].idempotencyKey).toBe(`${row.id}:r1`);
    expect(await storedMessage(row.id)).toMatchObject({ revision: 1, to_addresses: JSON.stringify([dispatch]), provider_id: sent[0].id });
    const listed = await readBody(await jobMessages.GET(request(`/api/jobs/${job.id}/messages`, { cookie: office.cookie }), params({ id: String(job.id) })));
    expect(listed.messages[0]).toMatchObject({ state: "sent", recipients: [dispatch] });
  });

  it("is skipped when the office switched e-mail off, or left nobody to receive it, after the first attempt", async () => {
    const office = await as("office");
    const off = await customerJob();
    const first = await moveThatMustRetry(off.job.id);
    expect((await putSettings(office.cookie, off.job.id, { emailOff: true, contactIds: [off.contacts.dispatch, off.contacts.fleet] })).status).toBe(200);
    expect(await dispatchDueOutbox(db(), first.retryAt, sender)).toMatchObject({ claimed: 1, skipped: 1, sent: 0 });
    expect((await outbox(off.job.id))[0]).toMatchObject({ status: "skipped", last_error: "E-mail is off for this job." });

    const nobody = await customerJob();
    const second = await moveThatMustRetry(nobody.job.id);
    expect((await putSettings(office.cookie, nobody.job.id, { emailOff: false, contactIds: [] })).status).toBe(200);
    expect(await dispatchDueOutbox(db(), second.retryAt, sender)).toMatchObject({ claimed: 1, skipped: 1, sent: 0 });
    expect((await outbox(nobody.job.id))[0]).toMatchObject({ status: "skipped", last_error: expect.stringMatching(/^Nobody on this job gets e-mail updates/) });
    expect(await emails()).toEqual([]);
  });

  it("does not bring back a status link the office turned off: the message is skipped and no new link is issued", async () => {
    const { job } = await customerJob();
    const { row, retryAt } = await moveThatMustRetry(job.id);
    const { status_link_id: linkId } = await storedMessage(row.id);
    expect(linkId).not.toBeNull();
    const office = await as("office");
    const revoked = await linkItem.DELETE(request(`/api/status-links/${linkId}`, { method: "DELETE", cookie: office.cookie }), params({ id: String(linkId) }));
    expect(revoked.status).toBe(200);

    expect(await dispatchDueOutbox(db(), retryAt, sender)).toMatchObject({ claimed: 1, skipped: 1, sent: 0 });
    expect((await outbox(job.id))[0]).toMatchObject({
      status: "skipped",
      last_error: "The office turned off the status link before this e-mail went out; issue a new link, then send the message again.",
    });
    expect(await emails()).toEqual([]);
    const links = await db().selectFrom("status_link").select(["id", "revoked_at"]).where("job_id", "=", job.id).execute();
    expect(links).toEqual([{ id: linkId, revoked_at: expect.any(String) }]);
  });

  it("carries the link the office issued in place of the one it was rendered with, under a new idempotency key", async () => {
    const { job } = await customerJob();
    const { row, retryAt } = await moveThatMustRetry(job.id);
    const office = await as("office");
    const reissued = await readBody(await jobLinks.POST(request(`/api/jobs/${job.id}/status-links`, { method: "POST", cookie: office.cookie }), params({ id: String(job.id) })));

    expect(await dispatchDueOutbox(db(), retryAt, sender)).toMatchObject({ claimed: 1, sent: 1 });
    const [mail] = await emails();
    expect(`https://status.cold-creek.example/status/${linkIn(mail.text)}`).toBe(reissued.link.url);
    expect(mail.idempotencyKey).toBe(`${row.id}:r1`);
    expect(await storedMessage(row.id)).toMatchObject({ revision: 1, status_link_id: reissued.link.id });
    expect(await db().selectFrom("status_link").select("id").where("job_id", "=", job.id).execute()).toHaveLength(2);
  });

  it("keeps the first key when nothing changed between attempts", async () => {
    const { job } = await customerJob();
    const { row, retryAt } = await moveThatMustRetry(job.id);
    expect(await dispatchDueOutbox(db(), retryAt, sender)).toMatchObject({ sent: 1 });
    expect((await emails()).map((e) => e.idempotencyKey)).toEqual([row.id]);
    expect(await storedMessage(row.id)).toMatchObject({ revision: 0 });
  });
});

describe("the retry schedule and its limits", () => {
  it("makes 10 attempts over 3 h 3 min 30 s (30 s doubling, at most an hour apart), as the README says", () => {
    const waits = Array.from({ length: MAX_ATTEMPTS - 1 }, (_, i) => backoffMs(i + 1));
    expect(waits.map((ms) => ms / 1000)).toEqual([30, 60, 120, 240, 480, 960, 1920, 3600, 3600]);
    expect(waits.reduce((a, b) => a + b, 0)).toBe((3 * 3600 + 3 * 60 + 30) * 1000);
    const readme = readFileSync(new URL("../../README.md", import.meta.url), "utf8");
    expect(readme).toContain("10 attempts over 3 h 3 min 30 s");
    expect(readme).not.toMatch(/about two hours/);
  });

  it("a row whose send never finishes (the server dies mid-send every time) ends failed after its last attempt", async () => {
    const { job } = await customerJob();
    await move(await tech(), job.id, "fabricate");
    let calls = 0;
    const dying: EmailSender = {
      send() {
        calls += 1;
        return new Promise(() => undefined);
      },
    };
    let now = new Date();
    for (let i = 1; i <= MAX_ATTEMPTS; i++) {
      void dispatchDueOutbox(db(), now, dying);
      await vi.waitFor(() => expect(calls).toBe(i), { timeout: 5_000, interval: 20 });
      now = new Date(now.getTime() + LEASE_MS + 1000);
    }
    expect((await outbox(job.id))[0]).toMatchObject({ status: "pending", attempts: MAX_ATTEMPTS });

    expect(await dispatchDueOutbox(db(), now, dying)).toMatchObject({ claimed: 0, failed: 1 });
    expect(calls).toBe(MAX_ATTEMPTS);
    expect((await outbox(job.id))[0]).toMatchObject({
      status: "failed",
      attempts: MAX_ATTEMPTS,
      last_error: `Gave up after ${MAX_ATTEMPTS} attempts: the last one never finished (the server stopped while sending).`,
    });
    expect(await dispatchDueOutbox(db(), new Date(now.getTime() + 86_400_000), dying)).toMatchObject({ claimed: 0, failed: 0 });
  });

  it("a service that never answers is given up on after the send timeout, and the row waits for its retry", async () => {
    const silent = http.createServer(() => undefined);
    await new Promise<void>((resolve) => silent.listen(0, "127.0.0.1", resolve));
    try {
      const slow = resendSender("re_test_dispatch", `http://127.0.0.1:${(silent.address() as AddressInfo).port}`, { timeoutMs: 300 });
      const { job } = await customerJob();
      await move(await tech(), job.id, "fabricate");
      expect(await dispatchDueOutbox(db(), new Date(), slow)).toMatchObject({ claimed: 1, retrying: 1 });
      expect((await outbox(job.id))[0]).toMatchObject({ status: "pending", attempts: 1, last_error: "The e-mail service did not answer within 0.3 s." });
    } finally {
      silent.closeAllConnections();
      await new Promise<void>((resolve) => silent.close(() => resolve()));
    }
  });
});
