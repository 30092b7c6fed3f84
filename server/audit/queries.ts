import "server-only";
import { TZDate } from "@date-fns/tz";
import { addDays } from "date-fns";
import type { DB } from "@/db";
import type { AuditKind } from "@/db/tables/audit";
import type { AuditFilter } from "./schemas";

export interface AuditLine {
  id: number;
  at: string;
  kind: AuditKind;
  actorId: string | null;
  actorName: string;
  address: string;
  subject: string;
  summary: string;
  details: Record<string, unknown> | null;
}

export const AUDIT_PAGE_SIZE = 200;

/** Midnight at the start of a calendar day on the shop's clock, as a UTC instant. */
function shopMidnight(isoDate: string, timeZone: string): string {
  const [y, m, d] = isoDate.split("-").map(Number);
  return new TZDate(y, m - 1, d, timeZone).toISOString();
}

function nextDay(isoDate: string): string {
  const [y, m, d] = isoDate.split("-").map(Number);
  const next = addDays(new Date(Date.UTC(y, m - 1, d)), 1);
  return next.toISOString().slice(0, 10);
}

/** Newest first. `limit` lines at most; `before` pages back by entry number. */
export async function listAudit(db: DB, filter: AuditFilter, timeZone: string, limit = AUDIT_PAGE_SIZE): Promise<AuditLine[]> {
  let query = db.selectFrom("audit_event").select(["id", "at", "kind", "actor_id", "actor_name", "address", "subject", "summary", "details"]);
  if (filter.kind) query = query.where("kind", "=", filter.kind);
  if (filter.staff) query = query.where("actor_id", "=", filter.staff);
  if (filter.from) query = query.where("at", ">=", shopMidnight(filter.from, timeZone));
  if (filter.to) query = query.where("at", "<", shopMidnight(nextDay(filter.to), timeZone));
  if (filter.before) query = query.where("id", "<", filter.before);
  const rows = await query.orderBy("id", "desc").limit(limit).execute();
  return rows.map((r) => ({
    id: r.id,
    at: r.at,
    kind: r.kind,
    actorId: r.actor_id,
    actorName: r.actor_name,
    address: r.address,
    subject: r.subject,
    summary: r.summary,
    details: r.details ? (JSON.parse(r.details) as Record<string, unknown>) : null,
  }));
}

/** Everyone who ever did something in the trail, for the filter's list (deactivated staff too). */
export async function auditPeople(db: DB): Promise<{ id: string; name: string; active: boolean }[]> {
  const rows = await db.selectFrom("staff").select(["id", "name", "active"]).orderBy("name").execute();
  return rows.map((r) => ({ id: r.id, name: r.name, active: r.active === 1 }));
}
