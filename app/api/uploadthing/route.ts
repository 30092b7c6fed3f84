import { createRouteHandler } from "uploadthing/next";
import type { NextRequest } from "next/server";
import { requireStaff } from "@/server/auth/session";
import { assertSameOrigin, respond } from "@/server/http/respond";
import { photoRouter } from "@/server/photos/router";

const handler = createRouteHandler({
  router: photoRouter,
  config: { logLevel: process.env.UPLOADTHING_LOG_LEVEL === undefined ? "Warning" : undefined },
});

/** The upload route's description, for the uploader in the browser: staff only like every route. */
export async function GET(req: NextRequest) {
  return respond(async () => {
    await requireStaff(req);
    return handler.GET(req);
  });
}

/**
 * Two callers: a signed-in browser asking to upload (session and same-site checked here, role
 * and files in the file route's middleware), and the upload service reporting a finished file,
 * which carries no cookie and is trusted only through its HMAC signature, checked by the SDK.
 */
export async function POST(req: NextRequest) {
  if (req.headers.get("uploadthing-hook")) return handler.POST(req);
  return respond(async () => {
    await requireStaff(req);
    assertSameOrigin(req);
    return handler.POST(req);
  });
}
