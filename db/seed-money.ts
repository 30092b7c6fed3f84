import type { Kysely } from "kysely";
import { depositCents, documentTotals, lineAmountCents } from "@/server/money/totals";
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
  await seedQuotes(db);
}

type SeedLine = { kind: LineKind; description: string; quantityMilli: number; unitPriceCents: number; taxable: boolean };

const priceOf = (name: string) => DEMO_PRICES.find((p) => p[1] === name)!;
const line = (name: string, quantity: number, description = name): SeedLine => {
  const [kind, , , cents, taxable] = priceOf(name);
  return { kind, description, quantityMilli: Math.round(quantity * 1000), unitPriceCents: cents, taxable };
};

/** What the demo shop quoted for a job, from its work and description. */
function demoLines(scope: string, description: string): SeedLine[] {
  if (scope === "install_only") return [line("Shop labour", 3.5, "Install and wire"), line("In-cab PTO switch with engaged light", 1), line("Hydraulic oil and shop supplies", 1)];
  if (/wet kit/i.test(description)) {
    return [
      line("PTO, 6-bolt opening, with mounting kit", 1),
      line("Gear pump, direct mount", 1),
      line("Aluminum reservoir, fabricated and leak-tested", 1),
      line("Suction hose, 1-3/4 in", 4),
      line("Hydraulic hose, 1 in, with ends", 14),
      line("Hydraulic hose, 3/4 in, with ends", 14),
      line("Outside powder coat, reservoir", 1),
      line("Shop labour", 9.5, "Install, plumb and wire the kit"),
      line("Hydraulic oil and shop supplies", 1),
    ];
  }
  return [line("Fabrication labour", 6.5, `Fabricate: ${description}`), line("Outside powder coat, reservoir", 1, "Outside powder coat"), line("Shop labour", 2, "Mount and fit")];
}

/**
 * Quotes that agree with each job's stage: a job still queued has its quote sent and waiting for
 * the customer; every job past Queued was approved on its status link before work began.
 */
export async function seedQuotes(db: Kysely<Database>) {
  const jobs = await db
    .selectFrom("job")
    .innerJoin("customer", "customer.id", "job.customer_id")
    .select(["job.id", "job.scope", "job.description", "job.stage", "job.created_at", "customer.name as customer_name"])
    .orderBy("job.id")
    .execute();
  const office = await db.selectFrom("staff").select("id").where("role", "=", "office").orderBy("created_at").executeTakeFirstOrThrow();
  for (const job of jobs) {
    const lines = demoLines(job.scope, job.description);
    const totals = documentTotals(lines, 8_250);
    const sentAt = new Date(Date.parse(job.created_at) + 2 * 3_600_000).toISOString();
    const approved = job.stage !== "queued";
    const decidedAt = new Date(Date.parse(job.created_at) + 20 * 3_600_000).toISOString();
    const quote = await db
      .insertInto("quote")
      .values({
        job_id: job.id,
        version: 1,
        kind: "quote",
        status: approved ? "approved" : "sent",
        supersedes_id: null,
        tax_millipercent: 8_250,
        subtotal_cents: totals.subtotalCents,
        taxable_cents: totals.taxableCents,
        tax_cents: totals.taxCents,
        total_cents: totals.totalCents,
        deposit_cents: depositCents(totals.totalCents, { kind: "percent", percent: 50 }),
        terms: DEMO_QUOTE_TERMS,
        created_by: office.id,
        created_at: job.created_at,
        updated_at: approved ? decidedAt : sentAt,
        sent_at: sentAt,
        sent_by: office.id,
        decided_at: approved ? decidedAt : null,
        decided_name: approved ? job.customer_name : null,
        decided_address: approved ? "" : null,
        terms_accepted: approved ? 1 : null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await db
      .insertInto("quote_line")
      .values(lines.map((l, position) => ({ quote_id: quote.id, position, kind: l.kind, description: l.description, quantity_milli: l.quantityMilli, unit_price_cents: l.unitPriceCents, taxable: l.taxable ? 1 : 0, amount_cents: lineAmountCents(l.quantityMilli, l.unitPriceCents), price_item_id: null })))
      .execute();
  }
}
