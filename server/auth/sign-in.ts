import "server-only";
import type { DB } from "@/db";
import { ApiError } from "@/server/http/errors";
import { findStaffForSignIn } from "@/server/staff/queries";
import { lucia } from "./lucia";
import { hashPassword, verifyPassword } from "./password";
import { checkSignInAllowed, clearFailedSignIns, recordFailedSignIn } from "./rate-limit";

let decoyHash: Promise<string> | undefined;

/** Checks the password and opens a fresh session (a new id at every sign-in). */
export async function signIn(db: DB, email: string, password: string, address: string, userAgent = "") {
  await checkSignInAllowed(email, address);
  const staff = await findStaffForSignIn(db, email);
  // Verify against a decoy when the account is unknown so timing does not reveal who works here.
  decoyHash ??= hashPassword("decoy-password-not-used");
  const ok = await verifyPassword(staff?.password_hash ?? (await decoyHash), password);
  if (!staff || !ok || !staff.active) {
    await recordFailedSignIn(email, address);
    throw new ApiError("invalid_credentials", "That e-mail and password do not match an active staff account.");
  }
  await clearFailedSignIns(email);
  const session = await lucia.createSession(staff.id, { userAgent });
  // A temporary password from the owner's reset signs in only to choose a new one.
  return { session, user: { id: staff.id, name: staff.name, role: staff.role, mustChangePassword: staff.must_change_password === 1 } };
}
