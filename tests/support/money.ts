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
