import { afterShell } from "@/server/http/after-shell";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import type { JobDetail } from "@/server/jobs/queries";
import { latestKitSpec } from "@/server/kit-spec/queries";
import { listPriceItems } from "@/server/money/price-list";
import { quotesForJob } from "@/server/money/quotes";
import { moneySettings } from "@/server/money/settings";
import { QuotePanel } from "./quote-panel";

/** The job's quotes and change orders: office and owner price the work; a tech builds it and sees no prices. */
export async function QuoteSection({ job, user, timeZone }: { job: JobDetail; user: StaffUser; timeZone: string }) {
  if (user.role === "tech") return null;
  await afterShell();
  const db = getDb();
  const [quotes, items, settings, spec] = await Promise.all([quotesForJob(db, job.id), listPriceItems(db), moneySettings(db), latestKitSpec(db, job.id)]);
  return (
    <Section title="Quote" id="quote">
      <QuotePanel
        jobId={job.id}
        initialQuotes={quotes}
        priceItems={items}
        taxMillipercent={settings.taxMillipercent}
        kitSpecVersion={spec?.version ?? null}
        timeZone={timeZone}
      />
    </Section>
  );
}
