import { lucia } from "@/server/auth/lucia";
import { appOrigin } from "@/server/http/origin";

const BASE = "http://localhost:3000";

export interface Call {
  method?: string;
  body?: unknown;
  cookie?: string;
  headers?: Record<string, string>;
  rawBody?: string;
}

/** A Request like a browser on the shop's own site would send. */
export function request(path: string, call: Call = {}): Request {
  const headers: Record<string, string> = { host: "localhost:3000", ...call.headers };
  if (call.cookie) headers.cookie = call.cookie;
  let body: string | undefined = call.rawBody;
  if (call.body !== undefined) {
    body = JSON.stringify(call.body);
    headers["content-type"] ??= "application/json";
  }
  const method = call.method ?? (body === undefined ? "GET" : "POST");
  // A browser on the shop's own pages sends its Origin with every write.
  if (method !== "GET" && method !== "HEAD") headers.origin ??= appOrigin();
  return new Request(BASE + path, { method, headers, body });
}

export async function sessionCookieFor(staffId: string) {
  const session = await lucia.createSession(staffId, {});
  return `${lucia.sessionCookieName}=${session.id}`;
}

export async function readBody<T = any>(res: Response): Promise<T> {
  return (await res.json()) as T;
}

export function params<T extends Record<string, string>>(p: T) {
  return { params: Promise.resolve(p) };
}
