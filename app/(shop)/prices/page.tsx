import { Section } from "@/components/section";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { moneyChecksOn } from "@/server/money/job-money";
import { listPriceItems } from "@/server/money/price-list";
import { depositWords, moneySettings } from "@/server/money/settings";
import { formatCents, formatRate } from "@/server/money/totals";
import { KIT_USE_WORDS, KIND_WORDS } from "./words";
import { MoneyChecksForm } from "./money-checks-form";
import { MoneySettingsForm, PriceList } from "./prices-forms";

export const metadata = { title: "Prices" };

export default async function PricesPage() {
  const user = await requirePageStaff(["office", "owner"]);
  const db = getDb();
  const isOwner = user.role === "owner";
  const [settings, items, checksOn] = await Promise.all([moneySettings(db), listPriceItems(db, { includeInactive: isOwner }), moneyChecksOn(db)]);
  return (
    <section className="max-w-5xl space-y-4">
      <div>
        <h1 className="text-2xl font-bold">Prices</h1>
        <p className="text-ink-soft">
          What quotes are priced from. {isOwner ? "Only an owner changes these; quotes already sent keep the prices they were sent with." : "Only an owner changes these."}
        </p>
      </div>
      <Section title="Sales tax and deposit" id="money-settings">
        {isOwner ? (
          <MoneySettingsForm initial={settings} />
        ) : (
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2">
            <dt className="font-semibold">Sales tax</dt>
            <dd>{formatRate(settings.taxMillipercent)} on taxable lines, once per quote</dd>
            <dt className="font-semibold">Deposit on approval</dt>
            <dd>{depositWords(settings)}</dd>
            <dt className="font-semibold">Terms</dt>
            <dd className="whitespace-pre-line">{settings.quoteTerms || "None written yet."}</dd>
          </dl>
        )}
      </Section>
      <Section title="Money checks" id="money-checks">
        {isOwner ? (
          <MoneyChecksForm initial={checksOn} />
        ) : (
          <p>
            Money checks before work and delivery: <strong>{checksOn ? "on" : "off"}</strong>. {checksOn ? "A job needs an approved quote and its deposit before work starts, and its invoice settled or on account before Delivered." : "Jobs move without them."}
          </p>
        )}
      </Section>
      <Section title="Price list" id="price-list">
        {isOwner ? (
          <PriceList initial={items} />
        ) : items.length === 0 ? (
          <p className="text-ink-soft">The owner has not priced anything yet.</p>
        ) : (
          <table className="w-full text-left">
            <caption className="sr-only">Price list</caption>
            <thead>
              <tr className="border-b border-line text-sm text-ink-soft">
                <th scope="col" className="py-2 pr-3">What</th>
                <th scope="col" className="py-2 pr-3">Kind</th>
                <th scope="col" className="py-2 pr-3 text-right">Price</th>
                <th scope="col" className="py-2 pr-3">Tax</th>
                <th scope="col" className="py-2">Kit spec line</th>
              </tr>
            </thead>
            <tbody>
              {items.map((i) => (
                <tr key={i.id} className="border-b border-line/60">
                  <td className="py-2 pr-3 font-semibold">{i.name}</td>
                  <td className="py-2 pr-3">{KIND_WORDS[i.kind]}</td>
                  <td className="py-2 pr-3 text-right tabular-nums">
                    {formatCents(i.unitPriceCents)} <span className="text-ink-soft">/ {i.unit}</span>
                  </td>
                  <td className="py-2 pr-3">{i.taxable ? "Taxable" : "Not taxed"}</td>
                  <td className="py-2">{i.kitUse ? `${KIT_USE_WORDS[i.kitUse]}${i.sizeIn ? ` ${i.sizeIn} in` : ""}` : "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Section>
    </section>
  );
}
