import { afterShell } from "@/server/http/after-shell";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import type { JobDetail } from "@/server/jobs/queries";
import { stagesFor } from "@/server/jobs/stages";
import { jobParts, listJobPhotos } from "@/server/photos/queries";
import { shopSettings } from "@/server/shop/queries";
import { PhotosPanel } from "./photos-panel";

export async function PhotosSection({ job, user }: { job: JobDetail; user: StaffUser }) {
  await afterShell();
  const db = getDb();
  const [photos, parts, shop] = await Promise.all([listJobPhotos(db, job.id), jobParts(db, job.id), shopSettings(db)]);
  return (
    <Section title="Photos" id="photos">
      <PhotosPanel jobId={job.id} jobStage={job.stage} stages={stagesFor(job.scope)} parts={parts} role={user.role} initialPhotos={photos} timeZone={shop.timeZone} />
    </Section>
  );
}
