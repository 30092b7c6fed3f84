import { ClockButton } from "@/components/labour-clock";
import { formatCents } from "@/components/money";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import type { JobDetail } from "@/server/jobs/queries";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { OVER_UNDER_QUOTE, overUnderWords } from "@/server/labour/cost";
import { loadJobCost, quotedFor } from "@/server/labour/job-cost";
import { jobClockEntries, jobHours } from "@/server/labour/queries";
import { formatShopTime } from "@/server/records/calendar";
import { shopSettings } from "@/server/shop/queries";
import { CorrectEntry } from "./correct-entry";

const hours = (h: number) => `${h.toFixed(2)} h`;
const stageLabel = (s: string) => STAGE_LABELS[s as keyof typeof STAGE_LABELS] ?? s;

/** The clock for the bench, and the job's hours by stage and by person. */
export async function LabourSection({ job, user }: { job: JobDetail; user: StaffUser }) {
  const db = getDb();
  const shop = await shopSettings(db);
  const now = new Date();
  const [summary, entries] = await Promise.all([jobHours(db, job.id, now), jobClockEntries(db, job.id, shop.timeZone, now)]);
  const canCorrect = user.role === "office" || user.role === "owner";
  const time = (iso: string) => formatShopTime(iso, shop.timeZone, "EEE d MMM HH:mm");
  return (
    <Section title="Hours" id="hours">
      {job.stage !== "delivered" && <ClockButton jobId={job.id} workOrder={job.workOrder} />}
      <p className="mt-3 font-semibold">{hours(summary.totalHours)} on this job</p>
      {summary.byStage.length > 0 && (
        <p className="text-sm text-ink-soft">By stage: {summary.byStage.map((s) => `${stageLabel(s.stage)} ${hours(s.hours)}`).join(" · ")}</p>
      )}
      {summary.byPerson.length > 0 && <p className="text-sm text-ink-soft">By person: {summary.byPerson.map((p) => `${p.name} ${hours(p.hours)}`).join(" · ")}</p>}
      {entries.length > 0 && (
        <details className="mt-2">
          <summary className="flex min-h-11 cursor-pointer items-center font-semibold text-bay-800">Clock entries ({entries.length})</summary>
          <ul className="space-y-2 text-sm">
            {entries.map((e) => (
              <li key={e.id} className="border-l-4 border-line pl-2" data-clock-entry={e.id}>
                <p>
                  <span className="font-semibold">{e.staffName}</span> · {time(e.startedAt)} – {e.endedAt ? formatShopTime(e.endedAt, shop.timeZone, "HH:mm") : "still on"} · {hours(e.hours)} · <span data-entry-stages>{e.stages.map(stageLabel).join(" → ")}</span>
                </p>
                {e.flags.map((f) => <p key={f.code} className="font-semibold text-warn-700">⚠ {f.message}</p>)}
                {e.correction && (
                  <p className="text-ink-soft">
                    Corrected by {e.correction.byName ?? "the office"}: “{e.correction.reason}” (first clocked {e.correction.originalStartedAt ? time(e.correction.originalStartedAt) : "?"} – {e.correction.originalEndedAt ? time(e.correction.originalEndedAt) : "still on"})
                  </p>
                )}
                {canCorrect && <CorrectEntry id={e.id} startedAt={e.startedAt} endedAt={e.endedAt} timeZone={shop.timeZone} />}
              </li>
            ))}
          </ul>
        </details>
      )}
    </Section>
  );
}

/** What the job has cost so far against its approved quote (office and owner). */
export async function JobCostSection({ job }: { job: JobDetail }) {
  const db = getDb();
  const [cost, quoted] = await Promise.all([loadJobCost(db, job.id), quotedFor(db, job.id)]);
  const q = (cents: number | undefined) => (quoted && cents !== undefined ? formatCents(cents) : "—");
  const overQuote = quoted ? cost.totalCents - quoted.subtotalCents : null;
  return (
    <Section title="Job cost" id="job-cost">
      {/* A gap before every figure, so two amounts never run together on a phone. */}
      <table className="w-full text-left text-sm [&_td+td]:pl-3 [&_th+th]:pl-3">
        <thead className="border-b border-line text-ink-soft">
          <tr><th className="py-1">What</th><th className="text-right">Hours</th><th className="text-right">Cost</th><th className="text-right">Quoted</th></tr>
        </thead>
        <tbody>
          {cost.stages.map((s) => (
            <tr key={s.stage} className="border-b border-line/60">
              <td className="py-1">Labour: {stageLabel(s.stage)}</td>
              <td className="text-right tabular-nums">{hours(s.hours)}</td>
              <td className="text-right tabular-nums">{cost.rateCents ? formatCents(s.labourCents) : "—"}</td>
              <td className="text-right text-ink-soft">—</td>
            </tr>
          ))}
          <tr className="border-b border-line/60">
            <td className="py-1 font-semibold">Labour in all</td>
            <td className="text-right tabular-nums">{hours(cost.hours)}{quoted ? <span className="text-ink-soft"> of {hours(quoted.labourHours)}</span> : null}</td>
            <td className="text-right tabular-nums">{cost.rateCents ? formatCents(cost.labourCents) : "—"}</td>
            <td className="text-right tabular-nums">{q(quoted?.labourCents)}</td>
          </tr>
          <tr className="border-b border-line/60">
            <td className="py-1">Bought-in parts{cost.unpricedParts ? ` (${cost.unpricedParts} not priced)` : ""}</td>
            <td />
            <td className="text-right tabular-nums">{formatCents(cost.partsCents)}</td>
            <td className="text-right tabular-nums">{q(quoted?.partsCents)}</td>
          </tr>
          <tr className="border-b border-line/60">
            <td className="py-1">Outside coating{cost.unpricedCoatingRuns ? ` (${cost.unpricedCoatingRuns} ${cost.unpricedCoatingRuns === 1 ? "run" : "runs"} not priced)` : ""}</td>
            <td />
            <td className="text-right tabular-nums" data-job-coating-cost>{formatCents(cost.coatingCents)}</td>
            <td className="text-right tabular-nums">{q(quoted?.coatingCents)}</td>
          </tr>
        </tbody>
        <tfoot>
          <tr>
            <td className="pt-1 font-bold">Cost so far</td>
            <td />
            <td className="text-right font-bold tabular-nums" data-job-cost-total>{formatCents(cost.totalCents)}</td>
            <td className="text-right font-bold tabular-nums">{q(quoted?.subtotalCents)}</td>
          </tr>
          {overQuote !== null && (
            <tr>
              <td className="pt-1 font-bold">{OVER_UNDER_QUOTE}</td>
              <td colSpan={3} className={`text-right font-bold tabular-nums ${overQuote > 0 ? "text-stop-700" : "text-ok-700"}`} data-job-over-under>{overUnderWords(overQuote)}</td>
            </tr>
          )}
        </tfoot>
      </table>
      <p className="mt-2 text-sm text-ink-soft">
        {cost.rateCents ? `Labour at the shop's cost of ${formatCents(cost.rateCents)} an hour (Settings).` : "The shop's labour cost per hour is not set: the owner sets it in Settings, and labour is counted from then on."}{" "}
        {quoted
          ? "Quoted: the approved quote and change orders before tax; quote lines carry no stage, so labour is compared in total."
          : "No approved quote yet: once the customer approves one, its prices show in the Quoted column and, below, how far over or under the quote the job is so far."}{" "}
        Outside coating is this job&apos;s share of each coating run&apos;s price, split equally over the parts on the run (the Coating page records the price).
      </p>
    </Section>
  );
}
