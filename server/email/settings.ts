import "server-only";
import type { DB } from "@/db";
import type { Stage } from "@/db/schema";
import { isStage } from "@/server/jobs/stages";
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
  await db
    .insertInto("message_setting")
    .values({ id: 1, ...values })
    .onConflict((oc) => oc.column("id").doUpdateSet(values))
    .execute();
  return notifySettings(db);
}
