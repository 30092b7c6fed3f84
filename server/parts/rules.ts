import type { BoughtPartKind, BoughtPartState } from "@/db/tables/bought-parts";

export const BOUGHT_PART_KIND_LABELS: Record<BoughtPartKind, string> = {
  pto: "PTO",
  pump: "Pump",
  valve: "Valve",
  hose: "Hose",
  fitting: "Fitting",
  control: "Control",
  other: "Other",
};

export const BOUGHT_PART_STATE_LABELS: Record<BoughtPartState, string> = {
  needed: "To order",
  ordered: "On order",
  received: "Received",
  installed: "Installed",
};

/** A bought-in line as the rules read it. */
export interface BoughtLine {
  quantity: number;
  receivedQuantity: number;
  ordered: boolean;
  installed: boolean;
}

/**
 * needed → ordered → received → installed. A short receipt keeps the line on order until the
 * rest arrives; a line received in full without a purchase order (bought over the counter)
 * counts as received all the same.
 */
export function boughtPartState(line: BoughtLine): BoughtPartState {
  if (line.installed) return "installed";
  if (line.receivedQuantity >= line.quantity) return "received";
  if (line.ordered || line.receivedQuantity > 0) return "ordered";
  return "needed";
}

export type ReceiptCheck = { ok: true; receivedQuantity: number; state: BoughtPartState } | { ok: false; message: string };

/** What one receipt does to a line: more than is still outstanding is refused, with the count. */
export function applyReceipt(line: BoughtLine, quantity: number): ReceiptCheck {
  const outstanding = line.quantity - line.receivedQuantity;
  if (outstanding <= 0) return { ok: false, message: `All ${line.quantity} are already received; nothing is outstanding on this line.` };
  if (quantity > outstanding) {
    return { ok: false, message: `Only ${outstanding} ${outstanding === 1 ? "is" : "are"} still outstanding (${line.receivedQuantity} of ${line.quantity} received); enter ${outstanding} or fewer.` };
  }
  const receivedQuantity = line.receivedQuantity + quantity;
  return { ok: true, receivedQuantity, state: boughtPartState({ ...line, receivedQuantity }) };
}

/** Whether a line still holds the job out of Install. */
export function isWaiting(state: BoughtPartState) {
  return state === "needed" || state === "ordered";
}

/** A bought-in line Install still waits for, as the gate reads it. */
export interface BoughtWaiting {
  description: string;
  quantity: number;
  receivedQuantity: number;
  state: BoughtPartState;
  purchaseOrder?: string | null;
  /** Already written for people ("Thu 10 Dec"). */
  expectedOn?: string | null;
}

/** One line of what Install still waits for, in words: "waiting on 10-bolt PTO: 1 of 2 received, on order (PO-26-0003)". */
export function waitingWords(line: BoughtWaiting) {
  if (line.state === "needed") return `waiting on ${line.description}: not ordered yet; order it from the parts desk.`;
  const got = line.receivedQuantity > 0 ? `${line.receivedQuantity} of ${line.quantity} received, the rest ` : "";
  const order = line.purchaseOrder ? ` on ${line.purchaseOrder}${line.expectedOn ? `, expected ${line.expectedOn}` : ""}` : "";
  return `waiting on ${line.description}: ${got}on order${order}; receive it when it arrives.`;
}

/** A line's amount: quantity × cost of one, in integer cents (null when the cost is not known). */
export function lineCents(quantity: number, unitCostCents: number | null): number | null {
  if (unitCostCents === null) return null;
  return quantity * unitCostCents;
}

/** A purchase order's total in cents, and how many lines have no cost yet (left out of the total). */
export function orderTotal(lines: readonly { quantity: number; unitCostCents: number | null }[]) {
  let totalCents = 0;
  let unpriced = 0;
  for (const l of lines) {
    const amount = lineCents(l.quantity, l.unitCostCents);
    if (amount === null) unpriced++;
    else totalCents += amount;
  }
  return { totalCents, unpriced };
}

/** Counted plural: "1 part", "2 parts". */
export function countOf(n: number, one: string, many = `${one}s`) {
  return `${n} ${n === 1 ? one : many}`;
}
