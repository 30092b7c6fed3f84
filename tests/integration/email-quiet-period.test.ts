import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { MessagesSection } from "@/app/(shop)/jobs/[id]/messages-section";
import * as jobMessages from "@/app/api/jobs/[id]/messages/route";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as jobLinks from "@/app/api/jobs/[id]/status-links/route";
import * as resend from "@/app/api/messages/[id]/resend/route";
import * as sendNowRoute from "@/app/api/messages/[id]/send-now/route";
import * as notify from "@/app/api/notify-settings/route";
import { closeDb, getDb } from "@/db";
import type { Role, Stage } from "@/db/schema";
import { type Fakes, startFakes } from "@/fakes/server.mjs";
import { dispatchDueOutbox } from "@/server/email/dispatcher";
import { BACK_WHERE_TOLD, REPLACED_BY_LATER_MOVE } from "@/server/email/outbox";
import { type EmailSender, resendSender } from "@/server/email/sender";
import { findJob } from "@/server/jobs/queries";
import { openStatusLink } from "@/server/status/queries";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { moneyChecksOff } from "../support/money";

/*
 * A move's customer e-mail waits a quiet period, so a slip of the hand and its correction tell
 * the customer nothing, and three quick moves tell one thing: where the job ended up.
 */

const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));
const dataDir = mkdtempSync(path.join(tmpdir(), "baywright-quiet-fakes-"));
let fake: Fakes;
let sender: EmailSender;
const QUIET_S = 120;

type StoredEmail = { id: string; to: string[]; subject: string; html: string; text: string; idempotencyKey: string | null };

beforeAll(async () => {
  fake = await startFakes({ port: 0, dataDir });
  sender = resendSender("re_test_quiet", `${fake.url}/resend`);
  process.env.APP_URL = "https://status.cold-creek.example";
  process.env.EMAIL_QUIET_SECONDS = String(QUIET_S);
  await ensureShop(db());
});
afterAll(async () => {
  delete process.env.EMAIL_QUIET_SECONDS;
  await fake.close();
  rmSync(dataDir, { recursive: true, force: true });
});
beforeEach(async () => {
  await fetch(`${fake.url}/__fake/reset`, { method: "POST" });
  await db().updateTable("outbox").set({ status: "sent" }).where("status", "=", "pending").execute();
});

const emails = async (): Promise<StoredEmail[]> => (await fetch(`${fake.url}/__fake/emails`)).json();
const later = (seconds: number) => new Date(Date.now() + seconds * 1000);

async function as(role: Role) {
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

/** A job with one contact who gets e-mail updates; its part is a tank that is leak-tested and coated, so every stage is on its route. */
async function customerJob() {
  const customer = await makeCustomer(db());
  const truck = await makeTruck(db(), customer.id);
  await db().insertInto("contact").values({ customer_id: customer.id, name: "Dana Whitcombe", email: `dana-${customer.id}@fleet.example`, phone: "", receives_email: 1 }).execute();
  const job = await makeJob(db(), { customerId: customer.id, truckId: truck.id, parts: false });
  const now = new Date().toISOString();
  await db()
    .insertInto("part")
    .values({ job_id: job.id, name: "Hydraulic tank", kind: "reservoir", material: "aluminum", needs_leak_test: 1, needs_coating: 1, created_at: now, updated_at: now } as never)
    .execute();
  return { job, truck };
}

async function move(cookie: string, jobId: number, toStage: Stage, override?: string) {
  const version = (await db().selectFrom("job").select("version").where("id", "=", jobId).executeTakeFirstOrThrow()).version;
  const body = override ? { toStage, version, override: { reason: override } } : { toStage, version };
  const res = await moves.POST(request(`/api/jobs/${jobId}/moves`, { cookie, body }), params({ id: String(jobId) }));
  expect(res.status, JSON.stringify(await res.clone().json())).toBe(200);
}

const outbox = (jobId: number) => db().selectFrom("outbox").selectAll().where("job_id", "=", jobId).orderBy("created_at").orderBy("id").execute();

describe("the quiet period after a move", () => {
  it("a move waits the quiet period: nothing goes before it, one e-mail after it", async () => {
    const { job } = await customerJob();
    const { cookie } = await as("tech");
    const before = Date.now();
    await move(cookie, job.id, "fabricate");
    const [row] = await outbox(job.id);
    const dueIn = Date.parse(row.next_attempt_at) - before;
    expect(dueIn).toBeGreaterThanOrEqual(QUIET_S * 1000);
    expect(dueIn).toBeLessThan(QUIET_S * 1000 + 5_000);
    expect(await dispatchDueOutbox(db(), later(QUIET_S - 5), sender)).toMatchObject({ claimed: 0 });
    expect(await dispatchDueOutbox(db(), later(QUIET_S + 5), sender)).toMatchObject({ claimed: 1, sent: 1 });
    expect((await emails()).map((e) => e.subject.split(" · ")[0])).toEqual(["Fabrication"]);
  });

  it("a move and its undo inside the window send nothing", async () => {
    const { job } = await customerJob();
    const { cookie } = await as("tech");
    await move(cookie, job.id, "fabricate");
    await move(cookie, job.id, "queued");
    expect(await dispatchDueOutbox(db(), later(QUIET_S + 60), sender)).toMatchObject({ claimed: 0 });
    expect(await emails()).toEqual([]);
    expect((await outbox(job.id)).map((r) => [r.status, r.last_error])).toEqual([["skipped", BACK_WHERE_TOLD]]);
  });

  it("after an e-mail went out, a move on and straight back sends nothing more", async () => {
    const { job } = await customerJob();
    const { cookie } = await as("tech");
    await move(cookie, job.id, "fabricate");
    await dispatchDueOutbox(db(), later(QUIET_S + 1), sender);
    expect(await emails()).toHaveLength(1);
    await move(cookie, job.id, "pressure_test");
    await move(cookie, job.id, "fabricate");
    expect(await dispatchDueOutbox(db(), later(2 * QUIET_S + 10), sender)).toMatchObject({ claimed: 0 });
    expect(await emails()).toHaveLength(1);
  });

  it("three quick moves send one message, naming the last stage, told from where the customer last heard", async () => {
    const { job, truck } = await customerJob();
    const { cookie } = await as("tech");
    await move(cookie, job.id, "fabricate");
    await move(cookie, job.id, "pressure_test");
    await move(cookie, job.id, "fabricate");
    const rows = await outbox(job.id);
    expect(rows.map((r) => r.status)).toEqual(["skipped", "skipped", "pending"]);
    expect(rows.slice(0, 2).every((r) => r.last_error === REPLACED_BY_LATER_MOVE && r.replaced_at !== null)).toBe(true);
    expect(JSON.parse(rows[2].payload)).toEqual({ from: "queued", to: "fabricate" });
    expect(await dispatchDueOutbox(db(), later(QUIET_S + 5), sender)).toMatchObject({ claimed: 1, sent: 1 });
    const sent = await emails();
    expect(sent).toHaveLength(1);
    expect(sent[0].subject).toBe(`Fabrication · Work order ${job.work_order} · Unit ${truck.unit_number} · Wet kit`);
    // From "booked in" to fabrication is forward: no "gone back" in a message about a slip the customer never heard of.
    expect(sent[0].text).toContain("Work has started. We are building the fabricated parts for your truck.");
    expect(sent[0].text).not.toMatch(/gone back/);
  });

  it("a reorder inside a column e-mails nobody", async () => {
    const { job } = await customerJob();
    const { cookie } = await as("tech");
    await move(cookie, job.id, "queued");
    expect(await outbox(job.id)).toEqual([]);
  });

  it("a restart inside the window (a new process, a later clock) sends once after it", async () => {
    const { job } = await customerJob();
    const { cookie } = await as("tech");
    const start = Date.now();
    await move(cookie, job.id, "fabricate");
    expect(await dispatchDueOutbox(db(), new Date(start + 30_000), sender)).toMatchObject({ claimed: 0 });
    // The server stops 30 s into the window; a new process opens the same database.
    await closeDb();
    const reopened = getDb();
    expect(await dispatchDueOutbox(reopened, new Date(start + 60_000), sender)).toMatchObject({ claimed: 0 });
    expect(await dispatchDueOutbox(reopened, new Date(start + (QUIET_S + 5) * 1000), sender)).toMatchObject({ claimed: 1, sent: 1 });
    expect(await dispatchDueOutbox(reopened, new Date(start + (QUIET_S + 3600) * 1000), sender)).toMatchObject({ claimed: 0 });
    const [row] = await outbox(job.id);
    expect((await emails()).map((e) => e.idempotencyKey)).toEqual([row.id]);
  });

  it("without EMAIL_QUIET_SECONDS the shop's setting decides, 3 minutes unless the shop changed it", async () => {
    delete process.env.EMAIL_QUIET_SECONDS;
    try {
      const { cookie } = await as("tech");
      const first = await customerJob();
      const t0 = Date.now();
      await move(cookie, first.job.id, "fabricate");
      const dueA = Date.parse((await outbox(first.job.id))[0].next_attempt_at) - t0;
      expect(dueA).toBeGreaterThanOrEqual(180_000);
      expect(dueA).toBeLessThan(185_000);

      await db().insertInto("message_setting").values({ id: 1, notify_stages: "fabricate,pressure_test,coating,install,wire,ready,delivered", status_link_days: 60, quiet_seconds: 600, updated_at: new Date().toISOString(), updated_by: null }).execute();
      const second = await customerJob();
      const t1 = Date.now();
      await move(cookie, second.job.id, "fabricate");
      const dueB = Date.parse((await outbox(second.job.id))[0].next_attempt_at) - t1;
      expect(dueB).toBeGreaterThanOrEqual(600_000);
      expect(dueB).toBeLessThan(605_000);
    } finally {
      await db().deleteFrom("message_setting").execute();
      process.env.EMAIL_QUIET_SECONDS = String(QUIET_S);
    }
  });
});

describe("the shop's quiet period setting", () => {
  const put = (cookie: string, body: unknown) => notify.PUT(request("/api/notify-settings", { method: "PUT", cookie, body }));

  it("the office saves it in whole minutes; a move then waits that long; a bad figure changes nothing", async () => {
    delete process.env.EMAIL_QUIET_SECONDS;
    try {
      const office = await as("office");
      const stages = ["fabricate", "pressure_test", "coating", "install", "wire", "ready", "delivered"];
      const saved = await put(office.cookie, { notifyStages: stages, statusLinkDays: 60, quietMinutes: 5 });
      expect(saved.status).toBe(200);
      expect((await readBody(saved)).settings.quietMinutes).toBe(5);
      const bad = await put(office.cookie, { notifyStages: stages, statusLinkDays: 60, quietMinutes: 61 });
      expect(bad.status).toBe(400);
      expect((await readBody(bad)).error.details.fields.quietMinutes[0]).toMatch(/60 minutes or fewer/);
      expect((await put((await as("tech")).cookie, { notifyStages: stages, statusLinkDays: 60, quietMinutes: 0 })).status).toBe(403);

      const { job } = await customerJob();
      const t0 = Date.now();
      await move((await as("tech")).cookie, job.id, "fabricate");
      const due = Date.parse((await outbox(job.id))[0].next_attempt_at) - t0;
      expect(due).toBeGreaterThanOrEqual(300_000);
      expect(due).toBeLessThan(305_000);
    } finally {
      await db().deleteFrom("message_setting").execute();
      process.env.EMAIL_QUIET_SECONDS = String(QUIET_S);
    }
  });
});

describe("Send now and Send again", () => {
  const sendNow = (cookie: string, id: string) => sendNowRoute.POST(request(`/api/messages/${id}/send-now`, { method: "POST", cookie }), params({ id }));
  const again = (cookie: string, id: string) => resend.POST(request(`/api/messages/${id}/resend`, { method: "POST", cookie }), params({ id }));

  it("the job's list says when a waiting message goes out; the office sends it now", async () => {
    const { job } = await customerJob();
    const tech = await as("tech");
    await move(tech.cookie, job.id, "fabricate");
    const listed = await readBody(await jobMessages.GET(request(`/api/jobs/${job.id}/messages`, { cookie: tech.cookie }), params({ id: String(job.id) })));
    const [waiting] = listed.messages;
    expect(waiting).toMatchObject({ state: "waiting", replaced: false, goesOutAt: (await outbox(job.id))[0].next_attempt_at });

    expect((await sendNow(tech.cookie, waiting.id)).status).toBe(403);
    const office = await as("office");
    const res = await sendNow(office.cookie, waiting.id);
    expect(res.status).toBe(200);
    expect(await dispatchDueOutbox(db(), new Date(Date.now() + 1000), sender)).toMatchObject({ claimed: 1, sent: 1 });
    const refused = await sendNow(office.cookie, waiting.id);
    expect(refused.status).toBe(409);
    expect((await readBody(refused)).error.message).toMatch(/Send again/);
  });

  it("a message a later move replaced is neither sent now nor sent again", async () => {
    const { job } = await customerJob();
    const tech = await as("tech");
    await move(tech.cookie, job.id, "fabricate");
    await move(tech.cookie, job.id, "pressure_test");
    const [replaced, current] = await outbox(job.id);
    const office = await as("office");
    const listed = await readBody(await jobMessages.GET(request(`/api/jobs/${job.id}/messages`, { cookie: office.cookie }), params({ id: String(job.id) })));
    expect(listed.messages.map((m: { id: string; replaced: boolean }) => [m.id, m.replaced])).toEqual([
      [current.id, false],
      [replaced.id, true],
    ]);
    const refusedNow = await sendNow(office.cookie, replaced.id);
    expect(refusedNow.status).toBe(409);
    const refusedAgain = await again(office.cookie, replaced.id);
    expect(refusedAgain.status).toBe(409);
    expect((await readBody(refusedAgain)).error.message).toMatch(/later move replaced/);
    expect(await outbox(job.id)).toHaveLength(2);
  });
});

describe("the job page", () => {
  async function jobPage(jobId: number, role: "office" | "tech") {
    const { staff } = await as(role);
    return renderToStaticMarkup(
      createElement(QueryClientProvider, { client: new QueryClient() }, await MessagesSection({ job: (await findJob(db(), jobId))!, user: { id: staff.id, name: staff.name, email: staff.email, role } })),
    );
  }

  it("says when the waiting e-mail goes out on the shop's clock, with Send now for the office, and offers no Send again on a replaced message", async () => {
    const { job } = await customerJob();
    const { cookie } = await as("tech");
    await move(cookie, job.id, "fabricate");
    await dispatchDueOutbox(db(), later(QUIET_S + 1), sender);
    await move(cookie, job.id, "pressure_test");
    await move(cookie, job.id, "queued");
    const due = "2031-06-02T15:42:00.000Z";
    await db().updateTable("outbox").set({ next_attempt_at: due }).where("job_id", "=", job.id).where("status", "=", "pending").execute();
    // The test shop is on US/Central: 15:42 UTC is 10:42 there in June.
    const html = await jobPage(job.id, "office");
    expect(html).toContain("E-mail goes out at 10:42 unless the card moves again.");
    expect(html.match(/>Send now</g)).toHaveLength(1);
    // Sent (fabricate) offers Send again; replaced (pressure test) does not; waiting (back to queued) has Send now.
    expect(html.match(/>Send again</g)).toHaveLength(1);
    expect(html).toContain(REPLACED_BY_LATER_MOVE);
    const techHtml = await jobPage(job.id, "tech");
    expect(techHtml).toContain("E-mail goes out at 10:42");
    expect(techHtml).not.toMatch(/>Send now<|>Send again</);
  });
});

describe("issuing a new status link", () => {
  const issue = (cookie: string, jobId: number, body?: unknown) =>
    jobLinks.POST(request(`/api/jobs/${jobId}/status-links`, { method: "POST", cookie, ...(body === undefined ? {} : { body }) }), params({ id: String(jobId) }));

  it("e-mails the new link to the job's contacts at once when the office asks, and the old link stops working", async () => {
    const { job } = await customerJob();
    const office = await as("office");
    const first = await readBody(await issue(office.cookie, job.id));
    const oldToken = (first.link.url as string).split("/status/")[1];
    const res = await issue(office.cookie, job.id, { emailContacts: true });
    expect(res.status).toBe(201);
    const { link } = await readBody(res);
    expect(link.emailedTo).toEqual([expect.stringMatching(/^dana-\d+@fleet\.example$/)]);
    expect(await dispatchDueOutbox(db(), new Date(), sender)).toMatchObject({ claimed: 1, sent: 1 });
    const [mail] = await emails();
    expect(mail.subject).toBe(`New status link · Work order ${job.work_order} · Unit ${(await db().selectFrom("truck").innerJoin("job", "job.truck_id", "truck.id").select("truck.unit_number").where("job.id", "=", job.id).executeTakeFirstOrThrow()).unit_number} · Wet kit`);
    expect(mail.text).toContain("Hello Dana Whitcombe,");
    expect(mail.text).toContain(link.url);
    expect(await openStatusLink(db(), oldToken)).toMatchObject({ state: "revoked" });
  });

  it("without the choice nothing is e-mailed; a job nobody gets e-mail for is refused before the old link is touched", async () => {
    const { job } = await customerJob();
    const office = await as("office");
    const plain = await issue(office.cookie, job.id, { emailContacts: false });
    expect(plain.status).toBe(201);
    expect(await outbox(job.id)).toEqual([]);

    const lonely = await makeJob(db());
    const kept = await readBody(await issue(office.cookie, lonely.id));
    const refused = await issue(office.cookie, lonely.id, { emailContacts: true });
    expect(refused.status).toBe(409);
    expect((await readBody(refused)).error.message).toMatch(/^Nobody on this job gets e-mail updates/);
    expect(await openStatusLink(db(), (kept.link.url as string).split("/status/")[1])).toMatchObject({ state: "active" });
    expect((await issue(office.cookie, lonely.id, { emailContacts: "yes" })).status).toBe(400);
  });
});
