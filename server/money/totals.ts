/**
 * The money arithmetic of quotes, change orders, deposits and balances. Pure: no I/O. Every amount
 * is an integer number of cents; quantities are integer thousandths of a unit and tax rates integer
 * thousandths of a percent, so nothing here is ever a binary fraction. Products go through BigInt,
 * so a large quantity times a large price cannot lose a cent to floating point.
 */
import type { LineKind } from "@/db/tables/money";

export const MILLI = 1000;
/** 100 % in thousandths of a percent. */
const PERCENT_SCALE = 100_000n;

/** Largest cents figure the shop deals in (ten million dollars): beyond it a typing slip is likelier than a truck. */
export const MAX_CENTS = 1_000_000_000;
export const MAX_QUANTITY_MILLI = 100_000_000;

/** n / d rounded half-up (a half goes to the larger whole), for n ≥ 0 and d > 0. */
export function divideHalfUp(n: bigint, d: bigint): bigint {
  if (n < 0n || d <= 0n) throw new RangeError("divideHalfUp takes a non-negative numerator and a positive divisor");
  const q = n / d;
  return (n % d) * 2n >= d ? q + 1n : q;
}

/**
 * A decimal figure as whole thousandths (2.5 → 2500), or null when it has more than three decimals
 * or is not a finite positive-or-zero number. Used for quantities and tax rates typed by people.
 */
export function toThousandths(value: number): number | null {
  if (!Number.isFinite(value) || value < 0) return null;
  const scaled = Math.round(value * 1000);
  // 0.1 × 1000 is 100.00000000000001 in binary; anything within a millionth of a whole is that whole.
  if (Math.abs(scaled - value * 1000) > 1e-6 * Math.max(1, value)) return null;
  return Number.isSafeInteger(scaled) ? scaled : null;
}

/** The words for a quantity that is not more than 0, in the form beside the field and from the API. */
export const QUANTITY_ABOVE_ZERO = "The quantity must be more than 0.";
export const QUANTITY_THREE_DECIMALS = "At most three decimals (2.125, not 2.1254).";
export const QUANTITY_LARGEST = "The quantity is at most 100,000.";

/**
 * What is wrong with a line's quantity as typed, or null when it is a quantity the shop can price.
 * Checked in the order a person fixes them: a number at all, then more than 0, then the size, and
 * only then the decimals, so "-1" is told it must be more than 0, not that it has too many decimals.
 */
export function quantityProblem(typed: string): string | null {
  const text = typed.trim();
  if (text === "") return "Type the quantity, such as 1 or 2.5.";
  const value = Number(text);
  if (!Number.isFinite(value)) return "Type the quantity as a number, such as 1 or 2.5.";
  if (value <= 0) return QUANTITY_ABOVE_ZERO;
  if (value > MAX_QUANTITY_MILLI / MILLI) return QUANTITY_LARGEST;
  if (toThousandths(value) === null) return QUANTITY_THREE_DECIMALS;
  return null;
}

export const fromThousandths = (milli: number): number => milli / 1000;

/** A line's amount: quantity × unit price, rounded half-up to the cent (common practice, no published source). */
export function lineAmountCents(quantityMilli: number, unitPriceCents: number): number {
  return Number(divideHalfUp(BigInt(quantityMilli) * BigInt(unitPriceCents), BigInt(MILLI)));
}

/**
 * Sales tax on a document's taxable subtotal, rounded once, half-up to the cent. The rule is the
 * Streamlined Sales and Use Tax Agreement §324 ("Rounding rule"): carry the computation to the third
 * decimal place and round up to the next cent whenever the third decimal place is greater than four;
 * sellers may compute on an item or an invoice basis. Baywright computes on the invoice (document)
 * basis, so the customer sees one tax figure that the lines' tax cannot drift from.
 */
export function salesTaxCents(taxableCents: number, taxMillipercent: number): number {
  return Number(divideHalfUp(BigInt(taxableCents) * BigInt(taxMillipercent), PERCENT_SCALE));
}

export interface PricedLine {
  kind: LineKind;
  quantityMilli: number;
  unitPriceCents: number;
  taxable: boolean;
}

export interface DocumentTotals {
  subtotalCents: number;
  taxableCents: number;
  taxCents: number;
  totalCents: number;
}

/** A quote's or change order's totals: sum of line amounts, tax once on the taxable part. */
export function documentTotals(lines: readonly PricedLine[], taxMillipercent: number): DocumentTotals {
  let subtotalCents = 0;
  let taxableCents = 0;
  for (const line of lines) {
    const amount = lineAmountCents(line.quantityMilli, line.unitPriceCents);
    subtotalCents += amount;
    if (line.taxable) taxableCents += amount;
  }
  const taxCents = salesTaxCents(taxableCents, taxMillipercent);
  return { subtotalCents, taxableCents, taxCents, totalCents: subtotalCents + taxCents };
}

export type DepositRule = { kind: "percent"; percent: number } | { kind: "fixed"; cents: number };

/**
 * The deposit asked on approval: a whole percent of the total rounded half-up to the cent (common
 * practice, no published source), or the fixed amount; never more than the total itself.
 */
export function depositCents(totalCents: number, rule: DepositRule): number {
  if (totalCents <= 0) return 0;
  const asked = rule.kind === "percent" ? Number(divideHalfUp(BigInt(totalCents) * BigInt(rule.percent), 100n)) : rule.cents;
  return Math.min(Math.max(asked, 0), totalCents);
}

/** The job's price: the approved quote plus every approved change order, each with its own tax. */
export function jobPriceCents(approvedDocuments: readonly { totalCents: number }[]): number {
  return approvedDocuments.reduce((sum, d) => sum + d.totalCents, 0);
}

/**
 * The job's price from all its quotes and change orders whatever their state: only approved ones
 * count. A declined, waiting, replaced or draft change order adds nothing.
 */
export function agreedPriceCents(documents: readonly { status: string; totalCents: number }[]): number {
  return jobPriceCents(documents.filter((d) => d.status === "approved"));
}

export interface MoneyMovement {
  /** Received is positive; a refund given back is negative. */
  amountCents: number;
}

/** What is still owed: the price less what was received, plus what was refunded. */
export function balanceCents(priceCents: number, movements: readonly MoneyMovement[]): number {
  return priceCents - movements.reduce((sum, m) => sum + m.amountCents, 0);
}

/**
 * Whether a payment of this size may be taken: more than zero and no more than is owed, so a job
 * is never overpaid by accident (money owed back is a refund, recorded as one).
 */
export function paymentFits(priceCents: number, movements: readonly MoneyMovement[], amountCents: number): boolean {
  return Number.isSafeInteger(amountCents) && amountCents > 0 && amountCents <= balanceCents(priceCents, movements);
}

/** Cents as the customer reads them: "$1,234.56". */
export function formatCents(cents: number): string {
  const sign = cents < 0 ? "−" : "";
  const abs = Math.abs(cents);
  const dollars = Math.floor(abs / 100).toString().replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  return `${sign}$${dollars}.${String(abs % 100).padStart(2, "0")}`;
}

/** A rate in thousandths of a percent as people write it: 8250 → "8.25 %". */
export function formatRate(millipercent: number): string {
  return `${fromThousandths(millipercent).toString()} %`;
}

/** A quantity in thousandths as people write it: 2500 → "2.5". */
export function formatQuantity(quantityMilli: number): string {
  return fromThousandths(quantityMilli).toString();
}

/**
 * Dollars as a person types them ("1,489", "125.5", "$6.75") to whole cents, read as text so no
 * binary fraction is involved; null when it is not a plain amount with at most two decimals.
 */
export function dollarsToCents(typed: string): number | null {
  const bare = typed.trim().replace(/^\$/, "");
  // Commas only as thousands separators ("1,250.00"): "12,50" is a decimal comma, not 1,250
  // dollars, so it is refused rather than read a hundred times too big.
  if (bare.includes(",") && !/^\d{1,3}(?:,\d{3})+(?:\.\d{1,2})?$/.test(bare)) return null;
  const text = bare.replaceAll(",", "");
  const m = /^(\d{1,8})(?:\.(\d{1,2}))?$/.exec(text);
  if (!m) return null;
  return Number(m[1]) * 100 + Number((m[2] ?? "0").padEnd(2, "0"));
}

/** Cents back to what the form shows: 148900 → "1489.00". */
export const centsToDollarsText = (cents: number): string => `${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, "0")}`;
