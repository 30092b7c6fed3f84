import Link from "next/link";
import { redirect } from "next/navigation";
import { FirstSteps } from "@/components/first-steps";
import { IconWarn } from "@/components/icons";
import { StageBadge } from "@/components/stage-badge";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { showStoredDate } from "@/server/http/calendar-date";
import { shopBeginnings } from "@/server/jobs/queries";
import { DUE_SOON_DAYS, loadOverview, type OverviewJob } from "@/server/reports/overview";

export const metadata = { title: "Overview" };

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
const day = (iso: string) => showStoredDate(iso, "EEE d MMM");
const linkClass = "font-semibold text-bay-800 underline decoration-bay-600/40 underline-offset-2 hover:decoration-bay-800";

/** One figure that opens the list behind it. */
function Figure({ label, value, href, tone = "plain", note }: { label: string; value: number; href: string; tone?: "plain" | "stop" | "warn"; note?: string }) {
  const toneClass = value > 0 && tone === "stop" ? "border-stop-700 bg-stop-100" : value > 0 && tone === "warn" ? "border-warn-700 bg-warn-100" : "border-line bg-panel";
  return (
    <Link href={href} className={`flex min-h-11 flex-col rounded-lg border-2 p-3 hover:border-bay-600 ${toneClass}`}>
      <span className="text-sm font-semibold text-ink-soft">{label}</span>
      <span className="flex items-center gap-2 text-3xl font-bold tabular-nums">
        {value > 0 && tone !== "plain" && <IconWarn />}
        {value}
      </span>
      {note && <span className="text-sm text-ink-soft">{note}</span>}
    </Link>
  );
}

function JobRows({ jobs, late }: { jobs: OverviewJob[]; late: boolean }) {
  return (
    <ul className="divide-y divide-line">
      {jobs.map((j) => (
        <li key={j.id} className="py-2">
          <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <Link href={`/jobs/${j.id}`} className={`${linkClass} inline-flex min-h-11 items-center whitespace-nowrap`}>{j.workOrder}</Link>
            <span className="min-w-0 flex-1 truncate">{j.customerName} · Unit {j.unitNumber}</span>
            <StageBadge stage={j.stage} />
          </div>
          <p className="text-sm text-ink-soft">
            {late ? (
              <>
                <strong className="text-stop-700">{plural(j.daysLate, "business day")} late</strong> (due {day(j.dueOn)})
              </>
            ) : (
              <>Due {day(j.dueOn)}</>
            )}
            {j.daysInStage !== null && <> · {plural(j.daysInStage, "business day")} in {j.stageLabel}</>}
          </p>
        </li>
      ))}
    </ul>
  );
}

export default async function OverviewPage() {
  const user = await requirePageStaff();
  // The bench starts at the board; the overview is the office's page.
  if (user.role === "tech") redirect("/board");
  const db = getDb();
  const o = await loadOverview(db);
  // A shop with no job yet has only zeros to show: the first steps come first.
  const beginnings = o.onBoard === 0 ? await shopBeginnings(db) : null;

  return (
    <section className="space-y-4" aria-labelledby="overview-title">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h1 id="overview-title" className="text-2xl font-bold">Overview</h1>
        <p className="text-ink-soft">
          {day(o.today)} · {plural(o.onBoard, "job")} on the board ·{" "}
          <Link href="/reports" className={linkClass}>Reports</Link>
        </p>
      </div>

      {beginnings && beginnings.jobs === 0 && <FirstSteps counts={beginnings} role={user.role} />}

      <div className="grid grid-cols-2 gap-3 md:grid-cols-4">
        <Figure label="Past due" value={o.pastDue.count} href={o.pastDue.href} tone="stop" note="open jobs past their due date" />
        <Figure label={`Due in ${DUE_SOON_DAYS} days`} value={o.dueSoon.count} href={o.dueSoon.href} note={`by ${day(o.dueSoonUntil)}`} />
        <Figure label="Coating runs out" value={o.coating.out} href={o.coating.href} note="at the coater now" />
        <Figure label="Coating due back" value={o.coating.dueBack} href={o.coating.href} note={`by ${day(o.nextWorkingDay)}`} />
        <Figure label="Coating overdue" value={o.coating.overdue} href={o.coating.href} tone="stop" note="past the coater's promise" />
        <Figure label="E-mails failed" value={o.emailsFailed.messages} href={o.emailsFailed.href} tone="warn" note={plural(o.emailsFailed.jobs, "job")} />
        <Figure label="Parts to order" value={o.boughtParts.toOrder} href={o.boughtParts.href} tone="warn" note={`bought-in lines; ${plural(o.boughtParts.onOrder, "line")} on order`} />
        <Figure label="Parts deliveries overdue" value={o.boughtParts.overdue} href={o.boughtParts.overdueHref} tone="stop" note="past the supplier's date" />
      </div>

      <section aria-labelledby="stages-title" className="rounded-lg border border-line bg-panel p-4">
        <h2 id="stages-title" className="mb-2 text-lg font-bold">Jobs in each stage now</h2>
        <ul className="grid grid-cols-2 gap-2 sm:grid-cols-4 xl:grid-cols-7">
          {o.stages.map((s) => (
            <li key={s.stage}>
              <Link href={s.href} className="flex min-h-11 items-center justify-between gap-2 rounded-md border border-line px-3 py-2 hover:border-bay-600">
                <span className="text-sm font-semibold">{s.label}</span>
                <span className="text-xl font-bold tabular-nums">{s.jobs}</span>
              </Link>
            </li>
          ))}
        </ul>
      </section>

      <div className="grid gap-4 xl:grid-cols-2">
        <section aria-labelledby="late-title" className="rounded-lg border border-line bg-panel p-4">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="late-title" className="text-lg font-bold">Past due: where each is stuck</h2>
            <Link href={o.pastDue.href} className={linkClass}>All {plural(o.pastDue.count, "job")}</Link>
          </div>
          {o.pastDue.count === 0 ? <p className="mt-2 text-ink-soft">No open job is past its due date.</p> : <JobRows jobs={o.pastDue.jobs} late />}
        </section>
        <section aria-labelledby="soon-title" className="rounded-lg border border-line bg-panel p-4">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="soon-title" className="text-lg font-bold">Due in the next {DUE_SOON_DAYS} days</h2>
            <Link href={o.dueSoon.href} className={linkClass}>All {plural(o.dueSoon.count, "job")}</Link>
          </div>
          {o.dueSoon.count === 0 ? <p className="mt-2 text-ink-soft">Nothing is due by {day(o.dueSoonUntil)}.</p> : <JobRows jobs={o.dueSoon.jobs} late={false} />}
        </section>
      </div>

      <div className="grid gap-4 xl:grid-cols-2">
        <section aria-labelledby="techs-title" className="rounded-lg border border-line bg-panel p-4">
          <h2 id="techs-title" className="mb-2 text-lg font-bold">Each tech&rsquo;s open jobs</h2>
          <ul className="divide-y divide-line">
            {o.techs.map((t) => (
              <li key={t.id}>
                <Link href={t.href} className="flex min-h-11 items-center justify-between gap-2 py-1 hover:bg-bay-50">
                  <span>{t.name}</span>
                  <span className="font-bold tabular-nums">{plural(t.openJobs, "job")}</span>
                </Link>
              </li>
            ))}
            <li>
              <Link href={o.unassigned.href} className="flex min-h-11 items-center justify-between gap-2 py-1 hover:bg-bay-50">
                <span className="text-ink-soft">Nobody assigned</span>
                <span className="font-bold tabular-nums">{plural(o.unassigned.count, "job")}</span>
              </Link>
            </li>
          </ul>
        </section>
        {/* Quotes waiting on someone go here once the shop records them. */}
      </div>
    </section>
  );
}
