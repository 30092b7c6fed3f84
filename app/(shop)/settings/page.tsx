import { Section } from "@/components/section";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { PUBLISHED_PROCEDURE } from "@/server/records/procedure";
import { recordsSettings } from "@/server/records/queries";
import { labourRateCents } from "@/server/labour/job-cost";
import { LabourRateForm } from "./labour-rate-form";
import { ProcedureForm } from "./procedure-form";

export const metadata = { title: "Shop settings" };

export default async function SettingsPage() {
  await requirePageStaff(["owner"]);
  const [{ procedure }, labourRate] = await Promise.all([recordsSettings(getDb()), labourRateCents(getDb())]);
  return (
    <section className="max-w-3xl space-y-4">
      <div>
        <h1 className="text-2xl font-bold">Shop settings</h1>
        <p className="text-ink-soft">What the shop decides for itself. Only an owner changes these.</p>
      </div>
      <Section title="Leak-test procedure" id="leak-test-procedure">
        <ProcedureForm initial={procedure} published={PUBLISHED_PROCEDURE} />
      </Section>
      <Section title="Labour rate" id="labour-rate">
        <p className="mb-2 text-sm text-ink-soft">What an hour of the shop&apos;s labour costs, for each job&apos;s cost. It moves to the price list once the shop keeps one.</p>
        <LabourRateForm cents={labourRate} />
      </Section>
    </section>
  );
}
