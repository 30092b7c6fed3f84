import "server-only";
import { createHmac, timingSafeEqual } from "node:crypto";
import { derivedKey } from "@/server/status/tokens";

/**
 * A device that has signed in to an account before carries a signed cookie naming that account.
 * Failed sign-ins by others lock the account for new devices, never for this one (it has its own,
 * smaller allowance), so a stranger guessing at the owner's e-mail cannot keep the owner out.
 */
export const DEVICE_COOKIE = "bw_device";
const DEVICE_DAYS = 180;

function sign(payload: string) {
  return createHmac("sha256", derivedKey("device-cookie")).update(payload).digest("base64url");
}

/** Value: `<staffId>.<issued unix seconds>.<signature>`; several accounts on one device are joined by `~`. */
export function deviceCookieValue(staffId: string, existing: string | null, now = Date.now()): string {
  const issued = Math.floor(now / 1000);
  const entry = `${staffId}.${issued}`;
  const others = (existing ?? "")
    .split("~")
    .filter((e) => e && !e.startsWith(`${staffId}.`) && verifiedEntry(e, now))
    .slice(-3);
  return [...others, `${entry}.${sign(entry)}`].join("~");
}

function verifiedEntry(entry: string, now: number): string | null {
  const parts = entry.split(".");
  if (parts.length !== 3) return null;
  const [staffId, issued, signature] = parts;
  const expected = Buffer.from(sign(`${staffId}.${issued}`));
  const given = Buffer.from(signature);
  if (expected.length !== given.length || !timingSafeEqual(expected, given)) return null;
  if (now / 1000 - Number(issued) > DEVICE_DAYS * 86400) return null;
  return staffId;
}

/**
 * This device's key for the account, when it has signed in to it before (verified signature), or
 * null. The key is the entry's signature: each device has its own allowance of tries.
 */
export function deviceKeyFor(cookieValue: string | null, staffId: string, now = Date.now()): string | null {
  for (const entry of (cookieValue ?? "").split("~")) {
    if (entry && verifiedEntry(entry, now) === staffId) return entry.split(".")[2];
  }
  return null;
}

export function deviceCookieHeader(value: string): string {
  const secure = process.env.NODE_ENV === "production" && process.env.INSECURE_COOKIES !== "1";
  return `${DEVICE_COOKIE}=${value}; Path=/api/session; Max-Age=${DEVICE_DAYS * 86400}; HttpOnly; SameSite=Lax${secure ? "; Secure" : ""}`;
}
