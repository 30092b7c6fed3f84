/**
 * The app's own origin and the rule for writes. No `server-only` here: the proxy (middleware)
 * imports it too.
 *
 * The origin comes from APP_URL (the address staff and customers open), or
 * `http://localhost:$PORT` when it is unset. It is never taken from the request's Host or
 * X-Forwarded-Host: those are whatever the sender wrote.
 */
export function appOrigin(): string {
  const raw = process.env.APP_URL?.trim();
  if (raw) {
    try {
      return new URL(raw).origin;
    } catch {
      // A malformed APP_URL falls back to the local default; the e-mail settings check reports it.
    }
  }
  return `http://localhost:${process.env.PORT || "3000"}`;
}

export type OriginVerdict = "same-origin" | "cross-site" | "no-origin";

/**
 * A write is same-origin when its Origin is exactly the app's origin (scheme, host and port), or,
 * when a browser sent no Origin, when it says `Sec-Fetch-Site: same-origin`. Anything else,
 * including no Origin at all from a script, is refused: browsers always send one on writes.
 */
export function writeOrigin(headers: Headers): OriginVerdict {
  const site = headers.get("sec-fetch-site");
  if (site && site !== "same-origin") return "cross-site";
  const origin = headers.get("origin");
  if (origin === null) return site === "same-origin" ? "same-origin" : "no-origin";
  let parsed: string;
  try {
    parsed = new URL(origin).origin;
  } catch {
    return "cross-site";
  }
  return parsed === appOrigin() ? "same-origin" : "cross-site";
}

export const CROSS_SITE_MESSAGE = "Requests from other sites are refused. Use Baywright from its own address.";
export const NO_ORIGIN_MESSAGE = `Writes must come from Baywright's own pages: send an Origin header of ${"`"}APP_URL${"`"} (the shop's address).`;
