import { Section } from "@/components/section";
import { getDb } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import type { JobDetail } from "@/server/jobs/queries";
import { canSeeCosts } from "@/server/parts/mutations";
import { fitSpecFor, knownSuppliers, listBoughtParts } from "@/server/parts/queries";
import { shopSettings } from "@/server/shop/queries";
import { BoughtParts } from "./bought-parts";

export async function BoughtPartsSection({ job, user }: { job: JobDetail; user: StaffUser }) {
  const db = getDb();
  const canCost = canSeeCosts(user);
  const [parts, spec, shop, approved, suppliers] = await Promise.all([
    listBoughtParts(db, job.id, { withCost: canCost }),
    fitSpecFor(db, job.id),
    shopSettings(db),
    db.selectFrom("quote").select("id").where("job_id", "=", job.id).where("status", "=", "approved").limit(1).executeTakeFirst(),
    knownSuppliers(db),
  ]);
  return (
    <Section title="Bought-in parts" id="bought-parts">
      <BoughtParts jobId={job.id} parts={parts} canCost={canCost} hasKitSpec={spec !== null} hasApprovedQuote={approved !== undefined} timeZone={shop.timeZone} suppliers={suppliers} />
    </Section>
  );
}
