import { NextRequest } from "next/server";
import { afterEach, describe, expect, it } from "vitest";
import * as customers from "@/app/api/customers/route";
import * as customerItem from "@/app/api/customers/[id]/route";
import * as session from "@/app/api/session/route";
import { proxy } from "@/proxy";
import { appOrigin, writeOrigin } from "@/server/http/origin";
import { useFreshDatabase } from "../support/db";
import { makeCustomer, makeStaff, TEST_PASSWORD } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();
const saved = { APP_URL: process.env.APP_URL, PORT: process.env.PORT };
afterEach(() => {
  for (const [k, v] of Object.entries(saved)) {
    if (v === undefined) delete process.env[k];
    else process.env[k] = v;
  }
});

async function customerCount() {
  return Number((await db().selectFrom("customer").select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow()).n);
}

describe("the app's own origin", () => {
  it("comes from APP_URL, or http://localhost:$PORT when unset", () => {
    process.env.APP_URL = "https://shop.example:8443/some/path";
    expect(appOrigin()).toBe("https://shop.example:8443");
    delete process.env.APP_URL;
    process.env.PORT = "4123";
    expect(appOrigin()).toBe("http://localhost:4123");
  });

  it("judges a write by Origin (scheme, host and port) or Sec-Fetch-Site, never by Host or X-Forwarded-Host", () => {
    process.env.APP_URL = "https://shop.example";
    const h = (o: Record<string, string>) => writeOrigin(new Headers(o));
    expect(h({ origin: "https://shop.example" })).toBe("same-origin");
    expect(h({ origin: "http://shop.example" })).toBe("cross-site");
    expect(h({ origin: "https://shop.example:444" })).toBe("cross-site");
    expect(h({ origin: "null" })).toBe("cross-site");
    expect(h({ origin: "https://elsewhere.example", host: "elsewhere.example", "x-forwarded-host": "elsewhere.example" })).toBe("cross-site");
    expect(h({ "sec-fetch-site": "same-origin" })).toBe("same-origin");
    expect(h({ "sec-fetch-site": "same-site", origin: "https://shop.example" })).toBe("cross-site");
    expect(h({ "sec-fetch-site": "none" })).toBe("cross-site");
    expect(h({})).toBe("no-origin");
  });
});

describe("writes through route handlers", () => {
  it("refuse a write with no Origin with 403, and change nothing", async () => {
    const office = await makeStaff(db(), "office");
    const cookie = await sessionCookieFor(office.id);
    const before = await customerCount();
    const req = new Request("http://localhost:3000/api/customers", {
      method: "POST",
      headers: { host: "localhost:3000", cookie, "content-type": "application/json" },
      body: JSON.stringify({ kind: "company", name: "Ridgeback Hauling" }),
    });
    const res = await customers.POST(req);
    expect(res.status).toBe(403);
    expect((await readBody(res)).error.message).toMatch(/Origin/);
    expect(await customerCount()).toBe(before);
  });

  it("refuse another scheme and a believed X-Forwarded-Host", async () => {
    const office = await makeStaff(db(), "office");
    const cookie = await sessionCookieFor(office.id);
    const body = { kind: "company", name: "Ridgeback Hauling" };
    const otherScheme = await customers.POST(request("/api/customers", { cookie, body, headers: { origin: "https://localhost:3000" } }));
    expect(otherScheme.status).toBe(403);
    const forwarded = await customers.POST(request("/api/customers", { cookie, body, headers: { origin: "http://evil.example", "x-forwarded-host": "evil.example" } }));
    expect(forwarded.status).toBe(403);
  });

  it("accept a same-origin write, and one that says only Sec-Fetch-Site: same-origin", async () => {
    const office = await makeStaff(db(), "office");
    const cookie = await sessionCookieFor(office.id);
    const customer = await makeCustomer(db());
    const ok = await customerItem.PATCH(request(`/api/customers/${customer.id}`, { method: "PATCH", cookie, body: { notes: "Gate code 4411" } }), params({ id: String(customer.id) }));
    expect(ok.status).toBe(200);
    const req = new Request(`http://localhost:3000/api/customers/${customer.id}`, {
      method: "PATCH",
      headers: { cookie, "content-type": "application/json", "sec-fetch-site": "same-origin" },
      body: JSON.stringify({ notes: "Gate code 4412" }),
    });
    expect((await customerItem.PATCH(req, params({ id: String(customer.id) }))).status).toBe(200);
  });

  it("sign-out without an Origin is refused (a link on another site cannot sign staff out)", async () => {
    const tech = await makeStaff(db(), "tech");
    const signedIn = await session.POST(request("/api/session", { body: { email: tech.email, password: TEST_PASSWORD } }));
    const cookie = (signedIn.headers.get("set-cookie") ?? "").split(";")[0];
    const res = await session.DELETE(new Request("http://localhost:3000/api/session", { method: "DELETE", headers: { cookie } }));
    expect(res.status).toBe(403);
  });
});

function proxied(path: string, init: { method?: string; headers?: Record<string, string> } = {}) {
  return proxy(new NextRequest(`http://localhost:3000${path}`, { method: init.method ?? "GET", headers: init.headers }));
}

describe("server actions meet the same origin rule in the proxy", () => {
  const action = { "next-action": "7f00aa", "content-type": "multipart/form-data; boundary=x" };
  it("refuses a cross-site action with no Origin with 403", async () => {
    const res = proxied("/first-run", { method: "POST", headers: { ...action, "sec-fetch-site": "cross-site" } });
    expect(res.status).toBe(403);
    expect((await res.json()).error.code).toBe("cross_site");
  });
  it("refuses a forged Origin with 403, not 500", () => {
    expect(proxied("/first-run", { method: "POST", headers: { ...action, origin: "https://elsewhere.example" } }).status).toBe(403);
    expect(proxied("/first-run", { method: "POST", headers: { ...action, origin: "not a url" } }).status).toBe(403);
    expect(proxied("/first-run", { method: "POST", headers: action }).status).toBe(403);
  });
  it("lets a same-origin action through", () => {
    const res = proxied("/first-run", { method: "POST", headers: { ...action, origin: "http://localhost:3000", "sec-fetch-site": "same-origin" } });
    expect(res.status).toBe(200);
    expect(res.headers.get("x-middleware-next")).toBe("1");
  });
});

describe("paths that do not decode", () => {
  it.each(["/api/jobs/%", "/status/%", "/api/jobs/%E0%A4%A", "/jobs/%zz", "/api/customers/%C0%AF/x"])("%s answers 400", async (path) => {
    const res = proxied(path);
    expect(res.status).toBe(400);
    expect((await res.json()).error.message).toMatch(/%-escape/);
  });
  it("a path that decodes goes on", () => {
    expect(proxied("/api/jobs/12%20").status).toBe(200);
  });
});
