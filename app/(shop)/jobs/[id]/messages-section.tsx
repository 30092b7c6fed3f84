import { NotBuiltNote, Section } from "@/components/section";
import type { StaffUser } from "@/server/auth/session";
import type { JobDetail } from "@/server/jobs/queries";

export async function MessagesSection(_props: { job: JobDetail; user: StaffUser }) {
  return (
    <Section title="Customer e-mail and status link">
      <NotBuiltNote>Every e-mail sent to the customer, with delivery state, and the status link will be managed here.</NotBuiltNote>
    </Section>
  );
}
