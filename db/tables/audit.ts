import type { Generated } from "kysely";

export const AUDIT_KINDS = [
  "sign_in",
  "sign_in_failed",
  "sign_in_refused",
  "staff_added",
  "staff_changed",
  "password_reset",
  "password_changed",
  "override",
  "status_link_issued",
  "status_link_turned_off",
  "part_deleted",
  "photo_deleted",
  "coating_run_deleted",
  "settings_changed",
  "price_changed",
  "quote_sent",
  "quote_approved",
  "quote_declined",
  "bought_part_deleted",
  "clock_corrected",
  "payment_recorded",
  "payment_received",
  "invoice_voided",
] as const;
export type AuditKind = (typeof AUDIT_KINDS)[number];

export interface AuditEventTable {
  id: Generated<number>;
  at: string;
  kind: AuditKind;
  actor_id: string | null;
  actor_name: string;
  address: string;
  subject: string;
  summary: string;
  /** JSON: what changed, e.g. `{ "role": ["tech", "office"] }`. */
  details: string | null;
}

export interface AuditTables {
  audit_event: AuditEventTable;
}
