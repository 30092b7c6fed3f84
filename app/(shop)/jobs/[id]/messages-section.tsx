import { afterShell } from "@/server/http/after-shell";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import { emailConfigured, emailEnv } from "@/server/email/env";
import { listMessages } from "@/server/email/messages";
import { jobEmailSettings } from "@/server/email/recipients";
import { notifySettings } from "@/server/email/settings";
import type { JobDetail } from "@/server/jobs/queries";
import { shopSettings } from "@/server/shop/queries";
import { listStatusLinks } from "@/server/status/links";
import { MessagesPanel } from "./messages-panel";

function quietOverride(): number | null {
  try {
    return emailEnv().EMAIL_QUIET_SECONDS ?? null;
  } catch {
    return null;
  }
}

export async function MessagesSection({ job, user }: { job: JobDetail; user: StaffUser }) {
  await afterShell();
  const db = getDb();
  const [messages, settings, links, notify, shop] = await Promise.all([
    listMessages(db, job.id),
    jobEmailSettings(db, job.id),
    listStatusLinks(db, job.id),
    notifySettings(db),
    shopSettings(db),
  ]);
  return (
    <Section title="Customer e-mail and status link" id="messages">
      <MessagesPanel
        jobId={job.id}
        role={user.role}
        emailConfigured={emailConfigured()}
        initialMessages={messages}
        initialSettings={settings}
        initialLinks={links}
        initialShop={notify}
        timeZone={shop.timeZone}
        quietOverrideSeconds={quietOverride()}
      />
    </Section>
  );
}
