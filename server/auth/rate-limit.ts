import "server-only";
import { RateLimiterMemory, RateLimiterRes } from "rate-limiter-flexible";
import { ApiError } from "@/server/http/errors";

/**
 * Failed sign-ins: after a few for one account or one address each new try is slowed, then
 * refused for a while. Kept in memory: Baywright runs as one server process per shop.
 */
const perAccount = new RateLimiterMemory({ keyPrefix: "signin_account", points: 5, duration: 15 * 60, blockDuration: 15 * 60 });
const perAddress = new RateLimiterMemory({ keyPrefix: "signin_address", points: 20, duration: 15 * 60, blockDuration: 15 * 60 });

const SLOW_AFTER = 2;
const SLOW_STEP_MS = 300;

function refused(res: RateLimiterRes): ApiError {
  const seconds = Math.max(1, Math.ceil(res.msBeforeNext / 1000));
  const minutes = Math.ceil(seconds / 60);
  return new ApiError(
    "rate_limited",
    `Too many failed sign-ins. Wait ${minutes} minute${minutes === 1 ? "" : "s"} and try again, or ask the owner to reset the password.`,
    { retryAfterSeconds: seconds },
    { "Retry-After": String(seconds) },
  );
}

export async function checkSignInAllowed(account: string, address: string) {
  const [a, b] = await Promise.all([perAccount.get(account), perAddress.get(address)]);
  for (const res of [a, b]) {
    if (res && res.remainingPoints <= 0) throw refused(res);
  }
  const failures = Math.max(a?.consumedPoints ?? 0, b ? Math.floor(b.consumedPoints / 4) : 0);
  if (failures > SLOW_AFTER) {
    await new Promise((r) => setTimeout(r, Math.min(2000, (failures - SLOW_AFTER) * SLOW_STEP_MS)));
  }
}

export async function recordFailedSignIn(account: string, address: string) {
  await Promise.all([perAccount.penalty(account, 1), perAddress.penalty(address, 1)]);
}

export async function clearFailedSignIns(account: string) {
  await perAccount.delete(account);
}

export function clientAddress(req: Request) {
  return req.headers.get("x-forwarded-for")?.split(",")[0]?.trim() || req.headers.get("x-real-ip") || "local";
}
