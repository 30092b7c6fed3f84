import "server-only";
import { DUE_SOON_DAYS } from "@/server/reports/overview";
import { addCalendarDays } from "@/server/shop/business-days";
import type { JobListFilter } from "./queries";
import { type JobListParams, jobListParamsSchema } from "./schemas";

/** The Jobs list's URL filters as a query filter; `today` is the shop's day (for `due`). */
export function jobListFilter(params: JobListParams, today: string | undefined): JobListFilter {
  return {
    stage: params.stage,
    q: params.q || undefined,
    sort: params.sort ?? "newest",
    customerId: params.customer,
    techId: params.tech,
    due: params.due,
    today,
    dueSoonUntil: today ? addCalendarDays(today, DUE_SOON_DAYS) : undefined,
    emailFailed: params.email === "failed",
  };
}

/**
 * The page's reading of the same URL: a value that does not parse is left out (a mistyped link
 * still shows a list), where the CSV export answers 400 naming it.
 */
export function readJobListParams(search: Record<string, string | undefined>): JobListParams {
  const params: Record<string, unknown> = {};
  for (const [key, field] of Object.entries(jobListParamsSchema.shape)) {
    const value = search[key];
    if (!value) continue;
    const read = field.safeParse(value);
    if (read.success && read.data !== undefined && read.data !== "") params[key] = read.data;
  }
  return params as JobListParams;
}

/** The export's address for the list a page shows. */
export function jobsCsvHref(params: JobListParams): string {
  const query = new URLSearchParams(Object.entries(params).filter(([, v]) => v !== undefined && v !== "").map(([k, v]) => [k, String(v)]));
  return `/api/jobs/export.csv${query.size ? `?${query}` : ""}`;
}
