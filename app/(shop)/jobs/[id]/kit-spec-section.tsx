import { afterShell } from "@/server/http/after-shell";
import { showStoredDate } from "@/server/http/calendar-date";
import Link from "next/link";
import { KitSpecSummary } from "@/components/kit-calc/kit-spec-summary";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import type { JobDetail } from "@/server/jobs/queries";
import { computeKitSpec, kitCalcInputSchema } from "@/server/kit-calc";
import { kitSpecStartingInputs, latestKitSpec } from "@/server/kit-spec/queries";
import { KitSpecEditor } from "./kit-spec-editor";

export async function KitSpecSection({ job, user }: { job: JobDetail; user: StaffUser }) {
  await afterShell();
  const db = getDb();
  const canEdit = user.role === "office" || user.role === "owner";
  const [spec, start] = await Promise.all([latestKitSpec(db, job.id), canEdit ? kitSpecStartingInputs(db, job.id) : null]);
  // A truck's recorded engine speed may sit outside the calculator's limits; then the form opens and says so.
  const startAnswer = start && kitCalcInputSchema.safeParse(start.inputs).success ? computeKitSpec(start.inputs) : undefined;

  return (
    <Section
      title="Kit spec"
      id="kit-spec"
      actions={
        spec && (
          <p className="text-sm text-ink-soft" data-testid="kit-spec-version">
            Version {spec.version} · saved by {spec.savedBy.name}, {showStoredDate(spec.savedAt, "d MMM yyyy, HH:mm")}
          </p>
        )
      }
    >
      <div className="space-y-4">
        {spec ? (
          <KitSpecSummary inputs={spec.inputs} results={spec.results} />
        ) : (
          <p className="text-ink-soft">
            No kit spec saved for this truck yet.{" "}
            {canEdit ? "Work one out below and save it with the job." : "The office or the owner saves one from the wet-kit calculator."}
          </p>
        )}
        <p className="text-sm text-ink-soft print:hidden">
          How each figure is worked out, with its source:{" "}
          <Link href="/calculator" className="inline-flex min-h-11 items-center font-semibold underline">
            wet-kit calculator
          </Link>
        </p>
        {canEdit && start && (
          <KitSpecEditor
            jobId={job.id}
            version={spec?.version ?? 0}
            start={start.inputs}
            startFrom={start.from}
            startAnswer={startAnswer}
          />
        )}
      </div>
    </Section>
  );
}
