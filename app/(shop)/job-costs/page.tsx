import Link from "next/link";
import { buttonClass, inputClass, touchLinkClass } from "@/components/styles";
import { formatCents } from "@/components/money";
import { Section } from "@/components/section";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { showStoredDate } from "@/server/http/calendar-date";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { openClocks } from "@/server/labour/queries";
import { OVER_UNDER_QUOTE, overUnderWords } from "@/server/labour/cost";
import { jobCostsReport } from "@/server/labour/report";
import { readPeriod } from "@/server/reports/period";
import { reportCalendar } from "@/server/reports/queries";
import { formatShopTime } from "@/server/records/calendar";
import { LazyHoursByStageChart } from "./hours-chart-lazy";

export const metadata = { title: "Hours and job cost" };

const hours = (h: number) => `${h.toFixed(2)} h`;
const day = (iso: string) => showStoredDate(iso, "EEE d MMM yyyy");

const JOBS_SHOWN = 20;

/** Hours by stage, each job's cost so far, and each person's hours per week, over a period. */
export default async function JobCostsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePageStaff(["office", "owner"]);
  const db = getDb();
  const cal = await reportCalendar(db);
  const raw = await searchParams;
  const read = readPeriod({ from: typeof raw.from === "string" ? raw.from : undefined, to: typeof raw.to === "string" ? raw.to : undefined }, cal.today);
  const fallback = readPeriod({}, cal.today);
  const period = read.ok ? read.period : fallback.ok ? fallback.period : { from: cal.today, to: cal.today };
  const [report, running] = await Promise.all([jobCostsReport(db, period, cal), openClocks(db, cal.timeZone)]);
  const csv = `/api/reports/job-costs?from=${period.from}&to=${period.to}&format=csv`;
  // A busy period clocks thousands of jobs: the page shows those most over their quote, then the
  // costliest, and the whole list is one link (or the CSV) away.
  const showAll = raw.all === "1";
  const ranked = [...report.jobs].sort((a, b) => Math.max(0, b.overQuoteCents ?? 0) - Math.max(0, a.overQuoteCents ?? 0));
  const shownJobs = showAll ? ranked : ranked.slice(0, JOBS_SHOWN);
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-bold">Hours and job cost</h1>
          <p className="text-ink-soft">Clocked hours from {day(period.from)} to {day(period.to)}, with each job&apos;s labour{report.labourRateCents ? ` at ${formatCents(report.labourRateCents)} an hour` : " (rate not set in Settings)"} and bought-in parts.</p>
        </div>
        <form className="flex flex-wrap items-end gap-2" method="get">
          <label className="text-sm font-semibold">From<input type="date" name="from" defaultValue={period.from} className={inputClass} /></label>
          <label className="text-sm font-semibold">To<input type="date" name="to" defaultValue={period.to} className={inputClass} /></label>
          <button type="submit" className={buttonClass.secondary}>Show</button>
          <a href={csv} className={buttonClass.secondary} download>Download CSV</a>
        </form>
      </div>
      {!read.ok && <p role="alert" className="rounded-md bg-stop-100 p-2 text-stop-700">{read.error.issues[0]?.message} Showing the last 90 days instead.</p>}

      {running.length > 0 && (
        <Section title="Clocks running now" id="running">
          <ul className="space-y-1 text-sm">
            {running.map((e) => (
              <li key={e.id} className={e.flags.length ? "font-semibold text-warn-700" : ""}>
                {e.staffName} on <Link className={`underline ${touchLinkClass}`} href={`/jobs/${e.jobId}#hours`}>{e.workOrder}</Link> since {formatShopTime(e.startedAt, cal.timeZone, "EEE d MMM HH:mm")}
                {e.flags.map((f) => <span key={f.code}> · ⚠ {f.message}</span>)}
              </li>
            ))}
          </ul>
        </Section>
      )}

      <Section title="Hours by stage" id="by-stage">
        {report.stages.length === 0 ? (
          <p className="text-ink-soft">No hours clocked in this period.</p>
        ) : (
          <>
            <LazyHoursByStageChart stages={report.stages} />
            <table className="mt-2 w-full max-w-xl text-left text-sm">
              <thead className="border-b border-line text-ink-soft"><tr><th className="py-1">Stage</th><th className="text-right">Hours</th></tr></thead>
              <tbody>
                {report.stages.map((s) => (
                  <tr key={s.stage} className="border-b border-line/60"><td className="py-1">{s.label}</td><td className="text-right tabular-nums">{hours(s.hours)}</td></tr>
                ))}
              </tbody>
            </table>
          </>
        )}
        <p className="mt-2 text-sm text-ink-soft">Quote lines carry no stage, so jobs are compared with their approved quotes in total (below), not stage by stage. Labour is costed on the exact clocked time; hours are shown rounded to the hundredth, so hours × rate can differ by a few cents.</p>
      </Section>

      <Section title="Jobs" id="jobs">
        {report.jobs.length === 0 ? (
          <p className="text-ink-soft">No job was clocked in this period.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full min-w-[860px] text-left text-sm">
              <thead className="border-b border-line text-ink-soft">
                <tr><th className="py-1">Job</th><th>Stage now</th><th className="text-right">Hours</th><th className="text-right">Labour</th><th className="text-right">Bought-in</th><th className="text-right">Coating</th><th className="text-right">Cost so far</th><th className="text-right">Quoted</th><th className="text-right">{OVER_UNDER_QUOTE}</th></tr>
              </thead>
              <tbody>
                {shownJobs.map((j) => (
                  <tr key={j.jobId} className="border-b border-line/60">
                    <td className="py-1"><Link className={`font-semibold underline ${touchLinkClass}`} href={`/jobs/${j.jobId}#job-cost`}>{j.workOrder}</Link> <span className="text-ink-soft">· {j.customerName}</span></td>
                    <td>{STAGE_LABELS[j.stage]}</td>
                    <td className="text-right tabular-nums">{hours(j.hours)}</td>
                    <td className="text-right tabular-nums">{formatCents(j.labourCents)}</td>
                    <td className="text-right tabular-nums">{formatCents(j.partsCents)}{j.unpricedParts ? ` (+${j.unpricedParts} not priced)` : ""}</td>
                    <td className="text-right tabular-nums">{formatCents(j.coatingCents)}{j.unpricedCoatingRuns ? ` (+${j.unpricedCoatingRuns} ${j.unpricedCoatingRuns === 1 ? "run" : "runs"} not priced)` : ""}</td>
                    <td className="text-right font-semibold tabular-nums">{formatCents(j.totalCents)}</td>
                    <td className="text-right tabular-nums">{j.quotedCents === null ? "no approved quote" : formatCents(j.quotedCents)}</td>
                    <td className={`text-right font-semibold tabular-nums ${j.overQuoteCents !== null && j.overQuoteCents > 0 ? "text-stop-700" : ""}`}>
                      {j.overQuoteCents === null ? "—" : overUnderWords(j.overQuoteCents)}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            {shownJobs.length < report.jobs.length && (
              <p className="mt-2 text-sm text-ink-soft">
                Showing {shownJobs.length} of {report.jobs.length.toLocaleString("en-US")} jobs: those most over their quote, then the costliest.{" "}
                <Link className="font-semibold underline" href={`/job-costs?from=${period.from}&to=${period.to}&all=1#jobs`}>Show all {report.jobs.length.toLocaleString("en-US")}</Link> or download the CSV.
              </p>
            )}
          </div>
        )}
      </Section>

      <Section title="Hours per person per week" id="people">
        {report.people.rows.length === 0 ? (
          <p className="text-ink-soft">No hours clocked in this period.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm">
              <thead className="border-b border-line text-ink-soft">
                <tr><th className="py-1">Person</th>{report.people.weeks.map((w) => <th key={w} className="text-right">Week of {showStoredDate(w, "d MMM")}</th>)}</tr>
              </thead>
              <tbody>
                {report.people.rows.map((p) => (
                  <tr key={p.name} className="border-b border-line/60"><td className="py-1">{p.name}</td>{p.hours.map((h, i) => <td key={report.people.weeks[i]} className="text-right tabular-nums">{h ? hours(h) : "—"}</td>)}</tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </Section>
    </div>
  );
}
