import "server-only";
import type { DB } from "@/db";
import type { Stage } from "@/db/schema";
import type { StaffUser } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import { moveJob } from "@/server/jobs/mutations";
import { STAGE_LABELS, stageIndex, stagesFor } from "@/server/jobs/stages";
import { createCoatingRun, patchCoatingRun } from "./mutations";
import { type CoatingRunView, type PartStatusRow, partStatuses } from "./queries";
import type { CoatingRunInput, CoatingRunPatch } from "./schemas";

export type RunMoveStage = "coating" | "install";

/** What became of one job the office asked to move with a coating run. */
export interface RunJobMove {
  jobId: number;
  workOrder: string;
  toStage: RunMoveStage;
  moved: boolean;
  /** Where the job is after the attempt. */
  stage: Stage;
  /** Why it did not move, in one sentence; with `unmet`, the heading of the list. */
  reason?: string;
  /** What it needs before it can move to the stage, item by item (the move's own words). */
  unmet?: string[];
}

/** A part needing coating that has not gone out since its last rework keeps its job out of Outside coating. */
export function notSentForCoating(parts: Pick<PartStatusRow, "name" | "needs_coating" | "coating_state">[]): string[] {
  return parts.filter((p) => p.needs_coating === 1 && p.coating_state === null).map((p) => p.name);
}

/**
 * Moves the jobs a run carries, one by one, through `moveJob` (the board's own move: the same
 * version check, "Needs before it can move to …", stage event and customer e-mail with its quiet
 * period). A job that cannot move stays where it is and the answer says why; the run itself is
 * already saved, so one job's refusal never undoes it or stops the others.
 */
export async function moveRunJobs(db: DB, actor: StaffUser, runId: number, jobIds: readonly number[], toStage: RunMoveStage): Promise<RunJobMove[]> {
  const unique = [...new Set(jobIds)];
  if (unique.length === 0) return [];
  const jobs = await db.selectFrom("job").select(["id", "work_order", "stage", "scope", "version"]).where("id", "in", unique).execute();
  const parts = toStage === "coating" ? await partStatuses(db, { jobIds: unique, onlyGated: true }) : [];
  const results: RunJobMove[] = [];
  for (const jobId of unique) {
    const job = jobs.find((j) => j.id === jobId);
    if (!job) continue;
    const base = { jobId, workOrder: job.work_order, toStage };
    const label = STAGE_LABELS[toStage];
    if (!stagesFor(job.scope).includes(toStage)) {
      results.push({ ...base, moved: false, stage: job.stage, reason: `The job is install only, so it skips ${label}.` });
      continue;
    }
    if (stageIndex(job.stage) >= stageIndex(toStage)) {
      results.push({ ...base, moved: false, stage: job.stage, reason: job.stage === toStage ? `Already in ${label}.` : `Already past ${label}, in ${STAGE_LABELS[job.stage]}.` });
      continue;
    }
    if (toStage === "coating") {
      const waiting = notSentForCoating(parts.filter((p) => p.job_id === jobId));
      if (waiting.length) {
        results.push({
          ...base, moved: false, stage: job.stage,
          reason: `Not every part needing coating is out: ${waiting.join(", ")} ${waiting.length === 1 ? "has" : "have"} not gone out yet. Move the job when ${waiting.length === 1 ? "it goes" : "they go"} out, or drag it on the board.`,
        });
        continue;
      }
    }
    const note = toStage === "coating" ? `Parts went out on coating run ${runId}.` : `Parts back from coating run ${runId} and inspected.`;
    try {
      const { job: after } = await moveJob(db, actor, jobId, { toStage, version: job.version, note });
      results.push({ ...base, moved: true, stage: after.stage });
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      const now = await db.selectFrom("job").select("stage").where("id", "=", jobId).executeTakeFirst();
      const details = err.details as { unmet?: string[] } | undefined;
      results.push(
        err.code === "gate_unmet" && details?.unmet?.length
          ? { ...base, moved: false, stage: now?.stage ?? job.stage, reason: `Needs before it can move to ${label}:`, unmet: details.unmet.map((u) => withoutStage(u, toStage)) }
          : { ...base, moved: false, stage: now?.stage ?? job.stage, reason: err.message },
      );
    }
  }
  return results;
}

/** "Into Install: …" under "Needs before it can move to Install:" would say the stage twice. */
function withoutStage(item: string, toStage: Stage) {
  const prefix = `Into ${STAGE_LABELS[toStage]}: `;
  return item.startsWith(prefix) ? item.slice(prefix.length) : item;
}

/** Sends a run out, then moves the jobs the office ticked into Outside coating. */
export async function sendCoatingRun(db: DB, actor: StaffUser, input: CoatingRunInput, now = new Date()): Promise<{ run: CoatingRunView; moves: RunJobMove[] }> {
  const run = await createCoatingRun(db, actor, input, now);
  return { run, moves: await moveRunJobs(db, actor, run.id, input.moveJobIds, "coating") };
}

/** Saves a run's change; with the receiving inspection, moves the jobs the office ticked into Install. */
export async function updateCoatingRun(db: DB, actor: StaffUser, runId: number, patch: CoatingRunPatch, now = new Date()): Promise<{ run: CoatingRunView; moves: RunJobMove[] }> {
  const run = await patchCoatingRun(db, actor, runId, patch, now);
  return { run, moves: patch.inspection ? await moveRunJobs(db, actor, runId, patch.moveJobIds ?? [], "install") : [] };
}

export interface RunMoveOffer {
  jobId: number;
  workOrder: string;
  customerName: string;
  unitNumber: string;
  stage: Stage;
}

/**
 * For each run waiting on its receiving inspection: the jobs it carries that the inspection can
 * release into Install, those not there yet whose every part needing coating is on this run or
 * already back and inspected with adhesion passed.
 */
export async function installOffers(db: DB, runs: readonly CoatingRunView[]): Promise<Map<number, RunMoveOffer[]>> {
  const offers = new Map<number, RunMoveOffer[]>();
  const jobIds = [...new Set(runs.flatMap((r) => r.parts.map((p) => p.jobId)))];
  if (jobIds.length === 0) return offers;
  const parts = await partStatuses(db, { jobIds, onlyGated: true });
  for (const run of runs) {
    const seen = new Set<number>();
    const list: RunMoveOffer[] = [];
    for (const p of run.parts) {
      if (seen.has(p.jobId)) continue;
      seen.add(p.jobId);
      if (stageIndex(p.jobStage) >= stageIndex("install")) continue;
      const released = parts
        .filter((s) => s.job_id === p.jobId && s.needs_coating === 1)
        .every((s) => s.last_run_id === run.id || (s.coating_state === "inspected" && s.adhesion_ok === 1));
      if (released) list.push({ jobId: p.jobId, workOrder: p.workOrder, customerName: p.customerName, unitNumber: p.unitNumber, stage: p.jobStage });
    }
    offers.set(run.id, list);
  }
  return offers;
}
