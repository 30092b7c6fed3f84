import { afterEach, describe, expect, it } from "vitest";
import * as session from "@/app/api/session/route";
import { clientAddress } from "@/server/auth/rate-limit";
import { useFreshDatabase } from "../support/db";
import { TEST_PASSWORD, makeStaff } from "../support/factories";
import { readBody, request } from "../support/http";

const { db } = useFreshDatabase();
afterEach(() => {
  delete process.env.TRUST_PROXY_HOPS;
});

function attempt(email: string, password: string, headers: Record<string, string> = {}) {
  return session.POST(request("/api/session", { body: { email, password }, headers }));
}

/** The device cookie a successful sign-in leaves, as the browser would send it back. */
function deviceCookie(res: Response): string {
  const found = res.headers.getSetCookie().find((c) => c.startsWith("bw_device="));
  expect(found, "a device cookie").toBeTruthy();
  return found!.split(";")[0];
}

describe("sign-in limits", () => {
  it("21 failures with made-up e-mails and no forwarded address do not stop the real owner", async () => {
    const owner = await makeStaff(db(), "owner");
    const failures = await Promise.all(Array.from({ length: 21 }, (_, i) => attempt(`nobody${i}@made-up.example`, "guess-password")));
    expect(failures.every((r) => r.status === 401)).toBe(true);
    expect((await attempt(owner.email, TEST_PASSWORD)).status).toBe(200);
  });

  it("believes X-Forwarded-For only with TRUST_PROXY_HOPS, and then only the proxy's own entry", () => {
    const req = (xff: string) => request("/api/session", { headers: { "x-forwarded-for": xff } });
    expect(clientAddress(req("203.0.113.9"))).toBeNull();
    process.env.TRUST_PROXY_HOPS = "1";
    expect(clientAddress(req("198.51.100.1, 203.0.113.9"))).toBe("203.0.113.9");
    process.env.TRUST_PROXY_HOPS = "2";
    expect(clientAddress(req("198.51.100.1, 203.0.113.9, 10.0.0.2"))).toBe("203.0.113.9");
    expect(clientAddress(req("10.0.0.2"))).toBeNull();
  });

  it("behind a proxy, a new made-up X-Forwarded-For on each try does not escape the address limit", async () => {
    process.env.TRUST_PROXY_HOPS = "1";
    const tries = await Promise.all(Array.from({ length: 22 }, (_, i) => attempt(`spray${i}@made-up.example`, "guess-password", { "x-forwarded-for": `192.0.2.${i}, 203.0.113.50` })));
    expect(tries.filter((r) => r.status === 429)).toHaveLength(2);
    // Another address is not held up.
    const tech = await makeStaff(db(), "tech");
    expect((await attempt(tech.email, TEST_PASSWORD, { "x-forwarded-for": "203.0.113.51" })).status).toBe(200);
  });

  it("counts a try before the slow hash: 30 wrong passwords at once get 5 checks and 25 refusals", async () => {
    const tech = await makeStaff(db(), "tech");
    const answers = await Promise.all(Array.from({ length: 30 }, (_, i) => attempt(tech.email, `wrong-${i}`)));
    const statuses = answers.map((r) => r.status);
    expect(statuses.filter((s) => s === 401)).toHaveLength(5);
    expect(statuses.filter((s) => s === 429)).toHaveLength(25);
  });

  it("failures against an account never stop its right password on a device that signed in before", async () => {
    const owner = await makeStaff(db(), "owner");
    const device = deviceCookie(await attempt(owner.email, TEST_PASSWORD));
    for (let i = 0; i < 5; i++) expect((await attempt(owner.email, `stranger-${i}`)).status).toBe(401);
    // A new device is paused for this account…
    const newDevice = await attempt(owner.email, TEST_PASSWORD);
    expect(newDevice.status).toBe(429);
    expect(newDevice.headers.get("retry-after")).toMatch(/^\d+$/);
    expect((await readBody(newDevice)).error.message).toMatch(/Wait \d+ minutes? and try again/);
    // …the owner's own device is not.
    expect((await attempt(owner.email, TEST_PASSWORD, { cookie: device })).status).toBe(200);
  });

  it("a known device still has a limit of its own, and a forged device cookie counts for nothing", async () => {
    const office = await makeStaff(db(), "office");
    const device = deviceCookie(await attempt(office.email, TEST_PASSWORD));
    const guesses = await Promise.all(Array.from({ length: 12 }, (_, i) => attempt(office.email, `guess-${i}`, { cookie: device })));
    expect(guesses.map((r) => r.status).filter((s) => s === 429)).toHaveLength(2);
    const other = await makeStaff(db(), "office");
    const forged = device.replace(office.id, other.id);
    for (let i = 0; i < 5; i++) await attempt(other.email, `guess-${i}`);
    expect((await attempt(other.email, TEST_PASSWORD, { cookie: forged })).status).toBe(429);
  });

  it("says in plain words when sign-in is being slowed", async () => {
    const tech = await makeStaff(db(), "tech");
    const messages: string[] = [];
    for (let i = 0; i < 5; i++) messages.push((await readBody(await attempt(tech.email, `wrong-${i}`))).error.message);
    expect(messages[0]).toBe("That e-mail and password do not match an active staff account.");
    expect(messages[2]).toMatch(/each try waits a little longer; 2 more tries before sign-in pauses for 15 minutes/);
    expect(messages[4]).toMatch(/That was the last try/);
  });

  it("a right password gives its counted try back", async () => {
    const tech = await makeStaff(db(), "tech");
    for (let i = 0; i < 4; i++) await attempt(tech.email, `wrong-${i}`);
    expect((await attempt(tech.email, TEST_PASSWORD)).status).toBe(200);
    expect((await attempt(tech.email, "wrong-again")).status).toBe(401);
    expect((await attempt(tech.email, "wrong-once-more")).status).toBe(429);
  });
});
