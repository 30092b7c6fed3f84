import "server-only";
import type { DB } from "@/db";
import { ApiError } from "@/server/http/errors";
import { findStaffForSignIn } from "@/server/staff/queries";
import { deviceKeyFor } from "./device";
import { lucia } from "./lucia";
import { hashPassword, verifyPassword } from "./password";
import { beginSignIn, slowedWords } from "./rate-limit";

let decoyHash: Promise<string> | undefined;

/**
 * Checks the password and opens a fresh session (a new id at every sign-in). The try is counted
 * before the slow hash and refunded when the password is right.
 */
export async function signIn(db: DB, email: string, password: string, address: string | null, deviceCookie: string | null = null, userAgent = "") {
  const staff = await findStaffForSignIn(db, email);
  const attempt = await beginSignIn(email, address, staff ? deviceKeyFor(deviceCookie, staff.id) : null);
  // Verify against a decoy when the account is unknown so timing does not reveal who works here.
  decoyHash ??= hashPassword("decoy-password-not-used");
  const ok = await verifyPassword(staff?.password_hash ?? (await decoyHash), password);
  if (!staff || !ok || !staff.active) {
    const slowed = slowedWords(attempt);
    throw new ApiError("invalid_credentials", `That e-mail and password do not match an active staff account.${slowed ? ` ${slowed}` : ""}`, slowed ? { remainingTries: attempt.remaining } : undefined);
  }
  await attempt.refund();
  const session = await lucia.createSession(staff.id, { userAgent });
  // A temporary password from the owner's reset signs in only to choose a new one.
  return { session, user: { id: staff.id, name: staff.name, role: staff.role, mustChangePassword: staff.must_change_password === 1 } };
}
