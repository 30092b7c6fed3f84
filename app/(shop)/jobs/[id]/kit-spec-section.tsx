import { NotBuiltNote, Section } from "@/components/section";
import type { StaffUser } from "@/server/auth/session";
import type { JobDetail } from "@/server/jobs/queries";

export async function KitSpecSection(_props: { job: JobDetail; user: StaffUser }) {
  return (
    <Section title="Kit spec">
      <NotBuiltNote>The wet-kit calculator's saved result for this truck will show here.</NotBuiltNote>
    </Section>
  );
}
