import "server-only";
import type { Transaction } from "kysely";
import type { DB } from "@/db";
import type { Database } from "@/db/schema";
import type { StaffUser } from "@/server/auth/session";
import { queueLinkMessage } from "@/server/email/outbox";
import { recipientsFor } from "@/server/email/recipients";
import { notifySettings } from "@/server/email/settings";
import { recordAudit } from "@/server/audit/record";
import { ApiError } from "@/server/http/errors";
import { deliveredAt } from "./queries";
import { linkExpiresAt, linkState } from "./rules";
import { newLinkSecrets, statusUrl, tokenFor } from "./tokens";

type Trx = Transaction<Database>;

/** The job's links as staff see them: never a token, only when and by whom. */
export async function listStatusLinks(db: DB, jobId: number, now = new Date()) {
  const job = await db.selectFrom("job").select(["id", "stage"]).where("id", "=", jobId).executeTakeFirst();
  if (!job) throw new ApiError("not_found", "That job was not found.");
  const [rows, settings, delivered] = await Promise.all([
    db
      .selectFrom("status_link")
      .leftJoin("staff as issuer", "issuer.id", "status_link.issued_by")
      .leftJoin("staff as revoker", "revoker.id", "status_link.revoked_by")
      .select([
        "status_link.id",
        "status_link.created_at as createdAt",
        "status_link.revoked_at",
        "status_link.last_opened_at as lastOpenedAt",
        "issuer.name as issuedBy",
        "revoker.name as revokedBy",
      ])
      .where("status_link.job_id", "=", jobId)
      .orderBy("status_link.id", "desc")
      .execute(),
    notifySettings(db),
    job.stage === "delivered" ? deliveredAt(db, jobId) : Promise.resolve(null),
  ]);
  const jobState = { stage: job.stage, deliveredAt: delivered };
  return rows.map((r) => ({
    id: r.id,
    createdAt: r.createdAt,
    /** null: issued by the dispatcher for a stage e-mail. */
    issuedBy: r.issuedBy,
    revokedAt: r.revoked_at,
    revokedBy: r.revokedBy,
    lastOpenedAt: r.lastOpenedAt,
    state: linkState(r, jobState, settings.statusLinkDays, now),
    expiresAt: r.revoked_at ? null : linkExpiresAt(jobState, settings.statusLinkDays),
  }));
}

async function insertLink(trx: Trx, jobId: number, issuedBy: string | null, at: string) {
  const secrets = newLinkSecrets();
  const row = await trx
    .insertInto("status_link")
    .values({ job_id: jobId, token_hash: secrets.tokenHash, nonce: secrets.nonce, issued_by: issuedBy, created_at: at, revoked_at: null, revoked_by: null, last_opened_at: null })
    .returning("id")
    .executeTakeFirstOrThrow();
  return { id: row.id, token: secrets.token };
}

/**
 * Issues a new link and turns off the job's other links, so one link is live at a time and a
 * link sent to the wrong person can be replaced. The URL is returned here once.
 */
export async function issueStatusLink(db: DB, actor: StaffUser, jobId: number, options: { emailContacts?: boolean } = {}) {
  const at = new Date().toISOString();
  const link = await db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select(["id", "work_order"]).where("id", "=", jobId).executeTakeFirst();
    if (!job) throw new ApiError("not_found", "That job was not found.");
    // Checked before anything changes: a refused request leaves the old link working.
    let recipients: string[] = [];
    if (options.emailContacts) {
      const { emailOff, to } = await recipientsFor(trx, jobId);
      if (emailOff) throw new ApiError("conflict", "E-mail is off for this job: switch it on under “Who gets e-mail about this job”, or issue the link without e-mailing it.");
      if (to.length === 0) throw new ApiError("conflict", "Nobody on this job gets e-mail updates: choose a contact with an e-mail address, or issue the link without e-mailing it.");
      recipients = to;
    }
    const replaced = await trx.updateTable("status_link").set({ revoked_at: at, revoked_by: actor.id }).where("job_id", "=", jobId).where("revoked_at", "is", null).executeTakeFirst();
    const issued = await insertLink(trx, jobId, actor.id, at);
    const outboxId = options.emailContacts ? await queueLinkMessage(trx, { jobId, linkId: issued.id, requestedBy: actor.id, at }) : null;
    const turnedOff = Number(replaced.numUpdatedRows);
    await recordAudit(trx, {
      kind: "status_link_issued",
      actor,
      at,
      subject: `work order ${job.work_order}`,
      summary: `${actor.name} issued a new status link for work order ${job.work_order}${turnedOff ? `, turning off the ${turnedOff === 1 ? "one" : turnedOff} before it` : ""}${options.emailContacts ? `, e-mailed to ${recipients.length === 1 ? "1 contact" : `${recipients.length} contacts`}` : ""}.`,
      details: { jobId, linkId: issued.id, turnedOff, emailedTo: recipients.length },
    });
    return { ...issued, outboxId, recipients };
  });
  return { id: link.id, url: statusUrl(link.token), createdAt: at, emailedTo: link.recipients, outboxId: link.outboxId };
}

export async function revokeStatusLink(db: DB, actor: StaffUser, linkId: number) {
  const at = new Date().toISOString();
  const link = await db.selectFrom("status_link").innerJoin("job", "job.id", "status_link.job_id").select(["status_link.id", "status_link.job_id", "status_link.revoked_at", "job.work_order"]).where("status_link.id", "=", linkId).executeTakeFirst();
  if (!link) throw new ApiError("not_found", "That status link was not found.");
  if (!link.revoked_at) {
    await db.transaction().execute(async (trx) => {
      const off = await trx.updateTable("status_link").set({ revoked_at: at, revoked_by: actor.id }).where("id", "=", linkId).where("revoked_at", "is", null).executeTakeFirst();
      if (Number(off.numUpdatedRows) !== 1) return;
      await recordAudit(trx, { kind: "status_link_turned_off", actor, at, subject: `work order ${link.work_order}`, summary: `${actor.name} turned off the status link for work order ${link.work_order}.`, details: { jobId: link.job_id, linkId } });
    });
  }
  return { id: link.id, jobId: link.job_id, revokedAt: link.revoked_at ?? at };
}

/** The job's newest link that is not turned off and whose token can still be derived. */
export async function workingLink(trx: Trx, jobId: number): Promise<{ id: number; token: string } | null> {
  const live = await trx
    .selectFrom("status_link")
    .select(["id", "nonce", "token_hash"])
    .where("job_id", "=", jobId)
    .where("revoked_at", "is", null)
    .orderBy("id", "desc")
    .limit(1)
    .executeTakeFirst();
  const token = live ? tokenFor(live) : null;
  return live && token ? { id: live.id, token } : null;
}

/**
 * The link a first e-mail carries: the job's working link, else a new one issued by the
 * dispatcher (recorded hashed; the token goes only into the e-mail).
 */
export async function emailLinkFor(trx: Trx, jobId: number, at: string): Promise<{ id: number; token: string }> {
  return (await workingLink(trx, jobId)) ?? insertLink(trx, jobId, null, at);
}

/**
 * The link a retried e-mail carries: the one it was rendered with while that works; if the office
 * turned it off, the job's working link, or "turned_off" when there is none, because a link the
 * office ended is never replaced behind its back. A link whose token cannot be derived any more
 * (the secret changed) was not the office's doing and is replaced as for a first e-mail.
 */
export async function retryLinkFor(trx: Trx, jobId: number, linkId: number | null, at: string): Promise<{ id: number; token: string } | "turned_off"> {
  const link = linkId ? await trx.selectFrom("status_link").select(["id", "nonce", "token_hash", "revoked_at"]).where("id", "=", linkId).executeTakeFirst() : undefined;
  if (!link || link.revoked_at) return (await workingLink(trx, jobId)) ?? "turned_off";
  const token = tokenFor(link);
  return token ? { id: link.id, token } : emailLinkFor(trx, jobId, at);
}
