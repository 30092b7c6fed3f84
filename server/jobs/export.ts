import "server-only";
import type { DB } from "@/db";
import { toCsv } from "@/server/audit/csv";
import { shopSettings } from "@/server/shop/queries";
import { shopToday } from "@/server/records/turnaround";
import { deliveredDates } from "./history";
import { jobListFilter } from "./list-filter";
import { listJobs } from "./queries";
import type { JobListParams } from "./schemas";
import { STAGE_LABELS } from "./stages";
import { shopDateOf } from "@/server/shop/business-days";

/** A busy shop's whole history fits; more than that is a filter away. */
const CSV_LIMIT = 50_000;
const IDS_PER_STATEMENT = 500;

/**
 * The Jobs list as a spreadsheet, with the same filters and order as the page. Dates are ISO 8601:
 * calendar days as YYYY-MM-DD on the shop's clock, instants in UTC.
 */
export async function jobsCsv(db: DB, params: JobListParams, now = new Date()) {
  const shop = await shopSettings(db);
  const today = shopToday({ now, timeZone: shop.timeZone });
  const jobs = await listJobs(db, { ...jobListFilter(params, today), limit: CSV_LIMIT });
  const delivered = new Map<number, string>();
  const deliveredIds = jobs.filter((j) => j.stage === "delivered").map((j) => j.id);
  for (let i = 0; i < deliveredIds.length; i += IDS_PER_STATEMENT) {
    for (const [id, at] of await deliveredDates(db, deliveredIds.slice(i, i + IDS_PER_STATEMENT))) delivered.set(id, shopDateOf(at, shop.timeZone));
  }
  const body = toCsv(
    ["work_order", "customer", "unit_number", "vin", "work", "work_description", "stage", "priority", "assigned_to", "due_on", "delivered_on", "opened_at_utc", "updated_at_utc"],
    jobs.map((j) => [
      j.workOrder, j.customerName, j.unitNumber, j.vin, j.scope === "fabrication" ? "fabricated parts" : "install only", j.description,
      STAGE_LABELS[j.stage], j.priority, j.techName, j.dueOn, delivered.get(j.id) ?? "", j.createdAt, j.updatedAt,
    ]),
  );
  return { body, filename: `jobs-${today}.csv` };
}
