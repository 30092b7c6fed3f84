import { type NextRequest, NextResponse } from "next/server";

/**
 * Only a convenience: sends people without a session cookie to the sign-in page. Access is
 * decided in each page, route handler and server action, which check the session themselves.
 */
export function proxy(req: NextRequest) {
  if (!req.cookies.has("bw_session")) {
    const url = req.nextUrl.clone();
    url.pathname = "/sign-in";
    url.search = "";
    return NextResponse.redirect(url);
  }
  return NextResponse.next();
}

export const config = {
  matcher: ["/board/:path*", "/jobs/:path*", "/customers/:path*", "/trucks/:path*", "/coating/:path*", "/calculator/:path*", "/staff/:path*", "/account/:path*"],
};
