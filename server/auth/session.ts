import "server-only";
import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";
import type { Role } from "@/db/schema";
import { ApiError } from "@/server/http/errors";
import { SESSION_COOKIE, lucia } from "./lucia";
import { clientAddress } from "./rate-limit";

export interface StaffUser {
  id: string;
  name: string;
  email: string;
  role: Role;
  /** Where the request came from (route handlers behind a trusted proxy only), for the audit trail. */
  address?: string | null;
  /** Set by the owner's reset: until they choose their own password they may only do that. */
  mustChangePassword?: boolean;
}

/** Where someone holding a temporary password is sent, and the only place they may use. */
export const ACCOUNT_PATH = "/account";

type Access = { forPasswordChange?: boolean };

function readCookie(header: string | null, name: string): string | null {
  if (!header) return null;
  for (const part of header.split(";")) {
    const [k, ...v] = part.trim().split("=");
    if (k === name) return decodeURIComponent(v.join("="));
  }
  return null;
}

async function validate(sessionId: string | null) {
  if (!sessionId) return null;
  const { session, user } = await lucia.validateSession(sessionId);
  if (!session || !user) return null;
  return {
    sessionId: session.id,
    user: { id: user.id, name: user.name, email: user.email, role: user.role, mustChangePassword: user.mustChangePassword } as StaffUser,
  };
}

/** The signed-in staff member behind a route handler's request, read from its own cookie header. */
export async function sessionFromRequest(req: Request) {
  return validate(readCookie(req.headers.get("cookie"), SESSION_COOKIE));
}

/**
 * Every route handler calls this itself: the proxy only redirects, it never decides access.
 * With no roles given, any active staff member passes.
 */
export async function requireStaff(req: Request, roles?: readonly Role[], access: Access = {}): Promise<StaffUser> {
  const found = await sessionFromRequest(req);
  if (!found) throw new ApiError("unauthenticated", "Sign in first.");
  assertPasswordChosen(found.user, access);
  assertRole(found.user, roles);
  return { ...found.user, address: clientAddress(req) };
}

/** Like requireStaff, with the session id too (the account routes keep this device signed in). */
export async function requireStaffSession(req: Request, access: Access = {}) {
  const found = await sessionFromRequest(req);
  if (!found) throw new ApiError("unauthenticated", "Sign in first.");
  assertPasswordChosen(found.user, access);
  return found;
}

function assertPasswordChosen(user: StaffUser, access: Access) {
  if (user.mustChangePassword && !access.forPasswordChange) {
    throw new ApiError("forbidden", `You are signed in with a temporary password: choose your own password on ${ACCOUNT_PATH} first.`);
  }
}

export function assertRole(user: StaffUser, roles?: readonly Role[]) {
  if (roles && !roles.includes(user.role)) {
    throw new ApiError("forbidden", `This needs the ${roles.join(" or ")} role; you are signed in as ${user.role}.`);
  }
}

/** For server components: the session, read once per request. Never refreshes the cookie while rendering. */
export const currentStaff = cache(async (): Promise<StaffUser | null> => {
  const jar = await cookies();
  const found = await validate(jar.get(SESSION_COOKIE)?.value ?? null);
  return found?.user ?? null;
});

export async function requirePageStaff(roles?: readonly Role[], access: Access = {}): Promise<StaffUser> {
  const user = await currentStaff();
  if (!user) redirect("/sign-in");
  if (user.mustChangePassword && !access.forPasswordChange) redirect(ACCOUNT_PATH);
  if (roles && !roles.includes(user.role)) redirect("/board?denied=1");
  return user;
}

export { readCookie };
