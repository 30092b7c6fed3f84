import Link from "next/link";
import { FirstSteps } from "@/components/first-steps";
import { JobList, type JobSortKey } from "@/components/job-list";
import { buttonClass, inputClass } from "@/components/styles";
import { getDb } from "@/db";
import { STAGES } from "@/db/schema";
import { requirePageStaff } from "@/server/auth/session";
import { listJobs, shopBeginnings } from "@/server/jobs/queries";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { shopToday } from "@/server/records/turnaround";
import { DUE_SOON_DAYS } from "@/server/reports/overview";
import { jobListFilter, jobsCsvHref, readJobListParams } from "@/server/jobs/list-filter";
import { shopSettings } from "@/server/shop/queries";

export const metadata = { title: "Jobs" };

const SORTS: Record<JobSortKey, string> = { newest: "Newest first", due: "Due (soonest first)", customer: "Customer (A–Z)", stage: "Stage (board order)" };
const HEADINGS: Record<JobSortKey, string> = { newest: "Work order", due: "Due", customer: "Customer", stage: "Stage" };
const PAGE = 50;

export default async function JobsPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requirePageStaff();
  const sp = await searchParams;
  const params = readJobListParams(sp);
  const { stage, due, email } = params;
  const sort: JobSortKey = params.sort ?? "newest";
  const q = params.q ?? "";
  const page = /^[1-9]\d{0,4}$/.test(sp.page ?? "") ? Number(sp.page) : 1;
  const db = getDb();
  const shop = due ? await shopSettings(db) : null;
  const today = shop ? shopToday({ now: new Date(), timeZone: shop.timeZone }) : undefined;
  // One row more than a page tells whether there is a next page, without counting every job.
  const found = await listJobs(db, { ...jobListFilter(params, today), sort, limit: PAGE + 1, offset: (page - 1) * PAGE });
  const rows = found.slice(0, PAGE);
  const hasNext = found.length > PAGE;
  const paged = page > 1 || hasNext;
  const filtered = Boolean(stage || q || due || email || params.customer || params.tech);
  const beginnings = rows.length === 0 && !filtered && page === 1 ? await shopBeginnings(db) : null;
  const emptyShop = beginnings !== null && beginnings.jobs === 0;
  const href = (over: Record<string, string | undefined>) => {
    const query = new URLSearchParams(Object.entries({ ...params, sort, ...over }).filter(([, v]) => v).map(([k, v]) => [k, String(v)]));
    return `/jobs?${query}`;
  };

  return (
    <section className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-2xl font-bold">Jobs</h1>
        {user.role !== "tech" && !emptyShop && (
          <Link href="/jobs/new" className={buttonClass.primary}>
            <span aria-hidden="true">+</span> New job
          </Link>
        )}
      </div>
      {emptyShop ? (
        <FirstSteps counts={beginnings} role={user.role} />
      ) : (
        <>
          <form role="search" className="flex flex-wrap items-end gap-2" action="/jobs">
            {due && <input type="hidden" name="due" value={due} />}
            {email && <input type="hidden" name="email" value={email} />}
            {params.customer && <input type="hidden" name="customer" value={params.customer} />}
            {params.tech && <input type="hidden" name="tech" value={params.tech} />}
            <label className="min-w-56 flex-1 text-sm font-semibold">
              Search
              <input name="q" type="search" defaultValue={q} placeholder="Work order, unit, customer or description" className={`${inputClass} mt-1`} />
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
            <label className="text-sm font-semibold">
              Order
              <select name="sort" defaultValue={sort} className={`${inputClass} mt-1`}>
                {(Object.keys(SORTS) as JobSortKey[]).map((k) => (
                  <option key={k} value={k}>{SORTS[k]}</option>
                ))}
              </select>
            </label>
            <button className={buttonClass.secondary}>Show</button>
          </form>
          <div className="flex flex-wrap items-center justify-between gap-x-4">
          <p role="status" className="text-sm text-ink-soft">
            {paged && rows.length > 0
              ? `Jobs ${(page - 1) * PAGE + 1}–${(page - 1) * PAGE + rows.length}`
              : `${rows.length} ${rows.length === 1 ? "job" : "jobs"}`}
            {stage ? ` in ${STAGE_LABELS[stage]}` : ""}
            {due === "late" ? " past their due date" : due === "soon" ? ` due in the next ${DUE_SOON_DAYS} days` : ""}
            {email ? " with a customer e-mail that failed to send" : ""}
            {q ? ` matching \u201c${q}\u201d` : ""}, {SORTS[sort].toLowerCase()}.
          </p>
          {user.role !== "tech" && (
            // Every page of the list as it is filtered here, for a spreadsheet.
            <a href={jobsCsvHref({ ...params, sort })} download className="inline-flex min-h-11 items-center text-sm font-semibold text-bay-800 underline">
              Download CSV
            </a>
          )}
          </div>
          <JobList
            rows={rows}
            caption="Jobs"
            sort={{ current: sort, href: (k) => href({ sort: k }), labels: HEADINGS }}
            empty={
              <div className="rounded-lg border border-line bg-panel p-4">
                <p>{page > 1 ? "No more jobs in this list." : <>No job matches {q ? <>&ldquo;{q}&rdquo;</> : "that"}{stage ? ` in ${STAGE_LABELS[stage]}` : ""}.</>}</p>
                <p className="mt-2">
                  <Link href="/jobs" className="inline-flex min-h-11 items-center font-semibold text-bay-800 underline">Show every job</Link>
                </p>
              </div>
            }
          />
          {paged && (
            <nav aria-label="Pages of jobs" className="flex flex-wrap items-center justify-between gap-2">
              {page > 1 ? (
                <Link href={href({ page: page > 2 ? String(page - 1) : undefined })} className={buttonClass.secondary}>← Previous {PAGE}</Link>
              ) : <span />}
              {hasNext ? (
                <Link href={href({ page: String(page + 1) })} className={buttonClass.secondary}>Next {PAGE} →</Link>
              ) : <span />}
            </nav>
          )}
        </>
      )}
    </section>
  );
}
