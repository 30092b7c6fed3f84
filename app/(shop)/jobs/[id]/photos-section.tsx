import { NotBuiltNote, Section } from "@/components/section";
import type { StaffUser } from "@/server/auth/session";
import type { JobDetail } from "@/server/jobs/queries";

export async function PhotosSection(_props: { job: JobDetail; user: StaffUser }) {
  return (
    <Section title="Photos">
      <NotBuiltNote>Photos by stage and part, with captions and a customer-visible flag, will be uploaded here.</NotBuiltNote>
    </Section>
  );
}
