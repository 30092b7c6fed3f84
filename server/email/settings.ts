import "server-only";
import type { Transaction } from "kysely";
import type { DB } from "@/db";
import type { Database } from "@/db/schema";
import type { Stage } from "@/db/schema";
import { isStage } from "@/server/jobs/stages";
import { recordAudit } from "@/server/audit/record";
import { emailEnv } from "./env";
import type { StaffUser } from "@/server/auth/session";
import { DEFAULT_NOTIFY_STAGES, DEFAULT_STATUS_LINK_DAYS, type NotifySettingsInput } from "./schemas";

export interface NotifySettings {
  notifyStages: Stage[];
  statusLinkDays: number;
  /** The shop's quiet period after a move, in minutes. */
  quietMinutes: number;
}

export const DEFAULT_QUIET_SECONDS = 180;

/** The shop's e-mail settings; a shop that never saved any gets the defaults. */
export async function notifySettings(db: DB | Transaction<Database>): Promise<NotifySettings> {
  const row = await db.selectFrom("message_setting").select(["notify_stages", "status_link_days", "quiet_seconds"]).where("id", "=", 1).executeTakeFirst();
  if (!row) return { notifyStages: [...DEFAULT_NOTIFY_STAGES], statusLinkDays: DEFAULT_STATUS_LINK_DAYS, quietMinutes: DEFAULT_QUIET_SECONDS / 60 };
  return { notifyStages: row.notify_stages.split(",").filter(isStage), statusLinkDays: row.status_link_days, quietMinutes: Math.round(row.quiet_seconds / 6) / 10 };
}

export async function saveNotifySettings(db: DB, actor: StaffUser, input: NotifySettingsInput): Promise<NotifySettings> {
  const values = {
    notify_stages: [...new Set(input.notifyStages)].join(","),
    status_link_days: input.statusLinkDays,
    ...(input.quietMinutes !== undefined ? { quiet_seconds: input.quietMinutes * 60 } : {}),
    updated_at: new Date().toISOString(),
    updated_by: actor.id,
  };
  await db.transaction().execute(async (trx) => {
    const before = await notifySettings(trx);
    // The shop's saved figure, not EMAIL_QUIET_SECONDS: the audit line is about what the owner changed.
    const quietBefore = Math.round(before.quietMinutes * 60);
    await trx
      .insertInto("message_setting")
      .values({ id: 1, ...values })
      .onConflict((oc) => oc.column("id").doUpdateSet(values))
      .execute();
    const changes: string[] = [];
    const stagesBefore = before.notifyStages.join(",");
    if (stagesBefore !== values.notify_stages) changes.push(`e-mail at stages ${stagesBefore || "none"} → ${values.notify_stages || "none"}`);
    if (before.statusLinkDays !== values.status_link_days) changes.push(`status links last ${before.statusLinkDays} → ${values.status_link_days} days after delivery`);
    if (values.quiet_seconds !== undefined && values.quiet_seconds !== quietBefore) changes.push(`stage e-mail waits ${quietBefore / 60} → ${values.quiet_seconds / 60} minutes after a move`);
    if (changes.length) {
      await recordAudit(trx, {
        kind: "settings_changed",
        actor,
        subject: "Customer e-mail",
        summary: `${actor.name} changed customer e-mail settings: ${changes.join("; ")}.`,
        details: { notifyStages: [stagesBefore, values.notify_stages], statusLinkDays: [before.statusLinkDays, values.status_link_days], ...(values.quiet_seconds !== undefined ? { quietSeconds: [quietBefore, values.quiet_seconds] } : {}) },
      });
    }
  });
  return notifySettings(db);
}

/**
 * How long a stage e-mail waits after the move, in seconds: EMAIL_QUIET_SECONDS when set (tests,
 * scripted checks), else the shop's setting, else 3 minutes.
 */
export async function quietSeconds(db: DB | Transaction<Database>): Promise<number> {
  const fromEnv = emailEnv().EMAIL_QUIET_SECONDS;
  if (fromEnv !== undefined) return fromEnv;
  const row = await db.selectFrom("message_setting").select("quiet_seconds").where("id", "=", 1).executeTakeFirst();
  return row?.quiet_seconds ?? DEFAULT_QUIET_SECONDS;
}
