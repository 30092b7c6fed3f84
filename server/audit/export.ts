import "server-only";
import type { DB } from "@/db";
import { formatShopTime } from "@/server/records/calendar";
import { toCsv } from "./csv";
import { AUDIT_KIND_LABELS } from "./kinds";
import { listAudit } from "./queries";
import type { AuditFilter } from "./schemas";

/** A whole year of a busy shop fits; more than that is a filter away. */
const CSV_LIMIT = 50_000;

export async function auditCsv(db: DB, filter: AuditFilter, timeZone: string) {
  const lines = await listAudit(db, filter, timeZone, CSV_LIMIT);
  const body = toCsv(
    ["Entry", `When (${timeZone})`, "When (UTC)", "What", "Who", "From address", "Concerning", "Details"],
    lines.map((l) => [l.id, formatShopTime(l.at, timeZone, "yyyy-MM-dd HH:mm:ss"), l.at, AUDIT_KIND_LABELS[l.kind], l.actorName, l.address, l.subject, l.summary]),
  );
  const today = formatShopTime(new Date().toISOString(), timeZone, "yyyy-MM-dd");
  return { body, filename: `audit-trail-${today}.csv` };
}
