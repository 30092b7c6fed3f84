import "server-only";
import type { DB } from "@/db";
import type { AuditKind } from "@/db/tables/audit";

export interface AuditActor {
  id: string;
  name: string;
  /** Where the request came from, as `requireStaff` read it (null when the app cannot know). */
  address?: string | null;
}

export interface AuditEntry {
  kind: AuditKind;
  actor: AuditActor | null;
  /** For entries without a signed-in actor (a failed sign-in), or to override the actor's. */
  address?: string | null;
  /** Who or what it concerns: a staff member, a work order, the e-mail typed at sign-in. */
  subject?: string;
  /** What happened, in a sentence the owner reads. */
  summary: string;
  details?: Record<string, unknown>;
  at?: string;
}

const clip = (text: string, max: number) => (text.length > max ? `${text.slice(0, max - 1)}…` : text);

/**
 * Adds a line to the audit trail. Call it with the transaction that makes the change, so the
 * change and its line are kept or lost together.
 */
export async function recordAudit(trx: DB, entry: AuditEntry): Promise<void> {
  await trx
    .insertInto("audit_event")
    .values({
      at: entry.at ?? new Date().toISOString(),
      kind: entry.kind,
      actor_id: entry.actor?.id ?? null,
      actor_name: clip(entry.actor?.name ?? "", 200),
      address: clip(entry.address ?? entry.actor?.address ?? "", 100),
      subject: clip(entry.subject ?? "", 200),
      summary: clip(entry.summary, 2000),
      details: entry.details ? JSON.stringify(entry.details) : null,
    })
    .execute();
}
