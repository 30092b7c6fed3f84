import { createRouteHandler } from "uploadthing/next";
import { NextRequest } from "next/server";
import { requireStaff } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import { jsonShapeProblem } from "@/server/http/json-shape";
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
    return noStore(await handler.GET(req));
  });
}

/**
 * Two callers: a signed-in browser asking to upload (session and same-site checked here, role
 * and files in the file route's middleware), and the upload service reporting a finished file,
 * which carries no cookie and is trusted only through its HMAC signature, checked by the SDK.
 */
export async function POST(req: NextRequest) {
  return respond(async () => {
    if (!req.headers.get("uploadthing-hook")) {
      await requireStaff(req);
      assertSameOrigin(req);
    }
    return noStore(await handler.POST(await checkedBody(req)));
  });
}

const MAX_BODY_BYTES = 256 * 1024;

/** The SDK's answers carry presigned upload URLs: no cache may keep them. */
function noStore(res: Response): Response {
  const headers = new Headers(res.headers);
  if (!/no-store/.test(headers.get("cache-control") ?? "")) headers.set("Cache-Control", "no-store");
  return new Response(res.body, { status: res.status, statusText: res.statusText, headers });
}

/**
 * The SDK answers 500 to a body nested thousands deep or a file name with half a UTF-16 pair; both
 * are refused here with what to fix. The body is handed on byte for byte (the service's callback
 * is signed over it).
 */
async function checkedBody(req: NextRequest): Promise<NextRequest> {
  if (Number(req.headers.get("content-length") ?? "0") > MAX_BODY_BYTES) throw new ApiError("validation", "The upload request is too large.");
  const bytes = Buffer.from(await req.arrayBuffer());
  if (bytes.length > MAX_BODY_BYTES) throw new ApiError("validation", "The upload request is too large.");
  const text = bytes.toString("utf8");
  if (text.trim() !== "") {
    const problem = jsonShapeProblem(text);
    if (problem) throw new ApiError("validation", problem);
  }
  return new NextRequest(req.url, { method: req.method, headers: req.headers, body: bytes.length ? bytes : undefined });
}
