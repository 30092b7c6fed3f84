import type { DB } from "@/db";

/** A price-list item and a draft quote of one line on the job, written straight to the database. */
export async function makePriceItemAndQuote(db: DB, jobId: number, staffId: string) {
  const now = new Date().toISOString();
  const item = await db
    .insertInto("price_item")
    .values({ kind: "labour", name: `Shop labour ${jobId}`, unit: "hour", unit_price_cents: 12_500, taxable: 0, kit_use: null, size_milli_in: null, created_at: now, updated_at: now })
    .returning("id")
    .executeTakeFirstOrThrow();
  const version = ((await db.selectFrom("quote").select((e) => e.fn.max("version").as("v")).where("job_id", "=", jobId).executeTakeFirst())?.v ?? 0) + 1;
  const quote = await db
    .insertInto("quote")
    .values({
      job_id: jobId,
      version,
      kind: "quote",
      status: "draft",
      supersedes_id: null,
      tax_millipercent: 8250,
      subtotal_cents: 25_000,
      taxable_cents: 0,
      tax_cents: 0,
      total_cents: 25_000,
      deposit_cents: 12_500,
      created_by: staffId,
      created_at: now,
      updated_at: now,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db
    .insertInto("quote_line")
    .values({ quote_id: quote.id, position: 0, kind: "labour", description: "Install", quantity_milli: 2000, unit_price_cents: 12_500, taxable: 0, amount_cents: 25_000, price_item_id: item.id })
    .execute();
  return { priceItemId: item.id, quoteId: quote.id };
}

/**
 * Turns the shop's "Money checks before work and delivery" off, for tests whose subject is not
 * money but that move jobs into Fabricate or Delivered. Makes the shop row if there is none.
 */
export async function moneyChecksOff(db: DB) {
  await db.insertInto("shop").values({ id: 1, name: "Test Upfit", phone: "(555) 010-0000" }).onConflict((oc) => oc.column("id").doNothing()).execute();
  await db.updateTable("shop").set({ money_checks: 0 }).where("id", "=", 1).execute();
}

export type MoneyState = "quote-approved" | "deposit-paid" | "invoiced" | "settled";

/**
 * Puts a job in the money state a test needs, written straight to the database: an approved quote
 * of $1,000.00 (no tax) asking a $500.00 deposit; "deposit-paid" adds the deposit in cash;
 * "invoiced" adds an open invoice for the whole; "settled" pays its balance by check.
 */
export async function giveJobMoney(db: DB, jobId: number, state: MoneyState, staffId?: string) {
  const now = new Date().toISOString();
  const by = staffId ?? (await db.selectFrom("staff").select("id").limit(1).executeTakeFirstOrThrow()).id;
  const version = ((await db.selectFrom("quote").select((e) => e.fn.max("version").as("v")).where("job_id", "=", jobId).executeTakeFirst())?.v ?? 0) + 1;
  const quote = await db
    .insertInto("quote")
    .values({ job_id: jobId, version, kind: "quote", status: "approved", supersedes_id: null, tax_millipercent: 0, subtotal_cents: 100_000, taxable_cents: 0, tax_cents: 0, total_cents: 100_000, deposit_cents: 50_000, created_by: by, created_at: now, updated_at: now, sent_at: now, sent_by: by, decided_at: now, decided_name: "Test Customer", terms_accepted: 1 })
    .returning("id")
    .executeTakeFirstOrThrow();
  await db.insertInto("quote_line").values({ quote_id: quote.id, position: 0, kind: "labour", description: "Upfit work", quantity_milli: 1000, unit_price_cents: 100_000, taxable: 0, amount_cents: 100_000, price_item_id: null }).execute();
  if (state === "quote-approved") return;
  await db.insertInto("payment").values({ job_id: jobId, purpose: "deposit", method: "cash", amount_cents: 50_000, reference: "test deposit", checkout_id: null, recorded_by: by, at: now }).execute();
  if (state === "deposit-paid") return;
  await db.insertInto("invoice").values({ job_id: jobId, number: `INV-T-${jobId}`, status: state === "settled" ? "paid" : "open", total_cents: 100_000, created_by: by, created_at: now, void_reason: null, voided_at: null }).execute();
  if (state === "settled") {
    await db.insertInto("payment").values({ job_id: jobId, purpose: "invoice", method: "check", amount_cents: 50_000, reference: "Check 1001", checkout_id: null, recorded_by: by, at: now }).execute();
  }
}
