import { unstable_doesMiddlewareMatch } from "next/experimental/testing/server";
import { NextRequest } from "next/server";
import { afterEach, describe, expect, it } from "vitest";
import nextConfig from "@/next.config";
import { config, proxy } from "@/proxy";
import { appEntries } from "../support/app-tree";

const saved = { APP_URL: process.env.APP_URL, UPLOADTHING_INGEST_URL: process.env.UPLOADTHING_INGEST_URL };
afterEach(() => {
  for (const [k, v] of Object.entries(saved)) {
    if (v === undefined) delete process.env[k];
    else process.env[k] = v;
  }
});

const paths = [...new Set(appEntries().filter((e) => e.kind !== "action").map((e) => e.path.replace(/\[(?:\.\.\.)?\w+\]/g, "1")))];

function directives(csp: string) {
  return Object.fromEntries(csp.split(";").map((d) => d.trim().split(/\s+/)).map(([name, ...values]) => [name, values]));
}

describe("headers on every page and route", () => {
  it("finds the app's paths", () => expect(paths.length).toBeGreaterThan(30));

  it.each(paths)("%s goes through the proxy and gets the security headers", (path) => {
    expect(unstable_doesMiddlewareMatch({ config, url: path })).toBe(true);
    const res = proxy(new NextRequest(`http://localhost:3000${path}`, { headers: { cookie: "bw_session=x" } }));
    const h = res.headers;
    expect(h.get("x-content-type-options")).toBe("nosniff");
    expect(h.get("x-frame-options")).toBe("DENY");
    expect(h.get("referrer-policy")).toBe(path.startsWith("/status/") ? "no-referrer" : "same-origin");
    expect(h.get("strict-transport-security")).toBeNull();
    const csp = directives(h.get("content-security-policy") ?? "");
    expect(csp["frame-ancestors"]).toEqual(["'none'"]);
    expect(csp["form-action"]).toEqual(["'self'"]);
    expect(csp["object-src"]).toEqual(["'none'"]);
    expect(csp["script-src"]).not.toContain("'unsafe-inline'");
    expect(csp["script-src"].some((v: string) => /^'nonce-[A-Za-z0-9+/=]{16,}'$/.test(v))).toBe(true);
  });

  it("a fresh nonce for each request, handed to Next on the request", () => {
    const a = proxy(new NextRequest("http://localhost:3000/board", { headers: { cookie: "bw_session=x" } }));
    const b = proxy(new NextRequest("http://localhost:3000/board", { headers: { cookie: "bw_session=x" } }));
    expect(a.headers.get("content-security-policy")).not.toBe(b.headers.get("content-security-policy"));
    // NextResponse.next({ request: { headers } }) passes overridden request headers on as x-middleware-request-*.
    expect(a.headers.get("x-middleware-request-content-security-policy")).toBe(a.headers.get("content-security-policy"));
  });

  it("HSTS only when the shop serves Baywright over HTTPS", () => {
    process.env.APP_URL = "https://shop.example";
    const res = proxy(new NextRequest("https://shop.example/sign-in"));
    expect(res.headers.get("strict-transport-security")).toMatch(/^max-age=\d{7,}/);
  });

  it("connect-src names the upload service's host from the environment", () => {
    process.env.UPLOADTHING_INGEST_URL = "http://127.0.0.1:4555/some/path";
    const csp = directives(proxy(new NextRequest("http://localhost:3000/jobs/1", { headers: { cookie: "bw_session=x" } })).headers.get("content-security-policy") ?? "");
    expect(csp["connect-src"]).toEqual(["'self'", "http://127.0.0.1:4555"]);
    delete process.env.UPLOADTHING_INGEST_URL;
    const hosted = directives(proxy(new NextRequest("http://localhost:3000/jobs/1", { headers: { cookie: "bw_session=x" } })).headers.get("content-security-policy") ?? "");
    expect(hosted["connect-src"]).toContain("https://*.ingest.uploadthing.com");
  });

  it("every signed-in page sends a visitor without a session cookie to sign in (add its area to SIGNED_IN_AREAS in proxy.ts)", () => {
    const shopPages = appEntries().filter((e) => e.kind === "page" && e.file.includes("(shop)"));
    expect(shopPages.length).toBeGreaterThan(5);
    for (const page of shopPages) {
      const res = proxy(new NextRequest(`http://localhost:3000${page.path.replace(/\[(?:\.\.\.)?\w+\]/g, "1")}`));
      expect([page.path, res.status, res.headers.get("location")]).toEqual([page.path, 307, "http://localhost:3000/sign-in"]);
    }
  });

  it("the redirect to sign-in carries them too, and Next does not announce itself", () => {
    const res = proxy(new NextRequest("http://localhost:3000/board"));
    expect(res.status).toBe(307);
    expect(res.headers.get("x-frame-options")).toBe("DENY");
    expect(nextConfig.poweredByHeader).toBe(false);
  });
});
