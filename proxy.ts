import { type NextRequest, NextResponse } from "next/server";
import { CROSS_SITE_MESSAGE, writeOrigin } from "@/server/http/origin";
import { contentSecurityPolicy, pathDecodes, securityHeaders } from "@/server/http/security-headers";

const SIGNED_IN_AREAS = ["/board", "/jobs", "/customers", "/trucks", "/coating", "/calculator", "/staff", "/account", "/settings", "/audit", "/reports", "/parts", "/purchase-orders", "/hours", "/job-costs", "/prices"];

/**
 * Runs before every page, route handler and server action:
 * - a path that does not decode is a 400 here (it cannot name anything);
 * - a server action (a POST carrying `Next-Action`) gets the same origin rule as route handlers;
 * - every answer gets the security headers, and pages a Content-Security-Policy with a fresh nonce;
 * - people without a session cookie are sent to sign in (a convenience only: access is decided
 *   in each page, route handler and server action, which check the session themselves).
 */
export function proxy(req: NextRequest) {
  const { pathname } = req.nextUrl;
  const headers = securityHeaders(pathname);
  const refuse = (status: number, code: string, message: string) => NextResponse.json({ error: { code, message } }, { status, headers: { ...headers, "Cache-Control": "no-store" } });

  if (!pathDecodes(rawPathOf(req))) return refuse(400, "validation", "That address has a broken %-escape in it. Check the link.");
  if (req.method === "POST" && req.headers.has("next-action") && writeOrigin(req.headers) !== "same-origin") {
    return refuse(403, "cross_site", CROSS_SITE_MESSAGE);
  }

  // "/" is the office's overview: signed in only, like the areas.
  if ((pathname === "/" || SIGNED_IN_AREAS.some((p) => pathname === p || pathname.startsWith(`${p}/`))) && !req.cookies.has("bw_session")) {
    const url = req.nextUrl.clone();
    url.pathname = "/sign-in";
    url.search = "";
    return withHeaders(NextResponse.redirect(url), headers);
  }

  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
  const csp = contentSecurityPolicy(nonce);
  const forward = new Headers(req.headers);
  // Next reads the policy from the request to put the nonce on the scripts it writes into the page.
  forward.set("x-nonce", nonce);
  forward.set("Content-Security-Policy", csp);
  const res = NextResponse.next({ request: { headers: forward } });
  res.headers.set("Content-Security-Policy", csp);
  return withHeaders(res, headers);
}

/** The path as the client sent it, before any decoding. */
function rawPathOf(req: NextRequest): string {
  const afterHost = req.url.replace(/^[a-z]+:\/\/[^/]*/i, "");
  return afterHost.split(/[?#]/)[0];
}

function withHeaders(res: NextResponse, headers: Record<string, string>) {
  for (const [k, v] of Object.entries(headers)) res.headers.set(k, v);
  return res;
}

export const config = {
  // Everything but the build's static files.
  matcher: ["/((?!_next/static|_next/image|favicon.ico).*)"],
};
