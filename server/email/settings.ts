import "server-only";
import type { DB } from "@/db";
import type { Stage } from "@/db/schema";
import { isStage } from "@/server/jobs/stages";
import { recordAudit } from "@/server/audit/record";
import type { StaffUser } from "@/server/auth/session";
import { DEFAULT_NOTIFY_STAGES, DEFAULT_STATUS_LINK_DAYS, type NotifySettingsInput } from "./schemas";

export interface NotifySettings {
  notifyStages: Stage[];
  statusLinkDays: number;
}

/** The shop's e-mail settings; a shop that never saved any gets the defaults. */
export async function notifySettings(db: DB): Promise<NotifySettings> {
  const row = await db.selectFrom("message_setting").select(["notify_stages", "status_link_days"]).where("id", "=", 1).executeTakeFirst();
  if (!row) return { notifyStages: [...DEFAULT_NOTIFY_STAGES], statusLinkDays: DEFAULT_STATUS_LINK_DAYS };
  return { notifyStages: row.notify_stages.split(",").filter(isStage), statusLinkDays: row.status_link_days };
}

export async function saveNotifySettings(db: DB, actor: StaffUser, input: NotifySettingsInput): Promise<NotifySettings> {
  const values = { notify_stages: [...new Set(input.notifyStages)].join(","), status_link_days: input.statusLinkDays, updated_at: new Date().toISOString(), updated_by: actor.id };
  await db.transaction().execute(async (trx) => {
    const before = await notifySettings(trx);
    await trx
      .insertInto("message_setting")
      .values({ id: 1, ...values })
      .onConflict((oc) => oc.column("id").doUpdateSet(values))
      .execute();
    const changes: string[] = [];
    const stagesBefore = before.notifyStages.join(",");
    if (stagesBefore !== values.notify_stages) changes.push(`e-mail at stages ${stagesBefore || "none"} → ${values.notify_stages || "none"}`);
    if (before.statusLinkDays !== values.status_link_days) changes.push(`status links last ${before.statusLinkDays} → ${values.status_link_days} days after delivery`);
    if (changes.length) {
      await recordAudit(trx, { kind: "settings_changed", actor, subject: "Customer e-mail", summary: `${actor.name} changed customer e-mail settings: ${changes.join("; ")}.`, details: { notifyStages: [stagesBefore, values.notify_stages], statusLinkDays: [before.statusLinkDays, values.status_link_days] } });
    }
  });
  return notifySettings(db);
}
