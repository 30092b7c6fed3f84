import { NotBuiltNote, Section } from "@/components/section";
import type { StaffUser } from "@/server/auth/session";
import type { JobDetail } from "@/server/jobs/queries";

export async function RecordsSection(_props: { job: JobDetail; user: StaffUser }) {
  return (
    <Section title="Shop records">
      <NotBuiltNote>Parts, leak tests, coating runs and the wiring sign-off for this job will be recorded here.</NotBuiltNote>
    </Section>
  );
}
