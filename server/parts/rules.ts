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
/**
 * A long list on the parts desk (overdue deliveries, received this week) shows its first lines and
 * folds the rest behind "Show all"; a list only a few lines past the cut shows whole, so nobody
 * opens a fold to find two lines.
 */
export const DESK_FIRST_LINES = 10;
export const DESK_FOLD_FROM = 15;
export function firstLinesOf<T>(lines: readonly T[]): readonly T[] {
  return lines.length < DESK_FOLD_FROM ? lines : lines.slice(0, DESK_FIRST_LINES);
}

/**
 * A section of the parts desk with more lines than a person reads at once (a busy shop's hundreds)
 * shows one row per supplier, each opening that supplier's lines; a small shop sees every line.
 */
export const DESK_INLINE_LINES = 25;

export interface SupplierSummary {
  lines: number;
  jobs: number;
  /** Priced lines' amounts summed in cents; unpriced lines counted apart. */
  amountCents: number;
  unpriced: number;
  /** The soonest expected date among the lines, and how many are past theirs. */
  nextExpectedOn: string | null;
  overdue: number;
}

export function supplierSummary(lines: readonly { jobId: number; lineCents: number | null; expectedOn: string | null; overdue: boolean }[]): SupplierSummary {
  let amountCents = 0;
  let unpriced = 0;
  let overdue = 0;
  let nextExpectedOn: string | null = null;
  const jobs = new Set<number>();
  for (const l of lines) {
    jobs.add(l.jobId);
    if (l.lineCents === null) unpriced++;
    else amountCents += l.lineCents;
    if (l.overdue) overdue++;
    if (l.expectedOn !== null && (nextExpectedOn === null || l.expectedOn < nextExpectedOn)) nextExpectedOn = l.expectedOn;
  }
  return { lines: lines.length, jobs: jobs.size, amountCents, unpriced, nextExpectedOn, overdue };
}

export function countOf(n: number, one: string, many = `${one}s`) {
  return `${n} ${n === 1 ? one : many}`;
}

/** A part line of the job's approved quote or change order, as "List from the quote" reads it. */
export interface QuotePartLine {
  description: string;
  /** Thousandths, as quote lines keep them (2.5 is 2500). */
  quantityMilli: number;
  /** The kit-spec line its price-list item prices, if any (pto, pump, reservoir, hose). */
  kitUse: string | null;
}

export interface ListedLine {
  kind: BoughtPartKind;
  description: string;
}

export interface LineFromQuote {
  kind: BoughtPartKind;
  description: string;
  quantity: number;
}

const DESCRIPTION_MAX = 200;

// The kind from the price-list item's kit use, else from the trade's own words in the description.
const KIND_WORDS: [BoughtPartKind, RegExp][] = [
  ["pto", /\bpto\b|power take-?off/i],
  ["pump", /\bpump\b/i],
  ["valve", /\bvalve\b/i],
  ["hose", /\bhose\b/i],
  ["fitting", /\bfitting|\bcoupler|\badapter|\belbow\b|\btee\b|\bnipple\b/i],
  ["control", /\bswitch\b|\bcontrol\b|\bcable\b|\bindicator\b|\bsolenoid\b|\bharness\b/i],
];

export function kindOfQuoteLine(line: Pick<QuotePartLine, "description" | "kitUse">): BoughtPartKind {
  if (line.kitUse === "pto" || line.kitUse === "pump" || line.kitUse === "hose") return line.kitUse;
  return KIND_WORDS.find(([, words]) => words.test(line.description))?.[0] ?? "other";
}

/**
 * The bought-in line a quote line becomes: whole quantities carry over; a part quoted by a
 * fraction (hose by the foot) is one piece to order, its quoted quantity kept in the description.
 */
export function lineFromQuote(line: QuotePartLine): LineFromQuote {
  const kind = kindOfQuoteLine(line);
  if (line.quantityMilli % 1000 === 0) return { kind, description: line.description.slice(0, DESCRIPTION_MAX), quantity: line.quantityMilli / 1000 };
  const quoted = ` (quoted quantity ${line.quantityMilli / 1000})`;
  return { kind, description: `${line.description.slice(0, DESCRIPTION_MAX - quoted.length)}${quoted}`, quantity: 1 };
}

// A kit has one PTO and one pump: one already listed (by hand or from the kit spec, whatever its
// words) stands for the quote's. Other lines match on their description, case and spaces aside.
const listingKey = (line: ListedLine) =>
  line.kind === "pto" || line.kind === "pump" ? `kind:${line.kind}` : `words:${line.description.toLowerCase().replace(/\s+/g, " ").trim()}`;

/**
 * The quote's part lines not yet listed on the job, in quote order. Each listed line stands for
 * one quote line, so two identical quote lines need two listed lines and a second press adds nothing.
 */
export function linesFromQuote(quoteLines: readonly QuotePartLine[], listed: readonly ListedLine[]): LineFromQuote[] {
  const unmatched = new Map<string, number>();
  for (const line of listed) unmatched.set(listingKey(line), (unmatched.get(listingKey(line)) ?? 0) + 1);
  const out: LineFromQuote[] = [];
  for (const quoteLine of quoteLines) {
    const line = lineFromQuote(quoteLine);
    const key = listingKey(line);
    const left = unmatched.get(key) ?? 0;
    if (left > 0) unmatched.set(key, left - 1);
    else out.push(line);
  }
  return out;
}

/**
 * How suppliers are told apart: without capitals and without surrounding or doubled spaces, so
 * "Ketterby Fluid Power" and " ketterby  fluid power" are one supplier. Only for matching; the
 * name as first written is what is shown.
 */
export function supplierKey(name: string): string {
  return tidySupplier(name).toLowerCase();
}

/** A supplier's name as shown: as written, without surrounding or doubled spaces. */
function tidySupplier(name: string): string {
  return name.trim().replace(/\s+/g, " ");
}

/**
 * Lines grouped by supplier (see supplierKey), each group shown under the name as first written
 * (the line with the lowest id); suppliers A–Z, the group with no supplier yet last.
 */
export function groupBySupplier<T extends { id: number; supplier: string }>(lines: readonly T[]): { supplier: string; lines: T[] }[] {
  const groups = new Map<string, { first: T; lines: T[] }>();
  for (const l of lines) {
    const key = supplierKey(l.supplier);
    const group = groups.get(key);
    if (!group) groups.set(key, { first: l, lines: [l] });
    else {
      group.lines.push(l);
      if (l.id < group.first.id) group.first = l;
    }
  }
  return [...groups.entries()]
    .sort(([a], [b]) => (a === "" ? 1 : b === "" ? -1 : a.localeCompare(b)))
    .map(([key, g]) => ({ supplier: key === "" ? "" : tidySupplier(g.first.supplier), lines: g.lines }));
}

/** Known supplier names, one per supplier (the first of each in the order given), A–Z; blanks left out. */
export function distinctSuppliers(names: readonly string[]): string[] {
  const byKey = new Map<string, string>();
  for (const name of names) {
    const key = supplierKey(name);
    if (key !== "" && !byKey.has(key)) byKey.set(key, tidySupplier(name));
  }
  return [...byKey.values()].sort((a, b) => a.localeCompare(b));
}
