import Link from "next/link";
import { LazyReportChart } from "@/components/report-chart-lazy";
import type { ChartSeries } from "@/components/report-chart";
import { buttonClass, inputClass } from "@/components/styles";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { showStoredDate } from "@/server/http/calendar-date";
import { fieldErrors } from "@/server/http/errors";
import { readPeriod } from "@/server/reports/period";
import { coatersReport, reportCalendar, stageTimesReport, throughputReport, workloadReport } from "@/server/reports/queries";

export const metadata = { title: "Reports" };

const REPORTS = {
  "stage-times": "Time in each stage",
  throughput: "Jobs delivered",
  coaters: "Coaters",
  workload: "Tech workload",
} as const;
type ReportKey = keyof typeof REPORTS;

// Theme colours (app/globals.css): bay-700, spark-500, stop-700, ink-soft, bay-600, spark-700.
const COLOURS = ["#0e5a54", "#e2772a", "#a32219", "#44545b", "#137068", "#a44e10"];

const week = (iso: string) => showStoredDate(iso, "d MMM");
const days = (n: number | null) => (n === null ? "—" : `${n}`);
const share = (s: number | null) => (s === null ? "—" : `${Math.round(s * 100)} %`);
const thClass = "border-b-2 border-line px-2 py-2 text-left font-semibold";
const tdClass = "border-b border-line px-2 py-2";
const numClass = `${tdClass} text-right tabular-nums`;

function Table({ caption, head, rows }: { caption: string; head: string[]; rows: (string | number)[][] }) {
  // Up to five columns fit a phone with their headings wrapped; a wider table scrolls sideways and says so.
  const wide = head.length > 5;
  return (
    <>
      {wide && <p className="mb-1 text-sm text-ink-soft sm:hidden">{head.length} columns: slide the table sideways to see them all.</p>}
      <div role="region" aria-label={`${caption} (table)`} tabIndex={0} className="overflow-x-auto rounded-lg border border-line bg-panel">
        <table className={`w-full border-collapse text-sm ${wide ? "min-w-[32rem]" : ""}`} data-testid="report-table">
          <caption className="sr-only">{caption}</caption>
          <thead>
            <tr>
              {head.map((h, i) => (
                <th key={h} scope="col" className={`${thClass} ${i > 0 ? "text-right" : ""}`}>{h}</th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => (
              <tr key={i}>
                {r.map((cell, j) => (j === 0 ? <th key={j} scope="row" className={`${tdClass} text-left font-normal`}>{cell}</th> : <td key={j} className={numClass}>{cell}</td>))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}

interface View {
  intro: string;
  chart: { rows: Record<string, string | number | null>[]; xKey: string; xLabel: string; yLabel: string; series: ChartSeries[]; summary: string; integers?: boolean } | null;
  empty: string | null;
  table: { caption: string; head: string[]; rows: (string | number)[][] };
}

async function view(report: ReportKey, period: { from: string; to: string }): Promise<View> {
  const db = getDb();
  const cal = await reportCalendar(db);
  switch (report) {
    case "stage-times": {
      const r = await stageTimesReport(db, period, cal);
      const visits = r.stages.reduce((n, s) => n + s.visits, 0);
      return {
        intro: "Business days each job spent in a stage, each time a job went through a stage and left it in the period (a job sent back to Fabricate counts each time through). Half of them took less than the median; nine in ten took no longer than the 90th percentile.",
        empty: visits === 0 ? "No job left a stage in this period." : null,
        chart: {
          rows: r.stages.map((s) => ({ stage: s.label, median: s.medianDays, p90: s.p90Days })),
          xKey: "stage",
          xLabel: "Stage",
          yLabel: "Business days",
          series: [
            { key: "median", label: "Median", color: COLOURS[0] },
            { key: "p90", label: "90th percentile", color: COLOURS[1] },
          ],
          summary: `Bar chart of business days in each stage, median and 90th percentile, ${visits} ${visits === 1 ? "job" : "jobs"} through in all. The table below holds the figures.`,
        },
        table: {
          caption: "Time in each stage",
          head: ["Stage", "Jobs through", "Median (business days)", "90th percentile (business days)"],
          rows: r.stages.map((s) => [s.label, s.visits, days(s.medianDays), days(s.p90Days)]),
        },
      };
    }
    case "throughput": {
      const r = await throughputReport(db, period, cal);
      return {
        intro: `Jobs delivered each week (Monday to Sunday) and whether they went out on or before their due date. In the period: ${r.delivered} delivered, ${share(r.onTimeShare)} of those with a due date on time.`,
        empty: r.delivered === 0 ? "No job was delivered in this period." : null,
        chart: {
          rows: r.weeks.map((w) => ({ week: week(w.week), onTime: w.onTime, late: w.late, noDueDate: w.noDueDate })),
          xKey: "week",
          xLabel: "Week starting",
          yLabel: "Jobs delivered",
          integers: true,
          series: [
            { key: "onTime", label: "On time", color: COLOURS[0], stack: "d" },
            { key: "late", label: "Late", color: COLOURS[2], stack: "d" },
            { key: "noDueDate", label: "No due date", color: COLOURS[3], stack: "d" },
          ],
          summary: `Stacked bar chart of jobs delivered per week: ${r.onTime} on time, ${r.late} late, ${r.noDueDate} with no due date. The table below holds the figures.`,
        },
        table: {
          caption: "Jobs delivered per week",
          head: ["Week starting", "Delivered", "On time", "Late", "No due date"],
          rows: r.weeks.map((w) => [week(w.week), w.delivered, w.onTime, w.late, w.noDueDate]),
        },
      };
    }
    case "coaters": {
      const r = await coatersReport(db, period, cal);
      return {
        intro: "Each coater's turnaround (sent to received, business days) against what it promised, over the coating runs sent in the period. A run still out past its promise counts as late.",
        empty: r.coaters.length === 0 ? "No coating run was sent in this period." : null,
        chart: {
          rows: r.coaters.map((c) => ({ coater: c.vendorName, promised: c.medianPromisedDays, turnaround: c.medianTurnaroundDays, p90: c.p90TurnaroundDays })),
          xKey: "coater",
          xLabel: "Coater",
          yLabel: "Business days",
          series: [
            { key: "promised", label: "Promised (median)", color: COLOURS[3] },
            { key: "turnaround", label: "Took (median)", color: COLOURS[0] },
            { key: "p90", label: "Took (90th percentile)", color: COLOURS[1] },
          ],
          summary: `Bar chart of each coater's promised and actual turnaround in business days, ${r.coaters.length} coaters. The table below holds the figures.`,
        },
        table: {
          caption: "Coaters' turnaround against promise",
          head: ["Coater", "Runs sent", "Back", "On time", "Late", "Overdue now", "Promised (median)", "Took (median)", "Took (90th pct.)", "On time share"],
          rows: r.coaters.map((c) => [c.vendorName, c.runs, c.received, c.onTime, c.late, c.overdue, days(c.medianPromisedDays), days(c.medianTurnaroundDays), days(c.p90TurnaroundDays), share(c.onTimeShare)]),
        },
      };
    }
    case "workload": {
      const r = await workloadReport(db, period, cal);
      return {
        intro: "Open jobs assigned to each tech now, and the stage moves each made per week (reorders inside a column are not counted).",
        empty: r.techs.length === 0 ? "No active tech is on the staff list." : null,
        chart: {
          rows: r.weeks.map((w, i) => Object.fromEntries([["week", week(w)], ...r.techs.map((t) => [t.id, t.movesByWeek[i]])])),
          xKey: "week",
          xLabel: "Week starting",
          yLabel: "Stage moves",
          integers: true,
          series: r.techs.map((t, i) => ({ key: t.id, label: t.name, color: COLOURS[i % COLOURS.length] })),
          summary: `Bar chart of stage moves per week for each of ${r.techs.length} techs. The table below holds the figures.`,
        },
        table: {
          caption: "Tech workload",
          head: ["Tech", "Open jobs now", "Moves in the period", ...r.weeks.map((w) => `Week of ${week(w)}`)],
          rows: r.techs.map((t) => [t.name, t.openJobs, t.moves, ...t.movesByWeek]),
        },
      };
    }
  }
}

export default async function ReportsPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  await requirePageStaff(["office", "owner"]);
  const sp = await searchParams;
  const report: ReportKey = sp.report && sp.report in REPORTS ? (sp.report as ReportKey) : "stage-times";
  const cal = await reportCalendar(getDb());
  const read = readPeriod({ from: sp.from, to: sp.to }, cal.today);
  const problem = read.ok ? null : Object.values(fieldErrors(read.error))[0]?.[0];
  const period = read.ok ? read.period : (readPeriod({}, cal.today) as Extract<ReturnType<typeof readPeriod>, { ok: true }>).period;
  const v = await view(report, period);
  const query = (over: Record<string, string>) => new URLSearchParams({ report, from: period.from, to: period.to, ...over }).toString();

  return (
    <section className="space-y-4" aria-labelledby="reports-title">
      <h1 id="reports-title" className="text-2xl font-bold">Reports</h1>
      <nav aria-label="Reports">
        <ul className="flex flex-wrap gap-2">
          {(Object.keys(REPORTS) as ReportKey[]).map((k) => (
            <li key={k}>
              <Link
                href={`/reports?${query({ report: k })}`}
                aria-current={k === report ? "page" : undefined}
                className={`inline-flex min-h-11 items-center rounded-md border px-3 font-semibold ${k === report ? "border-bay-700 bg-bay-700 text-white" : "border-line bg-panel text-ink hover:bg-bay-50"}`}
              >
                {REPORTS[k]}
              </Link>
            </li>
          ))}
        </ul>
      </nav>
      <form action="/reports" className="flex flex-wrap items-end gap-2">
        <input type="hidden" name="report" value={report} />
        <label className="text-sm font-semibold">
          First day
          <input type="date" name="from" defaultValue={period.from} className={`${inputClass} mt-1`} />
        </label>
        <label className="text-sm font-semibold">
          Last day
          <input type="date" name="to" defaultValue={period.to} className={`${inputClass} mt-1`} />
        </label>
        <button className={buttonClass.secondary}>Show</button>
        <a href={`/api/reports/${report}?${new URLSearchParams({ from: period.from, to: period.to, format: "csv" })}`} className={buttonClass.secondary} download>
          Download CSV
        </a>
      </form>
      {problem && (
        <p role="alert" className="rounded-md border-2 border-stop-700 bg-stop-100 p-3">
          {problem} Showing the last 90 days instead.
        </p>
      )}
      <section aria-labelledby="report-title" className="space-y-3 rounded-lg border border-line bg-panel p-4">
        <h2 id="report-title" className="text-lg font-bold">
          {REPORTS[report]}, {showStoredDate(period.from, "d MMM yyyy")} to {showStoredDate(period.to, "d MMM yyyy")}
        </h2>
        <p className="max-w-3xl text-ink-soft">{v.intro}</p>
        {v.empty ? <p className="font-semibold">{v.empty}</p> : v.chart && <LazyReportChart {...v.chart} />}
        <Table {...v.table} />
      </section>
    </section>
  );
}
