import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as voidRoute from "@/app/api/invoices/[id]/void/route";
import { type Fakes, startFakes } from "@/fakes/server.mjs";
import { dispatchDueOutbox } from "@/server/email/dispatcher";
import { type EmailSender, resendSender } from "@/server/email/sender";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
import { params, request, sessionCookieFor } from "../support/http";
import { giveJobMoney } from "../support/money";
import { pdfPages } from "../support/pdf-text";

const { db } = useFreshDatabase();
const dataDir = mkdtempSync(path.join(tmpdir(), "baywright-invoice-mail-"));
let fake: Fakes;
let sender: EmailSender;

type FakeMail = { subject: string; text: string; html: string; to: string[]; attachments: { filename: string; content: string; content_type?: string }[] | null };

beforeAll(async () => {
  fake = await startFakes({ port: 0, dataDir });
  sender = resendSender("re_test_invoice", `${fake.url}/resend`);
  process.env.APP_URL = "https://status.cold-creek.example";
  process.env.EMAIL_FROM = "updates@cold-creek.example";
  // Stage e-mails wait ten minutes here; the invoice's must not.
  process.env.EMAIL_QUIET_SECONDS = "600";
  await ensureShop(db());
  await db().updateTable("shop").set({ name: "Cold Creek Upfit", address: "400 Mill Race Road, Cold Creek", phone: "555-0142" }).where("id", "=", 1).execute();
});
afterAll(async () => {
  await fake.close();
  rmSync(dataDir, { recursive: true, force: true });
});

async function readyJob() {
  const customer = await makeCustomer(db(), "Harlan Ridge Heavy Haul");
  const truck = await makeTruck(db(), customer.id);
  await db().insertInto("contact").values({ customer_id: customer.id, name: "Dana", email: `dana-${customer.id}@fleet.example`, phone: "", receives_email: 1 }).execute();
  const job = await makeJob(db(), { customerId: customer.id, truckId: truck.id, stage: "wire" });
  const owner = await makeStaff(db(), "owner");
  // $1,000.00 approved, $500.00 deposit in cash (tests/support/money.ts).
  await giveJobMoney(db(), job.id, "deposit-paid", owner.id);
  const cookie = await sessionCookieFor(owner.id);
  const { version } = await db().selectFrom("job").select("version").where("id", "=", job.id).executeTakeFirstOrThrow();
  // The sign-off is not the subject: the owner moves it on with a reason.
  const moved = await moves.POST(request(`/api/jobs/${job.id}/moves`, { cookie, body: { toStage: "ready", version, override: { reason: "Signed off on paper today" } } }), params({ id: String(job.id) }));
  expect(moved.status).toBe(200);
  const invoice = await db().selectFrom("invoice").selectAll().where("job_id", "=", job.id).executeTakeFirstOrThrow();
  return { job, truck, invoice, cookie };
}

const mails = async (): Promise<FakeMail[]> => (await fetch(`${fake.url}/__fake/emails`)).json();

describe("the invoice e-mail", () => {
  it("goes at once when the job reaches Ready for pickup, with the balance, a link to pay and the invoice PDF", async () => {
    const { job, invoice } = await readyJob();
    const row = await db().selectFrom("outbox").selectAll().where("job_id", "=", job.id).where("kind", "=", "invoice_sent").executeTakeFirstOrThrow();
    expect(Date.parse(row.next_attempt_at)).toBeLessThanOrEqual(Date.now());
    await dispatchDueOutbox(db(), new Date(), sender);
    const mail = (await mails()).find((m) => m.subject.startsWith("Invoice"))!;
    expect(mail.subject).toMatch(new RegExp(`^Invoice ${invoice.number} · balance \\$500\\.00 · Work order ${job.work_order}`));
    for (const part of [mail.text, mail.html]) {
      expect(part).toContain("$1,000.00");
      expect(part).toMatch(/https:\/\/status\.cold-creek\.example\/status\/[A-Za-z0-9_-]+/);
    }
    expect(mail.text).toContain("Balance due: $500.00");
    expect(mail.text).toContain("Deposit received: −$500.00");
    expect(mail.attachments).toHaveLength(1);
    const att = mail.attachments![0];
    expect(att.filename).toBe(`${job.work_order}-invoice-${invoice.number}.pdf`);
    const [page] = await pdfPages(Buffer.from(att.content, "base64"));
    for (const words of ["Cold Creek Upfit", "Invoice", invoice.number, "For Harlan Ridge Heavy Haul", job.work_order, "Upfit work", "Balance due $500.00"]) expect(page).toContain(words);
  });

  it("is not sent when the owner voids the invoice before it goes", async () => {
    const { job, invoice, cookie } = await readyJob();
    expect((await voidRoute.POST(request(`/api/invoices/${invoice.id}/void`, { cookie, body: { reason: "Wrong customer on the job" } }), params({ id: String(invoice.id) }))).status).toBe(200);
    await dispatchDueOutbox(db(), new Date(), sender);
    const row = await db().selectFrom("outbox").select(["status", "last_error"]).where("job_id", "=", job.id).where("kind", "=", "invoice_sent").executeTakeFirstOrThrow();
    expect(row).toEqual({ status: "skipped", last_error: "The invoice this e-mail was for was voided before it went out." });
  });
});
