import { showStoredDate } from "@/server/http/calendar-date";
import Link from "next/link";
import { buttonClass, inputClass } from "@/components/styles";
import { StageBadge } from "@/components/stage-badge";
import { getDb } from "@/db";
import { STAGES, type Stage } from "@/db/schema";
import { requirePageStaff } from "@/server/auth/session";
import { listJobs } from "@/server/jobs/queries";
import { STAGE_LABELS } from "@/server/jobs/stages";

export const metadata = { title: "Jobs" };

const SORTS = { newest: "Newest first", due: "Due (soonest first)", customer: "Customer (A–Z)", stage: "Stage (first to last)" } as const;
const PAGE = 50;

export default async function JobsPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requirePageStaff();
  const sp = await searchParams;
  const stage = STAGES.includes(sp.stage as Stage) ? (sp.stage as Stage) : undefined;
  const sort = sp.sort && sp.sort in SORTS ? (sp.sort as keyof typeof SORTS) : "newest";
  const q = (sp.q ?? "").slice(0, 60);
  const page = /^[1-9]\d{0,4}$/.test(sp.page ?? "") ? Number(sp.page) : 1;
  // One row more than a page tells whether there is a next page, without counting every job.
  const found = await listJobs(getDb(), { stage, q: q || undefined, sort, limit: PAGE + 1, offset: (page - 1) * PAGE });
  const rows = found.slice(0, PAGE);
  const hasNext = found.length > PAGE;
  const href = (over: Record<string, string | undefined>) => {
    const params = new URLSearchParams(Object.entries({ stage, sort, q: q || undefined, ...over }).filter(([, v]) => v) as [string, string][]);
    return `/jobs?${params}`;
  };

  return (
    <section className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-2xl font-bold">Jobs</h1>
        {user.role !== "tech" && (
          <Link href="/jobs/new" className={buttonClass.primary}>
            New work order
          </Link>
        )}
      </div>
      <form className="flex flex-wrap items-end gap-2" action="/jobs">
        <label className="min-w-56 flex-1 text-sm font-semibold">
          Search
          <input name="q" defaultValue={q} placeholder="Work order, unit number or customer" className={`${inputClass} mt-1`} />
        </label>
        <label className="text-sm font-semibold">
          Stage
          <select name="stage" defaultValue={stage ?? ""} className={`${inputClass} mt-1`}>
            <option value="">Every stage (delivered too)</option>
            {STAGES.map((s) => (
              <option key={s} value={s}>{STAGE_LABELS[s]}</option>
            ))}
          </select>
        </label>
        <input type="hidden" name="sort" value={sort} />
        <button className={buttonClass.secondary}>Show</button>
      </form>
      <div className="overflow-x-auto rounded-lg border border-line bg-panel">
        <table className="w-full min-w-[720px] text-left text-sm">
          <thead className="bg-bay-50 text-bay-900">
            <tr>
              {(["newest", "customer", "stage", "due"] as const).map((k) => (
                <th key={k} className="p-2" aria-sort={sort === k ? "ascending" : undefined}>
                  <Link href={href({ sort: k })} className="underline-offset-2 hover:underline">
                    {k === "newest" ? "Work order" : SORTS[k]}
                    {sort === k ? " ▾" : ""}
                  </Link>
                </th>
              ))}
              <th className="p-2">Truck</th>
              <th className="p-2">Work</th>
              <th className="p-2">Assigned</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((j) => (
              <tr key={j.id} className="border-t border-line">
                <td className="p-2 font-semibold">
                  <Link href={`/jobs/${j.id}`} className="text-bay-900 underline">{j.workOrder}</Link>
                  {j.priority === "rush" && <span className="ml-1 text-xs font-bold text-spark-700">▲ Rush</span>}
                </td>
                <td className="p-2">{j.customerName}</td>
                <td className="p-2"><StageBadge stage={j.stage} /></td>
                <td className="p-2">{j.dueOn ? showStoredDate(j.dueOn, "d MMM yyyy") : "—"}</td>
                <td className="p-2">Unit {j.unitNumber}</td>
                <td className="max-w-72 truncate p-2" title={j.description}>{j.description}</td>
                <td className="p-2">{j.techName ?? "—"}</td>
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={7} className="p-4 text-center text-ink-soft">No jobs match. Clear the search or choose every stage.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      {(page > 1 || hasNext) && (
        <nav aria-label="Pages of jobs" className="flex flex-wrap items-center justify-between gap-2">
          {page > 1 ? (
            <Link href={href({ page: page > 2 ? String(page - 1) : undefined })} className={buttonClass.secondary}>← Previous {PAGE}</Link>
          ) : <span />}
          <span className="text-sm text-ink-soft">Jobs {(page - 1) * PAGE + 1}–{(page - 1) * PAGE + rows.length}</span>
          {hasNext ? (
            <Link href={href({ page: String(page + 1) })} className={buttonClass.secondary}>Next {PAGE} →</Link>
          ) : <span />}
        </nav>
      )}
    </section>
  );
}
