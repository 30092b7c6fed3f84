import { readdirSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { describe, expect, it } from "vitest";
import { useFreshDatabase } from "../support/db";
import { request } from "../support/http";

useFreshDatabase();

const API_DIR = join(process.cwd(), "app", "api");
// The payment service's webhook has no session: its signature is checked instead (400 without one).
const OPEN = new Set(["GET /api/health", "POST /api/session", "DELETE /api/session", "POST /api/payments/webhook"]);
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return routeFiles(path);
    return name === "route.ts" ? [path] : [];
  });
}

/** Every API route but the open ones answers 401 to a request without a session. */
describe("every API route without a session", () => {
  const files = routeFiles(API_DIR);
  it("finds the routes", () => expect(files.length).toBeGreaterThan(4));
  for (const file of files) {
    const urlPath = "/api/" + relative(API_DIR, file).replace(/\/?route\.ts$/, "").replace(/\[(\w+)\]/g, "1");
    it(`${urlPath} answers 401`, async () => {
      const mod = await import(/* @vite-ignore */ file);
      for (const method of METHODS) {
        const handler = mod[method];
        if (typeof handler !== "function") continue;
        const label = `${method} ${urlPath.replace(/\/$/, "")}`;
        if (OPEN.has(label)) continue;
        const body = method === "GET" || method === "DELETE" ? undefined : {};
        const res: Response = await handler(request(urlPath, { method, body }), { params: Promise.resolve(new Proxy({}, { get: () => "1" })) });
        expect(res.status, label).toBe(401);
      }
    });
  }
});
