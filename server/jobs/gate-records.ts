import "server-only";
import type { DB } from "@/db";
import { loadJobMoney } from "@/server/money/job-money";
import { waitingBoughtParts } from "@/server/parts/queries";
import { partStatuses, signOffStates } from "@/server/records/queries";
import { type GateRecords, waivedGatesOf } from "./gates";

/**
 * The records each job's gates read, for many jobs at once (the board asks for hundreds): one
 * statement for the part counts, one for the parts with their leak-test and coating state, one
 * for the sign-offs, whatever the number of jobs. Takes a transaction too, so a move decides on what it will commit against.
 */
export async function loadGateRecords(db: DB, jobIds: readonly number[]): Promise<Map<number, GateRecords>> {
  const records = new Map<number, GateRecords>(jobIds.map((id) => [id, { partCount: 0, leakTestParts: [], coatedParts: [], signOff: null }]));
  if (jobIds.length === 0) return records;
  const counts = await db.selectFrom("part").select(["job_id", (eb) => eb.fn.countAll<number>().as("n")]).where("job_id", "in", jobIds).groupBy("job_id").execute();
  for (const c of counts) {
    const job = records.get(c.job_id);
    if (job) job.partCount = Number(c.n);
  }
  const parts = await partStatuses(db, { jobIds, onlyGated: true });
  const signOffs = await signOffStates(db, jobIds);
  for (const waiting of await waitingBoughtParts(db, jobIds)) {
    const job = records.get(waiting.jobId);
    if (job) (job.waitingBoughtParts ??= []).push(waiting);
  }
  // Owner overrides are rare: only the jobs that have one read their moves.
  const overridden = await db.selectFrom("stage_event").select("job_id").distinct().where("job_id", "in", jobIds).where("override_reason", "is not", null).execute();
  if (overridden.length) {
    const moves = await db
      .selectFrom("stage_event")
      .select(["job_id", "from_stage", "to_stage", "override_reason"])
      .where("job_id", "in", overridden.map((o) => o.job_id))
      .orderBy("job_id")
      .orderBy("id")
      .execute();
    for (const o of overridden) {
      const job = records.get(o.job_id);
      if (job) job.waivedGates = waivedGatesOf(moves.filter((m) => m.job_id === o.job_id).map((m) => ({ from: m.from_stage, to: m.to_stage, overridden: m.override_reason !== null })));
    }
  }
  for (const part of parts) {
    const job = records.get(part.job_id);
    if (!job) continue;
    if (part.needs_leak_test === 1) {
      job.leakTestParts.push({ name: part.name, passedSinceRework: part.passed === 1, lastResult: part.last_result, reworked: part.rework_count > 0 });
    }
    if (part.needs_coating === 1) {
      // Only runs since the part's last rework count, and the newest of them decides: a part sent
      // again for a recoat is out until that run is back. An inspection whose adhesion check failed
      // does not release the part; defects noted on a passing inspection are a note, not a hold
      // (whoever inspected it accepted them).
      const inspected = part.coating_state === "inspected";
      job.coatedParts.push({
        name: part.name,
        sent: part.coating_state !== null,
        received: part.coating_state === "back" || inspected,
        inspected: inspected && part.adhesion_ok === 1,
        adhesionFailed: inspected && part.adhesion_ok === 0,
      });
    }
  }
  for (const [jobId, money] of await loadJobMoney(db, jobIds)) {
    const job = records.get(jobId);
    if (job) job.money = money;
  }
  for (const [jobId, signOff] of signOffs) {
    const job = records.get(jobId);
    if (job) job.signOff = signOff;
  }
  return records;
}
