/**
 * A job's cost so far, in integer cents: labour is hours × the shop's hourly rate, each stage's
 * share rounded half-up to the cent from milliseconds (no float dollars), bought-in parts are
 * quantity × cost of one. Lines without a cost are counted, not guessed.
 */
export function labourCents(ms: number, rateCentsPerHour: number): number {
  // ms × cents/h ÷ 3,600,000 ms/h, rounded half-up: integers until the one division.
  return Math.floor((ms * rateCentsPerHour + 1_800_000) / 3_600_000);
}

export interface JobCostInput {
  rateCentsPerHour: number;
  msByStage: ReadonlyMap<string, number> | readonly [string, number][];
  boughtLines: readonly { quantity: number; unitCostCents: number | null }[];
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
  return {
    stages,
    hours: stages.reduce((n, s) => n + s.hours, 0),
    labourCents: labour,
    partsCents: parts,
    unpricedParts: unpriced,
    totalCents: labour + parts,
  };
}
