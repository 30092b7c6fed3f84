import Link from "next/link";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { emailEnv } from "@/server/email/env";
import { notifySettings } from "@/server/email/settings";
import { PUBLISHED_PROCEDURE } from "@/server/records/procedure";
import { recordsSettings } from "@/server/records/queries";
import { labourRateCents } from "@/server/labour/job-cost";
import { shopDetails } from "@/server/shop/settings";
import { ShopNotifyBox } from "../jobs/[id]/messages-panel";
import { LabourRateForm } from "./labour-rate-form";
import { ProcedureForm } from "./procedure-form";
import { ShopDetailsForm } from "./shop-details-form";

export const metadata = { title: "Shop settings" };

function quietOverride(): number | null {
  try {
    return emailEnv().EMAIL_QUIET_SECONDS ?? null;
  } catch {
    return null;
  }
}

export default async function SettingsPage() {
  const user = await requirePageStaff(["office", "owner"]);
  const owner = user.role === "owner";
  const db = getDb();
  const [{ procedure }, details, notify, labourRate] = await Promise.all([recordsSettings(db), shopDetails(db), notifySettings(db), labourRateCents(db)]);
  return (
    <section className="max-w-3xl space-y-4">
      <div>
        <h1 className="text-2xl font-bold">Shop settings</h1>
        <p className="text-ink-soft">
          What the shop decides for itself. {owner ? "Only an owner changes the shop's details and the leak-test procedure." : "The owner changes the shop's details and the leak-test procedure; you can read them here."}
        </p>
      </div>
      <Section title="The shop" id="shop-details">
        <ShopDetailsForm initial={details} canEdit={owner} />
      </Section>
      <Section title="Customer e-mail" id="customer-email">
        <ShopNotifyBox initial={notify} quietOverrideSeconds={quietOverride()} />
      </Section>
      {owner && (
        <Section title="Leak-test procedure" id="leak-test-procedure">
          <ProcedureForm initial={procedure} published={PUBLISHED_PROCEDURE} />
        </Section>
      )}
      <Section title="Labour rate" id="labour-rate">
        <p className="mb-2 text-sm text-ink-soft">What an hour of the shop&apos;s labour costs, for each job&apos;s cost; the price list holds what the customer pays.</p>
        {owner ? <LabourRateForm cents={labourRate} /> : <p>{labourRate ? `$${(labourRate / 100).toFixed(2)} an hour` : "Not set yet."}</p>}
      </Section>
      <Section title="Tax, deposit and money checks" id="money">
        <p>
          Sales tax, the deposit a quote asks, the quote terms and the money checks before work and delivery are kept with the price list:{" "}
          <Link className="font-semibold underline" href="/prices#money-settings">Prices</Link>.
        </p>
      </Section>
    </section>
  );
}
