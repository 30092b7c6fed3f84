import type { Kysely } from "kysely";
import type { Database } from "./schema";
import type { KitUse, LineKind } from "./tables/money";

/** The demo shop's terms, printed under every quote. Invented for the demo. */
export const DEMO_QUOTE_TERMS = [
  "Prices hold for 30 days from the quote's date.",
  "Half the quote is due as a deposit on approval; bought-in parts are ordered on that money and are not returnable.",
  "The balance is due when the truck is ready for pickup. Work added after approval is quoted as a change order first.",
].join("\n");

type DemoPrice = [kind: LineKind, name: string, unit: string, cents: number, taxable: boolean, kitUse?: KitUse, sizeIn?: number];

/** The demo price list: the shop's labour rates, the parts and services it quotes most. Invented figures. */
export const DEMO_PRICES: DemoPrice[] = [
  ["labour", "Shop labour", "hour", 12_500, false],
  ["labour", "Fabrication labour", "hour", 13_500, false],
  ["part", "PTO, 6-bolt opening, with mounting kit", "each", 148_900, true, "pto"],
  ["part", "Gear pump, direct mount", "each", 92_500, true, "pump"],
  ["fabrication", "Aluminum reservoir, fabricated and leak-tested", "each", 165_000, true, "reservoir"],
  ["part", "Hydraulic hose, 3/4 in, with ends", "ft", 525, true, "hose", 0.75],
  ["part", "Hydraulic hose, 1 in, with ends", "ft", 675, true, "hose", 1],
  ["part", "Suction hose, 1-3/4 in", "ft", 1_150, true, "hose", 1.75],
  ["part", "Breakaway couplers, pair", "each", 18_400, true],
  ["part", "In-cab PTO switch with engaged light", "each", 21_650, true],
  ["coating", "Outside powder coat, reservoir", "each", 38_500, false],
  ["fee", "Hydraulic oil and shop supplies", "job", 9_500, true],
];

export async function seedMoney(db: Kysely<Database>, now: Date) {
  const at = now.toISOString();
  await db.updateTable("shop").set({ sales_tax_millipercent: 8_250, deposit_kind: "percent", deposit_percent: 50, quote_terms: DEMO_QUOTE_TERMS }).where("id", "=", 1).execute();
  for (const [kind, name, unit, cents, taxable, kitUse, sizeIn] of DEMO_PRICES) {
    await db
      .insertInto("price_item")
      .values({ kind, name, unit, unit_price_cents: cents, taxable: taxable ? 1 : 0, kit_use: kitUse ?? null, size_milli_in: sizeIn === undefined ? null : Math.round(sizeIn * 1000), created_at: at, updated_at: at })
      .execute();
  }
}
