import { describe, expect, it } from "vitest";
import * as board from "@/app/api/board/route";
import * as devices from "@/app/api/me/devices/route";
import * as device from "@/app/api/me/devices/[id]/route";
import * as me from "@/app/api/me/route";
import * as password from "@/app/api/me/password/route";
import * as session from "@/app/api/session/route";
import * as reset from "@/app/api/staff/[id]/password-reset/route";
import * as staffItem from "@/app/api/staff/[id]/route";
import { verifyPassword } from "@/server/auth/password";
import { deviceName } from "@/server/staff/devices";
import { useFreshDatabase } from "../support/db";
import { TEST_PASSWORD, ensureShop, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

const cookieFrom = (res: Response) => (res.headers.get("set-cookie") ?? "").split(";")[0];
const PHONE = "Mozilla/5.0 (Linux; Android 14; Pixel) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/131.0 Mobile Safari/537.36";
const DESK = "Mozilla/5.0 (Windows NT 10.0; Win64; x64; rv:133.0) Gecko/20100101 Firefox/133.0";

async function signIn(email: string, pw: string, userAgent = DESK) {
  const res = await session.POST(request("/api/session", { body: { email, password: pw }, headers: { "user-agent": userAgent } }));
  return { res, cookie: cookieFrom(res), body: await readBody(res) };
}

function change(cookie: string, body: Record<string, unknown>) {
  return password.POST(request("/api/me/password", { cookie, body }));
}

describe("changing your own password (POST /api/me/password)", () => {
  it("signs out the person's other devices and keeps this one; the new password signs in and the old does not", async () => {
    const tech = await makeStaff(db(), "tech");
    const phone = await signIn(tech.email, TEST_PASSWORD, PHONE);
    const desk = await signIn(tech.email, TEST_PASSWORD, DESK);
    const res = await change(desk.cookie, { currentPassword: TEST_PASSWORD, newPassword: "shop-floor-2026-pass", confirmPassword: "shop-floor-2026-pass" });
    expect(res.status).toBe(200);
    expect((await readBody(res)).otherDevicesSignedOut).toBe(1);
    expect((await me.GET(request("/api/me", { cookie: phone.cookie }))).status).toBe(401);
    expect((await me.GET(request("/api/me", { cookie: desk.cookie }))).status).toBe(200);
    const row = await db().selectFrom("staff").select("password_hash").where("id", "=", tech.id).executeTakeFirstOrThrow();
    expect(row.password_hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
    expect(await verifyPassword(row.password_hash, "shop-floor-2026-pass")).toBe(true);
    expect((await signIn(tech.email, TEST_PASSWORD)).res.status).toBe(401);
    expect((await signIn(tech.email, "shop-floor-2026-pass")).res.status).toBe(200);
  });

  it("refuses a wrong current password, two different new ones, a short one, or the same one, and changes nothing", async () => {
    const tech = await makeStaff(db(), "tech");
    const cookie = await sessionCookieFor(tech.id);
    const other = await sessionCookieFor(tech.id);
    const before = await db().selectFrom("staff").select("password_hash").where("id", "=", tech.id).executeTakeFirstOrThrow();
    const cases: [Record<string, unknown>, string][] = [
      [{ currentPassword: "not-my-password", newPassword: "another-long-one", confirmPassword: "another-long-one" }, "currentPassword"],
      [{ currentPassword: TEST_PASSWORD, newPassword: "another-long-one", confirmPassword: "another-long-two" }, "confirmPassword"],
      [{ currentPassword: TEST_PASSWORD, newPassword: "short", confirmPassword: "short" }, "newPassword"],
      [{ currentPassword: TEST_PASSWORD, newPassword: TEST_PASSWORD, confirmPassword: TEST_PASSWORD }, "newPassword"],
      [{ currentPassword: TEST_PASSWORD }, "newPassword"],
    ];
    for (const [body, field] of cases) {
      const res = await change(cookie, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys((await readBody(res)).error.details.fields), JSON.stringify(body)).toContain(field);
    }
    const after = await db().selectFrom("staff").select("password_hash").where("id", "=", tech.id).executeTakeFirstOrThrow();
    expect(after.password_hash).toBe(before.password_hash);
    expect((await me.GET(request("/api/me", { cookie: other }))).status).toBe(200);
  });
});

describe("signed-in devices", () => {
  it("lists the person's own devices, this one first, and signs one out or all the others", async () => {
    const office = await makeStaff(db(), "office");
    const someoneElse = await makeStaff(db(), "office");
    const phone = await signIn(office.email, TEST_PASSWORD, PHONE);
    const desk = await signIn(office.email, TEST_PASSWORD, DESK);
    const third = await signIn(office.email, TEST_PASSWORD, "");
    const theirs = await signIn(someoneElse.email, TEST_PASSWORD, DESK);

    const list = await readBody(await devices.GET(request("/api/me/devices", { cookie: desk.cookie })));
    expect(list.devices).toHaveLength(3);
    expect(list.devices[0]).toEqual(expect.objectContaining({ current: true, device: "Firefox on Windows" }));
    expect(list.devices.map((d: { device: string }) => d.device).sort()).toEqual(["Chrome on Android", "Firefox on Windows", "Unknown browser"]);

    const phoneId = list.devices.find((d: { device: string }) => d.device === "Chrome on Android").id;
    // Another person's device is not found from here, and stays signed in.
    const theirId = (await readBody(await devices.GET(request("/api/me/devices", { cookie: theirs.cookie })))).devices[0].id;
    expect((await device.DELETE(request(`/api/me/devices/${theirId}`, { method: "DELETE", cookie: desk.cookie }), params({ id: theirId }))).status).toBe(404);
    expect((await me.GET(request("/api/me", { cookie: theirs.cookie }))).status).toBe(200);
    expect((await device.DELETE(request("/api/me/devices/abc", { method: "DELETE", cookie: desk.cookie }), params({ id: "abc" }))).status).toBe(400);

    expect((await device.DELETE(request(`/api/me/devices/${phoneId}`, { method: "DELETE", cookie: desk.cookie }), params({ id: phoneId }))).status).toBe(200);
    expect((await me.GET(request("/api/me", { cookie: phone.cookie }))).status).toBe(401);
    expect((await me.GET(request("/api/me", { cookie: third.cookie }))).status).toBe(200);

    const others = await devices.DELETE(request("/api/me/devices", { method: "DELETE", cookie: desk.cookie }));
    expect((await readBody(others)).signedOut).toBe(1);
    expect((await me.GET(request("/api/me", { cookie: third.cookie }))).status).toBe(401);
    expect((await me.GET(request("/api/me", { cookie: desk.cookie }))).status).toBe(200);
  });

  it("names browsers as a person would", () => {
    expect(deviceName(PHONE)).toBe("Chrome on Android");
    expect(deviceName("Mozilla/5.0 (iPhone; CPU iPhone OS 17_5 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.5 Mobile/15E148 Safari/604.1")).toBe("Safari on iPhone or iPad");
    expect(deviceName("")).toBe("Unknown browser");
  });
});

describe("the owner's reset of someone else's password", () => {
  it("answers a temporary password once, signs the person out, and makes them change it at next sign-in", async () => {
    await ensureShop(db());
    const owner = await makeStaff(db(), "owner");
    const tech = await makeStaff(db(), "tech");
    const ownerCookie = await sessionCookieFor(owner.id);
    const before = await signIn(tech.email, TEST_PASSWORD);

    const res = await reset.POST(request(`/api/staff/${tech.id}/password-reset`, { cookie: ownerCookie, body: {} }), params({ id: tech.id }));
    expect(res.status).toBe(200);
    expect(res.headers.get("cache-control")).toBe("no-store");
    const { temporaryPassword } = await readBody(res);
    expect(temporaryPassword).toMatch(/^[a-z2-9]{4}(-[a-z2-9]{4}){3}$/);
    expect((await me.GET(request("/api/me", { cookie: before.cookie }))).status).toBe(401);
    const stored = await db().selectFrom("staff").select(["password_hash", "must_change_password"]).where("id", "=", tech.id).executeTakeFirstOrThrow();
    expect(stored.password_hash).not.toContain(temporaryPassword);
    expect(stored.must_change_password).toBe(1);

    // Signing in with it works only to choose a new password.
    const temp = await signIn(tech.email, temporaryPassword);
    expect(temp.res.status).toBe(200);
    expect(temp.body.user.mustChangePassword).toBe(true);
    const refused = await board.GET(request("/api/board", { cookie: temp.cookie }));
    expect(refused.status).toBe(403);
    expect((await readBody(refused)).error.message).toMatch(/temporary password.*\/account/);
    expect((await readBody(await me.GET(request("/api/me", { cookie: temp.cookie })))).user.mustChangePassword).toBe(true);

    const changed = await change(temp.cookie, { currentPassword: temporaryPassword, newPassword: "my-own-bench-pass", confirmPassword: "my-own-bench-pass" });
    expect(changed.status).toBe(200);
    expect((await board.GET(request("/api/board", { cookie: temp.cookie }))).status).toBe(200);
    const after = await db().selectFrom("staff").select("must_change_password").where("id", "=", tech.id).executeTakeFirstOrThrow();
    expect(after.must_change_password).toBe(0);
  });

  it("is for the owner, for someone else, and the staff PATCH no longer sets passwords", async () => {
    const owner = await makeStaff(db(), "owner");
    const office = await makeStaff(db(), "office");
    const ownerCookie = await sessionCookieFor(owner.id);
    const officeCookie = await sessionCookieFor(office.id);
    expect((await reset.POST(request(`/api/staff/${owner.id}/password-reset`, { cookie: officeCookie, body: {} }), params({ id: owner.id }))).status).toBe(403);
    const self = await reset.POST(request(`/api/staff/${owner.id}/password-reset`, { cookie: ownerCookie, body: {} }), params({ id: owner.id }));
    expect(self.status).toBe(409);
    expect((await readBody(self)).error.message).toMatch(/Account page/);
    expect((await reset.POST(request("/api/staff/nobody/password-reset", { cookie: ownerCookie, body: {} }), params({ id: "nobody" }))).status).toBe(404);
    const patch = await staffItem.PATCH(request(`/api/staff/${office.id}`, { method: "PATCH", cookie: ownerCookie, body: { password: "chosen-by-owner" } }), params({ id: office.id }));
    expect(patch.status).toBe(400);
    expect((await me.GET(request("/api/me", { cookie: officeCookie }))).status).toBe(200);
  });
});
