import type { ColumnType, Generated } from "kysely";

export const BOUGHT_PART_KINDS = ["pto", "pump", "valve", "hose", "fitting", "control", "other"] as const;
export type BoughtPartKind = (typeof BOUGHT_PART_KINDS)[number];
export const BOUGHT_PART_STATES = ["needed", "ordered", "received", "installed"] as const;
export type BoughtPartState = (typeof BOUGHT_PART_STATES)[number];

export interface PurchaseOrderTable {
  id: Generated<number>;
  /** PO-26-0007: the shop's own number, printed on the order. */
  number: string;
  supplier: string;
  ordered_on: string;
  expected_on: string | null;
  notes: ColumnType<string, string | undefined, string>;
  created_by: string | null;
  created_at: string;
}

export interface BoughtPartTable {
  id: Generated<number>;
  job_id: number;
  kind: BoughtPartKind;
  /** What it is, as the supplier writes it. */
  description: string;
  part_number: ColumnType<string, string | undefined, string>;
  quantity: number;
  supplier: ColumnType<string, string | undefined, string>;
  /** Cost of one, cents; null until the office knows it. */
  unit_cost_cents: number | null;
  state: ColumnType<BoughtPartState, BoughtPartState | undefined, BoughtPartState>;
  purchase_order_id: number | null;
  expected_on: string | null;
  received_quantity: ColumnType<number, number | undefined, number>;
  installed_at: string | null;
  installed_by: string | null;
  fits_transmission: ColumnType<string, string | undefined, string>;
  ratio_percent: number | null;
  displacement_cu_in: number | null;
  source: ColumnType<"manual" | "kit_spec" | "quote", "manual" | "kit_spec" | "quote" | undefined, never>;
  created_by: string | null;
  created_at: string;
  updated_at: string;
}

export interface BoughtPartReceiptTable {
  id: Generated<number>;
  bought_part_id: number;
  quantity: number;
  received_by: string | null;
  received_by_name: string;
  received_at: string;
}

export interface ClockEntryTable {
  id: Generated<number>;
  staff_id: string;
  job_id: number;
  stage: string;
  started_at: string;
  ended_at: string | null;
  original_started_at: string | null;
  original_ended_at: string | null;
  correction_reason: string | null;
  corrected_by: string | null;
  corrected_at: string | null;
}

/** Bought-in parts, purchase orders and the labour clock. Filled by migration 0012. */
export interface BoughtPartsTables {
  purchase_order: PurchaseOrderTable;
  bought_part: BoughtPartTable;
  bought_part_receipt: BoughtPartReceiptTable;
  clock_entry: ClockEntryTable;
}
