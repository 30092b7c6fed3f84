import "server-only";
import type { DB } from "@/db";
import { recordAudit, type AuditActor } from "@/server/audit/record";
import { moneyChecksOn } from "./job-money";

/** Turns the shop's money checks on or off; a change is an audit line, saving it unchanged writes nothing. */
export async function setMoneyChecks(db: DB, actor: AuditActor, on: boolean): Promise<boolean> {
  return db.transaction().execute(async (trx) => {
    const before = await moneyChecksOn(trx);
    if (before === on) return on;
    await trx.insertInto("shop").values({ id: 1, name: "Your shop" }).onConflict((oc) => oc.column("id").doNothing()).execute();
    await trx.updateTable("shop").set({ money_checks: on ? 1 : 0 }).where("id", "=", 1).execute();
    await recordAudit(trx, {
      kind: "settings_changed",
      actor,
      subject: "Money checks before work and delivery",
      summary: `${actor.name} turned the money checks before work and delivery ${on ? "on" : "off"}.`,
      details: { moneyChecks: [before, on] },
    });
    return on;
  });
}
