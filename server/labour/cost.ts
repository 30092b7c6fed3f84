import { formatCents } from "@/server/money/totals";

/**
 * A job's cost so far, in integer cents: labour is hours × the shop's hourly rate, each stage's
 * share rounded half-up to the cent from milliseconds (no float dollars), bought-in parts are
 * quantity × cost of one, outside coating the job's share of each run's price. Lines and runs
 * without a price are counted, not guessed.
 */
export function labourCents(ms: number, rateCentsPerHour: number): number {
  // ms × cents/h ÷ 3,600,000 ms/h, rounded half-up: integers until the one division.
  return Math.floor((ms * rateCentsPerHour + 1_800_000) / 3_600_000);
}

/**
 * A coating run's price split over the parts on it: equal shares in whole cents, the cents left
 * over going one each to the parts with the lowest ids, so the shares add up to the price exactly
 * (common practice, no published source: a coater prices the run, not each part).
 */
export function splitRunPrice(priceCents: number, partIds: readonly number[]): Map<number, number> {
  const ids = [...new Set(partIds)].sort((a, b) => a - b);
  const shares = new Map<number, number>();
  if (ids.length === 0) return shares;
  const each = Math.floor(priceCents / ids.length);
  const left = priceCents - each * ids.length;
  ids.forEach((id, i) => shares.set(id, each + (i < left ? 1 : 0)));
  return shares;
}

export interface CoatingRunCost {
  priceCents: number | null;
  /** Every part on the run, of any job. */
  partIds: readonly number[];
}

/** A job's share of its coating runs: its parts' shares of each priced run, and how many runs carry no price yet. */
export function coatingShare(runs: readonly CoatingRunCost[], jobPartIds: ReadonlySet<number>) {
  let cents = 0;
  let unpricedRuns = 0;
  for (const run of runs) {
    if (!run.partIds.some((id) => jobPartIds.has(id))) continue;
    if (run.priceCents === null) {
      unpricedRuns++;
      continue;
    }
    for (const [partId, share] of splitRunPrice(run.priceCents, run.partIds)) if (jobPartIds.has(partId)) cents += share;
  }
  return { cents, unpricedRuns };
}

export interface JobCostInput {
  rateCentsPerHour: number;
  msByStage: ReadonlyMap<string, number> | readonly [string, number][];
  boughtLines: readonly { quantity: number; unitCostCents: number | null }[];
  /** The job's share of its outside coating (`coatingShare`); none when left out. */
  coating?: { cents: number; unpricedRuns: number };
}

export function jobCost(input: JobCostInput) {
  const stages = [...(input.msByStage instanceof Map ? input.msByStage.entries() : input.msByStage)].map(([stage, ms]) => ({
    stage,
    hours: ms / 3_600_000,
    labourCents: labourCents(ms, input.rateCentsPerHour),
  }));
  const labour = stages.reduce((n, s) => n + s.labourCents, 0);
  let parts = 0;
  let unpriced = 0;
  for (const l of input.boughtLines) {
    if (l.unitCostCents === null) unpriced++;
    else parts += l.quantity * l.unitCostCents;
  }
  const coating = input.coating ?? { cents: 0, unpricedRuns: 0 };
  return {
    stages,
    hours: stages.reduce((n, s) => n + s.hours, 0),
    labourCents: labour,
    partsCents: parts,
    unpricedParts: unpriced,
    coatingCents: coating.cents,
    unpricedCoatingRuns: coating.unpricedRuns,
    totalCents: labour + parts + coating.cents,
  };
}

/**
 * The one name for a job's cost so far against its approved quote (before tax), used on the job
 * page, the Hours page and, as `over_under_quote_dollars`, in the CSV: the same figure, the same words.
 */
export const OVER_UNDER_QUOTE = "Over / under the quote";

/** Cost so far less the quote, in cents, said plainly: "over by $12.00", "under by $858.09", "on the quote". */
export function overUnderWords(overCents: number): string {
  if (overCents === 0) return "on the quote";
  return overCents > 0 ? `over by ${formatCents(overCents)}` : `under by ${formatCents(-overCents)}`;
}
