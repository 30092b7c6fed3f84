import "server-only";
import type { DB } from "@/db";
import type { LineKind } from "@/db/tables/money";
import { fromThousandths } from "./totals";

export interface QuoteLine {
  id: number;
  kind: LineKind;
  description: string;
  quantity: number;
  unitPriceCents: number;
  taxable: boolean;
  amountCents: number;
  priceItemId: number | null;
}

/** The lines of these quotes and change orders, in their order, by quote id: the one read every screen and document uses. */
export async function quoteLinesOf(db: DB, quoteIds: readonly number[]): Promise<Map<number, QuoteLine[]>> {
  const byQuote = new Map<number, QuoteLine[]>();
  if (!quoteIds.length) return byQuote;
  const rows = await db
    .selectFrom("quote_line")
    .select(["id", "quote_id", "kind", "description", "quantity_milli", "unit_price_cents", "taxable", "amount_cents", "price_item_id"])
    .where("quote_id", "in", [...quoteIds])
    .orderBy("quote_id")
    .orderBy("position")
    .execute();
  for (const l of rows) {
    const list = byQuote.get(l.quote_id) ?? [];
    list.push({
      id: l.id,
      kind: l.kind,
      description: l.description,
      quantity: fromThousandths(l.quantity_milli),
      unitPriceCents: l.unit_price_cents,
      taxable: l.taxable === 1,
      amountCents: l.amount_cents,
      priceItemId: l.price_item_id,
    });
    byQuote.set(l.quote_id, list);
  }
  return byQuote;
}
