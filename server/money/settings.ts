import "server-only";
import type { DB } from "@/db";
import { recordAudit, type AuditActor } from "@/server/audit/record";
import type { MoneySettingsInput } from "./schemas";
import { type DepositRule, formatCents, formatRate, fromThousandths, toThousandths } from "./totals";

export interface MoneySettings {
  taxMillipercent: number;
  taxRatePercent: number;
  depositKind: "percent" | "fixed";
  depositPercent: number;
  depositFixedCents: number;
  quoteTerms: string;
}

const DEFAULTS: MoneySettings = { taxMillipercent: 0, taxRatePercent: 0, depositKind: "percent", depositPercent: 50, depositFixedCents: 0, quoteTerms: "" };

export async function moneySettings(db: DB): Promise<MoneySettings> {
  const row = await db
    .selectFrom("shop")
    .select(["sales_tax_millipercent", "deposit_kind", "deposit_percent", "deposit_fixed_cents", "quote_terms"])
    .where("id", "=", 1)
    .executeTakeFirst();
  if (!row) return DEFAULTS;
  return {
    taxMillipercent: row.sales_tax_millipercent,
    taxRatePercent: fromThousandths(row.sales_tax_millipercent),
    depositKind: row.deposit_kind,
    depositPercent: row.deposit_percent,
    depositFixedCents: row.deposit_fixed_cents,
    quoteTerms: row.quote_terms,
  };
}

export function depositRule(s: Pick<MoneySettings, "depositKind" | "depositPercent" | "depositFixedCents">): DepositRule {
  return s.depositKind === "percent" ? { kind: "percent", percent: s.depositPercent } : { kind: "fixed", cents: s.depositFixedCents };
}

export function depositWords(s: Pick<MoneySettings, "depositKind" | "depositPercent" | "depositFixedCents">): string {
  return s.depositKind === "percent" ? `${s.depositPercent} % of the quote` : `${formatCents(s.depositFixedCents)} (never more than the quote)`;
}

/** The owner sets the tax rate, the deposit and the terms; quotes already sent keep what they were sent with. */
export async function updateMoneySettings(db: DB, actor: AuditActor, input: MoneySettingsInput): Promise<MoneySettings> {
  return db.transaction().execute(async (trx) => {
    const shop = await trx.selectFrom("shop").select("id").where("id", "=", 1).executeTakeFirst();
    if (!shop) await trx.insertInto("shop").values({ id: 1, name: "Your shop" }).execute();
    const before = await moneySettings(trx);
    const after: MoneySettings = {
      taxMillipercent: toThousandths(input.taxRatePercent)!,
      taxRatePercent: input.taxRatePercent,
      depositKind: input.depositKind,
      depositPercent: input.depositPercent,
      depositFixedCents: input.depositFixedCents,
      quoteTerms: input.quoteTerms,
    };
    await trx
      .updateTable("shop")
      .set({
        sales_tax_millipercent: after.taxMillipercent,
        deposit_kind: after.depositKind,
        deposit_percent: after.depositPercent,
        deposit_fixed_cents: after.depositFixedCents,
        quote_terms: after.quoteTerms,
      })
      .where("id", "=", 1)
      .execute();
    const changes: string[] = [];
    const details: Record<string, unknown> = {};
    if (before.taxMillipercent !== after.taxMillipercent) {
      changes.push(`sales tax from ${formatRate(before.taxMillipercent)} to ${formatRate(after.taxMillipercent)}`);
      details.taxRatePercent = [before.taxRatePercent, after.taxRatePercent];
    }
    if (depositWords(before) !== depositWords(after)) {
      changes.push(`deposit from ${depositWords(before)} to ${depositWords(after)}`);
      details.deposit = [depositWords(before), depositWords(after)];
    }
    if (before.quoteTerms !== after.quoteTerms) {
      changes.push("the quote terms");
      details.quoteTerms = [before.quoteTerms, after.quoteTerms];
    }
    if (changes.length) {
      await recordAudit(trx, { kind: "settings_changed", actor, subject: "Prices and deposit", summary: `${actor.name} changed ${changes.join("; ")}.`, details });
    }
    return after;
  });
}
