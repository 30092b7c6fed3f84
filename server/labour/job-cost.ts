import "server-only";
import type { DB } from "@/db";
import type { Stage } from "@/db/schema";
import { formatCents } from "@/components/money";
import type { StaffUser } from "@/server/auth/session";
import { recordAudit } from "@/server/audit/record";
import { coatingShare, jobCost } from "./cost";
import { msByStage } from "./rules";

export async function labourRateCents(db: DB): Promise<number> {
  const row = await db.selectFrom("shop").select("labour_rate_cents").where("id", "=", 1).executeTakeFirst();
  return row?.labour_rate_cents ?? 0;
}

/**
 * Every coating run that carried a part of these jobs, with all the parts on it (of any job), so
 * each job's share of a run's price can be worked out; answers each job's share.
 */
export async function coatingSharesOf(db: DB, jobIds: readonly number[]): Promise<(jobId: number) => { cents: number; unpricedRuns: number }> {
  if (jobIds.length === 0) return () => ({ cents: 0, unpricedRuns: 0 });
  const rows = await db
    .selectFrom("coating_run_part as c")
    .innerJoin("coating_run as r", "r.id", "c.run_id")
    .innerJoin("part as p", "p.id", "c.part_id")
    .select(["r.id as run_id", "r.price_cents", "c.part_id", "p.job_id"])
    .where("c.run_id", "in", (eb) =>
      eb.selectFrom("coating_run_part as c2").innerJoin("part as p2", "p2.id", "c2.part_id").select("c2.run_id").where("p2.job_id", "in", [...jobIds]),
    )
    .execute();
  const runs = new Map<number, { priceCents: number | null; partIds: number[] }>();
  const partsOfJob = new Map<number, Set<number>>();
  for (const r of rows) {
    const run = runs.get(r.run_id) ?? { priceCents: r.price_cents, partIds: [] };
    run.partIds.push(r.part_id);
    runs.set(r.run_id, run);
    if (!partsOfJob.has(r.job_id)) partsOfJob.set(r.job_id, new Set());
    partsOfJob.get(r.job_id)!.add(r.part_id);
  }
  const list = [...runs.values()];
  /** A job's share of those runs (`coatingShare`). */
  return (jobId: number) => coatingShare(list, partsOfJob.get(jobId) ?? new Set());
}

/** One job's cost so far: labour by stage at the shop's rate, its bought-in parts and its share of outside coating. */
export async function loadJobCost(db: DB, jobId: number, now = new Date()) {
  const [rate, entries, events, lines, shareOf] = await Promise.all([
    labourRateCents(db),
    db.selectFrom("clock_entry").select(["stage", "started_at", "ended_at"]).where("job_id", "=", jobId).execute(),
    db.selectFrom("stage_event").select(["at", "to_stage"]).where("job_id", "=", jobId).orderBy("id").execute(),
    db.selectFrom("bought_part").select(["quantity", "unit_cost_cents"]).where("job_id", "=", jobId).execute(),
    coatingSharesOf(db, [jobId]),
  ]);
  const coating = shareOf(jobId);
  const byStage = msByStage(
    entries.map((e) => ({ startedAt: e.started_at, endedAt: e.ended_at, stage: e.stage })),
    events.map((e) => ({ at: e.at, toStage: e.to_stage as Stage })),
    now,
  );
  return { rateCents: rate, ...jobCost({ rateCentsPerHour: rate, msByStage: byStage, boughtLines: lines.map((l) => ({ quantity: l.quantity, unitCostCents: l.unit_cost_cents })), coating }) };
}

/** The owner's new labour rate; unchanged writes nothing, a change is an audit line. */
export async function setLabourRate(db: DB, owner: StaffUser, cents: number) {
  await db.transaction().execute(async (trx) => {
    const before = await labourRateCents(trx);
    if (before === cents) return;
    await trx.updateTable("shop").set({ labour_rate_cents: cents }).where("id", "=", 1).execute();
    await recordAudit(trx, {
      kind: "settings_changed",
      actor: owner,
      subject: "labour rate",
      summary: `${owner.name} changed the labour rate from ${formatCents(before)} to ${formatCents(cents)} an hour.`,
      details: { labourRateCents: [before, cents] },
    });
  });
}

/**
 * What the job's approved quote and change orders priced (before tax): labour hours and amount,
 * bought-in parts, outside coating, and the subtotal the margin is counted from. Null when nothing
 * is approved yet. Quote lines carry no stage, so the comparison by stage is of hours only in total.
 */
export async function quotedFor(db: DB, jobId: number) {
  const lines = await db
    .selectFrom("quote_line as l")
    .innerJoin("quote as q", "q.id", "l.quote_id")
    .select(["l.kind", "l.quantity_milli", "l.amount_cents"])
    .where("q.job_id", "=", jobId)
    .where("q.status", "=", "approved")
    .execute();
  if (lines.length === 0) return null;
  let labourMilliHours = 0;
  const cents = { labour: 0, part: 0, fabrication: 0, coating: 0, fee: 0 } as Record<string, number>;
  for (const l of lines) {
    cents[l.kind] = (cents[l.kind] ?? 0) + l.amount_cents;
    if (l.kind === "labour") labourMilliHours += l.quantity_milli;
  }
  return {
    labourHours: labourMilliHours / 1000,
    labourCents: cents.labour,
    partsCents: cents.part,
    coatingCents: cents.coating,
    subtotalCents: Object.values(cents).reduce((a, b) => a + b, 0),
  };
}
