import { AUDIT_KINDS, type AuditKind } from "@/db/tables/audit";

export { AUDIT_KINDS, type AuditKind };

/** How each kind reads on the audit page and in the CSV, in the shop's words. */
export const AUDIT_KIND_LABELS: Record<AuditKind, string> = {
  sign_in: "Signed in",
  sign_in_failed: "Sign-in failed",
  sign_in_refused: "Sign-in refused (too many tries)",
  staff_added: "Staff added",
  staff_changed: "Staff changed",
  password_reset: "Password reset",
  password_changed: "Password changed",
  override: "Override",
  status_link_issued: "Status link issued",
  status_link_turned_off: "Status link turned off",
  part_deleted: "Part deleted",
  photo_deleted: "Photo deleted",
  coating_run_deleted: "Coating run deleted",
  settings_changed: "Shop setting changed",
  price_changed: "Price list changed",
  quote_sent: "Quote sent",
  quote_approved: "Quote approved by the customer",
  quote_declined: "Quote declined by the customer",
  bought_part_deleted: "Bought-in part deleted",
  clock_corrected: "Clock entry corrected",
  payment_recorded: "Payment recorded by staff",
  payment_received: "Payment received online",
  invoice_voided: "Invoice voided",
};
