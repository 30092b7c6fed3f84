import "server-only";
import { RateLimiterMemory, RateLimiterRes } from "rate-limiter-flexible";
import { ApiError } from "@/server/http/errors";

/**
 * Failed sign-ins, kept in memory (Baywright runs as one server process per shop).
 *
 * - Per account: 5 tries in 15 minutes from devices that never signed in to it, then a 15-minute
 *   pause. A try is counted BEFORE the password is checked (consume, then refund on success), so
 *   thirty tries at once get five password checks, not thirty.
 * - Per account and device: a device that signed in to the account before (or is signed in now,
 *   changing its password) has its own 10 tries, so strangers' failures never keep the right
 *   person out.
 * - Per address: 20 tries in 15 minutes, only when the app is told it sits behind a proxy
 *   (TRUST_PROXY_HOPS); otherwise the address is whatever the client wrote and is not used.
 */
const perAccount = new RateLimiterMemory({ keyPrefix: "signin_account", points: 5, duration: 15 * 60, blockDuration: 15 * 60 });
const perDevice = new RateLimiterMemory({ keyPrefix: "signin_device", points: 10, duration: 15 * 60, blockDuration: 15 * 60 });
const perAddress = new RateLimiterMemory({ keyPrefix: "signin_address", points: 20, duration: 15 * 60, blockDuration: 15 * 60 });

const SLOW_AFTER = 2;
const SLOW_STEP_MS = 300;

function refused(msBeforeNext: number): ApiError {
  const seconds = Math.max(1, Math.ceil(msBeforeNext / 1000));
  const minutes = Math.ceil(seconds / 60);
  return new ApiError(
    "rate_limited",
    `Too many failed sign-ins. Wait ${minutes} minute${minutes === 1 ? "" : "s"} and try again, or ask the owner to reset the password. A device that has signed in to this account before can still sign in.`,
    { retryAfterSeconds: seconds },
    { "Retry-After": String(seconds) },
  );
}

export interface SignInTry {
  /** Failed tries already counted against this account from this kind of device, before this one. */
  earlierFailures: number;
  /** Tries left before the pause, this one included. */
  remaining: number;
  refund(): Promise<void>;
}

async function take(limiter: RateLimiterMemory, key: string): Promise<RateLimiterRes> {
  try {
    return await limiter.consume(key, 1);
  } catch (res) {
    if (res instanceof RateLimiterRes) throw refused(res.msBeforeNext);
    throw res;
  }
}

/**
 * Counts one try before the password is checked, and waits a little longer after each failure.
 * Throws 429 when the allowance is used up. `deviceKey`: set when this device signed in to the
 * account before (or is signed in now); it then has its own allowance.
 */
export async function beginSignIn(account: string, address: string | null, deviceKey: string | null): Promise<SignInTry> {
  const knownDevice = deviceKey !== null;
  const accountKey = knownDevice ? `${account.trim().toLowerCase()}:${deviceKey}` : account.trim().toLowerCase();
  const limiter = knownDevice ? perDevice : perAccount;
  const taken: [RateLimiterMemory, string][] = [];
  const refund = async () => {
    await Promise.all(taken.map(([l, k]) => l.reward(k, 1)));
  };
  if (address && !knownDevice) {
    await take(perAddress, address);
    taken.push([perAddress, address]);
  }
  let res: RateLimiterRes;
  try {
    res = await take(limiter, accountKey);
  } catch (err) {
    await refund();
    throw err;
  }
  taken.push([limiter, accountKey]);
  const earlierFailures = res.consumedPoints - 1;
  if (earlierFailures > SLOW_AFTER) await new Promise((r) => setTimeout(r, Math.min(2000, (earlierFailures - SLOW_AFTER) * SLOW_STEP_MS)));
  return { earlierFailures, remaining: res.remainingPoints, refund };
}

/** Words for a failed try once sign-ins for the account are being slowed. */
export function slowedWords(t: SignInTry): string | null {
  if (t.earlierFailures + 1 <= SLOW_AFTER) return null;
  return t.remaining > 0
    ? `After several wrong passwords each try waits a little longer; ${t.remaining} more ${t.remaining === 1 ? "try" : "tries"} before sign-in pauses for 15 minutes.`
    : "That was the last try: sign-in for this account now pauses for 15 minutes, except on devices that signed in to it before.";
}

/** How many proxies in front of the app add to X-Forwarded-For (TRUST_PROXY_HOPS); 0 when unset. */
export function trustedProxyHops(): number {
  const n = Number(process.env.TRUST_PROXY_HOPS ?? "0");
  return Number.isInteger(n) && n > 0 && n < 10 ? n : 0;
}

/**
 * The client's address, or null when the app cannot know it. Behind N trusted proxies it is the
 * Nth entry from the right of X-Forwarded-For (entries further left were written by the client and
 * prove nothing). Without the setting, no header is believed.
 */
export function clientAddress(req: Request): string | null {
  const hops = trustedProxyHops();
  if (hops === 0) return null;
  const list = (req.headers.get("x-forwarded-for") ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  return list.length >= hops ? list[list.length - hops] : null;
}
