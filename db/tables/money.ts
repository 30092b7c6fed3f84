import type { ColumnType, Generated } from "kysely";

/** What a quote line (and a price-list item) is: the shop's own labour, a bought-in part, a fabricated part, outside coating, a fee. */
export const LINE_KINDS = ["labour", "part", "fabrication", "coating", "fee"] as const;
export type LineKind = (typeof LINE_KINDS)[number];

/** Which figure of a saved kit spec a price-list item prices, for "Start from the kit spec". */
export const KIT_USES = ["pto", "pump", "reservoir", "hose"] as const;
export type KitUse = (typeof KIT_USES)[number];

export type QuoteStatus = "draft" | "sent" | "approved" | "declined" | "superseded";
export type QuoteKind = "quote" | "change_order";

export interface PriceItemTable {
  id: Generated<number>;
  kind: LineKind;
  name: string;
  unit: string;
  unit_price_cents: number;
  taxable: number;
  kit_use: KitUse | null;
  /** Hose: inside diameter in thousandths of an inch. */
  size_milli_in: number | null;
  active: ColumnType<number, number | undefined, number>;
  created_at: string;
  updated_at: string;
}

export interface QuoteTable {
  id: Generated<number>;
  job_id: number;
  version: number;
  kind: QuoteKind;
  status: QuoteStatus;
  supersedes_id: number | null;
  tax_millipercent: number;
  subtotal_cents: number;
  taxable_cents: number;
  tax_cents: number;
  total_cents: number;
  deposit_cents: number;
  terms: ColumnType<string, string | undefined, string>;
  note: ColumnType<string, string | undefined, string>;
  created_by: string;
  created_at: string;
  updated_at: string;
  sent_at: ColumnType<string | null, string | null | undefined, string | null>;
  sent_by: ColumnType<string | null, string | null | undefined, string | null>;
  decided_at: ColumnType<string | null, string | null | undefined, string | null>;
  decided_name: ColumnType<string | null, string | null | undefined, string | null>;
  decided_address: ColumnType<string | null, string | null | undefined, string | null>;
  terms_accepted: ColumnType<number | null, number | null | undefined, number | null>;
  decline_reason: ColumnType<string | null, string | null | undefined, string | null>;
}

/**
 * One priced line. Kept deliberately plain so other parts of the shop (bought-in parts, job cost)
 * can read it: `kind`, `description`, `quantity_milli` (thousandths of the unit: 2.5 h is 2500),
 * `unit_price_cents`, `taxable`, and `amount_cents` = quantity × unit price rounded half-up to the cent.
 */
export interface QuoteLineTable {
  id: Generated<number>;
  quote_id: number;
  position: number;
  kind: LineKind;
  description: string;
  quantity_milli: number;
  unit_price_cents: number;
  taxable: number;
  amount_cents: number;
  price_item_id: number | null;
}

export interface InvoiceTable {
  id: Generated<number>;
  job_id: number;
  number: string;
  status: "open" | "paid" | "on_account" | "void";
  total_cents: number;
  created_by: string | null;
  created_at: string;
  void_reason: string | null;
  voided_at: string | null;
  voided_by: ColumnType<string | null, string | null | undefined, string | null>;
  sent_at: ColumnType<string | null, string | null | undefined, string | null>;
}

export interface CheckoutTable {
  id: Generated<number>;
  job_id: number;
  purpose: "deposit" | "invoice";
  quote_id: number | null;
  invoice_id: number | null;
  amount_cents: number;
  currency: string;
  session_id: string;
  status: "open" | "paid" | "expired";
  created_at: string;
}

export interface PaymentTable {
  id: Generated<number>;
  job_id: number;
  purpose: "deposit" | "invoice";
  method: "card" | "cash" | "check" | "on_account" | "refund";
  amount_cents: number;
  reference: ColumnType<string, string | undefined, string>;
  checkout_id: number | null;
  recorded_by: string | null;
  at: string;
}

export interface PaymentEventTable {
  event_id: string;
  type: string;
  outcome: "applied" | "refused";
  reason: ColumnType<string, string | undefined, string>;
  received_at: string;
}

/** Tables of migration 0013 (prices, quotes, invoices, payments). */
export interface MoneyTables {
  price_item: PriceItemTable;
  quote: QuoteTable;
  quote_line: QuoteLineTable;
  invoice: InvoiceTable;
  checkout: CheckoutTable;
  payment: PaymentTable;
  payment_event: PaymentEventTable;
}
