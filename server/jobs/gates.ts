import type { JobScope, Stage } from "@/db/schema";
import { type JobMoney, moneyBeforeDeliveryUnmet, moneyBeforeWorkUnmet } from "@/server/money/state";
import { type BoughtWaiting, waitingWords } from "@/server/parts/rules";
import { STAGE_LABELS, stageIndex, stagesFor } from "./stages";

/** What the gates read of a job's records; the records loader fills it, tests build it by hand. */
export interface GateRecords {
  /** How many parts are recorded on the job at all; a job with fabricated parts must list them. */
  partCount: number;
  /** Parts marked for a leak test, with whether a passing test is newer than their last rework. */
  leakTestParts: { name: string; passedSinceRework: boolean; lastResult: "pass" | "fail" | "invalid" | null; reworked?: boolean }[];
  /** Parts marked for outside coating: whether sent (absent means sent), back, and inspected. */
  coatedParts: { name: string; sent?: boolean; received: boolean; inspected: boolean; adhesionFailed?: boolean }[];
  /** The wiring & run-test sign-off: null when none has been started. */
  signOff: { complete: boolean; missing: string[] } | null;
  /** Bought-in parts not yet received in full (absent: none listed). */
  waitingBoughtParts?: BoughtWaiting[];
  /** Where the job stands with its money (absent: the money checks do not apply). */
  money?: JobMoney;
  /** Stages the owner moved the job past with an override (and it has not gone back before since). */
  waivedGates?: readonly GatedStage[];
}

export const NO_RECORDS: GateRecords = { partCount: 0, leakTestParts: [], coatedParts: [], signOff: null };

export type GatedStage = "fabricate" | "coating" | "install" | "ready" | "delivered";
export const GATED_STAGES: readonly GatedStage[] = ["fabricate", "coating", "install", "ready", "delivered"];

/**
 * Unmet conditions of one gate, in plain words a tech can act on. Money before work sits on the
 * first working stage of the job's route: Fabricate, or Install for install-only work.
 */
export function gateUnmet(gate: GatedStage, records: GateRecords, scope: JobScope = "fabrication"): string[] {
  switch (gate) {
    case "fabricate":
      return records.money ? moneyBeforeWorkUnmet(records.money) : [];
    case "delivered":
      return records.money ? moneyBeforeDeliveryUnmet(records.money) : [];
    case "coating":
      // The coating gate sits only on the fabrication route, so a job here must have parts to show for it.
      if (records.partCount === 0) return ["No fabricated parts are recorded on this job yet: add them under Parts (or make the job install only)."];
      return records.leakTestParts
        .filter((p) => !p.passedSinceRework)
        .map((p) =>
          p.lastResult === "fail"
            ? `${p.name}: the last leak test failed; rework it and record a passing test.`
            : p.lastResult === "invalid"
              ? `${p.name}: the last leak test did not follow the shop's procedure (invalid); test it again.`
              : `${p.name}: record a passing leak test${p.reworked ? " (none since its last rework)" : ""}.`,
        );
    case "install":
      return [
        ...(scope === "install_only" && records.money ? moneyBeforeWorkUnmet(records.money) : []),
        ...coatingUnmet(records),
        ...(records.waitingBoughtParts ?? []).map((p) => waitingWords(p)),
      ];
    case "ready":
      if (!records.signOff) return ["Wiring & run-test sign-off: not started."];
      return records.signOff.complete ? [] : records.signOff.missing.map((m) => `Sign-off: ${m}`);
  }
}

function coatingUnmet(records: GateRecords): string[] {
  return records.coatedParts
    .filter((p) => !p.received || !p.inspected || p.adhesionFailed)
    .map((p) =>
      p.sent === false
        ? `${p.name}: not sent for coating yet; send it out on a coating run.`
        : !p.received
          ? `${p.name}: still out for coating; mark the coating run received.`
          : p.adhesionFailed
            ? `${p.name}: coating failed adhesion; send it back for a recoat or record a passing inspection.`
            : `${p.name}: back from coating; record the receiving inspection.`,
    );
}

export type MoveKind = "forward" | "backward" | "reorder";

export interface MoveCheck {
  kind: MoveKind;
  /** Conditions that stop the move; empty when it may go. */
  unmet: string[];
  /** True when the move is refused for a reason an owner's override cannot change. */
  impossible: boolean;
}

/**
 * Decides whether a job may move. Backward moves and reordering are always allowed (a failed
 * leak test sends a job back to fabricate). A forward move must meet every gate on the job's
 * route up to where it goes, not only those it crosses: skipping a column does not skip its
 * gate, and a tank reworked after it passed must pass again before the job moves on.
 */
export function checkMove(from: Stage, to: Stage, scope: JobScope, records: GateRecords): MoveCheck {
  const route = stagesFor(scope);
  if (!route.includes(to)) {
    return {
      kind: stageIndex(to) > stageIndex(from) ? "forward" : "backward",
      unmet: [`This job has no fabricated parts, so it skips ${STAGE_LABELS[to]}. Change the job's Work to fabricated parts first if that is wrong.`],
      impossible: true,
    };
  }
  if (from === to) return { kind: "reorder", unmet: [], impossible: false };
  if (stageIndex(to) < stageIndex(from)) return { kind: "backward", unmet: [], impossible: false };
  const unmet = gatesUpTo(from, to, route, records);
  return { kind: "forward", unmet, impossible: false };
}

/**
 * Everything the stages up to `to` need, the ones the job is already past included (a tank
 * reworked after it passed holds the job wherever it is), except a stage behind the job that the
 * owner waived with an override: that decision is on record and is not asked again at every move.
 */
function gatesUpTo(from: Stage, to: Stage, route: Stage[], records: GateRecords): string[] {
  const scope: JobScope = route.includes("fabricate") ? "fabrication" : "install_only";
  const waived = (g: GatedStage) => stageIndex(g) <= stageIndex(from) && (records.waivedGates ?? []).includes(g);
  return GATED_STAGES.filter((g) => route.includes(g) && stageIndex(g) <= stageIndex(to) && !waived(g)).flatMap((g) =>
    gateUnmet(g, records, scope).map((m) => `Into ${STAGE_LABELS[g]}: ${m}`),
  );
}

/**
 * The next gate ahead of the job's current stage, with everything that would stop the job
 * reaching it (an earlier gate broken by rework counts too): shown on the card.
 */
export function nextGateState(stage: Stage, scope: JobScope, records: GateRecords): { gate: GatedStage; unmet: string[] } | null {
  const route = stagesFor(scope);
  // Fabricate and Delivered ask only about money: with the shop's money checks off they ask nothing.
  const moneyOn = records.money?.checksOn === true;
  const next = GATED_STAGES.find((g) => route.includes(g) && stageIndex(g) > stageIndex(stage) && (moneyOn || (g !== "fabricate" && g !== "delivered")));
  if (!next) return null;
  return { gate: next, unmet: gatesUpTo(stage, next, route, records) };
}

/**
 * The stages the owner waived, from the job's moves in order: a move made with an override waives
 * the gated stages it entered; a move back before a stage undoes its waiver (going forward again
 * asks again).
 */
export function waivedGatesOf(moves: readonly { from: Stage | null; to: Stage; overridden: boolean }[]): GatedStage[] {
  const waived = new Set<GatedStage>();
  for (const m of moves) {
    const from = m.from === null ? -1 : stageIndex(m.from);
    const to = stageIndex(m.to);
    if (to < from) for (const g of [...waived]) if (stageIndex(g) > to) waived.delete(g);
    if (to > from && m.overridden) for (const g of GATED_STAGES) if (stageIndex(g) > from && stageIndex(g) <= to) waived.add(g);
  }
  return GATED_STAGES.filter((g) => waived.has(g));
}
