import Link from "next/link";
import type { Stage } from "@/db/schema";
import { showStoredDate } from "@/server/http/calendar-date";
import { StageBadge } from "./stage-badge";

export interface JobListRow {
  id: number;
  workOrder: string;
  stage: Stage;
  description: string;
  dueOn: string | null;
  priority: string;
  customerName: string;
  unitNumber: string;
  techName: string | null;
  /** The day (YYYY-MM-DD, the shop's calendar) a delivered job went out; given on a customer's or truck's history. */
  deliveredAt?: string | null;
}

export type JobSortKey = "newest" | "customer" | "stage" | "due";

const due = (iso: string | null) => (iso ? showStoredDate(iso, "d MMM yyyy") : null);
const delivered = (iso: string | null | undefined) => (iso ? showStoredDate(iso, "d MMM yyyy") : null);

/**
 * Jobs as a table on a desk and as a list of rows on a phone, where the work order stays on one
 * line and the rest wraps under it. `hide` drops the columns a page already names (a truck's own
 * page need not repeat its customer and unit on every row).
 */
export function JobList({
  rows,
  hide = [],
  sort,
  empty,
  caption,
  narrow = false,
}: {
  rows: JobListRow[];
  hide?: ("customer" | "truck")[];
  sort?: { current: JobSortKey; href: (key: JobSortKey) => string; labels: Record<JobSortKey, string> };
  empty: React.ReactNode;
  caption: string;
  /** Rows at every width, for a side panel too narrow for the table. */
  narrow?: boolean;
}) {
  if (rows.length === 0) return <>{empty}</>;
  const show = { customer: !hide.includes("customer"), truck: !hide.includes("truck"), delivered: rows.some((r) => r.deliveredAt !== undefined) };
  const heading = (key: JobSortKey, label: string) =>
    sort ? (
      <th key={key} scope="col" className="p-2" aria-sort={sort.current === key ? "ascending" : undefined}>
        <Link href={sort.href(key)} className="inline-flex min-h-11 items-center gap-1 underline-offset-2 hover:underline">
          {label}
          {sort.current === key && <span aria-hidden="true">▾</span>}
        </Link>
      </th>
    ) : (
      <th key={key} scope="col" className="p-2">{label}</th>
    );

  const list = (
    <ul aria-label={caption} className={`divide-y divide-line rounded-lg border border-line bg-panel ${narrow ? "" : "md:hidden"}`}>
      {rows.map((j) => (
        <li key={j.id}>
          <Link href={`/jobs/${j.id}`} className="block space-y-1 px-3 py-2.5 hover:bg-bay-50">
            <span className="flex items-center justify-between gap-2">
              <span className="whitespace-nowrap font-bold text-bay-900 underline">{j.workOrder}</span>
              <StageBadge stage={j.stage} />
            </span>
            <span className="block truncate">{j.description}</span>
            <span className="flex flex-wrap gap-x-3 text-sm text-ink-soft">
              {(show.customer || show.truck) && (
                <span>{[show.customer && j.customerName, show.truck && `Unit ${j.unitNumber}`].filter(Boolean).join(" · ")}</span>
              )}
              {j.priority === "rush" && <span className="font-bold text-spark-700">▲ Rush</span>}
              {j.dueOn && <span>Due {due(j.dueOn)}</span>}
              {j.deliveredAt && <span>Delivered {delivered(j.deliveredAt)}</span>}
              <span>{j.techName ? `Assigned: ${j.techName}` : "Nobody assigned"}</span>
            </span>
          </Link>
        </li>
      ))}
    </ul>
  );
  if (narrow) return list;
  return (
    <>
      {list}
      {/* Focusable and named, so a keyboard can scroll it when the columns outgrow the screen. */}
      <div tabIndex={0} role="region" aria-label={caption} className="hidden overflow-x-auto rounded-lg border border-line bg-panel md:block">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">{caption}</caption>
          <thead className="bg-bay-50 text-bay-900">
            <tr>
              {heading("newest", sort?.labels.newest ?? "Work order")}
              {show.customer && heading("customer", sort?.labels.customer ?? "Customer")}
              {heading("stage", sort?.labels.stage ?? "Stage")}
              {heading("due", sort?.labels.due ?? "Due")}
              {show.delivered && <th scope="col" className="p-2">Delivered</th>}
              {show.truck && <th scope="col" className="p-2">Truck</th>}
              <th scope="col" className="p-2">Work description</th>
              <th scope="col" className="p-2">Assigned</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((j) => (
              <tr key={j.id} className="border-t border-line">
                <th scope="row" className="whitespace-nowrap p-2 font-semibold">
                  <Link href={`/jobs/${j.id}`} className="text-bay-900 underline">{j.workOrder}</Link>
                  {j.priority === "rush" && <span className="ml-1 text-xs font-bold text-spark-700">▲ Rush</span>}
                </th>
                {show.customer && <td className="p-2">{j.customerName}</td>}
                <td className="whitespace-nowrap p-2"><StageBadge stage={j.stage} /></td>
                <td className="whitespace-nowrap p-2">{due(j.dueOn) ?? "—"}</td>
                {show.delivered && <td className="whitespace-nowrap p-2">{delivered(j.deliveredAt) ?? "—"}</td>}
                {show.truck && <td className="whitespace-nowrap p-2">Unit {j.unitNumber}</td>}
                <td className="max-w-80 truncate p-2" title={j.description}>{j.description}</td>
                <td className="p-2">{j.techName ?? "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
