import "server-only";
import { randomUUID } from "node:crypto";
import type { z } from "zod";
import type { DB } from "@/db";
import { hashPassword } from "@/server/auth/password";
import { ApiError } from "@/server/http/errors";
import { type AuditActor, recordAudit } from "@/server/audit/record";
import { findStaff } from "./queries";
import type { firstRunSchema, newStaffSchema, staffPatchSchema } from "./schemas";

async function assertEmailFree(db: DB, email: string, exceptId?: string) {
  const taken = await db.selectFrom("staff").select("id").where("email", "=", email).executeTakeFirst();
  if (taken && taken.id !== exceptId) {
    throw new ApiError("conflict", "Someone on the staff already uses that e-mail.", { fields: { email: ["Someone on the staff already uses that e-mail."] } });
  }
}

const ROLE_WORDS = { owner: "owner", office: "office", tech: "tech" } as const;

export async function createStaff(db: DB, actor: AuditActor, input: z.infer<typeof newStaffSchema>) {
  await assertEmailFree(db, input.email);
  // Hash outside any transaction: argon2 is slow and SQLite has one connection.
  const password_hash = await hashPassword(input.password);
  const id = randomUUID();
  await db.transaction().execute(async (trx) => {
    await trx
      .insertInto("staff")
      .values({ id, name: input.name, email: input.email, role: input.role, password_hash, active: 1, created_at: new Date().toISOString() })
      .execute();
    await recordAudit(trx, { kind: "staff_added", actor, subject: input.name, summary: `${actor.name} added ${input.name} (${input.email}) as ${ROLE_WORDS[input.role]}.`, details: { staffId: id, role: input.role } });
  });
  return (await findStaff(db, id))!;
}

export async function updateStaff(db: DB, actor: AuditActor, id: string, patch: z.infer<typeof staffPatchSchema>) {
  const actorId = actor.id;
  const existing = await findStaff(db, id);
  if (!existing) throw new ApiError("not_found", "That staff member was not found.");
  if (id === actorId && (patch.active === false || (patch.role && patch.role !== "owner"))) {
    throw new ApiError("conflict", "You cannot demote or deactivate yourself; ask another owner.");
  }
  await db.transaction().execute(async (trx) => {
    if ((patch.active === false || (patch.role && patch.role !== "owner")) && existing.role === "owner") {
      const owners = await trx.selectFrom("staff").select("id").where("role", "=", "owner").where("active", "=", 1).where("id", "!=", id).execute();
      if (owners.length === 0) throw new ApiError("conflict", "The shop needs at least one active owner.");
    }
    await trx
      .updateTable("staff")
      .set({
        ...(patch.name !== undefined ? { name: patch.name } : {}),
        ...(patch.role !== undefined ? { role: patch.role } : {}),
        ...(patch.active !== undefined ? { active: patch.active ? 1 : 0 } : {}),
      })
      .where("id", "=", id)
      .execute();
    // A deactivated member or a new role ends every session of theirs at once.
    if (patch.active === false || patch.role !== undefined) {
      await trx.deleteFrom("session").where("staff_id", "=", id).execute();
    }
    await auditStaffChange(trx, actor, existing, patch);
  });
  return (await findStaff(db, id))!;
}

export async function createFirstOwner(db: DB, input: z.infer<typeof firstRunSchema>, address: string | null = null) {
  const password_hash = await hashPassword(input.password);
  const id = randomUUID();
  await db.transaction().execute(async (trx) => {
    const any = await trx.selectFrom("staff").select("id").limit(1).executeTakeFirst();
    if (any) throw new ApiError("conflict", "This shop is already set up. Sign in instead.");
    await trx
      .insertInto("staff")
      .values({ id, name: input.name, email: input.email, role: "owner", password_hash, active: 1, created_at: new Date().toISOString() })
      .execute();
    await trx
      .insertInto("shop")
      .values({ id: 1, name: input.shopName, phone: input.shopPhone })
      .onConflict((oc) => oc.column("id").doUpdateSet({ name: input.shopName, phone: input.shopPhone }))
      .execute();
    await recordAudit(trx, { kind: "staff_added", actor: { id, name: input.name }, address, subject: input.name, summary: `${input.name} (${input.email}) set up the shop and became its first owner.`, details: { staffId: id, role: "owner" } });
  });
  return id;
}

/** One line for what changed: name, role, active. */
async function auditStaffChange(trx: DB, actor: AuditActor, before: { id: string; name: string; role: keyof typeof ROLE_WORDS; active: number }, patch: z.infer<typeof staffPatchSchema>) {
  const changes: string[] = [];
  const details: Record<string, unknown> = { staffId: before.id };
  if (patch.name !== undefined && patch.name !== before.name) {
    changes.push(`renamed to ${patch.name}`);
    details.name = [before.name, patch.name];
  }
  if (patch.role !== undefined && patch.role !== before.role) {
    changes.push(`role ${ROLE_WORDS[before.role]} → ${ROLE_WORDS[patch.role]}`);
    details.role = [before.role, patch.role];
  }
  if (patch.active !== undefined && patch.active !== (before.active === 1)) {
    changes.push(patch.active ? "reactivated" : "deactivated");
    details.active = [before.active === 1, patch.active];
  }
  if (changes.length) await recordAudit(trx, { kind: "staff_changed", actor, subject: before.name, summary: `${actor.name} changed ${before.name}: ${changes.join(", ")}.`, details });
}
