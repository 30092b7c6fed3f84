import { sql } from "kysely";
import { beforeEach, describe, expect, it, vi, beforeAll } from "vitest";
import * as audit from "@/app/api/audit/route";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as jobLinks from "@/app/api/jobs/[id]/status-links/route";
import * as password from "@/app/api/me/password/route";
import * as notify from "@/app/api/notify-settings/route";
import * as partItem from "@/app/api/parts/[id]/route";
import * as photoItem from "@/app/api/photos/[id]/route";
import * as session from "@/app/api/session/route";
import * as procedure from "@/app/api/shop-settings/leak-test-procedure/route";
import * as shopSettings from "@/app/api/shop-settings/route";
import * as passwordReset from "@/app/api/staff/[id]/password-reset/route";
import * as staffItem from "@/app/api/staff/[id]/route";
import * as staff from "@/app/api/staff/route";
import * as linkItem from "@/app/api/status-links/[id]/route";
import { useFreshDatabase } from "../support/db";
import { TEST_PASSWORD, ensureShop, makeJob, makeStaff } from "../support/factories";
import { type Call, params, readBody, request, sessionCookieFor } from "../support/http";
import { moneyChecksOff } from "../support/money";

const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));
// Behind one proxy that writes X-Forwarded-For, as a shop with HTTPS in front of the app runs it.
process.env.TRUST_PROXY_HOPS = "1";

async function as(role: "owner" | "office" | "tech") {
  const person = await makeStaff(db(), role);
  return { person, cookie: await sessionCookieFor(person.id) };
}

/** A request the proxy in front of the app says came from `address`. */
function from(address: string, path: string, call: Call = {}) {
  return request(path, { ...call, headers: { "x-forwarded-for": address, ...call.headers } });
}

let since = 0;
/** Lines written since the test began. */
async function lines(kind?: string) {
  let q = db().selectFrom("audit_event").selectAll().where("id", ">", since).orderBy("id");
  if (kind) q = q.where("kind", "=", kind as never);
  return q.execute();
}

async function part(jobId: number, name: string, needsLeakTest = 0) {
  const now = new Date().toISOString();
  return db()
    .insertInto("part")
    .values({ job_id: jobId, name, kind: needsLeakTest ? "reservoir" : "bracket", material: "aluminum", needs_leak_test: needsLeakTest, needs_coating: 0, created_at: now, updated_at: now } as never)
    .returning("id" as never)
    .executeTakeFirstOrThrow() as Promise<{ id: number }>;
}

beforeEach(async () => {
  since = Number((await db().selectFrom("audit_event").select((eb) => eb.fn.max("id").as("n")).executeTakeFirst())?.n ?? 0);
});

describe("the audit trail records", () => {
  it("sign-ins, failed sign-ins and a refusal after too many tries, with the address they came from", async () => {
    const tech = await makeStaff(db(), "tech");
    const ok = from("203.0.113.7", "/api/session", { body: { email: tech.email, password: TEST_PASSWORD } });
    expect((await session.POST(ok)).status).toBe(200);
    const [signIn] = await lines("sign_in");
    expect(signIn).toMatchObject({ actor_id: tech.id, actor_name: tech.name, address: "203.0.113.7", summary: `${tech.name} signed in.` });

    await session.POST(from("203.0.113.8", "/api/session", { body: { email: tech.email, password: "not-the-password" } }));
    await session.POST(from("203.0.113.8", "/api/session", { body: { email: "nobody@shop.example", password: "whatever-it-is" } }));
    const failed = await lines("sign_in_failed");
    expect(failed.map((l) => [l.actor_id, l.subject, l.summary])).toEqual([
      [null, tech.email, `Failed sign-in for ${tech.name}'s account (${tech.email}). Wrong password.`],
      [null, "nobody@shop.example", "Failed sign-in for nobody@shop.example, which is no staff account."],
    ]);

    const victim = await makeStaff(db(), "office");
    let refusals = 0;
    for (let i = 0; i < 8; i++) {
      const res = await session.POST(from("203.0.113.9", "/api/session", { body: { email: victim.email, password: "wrong-password" } }));
      if (res.status === 429) refusals++;
    }
    expect(refusals).toBeGreaterThan(1);
    // Noted once, however often the form is hammered.
    const refused = await lines("sign_in_refused");
    expect(refused).toHaveLength(1);
    expect(refused[0].summary).toBe(`Sign-in refused after too many failed tries, for ${victim.name}'s account (${victim.email}).`);
  }, 30_000);

  it("keeps no address the app cannot trust: without a proxy setting a forged X-Forwarded-For is not written down", async () => {
    const tech = await makeStaff(db(), "tech");
    process.env.TRUST_PROXY_HOPS = "0";
    try {
      expect((await session.POST(from("192.0.2.66", "/api/session", { body: { email: tech.email, password: TEST_PASSWORD } }))).status).toBe(200);
    } finally {
      process.env.TRUST_PROXY_HOPS = "1";
    }
    expect((await lines("sign_in")).map((l) => l.address)).toEqual([""]);
  });

  it("staff added, role and active changes, a password reset and an own password change", async () => {
    const { person: owner, cookie } = await as("owner");
    const added = await staff.POST(from("198.51.100.4", "/api/staff", { cookie, body: { name: "Rosa Quill", email: "rosa@shop.example", role: "tech", password: "a-long-enough-password" } }));
    expect(added.status).toBe(201);
    const rosa = (await readBody(added)).staff as { id: string };
    await staffItem.PATCH(request(`/api/staff/${rosa.id}`, { cookie, method: "PATCH", body: { role: "office" } }), params({ id: rosa.id }));
    const reset = await passwordReset.POST(request(`/api/staff/${rosa.id}/password-reset`, { cookie, method: "POST", headers: { origin: "http://localhost:3000" } }), params({ id: rosa.id }));
    expect(reset.status).toBe(200);
    await staffItem.PATCH(request(`/api/staff/${rosa.id}`, { cookie, method: "PATCH", body: { active: false } }), params({ id: rosa.id }));
    const ownCookie = await sessionCookieFor(owner.id);
    await sessionCookieFor(owner.id); // a second signed-in device, signed out by the change
    const own = await password.POST(request("/api/me/password", { cookie: ownCookie, body: { currentPassword: TEST_PASSWORD, newPassword: "owner-new-password-1", confirmPassword: "owner-new-password-1" } }));
    expect(own.status).toBe(200);

    const all = await lines();
    expect(all.map((l) => [l.kind, l.actor_id, l.subject, l.summary])).toEqual([
      ["staff_added", owner.id, "Rosa Quill", `${owner.name} added Rosa Quill (rosa@shop.example) as tech.`],
      ["staff_changed", owner.id, "Rosa Quill", `${owner.name} changed Rosa Quill: role tech → office.`],
      ["password_reset", owner.id, "Rosa Quill", `${owner.name} reset Rosa Quill's password to a temporary one; their signed-in devices were signed out.`],
      ["staff_changed", owner.id, "Rosa Quill", `${owner.name} changed Rosa Quill: deactivated.`],
      ["password_changed", owner.id, owner.name, `${owner.name} changed their own password; 2 other signed-in devices were signed out.`],
    ]);
    expect(all[0].address).toBe("198.51.100.4");
    expect(JSON.parse(all[1].details!)).toEqual({ staffId: rosa.id, role: ["tech", "office"] });
    // A refused change leaves no line.
    const self = await staffItem.PATCH(request(`/api/staff/${owner.id}`, { cookie: ownCookie.replace(/=.*/, "=x"), method: "PATCH", body: { role: "tech" } }), params({ id: owner.id }));
    expect(self.status).toBe(401);
    expect(await lines()).toHaveLength(5);
  });

  it("an override with its reason, and not an ordinary move", async () => {
    const { person: owner, cookie } = await as("owner");
    const job = await makeJob(db(), { stage: "pressure_test", parts: false });
    await part(job.id, "Wet-kit reservoir", 1);
    const plain = await makeJob(db(), { stage: "queued", scope: "install_only" });
    expect((await moves.POST(request(`/api/jobs/${plain.id}/moves`, { cookie, body: { toStage: "install", version: plain.version } }), params({ id: String(plain.id) }))).status).toBe(200);
    expect(await lines("override")).toEqual([]);

    const refused = await moves.POST(request(`/api/jobs/${job.id}/moves`, { cookie, body: { toStage: "coating", version: job.version } }), params({ id: String(job.id) }));
    expect(refused.status).toBe(422);
    expect(await lines("override")).toEqual([]);
    const res = await moves.POST(request(`/api/jobs/${job.id}/moves`, { cookie, body: { toStage: "coating", version: job.version, override: { reason: "Tested on the customer's rig; paper sheet in the file." } } }), params({ id: String(job.id) }));
    expect(res.status).toBe(200);
    const [line] = await lines("override");
    expect(line).toMatchObject({ actor_id: owner.id, subject: `work order ${job.work_order}` });
    expect(line.summary).toMatch(new RegExp(`^${owner.name} moved work order ${job.work_order} from Pressure test to Outside coating without: .+\\. Reason: Tested on the customer's rig; paper sheet in the file\\.$`));
    expect(JSON.parse(line.details!)).toMatchObject({ jobId: job.id, from: "pressure_test", to: "coating", reason: "Tested on the customer's rig; paper sheet in the file." });
  });

  it("status links issued and turned off, part and photo deletions, and shop setting changes", async () => {
    await ensureShop(db());
    const { person: office, cookie } = await as("office");
    const { person: owner, cookie: ownerCookie } = await as("owner");
    const job = await makeJob(db(), { parts: false });

    expect((await jobLinks.POST(request(`/api/jobs/${job.id}/status-links`, { cookie, body: {} }), params({ id: String(job.id) }))).status).toBe(201);
    await jobLinks.POST(request(`/api/jobs/${job.id}/status-links`, { cookie, body: {} }), params({ id: String(job.id) }));
    const links = await db().selectFrom("status_link").select("id").where("job_id", "=", job.id).orderBy("id").execute();
    expect((await linkItem.DELETE(request(`/api/status-links/${links[1].id}`, { cookie, method: "DELETE", headers: { origin: "http://localhost:3000" } }), params({ id: String(links[1].id) }))).status).toBe(200);

    const bracket = await part(job.id, "Pump bracket");
    expect((await partItem.DELETE(request(`/api/parts/${bracket.id}`, { cookie, method: "DELETE", headers: { origin: "http://localhost:3000" } }), params({ id: String(bracket.id) }))).status).toBeLessThan(300);

    const now = new Date().toISOString();
    const photo = await db()
      .insertInto("photo")
      .values({ job_id: job.id, stage: "queued", part_id: null, caption: "Frame rail before drilling", customer_visible: 1, uploaded_by: office.id, upload_key: "auditphotokey", original_name: "rail.jpg", original_type: "image/jpeg", original_bytes: 10, width: 10, height: 10, created_at: now, updated_at: now })
      .returning("id")
      .executeTakeFirstOrThrow();
    expect((await photoItem.DELETE(request(`/api/photos/${photo.id}`, { cookie, method: "DELETE", headers: { origin: "http://localhost:3000" } }), params({ id: String(photo.id) }))).status).toBeLessThan(300);

    expect((await shopSettings.PATCH(request("/api/shop-settings", { cookie: ownerCookie, method: "PATCH", body: { leakAllowedDropPsi: 0.1 } }))).status).toBe(200);
    expect((await notify.PUT(request("/api/notify-settings", { cookie: ownerCookie, method: "PUT", body: { notifyStages: ["ready"], statusLinkDays: 30 } }))).status).toBe(200);
    expect((await procedure.PATCH(request("/api/shop-settings/leak-test-procedure", { cookie: ownerCookie, method: "PATCH", body: { minHoldMinutes: 20 } }))).status).toBe(200);

    const wo = job.work_order;
    expect((await lines()).map((l) => [l.kind, l.actor_id, l.summary])).toEqual([
      ["status_link_issued", office.id, `${office.name} issued a new status link for work order ${wo}.`],
      ["status_link_issued", office.id, `${office.name} issued a new status link for work order ${wo}, turning off the one before it.`],
      ["status_link_turned_off", office.id, `${office.name} turned off the status link for work order ${wo}.`],
      ["part_deleted", office.id, `${office.name} deleted the part "Pump bracket" from work order ${wo}.`],
      ["photo_deleted", office.id, `${office.name} deleted the photo "Frame rail before drilling" from work order ${wo}.`],
      ["settings_changed", owner.id, `${owner.name} changed the allowed leak-test drop from 0.05 psi to 0.1 psi.`],
      ["settings_changed", owner.id, expect.stringMatching(new RegExp(`^${owner.name} changed customer e-mail settings: e-mail at stages .+ → ready; status links last 60 → 30 days after delivery\\.$`))],
      ["settings_changed", owner.id, `${owner.name} changed the leak-test procedure: shortest hold (min) from 15 to 20.`],
    ]);
    // Saving the same settings again changes nothing, and says nothing.
    await shopSettings.PATCH(request("/api/shop-settings", { cookie: ownerCookie, method: "PATCH", body: { leakAllowedDropPsi: 0.1 } }));
    await procedure.PATCH(request("/api/shop-settings/leak-test-procedure", { cookie: ownerCookie, method: "PATCH", body: { minHoldMinutes: 20 } }));
    expect(await lines("settings_changed")).toHaveLength(3);
  });

  it("is written in the change's own transaction: when the line cannot be written, the change is not made either", async () => {
    const { cookie } = await as("office");
    const job = await makeJob(db(), { parts: false });
    const doomed = await part(job.id, "Tool box");
    await sql`create temp trigger audit_fails before insert on audit_event begin select raise(abort, 'disk full'); end`.execute(db());
    const logged = vi.spyOn(console, "error").mockImplementation(() => undefined);
    try {
      const res = await partItem.DELETE(request(`/api/parts/${doomed.id}`, { cookie, method: "DELETE", headers: { origin: "http://localhost:3000" } }), params({ id: String(doomed.id) }));
      expect(res.status).toBe(500);
    } finally {
      logged.mockRestore();
      await sql`drop trigger audit_fails`.execute(db());
    }
    expect(await db().selectFrom("part").select("id").where("id", "=", doomed.id).execute()).toHaveLength(1);
  });

  it("is never changed or removed", async () => {
    const { cookie } = await as("owner");
    await staff.POST(request("/api/staff", { cookie, body: { name: "Temp Hand", email: "temp@shop.example", role: "tech", password: "a-long-enough-password" } }));
    const [line] = await lines("staff_added");
    await expect(db().updateTable("audit_event").set({ summary: "nothing happened" }).where("id", "=", line.id).execute()).rejects.toThrow("The audit trail is never changed.");
    await expect(db().deleteFrom("audit_event").where("id", "=", line.id).execute()).rejects.toThrow("The audit trail is never changed.");
  });
});

describe("GET /api/audit", () => {
  it("filters by kind, person and day, newest first, and refuses an impossible date", async () => {
    const { person: owner, cookie } = await as("owner");
    const other = await makeStaff(db(), "owner");
    const otherCookie = await sessionCookieFor(other.id);
    await staff.POST(request("/api/staff", { cookie, body: { name: "Filter One", email: "f1@shop.example", role: "tech", password: "a-long-enough-password" } }));
    await staff.POST(request("/api/staff", { cookie: otherCookie, body: { name: "Filter Two", email: "f2@shop.example", role: "tech", password: "a-long-enough-password" } }));

    const get = async (query: string) => audit.GET(request(`/api/audit?${query}`, { cookie }));
    const byOwner = await readBody(await get(`kind=staff_added&staff=${owner.id}`));
    expect(byOwner.entries.map((e: { subject: string }) => e.subject)).toEqual(["Filter One"]);
    const both = await readBody(await get("kind=staff_added"));
    expect(both.entries.map((e: { subject: string }) => e.subject).slice(0, 2)).toEqual(["Filter Two", "Filter One"]);

    const long = (await readBody(await get(`from=2020-01-01&to=2099-12-31`))).entries.length;
    expect(long).toBeGreaterThanOrEqual(2);
    expect((await readBody(await get(`from=2020-01-01&to=2020-01-02`))).entries).toEqual([]);

    const bad = await get("from=2026-02-31");
    expect(bad.status).toBe(400);
    expect((await readBody(bad)).error.details.fields.from).toEqual(["Give a real date as YYYY-MM-DD, e.g. 2026-03-14."]);
    const backwards = await get("from=2026-03-02&to=2026-03-01");
    expect(backwards.status).toBe(400);
    const kind = await get("kind=coffee_break");
    expect(kind.status).toBe(400);

    const tech = await as("tech");
    expect((await audit.GET(request("/api/audit", { cookie: tech.cookie }))).status).toBe(403);
  });

  it("downloads CSV with formula-looking cells made harmless", async () => {
    const { cookie } = await as("owner");
    await staff.POST(request("/api/staff", { cookie, body: { name: '=HYPERLINK("http://bad.example","open")', email: "formula@shop.example", role: "tech", password: "a-long-enough-password" } }));
    const res = await audit.GET(request("/api/audit?format=csv&kind=staff_added", { cookie }));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="audit-trail-\d{4}-\d{2}-\d{2}\.csv"$/);
    const text = await res.text();
    const [header] = text.split("\r\n");
    expect(header).toMatch(/^Entry,When \(.+\),When \(UTC\),What,Who,From address,Concerning,Details$/);
    expect(text).toContain(`,"'=HYPERLINK(""http://bad.example"",""open"")",`);
    expect(text).not.toMatch(/,=HYPERLINK/);
    expect(text).not.toMatch(/,"=HYPERLINK/);
  });
});
