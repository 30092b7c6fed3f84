import { describe, expect, it } from "vitest";
import * as me from "@/app/api/me/route";
import * as password from "@/app/api/me/password/route";
import * as session from "@/app/api/session/route";
import * as staffItem from "@/app/api/staff/[id]/route";
import * as staff from "@/app/api/staff/route";
import { hashSessionId } from "@/server/auth/lucia";
import { useFreshDatabase } from "../support/db";
import { TEST_PASSWORD, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

function cookieFrom(res: Response) {
  const set = res.headers.get("set-cookie") ?? "";
  return set.split(";")[0];
}

describe("signing in", () => {
  it("opens a session, answers the user, and stores only a hash of the session id", async () => {
    const owner = await makeStaff(db(), "owner");
    const res = await session.POST(request("/api/session", { body: { email: owner.email, password: TEST_PASSWORD } }));
    expect(res.status).toBe(200);
    const body = await readBody(res);
    expect(body.user).toEqual({ id: owner.id, name: owner.name, role: "owner", mustChangePassword: false });
    const cookie = cookieFrom(res);
    const rawId = cookie.split("=")[1];
    expect(rawId.length).toBeGreaterThan(20);
    const stored = await db().selectFrom("session").select("id").where("staff_id", "=", owner.id).execute();
    expect(stored.map((s) => s.id)).toContain(hashSessionId(rawId));
    expect(stored.map((s) => s.id)).not.toContain(rawId);
    const meRes = await me.GET(request("/api/me", { cookie }));
    expect((await readBody(meRes)).user.role).toBe("owner");
  });

  it("gives a new session id at every sign-in", async () => {
    const tech = await makeStaff(db(), "tech");
    const a = cookieFrom(await session.POST(request("/api/session", { body: { email: tech.email, password: TEST_PASSWORD } })));
    const b = cookieFrom(await session.POST(request("/api/session", { body: { email: tech.email, password: TEST_PASSWORD } })));
    expect(a).not.toBe(b);
  });

  it("refuses a wrong password with 401 invalid_credentials", async () => {
    const tech = await makeStaff(db(), "tech");
    const res = await session.POST(request("/api/session", { body: { email: tech.email, password: "not-the-password" } }));
    expect(res.status).toBe(401);
    expect((await readBody(res)).error.code).toBe("invalid_credentials");
  });

  it("refuses a deactivated account", async () => {
    const gone = await makeStaff(db(), "tech", { active: 0 });
    const res = await session.POST(request("/api/session", { body: { email: gone.email, password: TEST_PASSWORD } }));
    expect(res.status).toBe(401);
  });

  it("slows and then refuses repeated failures for one account with 429", async () => {
    const tech = await makeStaff(db(), "tech");
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) {
      const res = await session.POST(request("/api/session", { body: { email: tech.email, password: `wrong-${i}` } }));
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(statuses[5]).toBe(429);
    const refused = await session.POST(request("/api/session", { body: { email: tech.email, password: TEST_PASSWORD } }));
    expect(refused.status).toBe(429);
    expect(refused.headers.get("retry-after")).toMatch(/^\d+$/);
  });

  it("refuses a cross-site sign-in and a body that is not JSON", async () => {
    const crossSite = await session.POST(request("/api/session", { body: { email: "a@b.example", password: "x" }, headers: { origin: "https://elsewhere.example" } }));
    expect(crossSite.status).toBe(403);
    const form = await session.POST(request("/api/session", { rawBody: "email=a&password=b", method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" } }));
    expect(form.status).toBe(415);
  });

  it("refuses a body over the size cap without reading it all", async () => {
    const huge = JSON.stringify({ email: "a@b.example", password: "x".repeat(300 * 1024) });
    const res = await session.POST(request("/api/session", { rawBody: huge, method: "POST", headers: { "content-type": "application/json", origin: "http://localhost:3000" } }));
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.message).toMatch(/too large/);
  });

  it("answers 400 with field details for missing fields and huge strings", async () => {
    const res = await session.POST(request("/api/session", { body: { email: "x".repeat(5000) } }));
    expect(res.status).toBe(400);
    const body = await readBody(res);
    expect(Object.keys(body.error.details.fields)).toEqual(expect.arrayContaining(["email", "password"]));
  });
});

describe("sessions end on the server", () => {
  it("sign-out ends the session", async () => {
    const tech = await makeStaff(db(), "tech");
    const cookie = await sessionCookieFor(tech.id);
    expect((await me.GET(request("/api/me", { cookie }))).status).toBe(200);
    await session.DELETE(request("/api/session", { method: "DELETE", cookie, headers: { origin: "http://localhost:3000" } }));
    expect((await me.GET(request("/api/me", { cookie }))).status).toBe(401);
  });

  it("a session past its shift-long lifetime is refused", async () => {
    const tech = await makeStaff(db(), "tech");
    const cookie = await sessionCookieFor(tech.id);
    await db().updateTable("session").set({ expires_at: Math.floor(Date.now() / 1000) - 1 }).where("staff_id", "=", tech.id).execute();
    expect((await me.GET(request("/api/me", { cookie }))).status).toBe(401);
  });

  it("the lifetime is absolute: validating near the end does not extend it", async () => {
    const tech = await makeStaff(db(), "tech");
    const cookie = await sessionCookieFor(tech.id);
    const soon = Math.floor(Date.now() / 1000) + 60;
    await db().updateTable("session").set({ expires_at: soon }).where("staff_id", "=", tech.id).execute();
    expect((await me.GET(request("/api/me", { cookie }))).status).toBe(200);
    const row = await db().selectFrom("session").select("expires_at").where("staff_id", "=", tech.id).executeTakeFirstOrThrow();
    expect(row.expires_at).toBe(soon);
  });

  it("deactivating a staff member ends their sessions at once", async () => {
    const owner = await makeStaff(db(), "owner");
    const tech = await makeStaff(db(), "tech");
    const ownerCookie = await sessionCookieFor(owner.id);
    const techCookie = await sessionCookieFor(tech.id);
    const res = await staffItem.PATCH(request(`/api/staff/${tech.id}`, { method: "PATCH", cookie: ownerCookie, body: { active: false } }), params({ id: tech.id }));
    expect(res.status).toBe(200);
    expect((await me.GET(request("/api/me", { cookie: techCookie }))).status).toBe(401);
  });

  it("changing one's password ends the other sessions and keeps this one signed in", async () => {
    const tech = await makeStaff(db(), "tech");
    const other = await sessionCookieFor(tech.id);
    const here = await sessionCookieFor(tech.id);
    const res = await password.POST(
      request("/api/me/password", { cookie: here, body: { currentPassword: TEST_PASSWORD, newPassword: "a-new-long-password", confirmPassword: "a-new-long-password" } }),
    );
    expect(res.status).toBe(200);
    expect((await me.GET(request("/api/me", { cookie: other }))).status).toBe(401);
    expect((await me.GET(request("/api/me", { cookie: here }))).status).toBe(200);
  });
});

describe("staff routes", () => {
  it("are for the owner only: a tech and the office get 403", async () => {
    for (const role of ["tech", "office"] as const) {
      const who = await makeStaff(db(), role);
      const cookie = await sessionCookieFor(who.id);
      expect((await staff.GET(request("/api/staff", { cookie }))).status).toBe(403);
      expect((await staff.POST(request("/api/staff", { cookie, body: { name: "X", email: "x@shop.example", role: "tech", password: "long-enough-pw" } }))).status).toBe(403);
      expect((await staffItem.PATCH(request(`/api/staff/${who.id}`, { method: "PATCH", cookie, body: { role: "owner" } }), params({ id: who.id }))).status).toBe(403);
    }
  });

  it("the owner adds staff; bad input gets 400 with the field named and adds nobody", async () => {
    const owner = await makeStaff(db(), "owner");
    const cookie = await sessionCookieFor(owner.id);
    const before = (await db().selectFrom("staff").select("id").execute()).length;
    for (const body of [
      { name: "", email: "not-an-email", role: "boss", password: "short" },
      { name: "A".repeat(10_000), email: "ok@shop.example", role: "tech", password: "long-enough-pw" },
      { name: 42, email: ["x"], role: null },
    ]) {
      const res = await staff.POST(request("/api/staff", { cookie, body }));
      expect(res.status).toBe(400);
      expect(Object.keys((await readBody(res)).error.details.fields).length).toBeGreaterThan(0);
    }
    expect((await db().selectFrom("staff").select("id").execute()).length).toBe(before);
    const ok = await staff.POST(request("/api/staff", { cookie, body: { name: "Nell Brask", email: "Nell@Shop.example", role: "tech", password: "long-enough-pw" } }));
    expect(ok.status).toBe(201);
    expect((await readBody(ok)).staff.email).toBe("nell@shop.example");
    const dup = await staff.POST(request("/api/staff", { cookie, body: { name: "Nell Again", email: "nell@shop.example", role: "tech", password: "long-enough-pw" } }));
    expect(dup.status).toBe(409);
  });

  it("the last active owner cannot be demoted or deactivated", async () => {
    const fresh = db();
    await fresh.updateTable("staff").set({ active: 0 }).where("role", "=", "owner").execute();
    const owner = await makeStaff(fresh, "owner");
    const cookie = await sessionCookieFor(owner.id);
    const self = await staffItem.PATCH(request(`/api/staff/${owner.id}`, { method: "PATCH", cookie, body: { active: false } }), params({ id: owner.id }));
    expect(self.status).toBe(409);
  });
});
