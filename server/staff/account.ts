import "server-only";
import { randomInt } from "node:crypto";
import type { DB } from "@/db";
import { hashSessionId } from "@/server/auth/lucia";
import { hashPassword, verifyPassword } from "@/server/auth/password";
import { beginSignIn } from "@/server/auth/rate-limit";
import type { StaffUser } from "@/server/auth/session";
import { recordAudit } from "@/server/audit/record";
import { ApiError, notFound } from "@/server/http/errors";
import { deviceName } from "./devices";
import type { passwordChangeSchema } from "./schemas";
import type { z } from "zod";

function fieldError(field: string, message: string) {
  return new ApiError("validation", message, { fields: { [field]: [message] } });
}

/**
 * A staff member chooses a new password. The current one is checked (and guesses count against
 * the same limits as sign-in, so a borrowed signed-in phone cannot be used to find it out); every
 * other signed-in device of theirs is signed out and this one stays signed in.
 */
export async function changeOwnPassword(db: DB, user: StaffUser, sessionId: string, input: z.infer<typeof passwordChangeSchema>, address: string | null) {
  if (input.newPassword !== input.confirmPassword) throw fieldError("confirmPassword", "The two new passwords differ; type the same new password twice.");
  // Counted before the hash like a sign-in; this signed-in device has its own allowance.
  const attempt = await beginSignIn(user.email, address, `session-${hashSessionId(sessionId)}`);
  const row = await db.selectFrom("staff").select("password_hash").where("id", "=", user.id).executeTakeFirstOrThrow();
  if (!(await verifyPassword(row.password_hash, input.currentPassword))) {
    throw fieldError("currentPassword", "The current password is not right. Type the password you signed in with.");
  }
  await attempt.refund();
  if (input.newPassword === input.currentPassword) throw fieldError("newPassword", "Choose a new password that differs from the current one.");
  // Hash outside the transaction: argon2 is slow and SQLite has one connection.
  const passwordHash = await hashPassword(input.newPassword);
  const signedOut = await db.transaction().execute(async (trx) => {
    await trx.updateTable("staff").set({ password_hash: passwordHash, must_change_password: 0 }).where("id", "=", user.id).execute();
    const others = await trx.deleteFrom("session").where("staff_id", "=", user.id).where("id", "!=", hashSessionId(sessionId)).executeTakeFirst();
    const count = Number(others.numDeletedRows);
    await recordAudit(trx, {
      kind: "password_changed",
      actor: user,
      address,
      subject: user.name,
      summary: `${user.name} changed their own password${count ? `; ${count === 1 ? "1 other signed-in device was" : `${count} other signed-in devices were`} signed out` : ""}.`,
      details: { staffId: user.id, otherDevicesSignedOut: count },
    });
    return count;
  });
  return { otherDevicesSignedOut: signedOut };
}

// No 0/O or 1/l/I: the owner may read the password out over the phone.
const TEMP_ALPHABET = "abcdefghjkmnpqrstuvwxyz23456789";

/** Four groups of four: about 79 bits, far beyond guessing at the sign-in limits, and easy to read out. */
export function temporaryPassword(): string {
  const groups = Array.from({ length: 4 }, () => Array.from({ length: 4 }, () => TEMP_ALPHABET[randomInt(TEMP_ALPHABET.length)]).join(""));
  return groups.join("-");
}

/**
 * The owner resets someone else's password: a temporary one is made, shown once to the owner, and
 * its holder must choose their own at next sign-in. Every signed-in device of theirs is signed out.
 */
export async function resetStaffPassword(db: DB, owner: StaffUser, staffId: string) {
  if (staffId === owner.id) {
    throw new ApiError("conflict", "Change your own password on the Account page; a reset is for someone else's.");
  }
  const person = await db.selectFrom("staff").select(["id", "name", "active"]).where("id", "=", staffId).executeTakeFirst();
  if (!person) throw notFound("That staff member");
  if (!person.active) throw new ApiError("conflict", `${person.name} is deactivated; reactivate them before resetting their password.`);
  const password = temporaryPassword();
  const passwordHash = await hashPassword(password);
  await db.transaction().execute(async (trx) => {
    await trx.updateTable("staff").set({ password_hash: passwordHash, must_change_password: 1 }).where("id", "=", staffId).execute();
    await trx.deleteFrom("session").where("staff_id", "=", staffId).execute();
    await recordAudit(trx, {
      kind: "password_reset",
      actor: owner,
      subject: person.name,
      summary: `${owner.name} reset ${person.name}'s password to a temporary one; their signed-in devices were signed out.`,
      details: { staffId },
    });
  });
  return { name: person.name, temporaryPassword: password };
}

export interface SignedInDevice {
  /** The stored hash of the device's session: names it without being usable to sign in. */
  id: string;
  device: string;
  signedInAt: string;
  expiresAt: string;
  current: boolean;
}

export async function listDevices(db: DB, staffId: string, sessionId: string): Promise<SignedInDevice[]> {
  const here = hashSessionId(sessionId);
  const now = Math.floor(Date.now() / 1000);
  const rows = await db
    .selectFrom("session")
    .select(["id", "user_agent", "created_at", "expires_at"])
    .where("staff_id", "=", staffId)
    .where("expires_at", ">", now)
    .orderBy("created_at", "desc")
    .execute();
  return rows
    .map((r) => ({ id: r.id, device: deviceName(r.user_agent), signedInAt: r.created_at, expiresAt: new Date(r.expires_at * 1000).toISOString(), current: r.id === here }))
    .sort((a, b) => Number(b.current) - Number(a.current));
}

/** Signs out one of the person's own devices; another person's device is "not found", never theirs to touch. */
export async function signOutDevice(db: DB, staffId: string, deviceId: string) {
  const gone = await db.deleteFrom("session").where("staff_id", "=", staffId).where("id", "=", deviceId).executeTakeFirst();
  if (Number(gone.numDeletedRows) === 0) throw notFound("That signed-in device");
}

export async function signOutOtherDevices(db: DB, staffId: string, sessionId: string) {
  const gone = await db.deleteFrom("session").where("staff_id", "=", staffId).where("id", "!=", hashSessionId(sessionId)).executeTakeFirst();
  return Number(gone.numDeletedRows);
}
