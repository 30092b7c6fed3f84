import type { Kysely } from "kysely";
import type { Database } from "./schema";

/**
 * The demo shop's money, agreeing with each job's stage (and with its quotes from seed-money.ts):
 * every job past Queued had its deposit paid before work began (online for the newer jobs, by
 * check or cash at the counter for the older ones); the job at Ready for pickup has its invoice
 * out with the balance due; delivered jobs are settled, one by check and one on the customer's
 * account. Queued jobs have a quote sent and nothing paid.
 */
export async function seedPayments(db: Kysely<Database>, now: Date) {
  const office = await db.selectFrom("staff").select("id").where("role", "=", "office").orderBy("created_at").executeTakeFirstOrThrow();
  const owner = await db.selectFrom("staff").select("id").where("role", "=", "owner").orderBy("created_at").executeTakeFirstOrThrow();
  const jobs = await db
    .selectFrom("job")
    .innerJoin("quote", (j) => j.onRef("quote.job_id", "=", "job.id").on("quote.status", "=", "approved").on("quote.kind", "=", "quote"))
    .select(["job.id", "job.stage", "job.scope", "quote.id as quote_id", "quote.total_cents", "quote.deposit_cents", "quote.decided_at"])
    .orderBy("job.id")
    .execute();
  const readyAt = async (jobId: number) =>
    (await db.selectFrom("stage_event").select("at").where("job_id", "=", jobId).where("to_stage", "=", "ready").orderBy("id", "desc").executeTakeFirst())?.at ?? now.toISOString();
  let invoiceSeq = 0;
  let cardSeq = 0;
  let counterSeq = 0;
  for (const job of jobs) {
    const paidAt = new Date(Date.parse(job.decided_at ?? now.toISOString()) + 3_600_000).toISOString();
    const late = job.stage === "ready" || job.stage === "delivered";
    if (job.deposit_cents > 0) {
      if (!late) {
        cardSeq++;
        const session = `cs_demo_${String(job.id).padStart(4, "0")}${"0".repeat(20)}`;
        const checkout = await db
          .insertInto("checkout")
          .values({ job_id: job.id, purpose: "deposit", quote_id: job.quote_id, invoice_id: null, amount_cents: job.deposit_cents, currency: "usd", session_id: session, status: "paid", created_at: paidAt })
          .returning("id")
          .executeTakeFirstOrThrow();
        await db.insertInto("payment").values({ job_id: job.id, purpose: "deposit", method: "card", amount_cents: job.deposit_cents, reference: "Paid online", checkout_id: checkout.id, recorded_by: null, at: paidAt }).execute();
        await db.insertInto("payment_event").values({ event_id: `evt_demo_${cardSeq}`, type: "checkout.session.completed", outcome: "applied", reason: "", received_at: paidAt }).execute();
      } else {
        counterSeq++;
        const method = counterSeq % 2 === 1 ? "check" : "cash";
        await db
          .insertInto("payment")
          .values({ job_id: job.id, purpose: "deposit", method, amount_cents: job.deposit_cents, reference: method === "check" ? `Check ${4100 + counterSeq}` : "Paid at the counter", checkout_id: null, recorded_by: office.id, at: paidAt })
          .execute();
      }
    }
    if (!late) continue;
    const at = await readyAt(job.id);
    invoiceSeq++;
    const number = `INV-${at.slice(2, 4)}-${String(invoiceSeq).padStart(4, "0")}`;
    const balance = job.total_cents - job.deposit_cents;
    if (job.stage === "ready") {
      await db.insertInto("invoice").values({ job_id: job.id, number, status: "open", total_cents: job.total_cents, created_by: office.id, created_at: at, sent_at: at, void_reason: null, voided_at: null }).execute();
      continue;
    }
    const onAccount = job.scope === "install_only";
    await db.insertInto("invoice").values({ job_id: job.id, number, status: onAccount ? "on_account" : "paid", total_cents: job.total_cents, created_by: office.id, created_at: at, sent_at: at, void_reason: null, voided_at: null }).execute();
    const settledAt = new Date(Date.parse(at) + 20 * 3_600_000).toISOString();
    await db
      .insertInto("payment")
      .values({ job_id: job.id, purpose: "invoice", method: onAccount ? "on_account" : "check", amount_cents: balance, reference: onAccount ? "Fleet account, 30 days" : `Check ${5200 + invoiceSeq}`, checkout_id: null, recorded_by: onAccount ? owner.id : office.id, at: settledAt })
      .execute();
  }
}
