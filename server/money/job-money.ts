import "server-only";
import { sql } from "kysely";
import type { DB } from "@/db";
import type { JobMoney } from "./state";

/** The shop's "Money checks before work and delivery" setting (on when the shop row is missing). */
export async function moneyChecksOn(db: DB): Promise<boolean> {
  const row = await db.selectFrom("shop").select("money_checks").where("id", "=", 1).executeTakeFirst();
  return row ? row.money_checks === 1 : true;
}

/**
 * The money state of many jobs at once (the board asks for hundreds): one statement each for the
 * quotes, the payments and the invoices, whatever the number of jobs. Takes a transaction too, so
 * a move decides on what it will commit against.
 */
export async function loadJobMoney(db: DB, jobIds: readonly number[]): Promise<Map<number, JobMoney>> {
  const checksOn = await moneyChecksOn(db);
  const out = new Map<number, JobMoney>(
    jobIds.map((id) => [id, { checksOn, quoteStatus: null, depositAskedCents: 0, depositReceivedCents: 0, priceCents: 0, receivedCents: 0, onAccountCents: 0, invoice: null }]),
  );
  if (jobIds.length === 0) return out;
  const quotes = await db
    .selectFrom("quote")
    .select(["job_id", "kind", "status", "version", "total_cents", "deposit_cents"])
    .where("job_id", "in", jobIds)
    .where("status", "!=", "superseded")
    .orderBy("job_id")
    .orderBy("version")
    .execute();
  for (const q of quotes) {
    const m = out.get(q.job_id)!;
    if (q.status === "approved") m.priceCents += q.total_cents;
    if (q.kind !== "quote") continue;
    // The newest version of the quote speaks for it; an approved one stays the price even if a later draft exists.
    if (m.quoteStatus !== "approved" || q.status === "approved") {
      m.quoteStatus = q.status as JobMoney["quoteStatus"];
      if (q.status === "approved") m.depositAskedCents = q.deposit_cents;
    }
  }
  const payments = await db
    .selectFrom("payment")
    .select(["job_id", "purpose", "method", sql<number>`sum(amount_cents)`.as("cents")])
    .where("job_id", "in", jobIds)
    .groupBy(["job_id", "purpose", "method"])
    .execute();
  for (const p of payments) {
    const m = out.get(p.job_id)!;
    const cents = Number(p.cents);
    if (p.method === "on_account") m.onAccountCents += cents;
    else m.receivedCents += cents;
    if (p.purpose === "deposit" && p.method !== "refund") m.depositReceivedCents += cents;
  }
  const invoices = await db.selectFrom("invoice").select(["job_id", "number", "status", "total_cents"]).where("job_id", "in", jobIds).where("status", "!=", "void").execute();
  for (const i of invoices) {
    out.get(i.job_id)!.invoice = { number: i.number, status: i.status as "open" | "paid" | "on_account", totalCents: i.total_cents };
  }
  return out;
}
