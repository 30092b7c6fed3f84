import "server-only";
import type { DB } from "@/db";
import { toCsv } from "@/server/audit/csv";
import { type CoatingRunListStatus, listCoatingRuns, shopClock } from "./queries";
import { glossLabels } from "./schemas";
import { shopToday, turnaroundBusinessDays } from "./turnaround";

const CSV_LIMIT = 50_000;

/**
 * Coating runs as a spreadsheet, one line a run (its parts listed in one cell), in the Coating
 * page's order. Dates are ISO 8601 calendar days; the inspection time is UTC.
 */
export async function coatingRunsCsv(db: DB, status: CoatingRunListStatus, now = new Date()) {
  const runs = await listCoatingRuns(db, { status, limit: CSV_LIMIT }, now);
  const today = shopToday(await shopClock(db, now));
  const body = toCsv(
    [
      "run", "coater", "color", "gloss", "sent_on", "promised_on", "received_on", "state", "business_days_out", "turnaround_business_days",
      "business_days_overdue", "inspected_at_utc", "inspected_by", "film_min_mils", "film_max_mils", "adhesion", "defects", "jobs", "parts",
    ],
    runs.map((r) => {
      const dft = r.inspection?.dftReadingsMils ?? [];
      return [
        r.id, r.vendorName, r.finish.colour, glossLabels[r.finish.gloss], r.sentOn, r.promisedOn, r.receivedOn,
        r.inspection ? "back and inspected" : r.receivedOn ? "back, inspection to record" : r.overdue ? "overdue" : "out",
        r.businessDaysOut, turnaroundBusinessDays(r) ?? "", r.overdue ? r.businessDaysOverdue : 0,
        r.inspection?.inspectedAt, r.inspection?.inspectedByName, dft.length ? Math.min(...dft) : "", dft.length ? Math.max(...dft) : "",
        r.inspection ? (r.inspection.adhesionOk ? "passed" : "failed") : "", r.inspection?.defects,
        [...new Set(r.parts.map((p) => p.workOrder))].join("; "),
        r.parts.map((p) => `${p.workOrder} ${p.name} (${p.customerName}, unit ${p.unitNumber})`).join("; "),
      ];
    }),
  );
  return { body, filename: `coating-runs-${today}.csv` };
}
