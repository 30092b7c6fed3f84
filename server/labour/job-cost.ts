import "server-only";
import type { DB } from "@/db";
import type { Stage } from "@/db/schema";
import { formatCents } from "@/components/money";
import type { StaffUser } from "@/server/auth/session";
import { recordAudit } from "@/server/audit/record";
import { jobCost } from "./cost";
import { msByStage } from "./rules";

export async function labourRateCents(db: DB): Promise<number> {
  const row = await db.selectFrom("shop").select("labour_rate_cents").where("id", "=", 1).executeTakeFirst();
  return row?.labour_rate_cents ?? 0;
}

/** One job's cost so far: labour by stage at the shop's rate and its bought-in parts. */
export async function loadJobCost(db: DB, jobId: number, now = new Date()) {
  const [rate, entries, events, lines] = await Promise.all([
    labourRateCents(db),
    db.selectFrom("clock_entry").select(["stage", "started_at", "ended_at"]).where("job_id", "=", jobId).execute(),
    db.selectFrom("stage_event").select(["at", "to_stage"]).where("job_id", "=", jobId).orderBy("id").execute(),
    db.selectFrom("bought_part").select(["quantity", "unit_cost_cents"]).where("job_id", "=", jobId).execute(),
  ]);
  const byStage = msByStage(
    entries.map((e) => ({ startedAt: e.started_at, endedAt: e.ended_at, stage: e.stage })),
    events.map((e) => ({ at: e.at, toStage: e.to_stage as Stage })),
    now,
  );
  return { rateCents: rate, ...jobCost({ rateCentsPerHour: rate, msByStage: byStage, boughtLines: lines.map((l) => ({ quantity: l.quantity, unitCostCents: l.unit_cost_cents })) }) };
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
