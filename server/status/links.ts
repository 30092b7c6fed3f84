import "server-only";
import type { Transaction } from "kysely";
import type { DB } from "@/db";
import type { Database } from "@/db/schema";
import type { StaffUser } from "@/server/auth/session";
import { notifySettings } from "@/server/email/settings";
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
export async function issueStatusLink(db: DB, actor: StaffUser, jobId: number) {
  const at = new Date().toISOString();
  const link = await db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select("id").where("id", "=", jobId).executeTakeFirst();
    if (!job) throw new ApiError("not_found", "That job was not found.");
    await trx.updateTable("status_link").set({ revoked_at: at, revoked_by: actor.id }).where("job_id", "=", jobId).where("revoked_at", "is", null).execute();
    return insertLink(trx, jobId, actor.id, at);
  });
  return { id: link.id, url: statusUrl(link.token), createdAt: at };
}

export async function revokeStatusLink(db: DB, actor: StaffUser, linkId: number) {
  const at = new Date().toISOString();
  const link = await db.selectFrom("status_link").select(["id", "job_id", "revoked_at"]).where("id", "=", linkId).executeTakeFirst();
  if (!link) throw new ApiError("not_found", "That status link was not found.");
  if (!link.revoked_at) {
    await db.updateTable("status_link").set({ revoked_at: at, revoked_by: actor.id }).where("id", "=", linkId).where("revoked_at", "is", null).execute();
  }
  return { id: link.id, jobId: link.job_id, revokedAt: link.revoked_at ?? at };
}

/**
 * The link an e-mail carries: the job's live link if its token can still be derived, else a new
 * one issued by the dispatcher (recorded hashed; the token goes only into the e-mail).
 */
export async function emailLinkFor(trx: Trx, jobId: number, at: string): Promise<{ id: number; token: string }> {
  const live = await trx
    .selectFrom("status_link")
    .select(["id", "nonce", "token_hash"])
    .where("job_id", "=", jobId)
    .where("revoked_at", "is", null)
    .orderBy("id", "desc")
    .limit(1)
    .executeTakeFirst();
  const token = live ? tokenFor(live) : null;
  if (live && token) return { id: live.id, token };
  return insertLink(trx, jobId, null, at);
}

/** The token of a link chosen earlier, if it still works and can be derived. */
export async function liveLinkToken(trx: Trx | DB, linkId: number): Promise<string | null> {
  const link = await trx.selectFrom("status_link").select(["nonce", "token_hash", "revoked_at"]).where("id", "=", linkId).executeTakeFirst();
  if (!link || link.revoked_at) return null;
  return tokenFor(link);
}
