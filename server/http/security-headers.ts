/**
 * The security headers every answer carries, and the page's Content-Security-Policy. No
 * `server-only`: the proxy (middleware) builds them for each request.
 */
import { appOrigin } from "./origin";

/** Where the browser may send photo uploads: the upload service's ingest host, from the environment. */
export function uploadConnectSources(): string[] {
  const ingest = process.env.UPLOADTHING_INGEST_URL?.trim();
  if (ingest) {
    try {
      return [new URL(ingest).origin];
    } catch {
      return [];
    }
  }
  // The hosted service: its regional ingest hosts.
  return ["https://*.ingest.uploadthing.com"];
}

/**
 * Scripts run only with this response's nonce (Next puts it on its own inline scripts when it
 * finds the policy on the request); 'strict-dynamic' lets those scripts load the app's chunks.
 * Styles allow inline attributes: React and the drag-and-drop library position cards with them,
 * and a style cannot run code.
 */
export function contentSecurityPolicy(nonce: string, dev = process.env.NODE_ENV === "development"): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    `connect-src 'self' ${uploadConnectSources().join(" ")}${dev ? " ws: wss:" : ""}`.trim(),
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

/** Headers for every answer, pages and API alike. HSTS only when the shop serves Baywright over HTTPS. */
export function securityHeaders(pathname: string): Record<string, string> {
  const out: Record<string, string> = {
    "X-Content-Type-Options": "nosniff",
    "X-Frame-Options": "DENY",
    // A status link is a secret in the URL: it must never leave in a Referer.
    "Referrer-Policy": pathname.startsWith("/status/") ? "no-referrer" : "same-origin",
  };
  if (appOrigin().startsWith("https:")) out["Strict-Transport-Security"] = "max-age=31536000";
  return out;
}

/** True when every segment of a raw path decodes: `/api/jobs/%` and `/status/%E0%A4%A` do not. */
export function pathDecodes(rawPath: string): boolean {
  try {
    for (const segment of rawPath.split("/")) decodeURIComponent(segment);
    return true;
  } catch {
    return false;
  }
}
