import "server-only";
import type { DB } from "@/db";
import { ApiError } from "@/server/http/errors";
import { findStaffForSignIn } from "@/server/staff/queries";
import { recordAudit } from "./record";

// A refused sign-in is noted once per e-mail and address per quarter hour: a script hammering
// the form must not fill the trail with the same line.
const REFUSAL_NOTE_MS = 15 * 60_000;
const refusalsNoted = new Map<string, number>();

function firstRefusalInWindow(key: string, now: number): boolean {
  const last = refusalsNoted.get(key);
  if (last !== undefined && now - last < REFUSAL_NOTE_MS) return false;
  if (refusalsNoted.size > 10_000) refusalsNoted.clear();
  refusalsNoted.set(key, now);
  return true;
}

export async function auditSignedIn(db: DB, user: { id: string; name: string }, address: string | null) {
  await recordAudit(db, { kind: "sign_in", actor: user, address, subject: user.name, summary: `${user.name} signed in.` });
}

/** Notes a refused sign-in (wrong password, unknown e-mail, deactivated account, too many tries). */
export async function auditSignInRefused(db: DB, err: unknown, email: string, address: string | null) {
  if (!(err instanceof ApiError) || (err.code !== "invalid_credentials" && err.code !== "rate_limited")) return;
  const typed = email.trim().toLowerCase().slice(0, 200);
  if (err.code === "rate_limited" && !firstRefusalInWindow(`${typed}\n${address}`, Date.now())) return;
  const staff = await findStaffForSignIn(db, typed);
  const whose = staff ? `${staff.name}'s account (${typed})` : `${typed}, which is no staff account`;
  if (err.code === "rate_limited") {
    await recordAudit(db, { kind: "sign_in_refused", actor: null, address, subject: typed, summary: `Sign-in refused after too many failed tries, for ${whose}.` });
  } else {
    const why = !staff ? "" : !staff.active ? " The account is deactivated." : " Wrong password.";
    await recordAudit(db, { kind: "sign_in_failed", actor: null, address, subject: typed, summary: `Failed sign-in for ${whose}.${why}` });
  }
}
