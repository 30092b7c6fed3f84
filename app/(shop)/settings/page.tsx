import { Section } from "@/components/section";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { emailEnv } from "@/server/email/env";
import { notifySettings } from "@/server/email/settings";
import { PUBLISHED_PROCEDURE } from "@/server/records/procedure";
import { recordsSettings } from "@/server/records/queries";
import { shopDetails } from "@/server/shop/settings";
import { ShopNotifyBox } from "../jobs/[id]/messages-panel";
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
  const [{ procedure }, details, notify] = await Promise.all([recordsSettings(db), shopDetails(db), notifySettings(db)]);
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
    </section>
  );
}
