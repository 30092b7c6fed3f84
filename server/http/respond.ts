import "server-only";
import { NextResponse } from "next/server";
import { z } from "zod";
import { quoteBareNonFiniteNumbers } from "./bare-numbers";
import { ApiError, uniqueConflict, validationError } from "./errors";
import { CROSS_SITE_MESSAGE, NO_ORIGIN_MESSAGE, writeOrigin } from "./origin";

/** JSON answers hold the shop's data for one signed-in person: no browser or proxy may keep a copy. */
function noStore(headers?: HeadersInit): Headers {
  const out = new Headers(headers);
  if (!out.has("cache-control")) out.set("Cache-Control", "no-store");
  return out;
}

export function json<T>(body: T, init?: ResponseInit) {
  return NextResponse.json(body, { ...init, headers: noStore(init?.headers) });
}

export function errorResponse(err: ApiError) {
  const body = { error: { code: err.code, message: err.message, ...(err.details ? { details: err.details } : {}) } };
  return NextResponse.json(body, { status: err.status, headers: noStore(err.headers) });
}

/** Runs a handler body and turns known failures into the API's error shape; anything else is logged and a 500. */
export async function respond(work: () => Promise<Response>): Promise<Response> {
  try {
    return await work();
  } catch (err) {
    if (err instanceof ApiError) return errorResponse(err);
    if (err instanceof z.ZodError) return errorResponse(validationError(err));
    const conflict = uniqueConflict(err);
    if (conflict) return errorResponse(conflict);
    console.error(err);
    return NextResponse.json(
      { error: { code: "internal", message: "Something went wrong on the server. Try again; if it keeps happening, tell the shop owner." } },
      { status: 500, headers: noStore() },
    );
  }
}

const MAX_BODY_BYTES = 256 * 1024;

/**
 * Refuses cross-site writes (a form on another site cannot post into the shop's data) and
 * anything that is not a JSON body, then parses it with the given schema.
 */
export async function readJson<S extends z.ZodType>(req: Request, schema: S): Promise<z.infer<S>> {
  assertSameOrigin(req);
  const type = req.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("application/json")) {
    throw new ApiError("unsupported_media_type", "Send the request as JSON (Content-Type: application/json).");
  }
  const text = await readCapped(req, MAX_BODY_BYTES);
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    // A bare NaN or Infinity is not JSON; quoted, the schema names the field that carried it.
    const quoted = quoteBareNonFiniteNumbers(text);
    try {
      if (quoted === null) throw new Error("not JSON");
      raw = JSON.parse(quoted);
    } catch {
      throw new ApiError("validation", "The request body is not valid JSON.");
    }
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}

/** Reads a body but stops at the cap, so nobody can fill the server's memory with one request. */
async function readCapped(req: Request, cap: number): Promise<string> {
  const tooLarge = () => new ApiError("validation", `The request is too large (at most ${Math.round(cap / 1024)} kB).`);
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > cap) throw tooLarge();
  if (!req.body) return "";
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > cap) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks).toString("utf8");
}

/** Refuses a write that did not come from the app's own pages (see `server/http/origin.ts`). */
export function assertSameOrigin(req: Request) {
  const verdict = writeOrigin(req.headers);
  if (verdict === "cross-site") throw new ApiError("cross_site", CROSS_SITE_MESSAGE);
  if (verdict === "no-origin") throw new ApiError("cross_site", NO_ORIGIN_MESSAGE);
}

/** Route params of another shape (a job id that is not a number) are a 404, never a crash. */
export function parseId(raw: string, what: string): number {
  if (!/^[1-9][0-9]{0,9}$/.test(raw)) throw new ApiError("validation", `${what} id must be a positive whole number.`, { fields: { id: [`${what} id must be a positive whole number.`] } });
  return Number(raw);
}
