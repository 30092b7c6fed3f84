import type { ColumnType, Generated, Insertable, Selectable, Updateable } from "kysely";
import type { AuditTables } from "./tables/audit";
import type { BoughtPartsTables } from "./tables/bought-parts";
import type { KitSpecTables } from "./tables/kit-spec";
import type { MessagingTables } from "./tables/messaging";
import type { MoneyTables } from "./tables/money";
import type { RecordsTables } from "./tables/records";

export const ROLES = ["owner", "office", "tech"] as const;
export type Role = (typeof ROLES)[number];

export const STAGES = [
  "queued",
  "fabricate",
  "pressure_test",
  "coating",
  "install",
  "wire",
  "ready",
  "delivered",
] as const;
export type Stage = (typeof STAGES)[number];

export interface StaffTable {
  id: string;
  email: string;
  name: string;
  role: Role;
  password_hash: string;
  active: number;
  created_at: string;
  /** 1 after the owner's reset: the temporary password works only to choose a new one. */
  must_change_password: ColumnType<number, number | undefined, number>;
}

export interface SessionTable {
  /** SHA-256 (hex) of the session id the cookie carries; the raw id is never stored. */
  id: string;
  staff_id: string;
  expires_at: number;
  created_at: string;
  /** The browser's User-Agent at sign-in, so a person can tell their signed-in devices apart. */
  user_agent: ColumnType<string, string | undefined, string>;
}

export interface ShopTable {
  id: ColumnType<number, number | undefined, never>;
  name: string;
  phone: ColumnType<string, string | undefined, string>;
  time_zone: ColumnType<string, string | undefined, string>;
  work_order_prefix: ColumnType<string, string | undefined, string>;
  next_work_order: ColumnType<number, number | undefined, number>;
  /** Leak-test pressure drop the shop allows, psi (added by the records migration). */
  leak_allowed_drop_psi: ColumnType<number, number | undefined, number>;
  /** The leak-test procedure's minimums (migration 0007; server/records/procedure.ts). */
  leak_min_hold_minutes: ColumnType<number, number | undefined, number>;
  leak_gauge_ratio_min: ColumnType<number, number | undefined, number>;
  leak_gauge_ratio_max: ColumnType<number, number | undefined, number>;
  leak_round_min_psig: ColumnType<number, number | undefined, number>;
  leak_round_max_psig: ColumnType<number, number | undefined, number>;
  leak_box_min_psig: ColumnType<number, number | undefined, number>;
  leak_box_max_psig: ColumnType<number, number | undefined, number>;
  leak_calibration_months: ColumnType<number, number | undefined, number>;
  /** Sales tax on the taxable subtotal, thousandths of a percent: 8.25 % is 8250 (migration 0013). */
  sales_tax_millipercent: ColumnType<number, number | undefined, number>;
  /** The deposit asked on approval: a percent of the quote's total or a fixed amount (migration 0013). */
  deposit_kind: ColumnType<"percent" | "fixed", "percent" | "fixed" | undefined, "percent" | "fixed">;
  deposit_percent: ColumnType<number, number | undefined, number>;
  deposit_fixed_cents: ColumnType<number, number | undefined, number>;
  /** Printed under every quote; the customer ticks that they accept them. */
  quote_terms: ColumnType<string, string | undefined, string>;
  /** "Money checks before work and delivery": 1 on (the default), 0 off (migration 0015). */
  money_checks: ColumnType<number, number | undefined, number>;
  /** What an hour of labour costs, cents; 0 until the owner sets it (migration 0012). */
  labour_rate_cents: ColumnType<number, number | undefined, number>;
  next_purchase_order: ColumnType<number, number | undefined, number>;
  /** The shop's street address (migration 0011), printed on the shop sheet. */
  address: ColumnType<string, string | undefined, string>;
  /** 1 when the customer's status page shows "likely ready around …" (migration 0011). */
  show_predicted_date: ColumnType<number, number | undefined, number>;
  /** Bumped by every save of the shop's details, so a stale form is refused (migration 0011). */
  settings_version: ColumnType<number, number | undefined, number>;
}

/** A day the shop is closed (migration 0011): business days skip it everywhere. */
export interface ShopHolidayTable {
  day: string;
  name: ColumnType<string, string | undefined, string>;
}

export interface CustomerTable {
  id: Generated<number>;
  kind: "company" | "owner_operator";
  name: string;
  phone: string;
  email: string;
  notes: string;
  created_at: string;
}

export interface ContactTable {
  id: Generated<number>;
  customer_id: number;
  name: string;
  email: string;
  phone: string;
  receives_email: number;
}

export interface TruckTable {
  id: Generated<number>;
  customer_id: number;
  unit_number: string;
  vin: string;
  year: number;
  description: string;
  transmission: string;
  work_engine_rpm: number | null;
  created_at: string;
  make: ColumnType<string, string | undefined, string>;
  model: ColumnType<string, string | undefined, string>;
  /** Where the PTO mounts on the transmission, as the shop reads it (e.g. "6-bolt, left side"). */
  pto_opening: ColumnType<string, string | undefined, string>;
}

export type Priority = "normal" | "rush";
export type JobScope = "fabrication" | "install_only";

export interface JobTable {
  id: Generated<number>;
  work_order: string;
  customer_id: number;
  truck_id: number;
  scope: JobScope;
  description: string;
  stage: Stage;
  position: number;
  due_on: string | null;
  assigned_tech_id: string | null;
  priority: Priority;
  notes: string;
  version: number;
  created_at: string;
  updated_at: string;
}

export interface StageEventTable {
  id: Generated<number>;
  job_id: number;
  from_stage: Stage | null;
  to_stage: Stage;
  actor_id: string | null;
  at: string;
  note: string;
  override_reason: string | null;
}

export interface OutboxTable {
  id: string;
  job_id: number;
  /** `stage_changed`: the job reached a stage; `link_issued`: the office e-mails a new status link; `quote_sent`: a quote or change order went to the customer; `invoice_sent`: the invoice at Ready for pickup; `payment_received`: the receipt for a payment. */
  kind: "stage_changed" | "link_issued" | "quote_sent" | "invoice_sent" | "payment_received";
  payload: string;
  status: "pending" | "sent" | "failed" | "skipped";
  attempts: number;
  next_attempt_at: string;
  last_error: string | null;
  created_at: string;
  sent_at: string | null;
  /** When a later move replaced this message before it went (migration 0006); never sent again. */
  replaced_at: ColumnType<string | null, string | null | undefined, string | null>;
}

export interface Database extends RecordsTables, KitSpecTables, MessagingTables, AuditTables, BoughtPartsTables, MoneyTables {
  staff: StaffTable;
  session: SessionTable;
  shop: ShopTable;
  customer: CustomerTable;
  contact: ContactTable;
  truck: TruckTable;
  job: JobTable;
  stage_event: StageEventTable;
  outbox: OutboxTable;
  shop_holiday: ShopHolidayTable;
}

export type Staff = Selectable<StaffTable>;
export type NewStaff = Insertable<StaffTable>;
export type Customer = Selectable<CustomerTable>;
export type Truck = Selectable<TruckTable>;
export type Job = Selectable<JobTable>;
export type JobUpdate = Updateable<JobTable>;
