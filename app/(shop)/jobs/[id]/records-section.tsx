import { afterShell } from "@/server/http/after-shell";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import type { JobDetail } from "@/server/jobs/queries";
import { stageIndex } from "@/server/jobs/stages";
import { findSignOff, listLeakTests, listParts, recordsSettings } from "@/server/records/queries";
import { shopToday } from "@/server/records/turnaround";
import { RecordsParts } from "./records-parts";
import { SignOffForm } from "./records-sign-off";

/** The evidence behind the job's gates: parts with their leak tests and coating, and the wiring sign-off. */
export async function RecordsSection({ job, user }: { job: JobDetail; user: StaffUser }) {
  await afterShell();
  const db = getDb();
  const [parts, leakTests, signOff, settings] = await Promise.all([
    listParts(db, { jobId: job.id }),
    listLeakTests(db, { jobId: job.id }),
    findSignOff(db, job.id),
    recordsSettings(db),
  ]);
  const today = shopToday({ now: new Date(), timeZone: settings.timeZone });
  return (
    <>
      <Section title="Parts, leak tests and coating" id="parts">
        <RecordsParts
          job={{ id: job.id, stage: job.stage, version: job.version, workOrder: job.workOrder, scope: job.scope }}
          parts={parts}
          leakTests={leakTests}
          allowedDropPsi={settings.allowedDropPsi}
          procedure={settings.procedure}
          today={today}
          timeZone={settings.timeZone}
          userName={user.name}
          canEditGates={user.role === "office" || user.role === "owner"}
        />
      </Section>
      <Section title="Wiring & run-test sign-off" id="sign-off">
        {signOff || stageIndex(job.stage) >= stageIndex("install") ? (
          <SignOffForm jobId={job.id} initial={signOff} timeZone={settings.timeZone} />
        ) : (
          // Far from the wiring bay, the form stays folded so the bench sees its own records first.
          <details>
            <summary className="flex min-h-11 cursor-pointer items-center font-semibold text-bay-800">Not started: open the sign-off form</summary>
            <SignOffForm jobId={job.id} initial={signOff} timeZone={settings.timeZone} />
          </details>
        )}
      </Section>
    </>
  );
}
