import { createHash } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { subDays } from "date-fns";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import StatusLinkNotFound from "@/app/(public)/status/[token]/not-found";
import StatusPage, { generateMetadata } from "@/app/(public)/status/[token]/page";
import * as statusPhotoRoute from "@/app/(public)/status/[token]/photos/[photoId]/route";
import { MessagesSection } from "@/app/(shop)/jobs/[id]/messages-section";
import * as jobLinks from "@/app/api/jobs/[id]/status-links/route";
import * as notify from "@/app/api/notify-settings/route";
import * as linkItem from "@/app/api/status-links/[id]/route";
import type { Role, Stage } from "@/db/schema";
import { findJob } from "@/server/jobs/queries";
import { savePhotoFiles } from "@/server/photos/store";
import { flushLinkOpens } from "@/server/status/opened";
import { openStatusLink } from "@/server/status/queries";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();
const photosDir = mkdtempSync(path.join(tmpdir(), "baywright-status-photos-"));

beforeAll(async () => {
  process.env.PHOTOS_DIR = photosDir;
  process.env.APP_URL = "https://status.cold-creek.example";
  await ensureShop(db());
});
afterAll(() => rmSync(photosDir, { recursive: true, force: true }));

async function as(role: Role) {
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

async function issue(cookie: string, jobId: number) {
  return jobLinks.POST(request(`/api/jobs/${jobId}/status-links`, { method: "POST", cookie }), params({ id: String(jobId) }));
}

async function issuedToken(jobId: number) {
  const { cookie } = await as("office");
  const res = await issue(cookie, jobId);
  expect(res.status).toBe(201);
  const { link } = await readBody(res);
  return { linkId: link.id as number, token: (link.url as string).split("/status/")[1], url: link.url as string };
}

/** The page as the server renders it (its body, not the document shell). */
async function pageHtml(token: string) {
  const element = await StatusPage({ params: Promise.resolve({ token }) });
  return renderToStaticMarkup(element);
}

async function pageRefused(token: string) {
  await expect(StatusPage({ params: Promise.resolve({ token }) })).rejects.toMatchObject({ digest: expect.stringMatching(/404/) });
}

async function addPhoto(jobId: number, uploadedBy: string, opts: { caption: string; visible: boolean; stage?: Stage }) {
  const key = `key${Math.random().toString(36).slice(2, 12)}`;
  const display = await sharp({ create: { width: 40, height: 30, channels: 3, background: "#a33" } }).webp().toBuffer();
  await savePhotoFiles(jobId, key, { display, thumb: display });
  const at = new Date().toISOString();
  const row = await db()
    .insertInto("photo")
    .values({ job_id: jobId, stage: opts.stage ?? "fabricate", part_id: null, caption: opts.caption, customer_visible: opts.visible ? 1 : 0, uploaded_by: uploadedBy, upload_key: key, original_name: "a.jpg", original_type: "image/jpeg", original_bytes: 100, width: 40, height: 30, created_at: at, updated_at: at })
    .returning("id")
    .executeTakeFirstOrThrow();
  return row.id;
}

function photo(token: string, photoId: number | string, size = "") {
  return statusPhotoRoute.GET(new Request(`http://localhost:3000/status/${token}/photos/${photoId}${size}`), { params: Promise.resolve({ token, photoId: String(photoId) }) });
}

describe("status links", () => {
  it("office issues a link: a long random token shown once, stored only as its SHA-256", async () => {
    const job = await makeJob(db());
    const { token, url, linkId } = await issuedToken(job.id);
    expect(url).toBe(`https://status.cold-creek.example/status/${token}`);
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    const stored = await db().selectFrom("status_link").selectAll().where("id", "=", linkId).executeTakeFirstOrThrow();
    expect(stored.token_hash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(JSON.stringify(stored)).not.toContain(token);

    const { cookie } = await as("tech");
    const listed = await readBody(await jobLinks.GET(request(`/api/jobs/${job.id}/status-links`, { cookie }), params({ id: String(job.id) })));
    expect(listed.links).toMatchObject([{ id: linkId, state: "active", revokedAt: null, expiresAt: null }]);
    expect(JSON.stringify(listed)).not.toContain(token);
    expect((await issue(cookie, job.id)).status).toBe(403);
  });

  it("reissuing turns the old link off; a revoked link is refused by the page and the photo route", async () => {
    const job = await makeJob(db());
    const first = await issuedToken(job.id);
    const second = await issuedToken(job.id);
    expect(second.token).not.toBe(first.token);
    expect(await openStatusLink(db(), first.token)).toMatchObject({ state: "revoked" });
    await pageRefused(first.token);

    const staff = await makeStaff(db(), "tech");
    const visible = await addPhoto(job.id, staff.id, { caption: "Tank welded", visible: true });
    expect((await photo(second.token, visible)).status).toBe(200);

    const { cookie } = await as("office");
    const tech = await as("tech");
    const revoke = (c: string) => linkItem.DELETE(request(`/api/status-links/${second.linkId}`, { method: "DELETE", cookie: c }), params({ id: String(second.linkId) }));
    expect((await revoke(tech.cookie)).status).toBe(403);
    expect((await revoke(cookie)).status).toBe(200);
    await pageRefused(second.token);
    const gone = await photo(second.token, visible);
    expect(gone.status).toBe(410);
    expect(gone.headers.get("cache-control")).toBe("no-store");
    expect((await linkItem.DELETE(request(`/api/status-links/999999`, { method: "DELETE", cookie }), params({ id: "999999" }))).status).toBe(404);
    expect((await linkItem.DELETE(request(`/api/status-links/x`, { method: "DELETE", cookie }), params({ id: "x" }))).status).toBe(400);
  });

  it("a link works before delivery however long it takes, and ends the shop's number of days after delivery", async () => {
    const job = await makeJob(db(), { stage: "delivered" });
    const { token } = await issuedToken(job.id);
    const deliveredOn = subDays(new Date(), 61).toISOString();
    await db().insertInto("stage_event").values({ job_id: job.id, from_stage: "ready", to_stage: "delivered", actor_id: null, at: deliveredOn, note: "", override_reason: null }).execute();
    expect(await openStatusLink(db(), token)).toMatchObject({ state: "expired" });
    await pageRefused(token);

    const { cookie } = await as("owner");
    const save = await notify.PUT(request("/api/notify-settings", { method: "PUT", cookie, body: { notifyStages: ["ready", "delivered"], statusLinkDays: 90 } }));
    expect(save.status).toBe(200);
    expect(await openStatusLink(db(), token)).toMatchObject({ state: "active" });
    expect(await openStatusLink(db(), token, subDays(new Date(), -30))).toMatchObject({ state: "expired" });

    const bad = await notify.PUT(request("/api/notify-settings", { method: "PUT", cookie, body: { notifyStages: ["paint"], statusLinkDays: 0 } }));
    expect(Object.keys((await readBody(bad)).error.details.fields)).toEqual(expect.arrayContaining(["notifyStages.0", "statusLinkDays"]));
    const tech = await as("tech");
    expect((await notify.PUT(request("/api/notify-settings", { method: "PUT", cookie: tech.cookie, body: { notifyStages: [], statusLinkDays: 60 } }))).status).toBe(403);
    await notify.PUT(request("/api/notify-settings", { method: "PUT", cookie, body: { notifyStages: ["fabricate", "pressure_test", "coating", "install", "wire", "ready", "delivered"], statusLinkDays: 60 } }));
    expect((await readBody(await notify.GET(request("/api/notify-settings", { cookie: tech.cookie })))).settings.statusLinkDays).toBe(60);

    const waiting = await makeJob(db(), { stage: "coating" });
    const old = await issuedToken(waiting.id);
    expect(await openStatusLink(db(), old.token, subDays(new Date(), -400))).toMatchObject({ state: "active" });
  });

  it("the job page gives the link's times on the shop's clock", async () => {
    const job = await makeJob(db());
    const { linkId } = await issuedToken(job.id);
    // 05:20 UTC on 2 Dec is 23:20 on 1 Dec at a shop on US/Central time.
    await db().updateTable("status_link").set({ created_at: "2031-12-02T05:20:00.000Z", last_opened_at: "2031-12-02T14:05:00.000Z" }).where("id", "=", linkId).execute();
    const { staff } = await as("office");
    const html = renderToStaticMarkup(
      createElement(QueryClientProvider, { client: new QueryClient() }, await MessagesSection({ job: (await findJob(db(), job.id))!, user: { id: staff.id, name: staff.name, email: staff.email, role: "office" } })),
    );
    expect(html).toContain("issued 1 Dec, 23:20");
    expect(html).toContain("last opened 2 Dec, 08:05");
    expect(html).not.toContain("05:20");
  });

  it("unknown and malformed tokens are simply not found", async () => {
    expect(await openStatusLink(db(), "not-a-token")).toEqual({ state: "unknown" });
    expect(await openStatusLink(db(), "A".repeat(43))).toEqual({ state: "unknown" });
    await pageRefused("A".repeat(43));
    expect((await photo("A".repeat(43), 1)).status).toBe(404);
  });
});

describe("the status page", () => {
  it("shows the truck, where it is, the timeline, the ready date, the visible photos and the shop's phone; nothing internal", async () => {
    const job = await makeJob(db(), { stage: "coating", notes: "INTERNAL: customer haggled on price, cost 4120 dollars" });
    const truck = await db().selectFrom("truck").innerJoin("job", "job.truck_id", "truck.id").select(["truck.unit_number", "truck.vin"]).where("job.id", "=", job.id).executeTakeFirstOrThrow();
    await db().updateTable("job").set({ due_on: "2031-03-14" }).where("id", "=", job.id).execute();
    const fabricator = await makeStaff(db(), "tech", { name: "Rosalind Quillfeather" });
    const owner = await makeStaff(db(), "owner", { name: "Bartholomew Vantongeren" });
    const days = (n: number) => subDays(new Date(), n).toISOString();
    await db()
      .insertInto("stage_event")
      .values([
        { job_id: job.id, from_stage: null, to_stage: "queued", actor_id: owner.id, at: days(20), note: "SECRET-OPEN-NOTE", override_reason: null },
        { job_id: job.id, from_stage: "queued", to_stage: "fabricate", actor_id: fabricator.id, at: days(15), note: "SECRET-MOVE-NOTE", override_reason: null },
        { job_id: job.id, from_stage: "fabricate", to_stage: "pressure_test", actor_id: fabricator.id, at: days(10), note: "", override_reason: null },
        { job_id: job.id, from_stage: "pressure_test", to_stage: "fabricate", actor_id: fabricator.id, at: days(9), note: "weld porosity at sump", override_reason: null },
        { job_id: job.id, from_stage: "fabricate", to_stage: "pressure_test", actor_id: fabricator.id, at: days(8), note: "", override_reason: null },
        { job_id: job.id, from_stage: "pressure_test", to_stage: "coating", actor_id: owner.id, at: days(5), note: "", override_reason: "SECRET-OVERRIDE-REASON" },
      ])
      .execute();
    await addPhoto(job.id, fabricator.id, { caption: "Tank ready for powder coat", visible: true });
    await addPhoto(job.id, fabricator.id, { caption: "HIDDEN-PHOTO-CAPTION", visible: false });
    const otherJob = await makeJob(db(), { notes: "OTHER-JOB-NOTE" });
    await addPhoto(otherJob.id, fabricator.id, { caption: "OTHER-JOB-PHOTO", visible: true });

    const { token } = await issuedToken(job.id);
    const html = await pageHtml(token);
    expect(html).toContain(`Unit ${truck.unit_number}`);
    expect(html).toContain(`VIN ending ${truck.vin.slice(-6)}`);
    expect(html).not.toContain(truck.vin);
    expect(html).toContain("Your job is at powder coat: the fabricated parts go to an outside coater and come back before install.");
    expect(html).toContain("When the parts are back from the coater, we install the kit on your truck.");
    expect(html).toContain("Friday 14 March");
    expect(html).toContain("Tank ready for powder coat");
    expect(html).toContain("(555) 010-0000");
    expect(html).toContain('href="tel:5550100000"');
    expect(html).toMatch(/Back to this step on/);
    for (const secret of ["INTERNAL", "haggled", "4120", "SECRET-OPEN-NOTE", "SECRET-MOVE-NOTE", "weld porosity", "SECRET-OVERRIDE-REASON", "HIDDEN-PHOTO-CAPTION", "OTHER-JOB", "Quillfeather", "Vantongeren", "Rosalind", "Bartholomew"]) {
      expect(html, secret).not.toContain(secret);
    }
    // "Opened" is written a moment after the view, off the request.
    await flushLinkOpens();
    expect((await db().selectFrom("status_link").select("last_opened_at").where("token_hash", "=", createHash("sha256").update(token).digest("hex")).executeTakeFirstOrThrow()).last_opened_at).not.toBeNull();
  });

  it("an override into coating claims no passed test: stage words only, no tank, dates as the shop's clock shows them", async () => {
    const job = await makeJob(db(), { stage: "coating" });
    await db().updateTable("job").set({ description: "Hose carrier and breakaway bracket" }).where("id", "=", job.id).execute();
    const owner = await makeStaff(db(), "owner");
    // 03:30 UTC is still the evening before at a shop on US/Central time.
    await db()
      .insertInto("stage_event")
      .values([
        { job_id: job.id, from_stage: null, to_stage: "queued", actor_id: owner.id, at: "2031-03-01T15:00:00.000Z", note: "", override_reason: null },
        { job_id: job.id, from_stage: "queued", to_stage: "fabricate", actor_id: owner.id, at: "2031-03-02T15:00:00.000Z", note: "", override_reason: null },
        { job_id: job.id, from_stage: "fabricate", to_stage: "pressure_test", actor_id: owner.id, at: "2031-03-03T15:00:00.000Z", note: "", override_reason: null },
        { job_id: job.id, from_stage: "pressure_test", to_stage: "coating", actor_id: owner.id, at: "2031-03-05T03:30:00.000Z", note: "", override_reason: "coater pickup today, test record to follow" },
      ])
      .execute();
    const { token } = await issuedToken(job.id);
    const html = await pageHtml(token);
    expect(html).toContain("Your job is at powder coat");
    expect(html).not.toMatch(/passed|tank|leak test/i);
    // Its only part is a bracket that needs no leak test: the customer sees no pressure test step.
    expect(html).not.toContain("Pressure test <span");
    expect(html).toContain("Powder coat <span");
    expect(html).toContain("Since Tue 4 Mar");
    expect(html).not.toContain("Wed 5 Mar");
    expect(html).toContain("Reached Sun 2 Mar");

    await db().updateTable("shop").set({ time_zone: "UTC" }).where("id", "=", 1).execute();
    try {
      expect(await pageHtml(token)).toContain("Since Wed 5 Mar");
    } finally {
      await db().updateTable("shop").set({ time_zone: "US/Central" }).where("id", "=", 1).execute();
    }
  });

  it("lists only the steps on the job's own route, names the job in its heading, and shows a new route once a part is added", async () => {
    const job = await makeJob(db(), { stage: "fabricate", parts: false });
    await db().updateTable("job").set({ description: "Wet kit: 35 gal stainless tank, PTO pump" }).where("id", "=", job.id).execute();
    const now = new Date().toISOString();
    const addPart = (name: string, leak: number, coat: number) =>
      db().insertInto("part").values({ job_id: job.id, name, kind: leak ? "reservoir" : "bracket", material: "stainless", needs_leak_test: leak, needs_coating: coat, created_at: now, updated_at: now } as never).execute();
    await addPart("35 gal stainless tank", 1, 0);
    const { token } = await issuedToken(job.id);
    const steps = (html: string) => [...html.matchAll(/<p class="[^"]*">([^<]+) <span class="text-sm font-normal text-ink-soft">· /g)].map((m) => m[1]);

    const stainless = await pageHtml(token);
    expect(stainless).toContain(job.work_order);
    expect(stainless).toContain("Wet kit: 35 gal stainless tank, PTO pump");
    expect(steps(stainless)).toEqual(["Booked in", "Fabrication", "Pressure test", "Install", "Wiring and run test", "Ready for pickup", "Picked up"]);
    expect(stainless).toContain("Next, the fabricated parts are pressure-tested for leaks.");
    expect(stainless).not.toMatch(/powder coat|coater/i);

    // The office adds a bracket that goes out for powder coat: the route grows from then on.
    await addPart("Pump mount bracket", 0, 1);
    expect(steps(await pageHtml(token))).toEqual(["Booked in", "Fabrication", "Pressure test", "Powder coat", "Install", "Wiring and run test", "Ready for pickup", "Picked up"]);
  });

  it("the browser tab names the unit and the shop, not the software", async () => {
    const job = await makeJob(db());
    const unit = (await db().selectFrom("truck").innerJoin("job", "job.truck_id", "truck.id").select("truck.unit_number").where("job.id", "=", job.id).executeTakeFirstOrThrow()).unit_number;
    const { token, linkId } = await issuedToken(job.id);
    const meta = await generateMetadata({ params: Promise.resolve({ token }) });
    expect(meta.title).toEqual({ absolute: `Unit ${unit} · ${job.work_order} · Test Upfit` });
    expect(meta.robots).toMatchObject({ index: false, follow: false });
    expect(meta.referrer).toBe("no-referrer");

    const { cookie } = await as("office");
    await linkItem.DELETE(request(`/api/status-links/${linkId}`, { method: "DELETE", cookie }), params({ id: String(linkId) }));
    const off = await generateMetadata({ params: Promise.resolve({ token }) });
    expect(off.title).toEqual({ absolute: "Status link not working · Test Upfit" });
    expect(JSON.stringify(off)).not.toContain(unit);
  });

  it("offers a reply only when replies go somewhere; a shop without a phone is still named", async () => {
    const job = await makeJob(db());
    const { token } = await issuedToken(job.id);
    const before = process.env.EMAIL_REPLY_TO;
    await db().updateTable("shop").set({ phone: "" }).where("id", "=", 1).execute();
    try {
      delete process.env.EMAIL_REPLY_TO;
      expect(await pageHtml(token)).not.toMatch(/reply/i);
      const gone = renderToStaticMarkup(await StatusLinkNotFound());
      expect(gone).not.toMatch(/reply/i);
      expect(gone).toContain("Get in touch with Test Upfit for news of your truck or a new link.");
      process.env.EMAIL_REPLY_TO = "office@cold-creek.example";
      expect(await pageHtml(token)).toContain("Reply to the shop&#x27;s e-mail to reach them.");
    } finally {
      await db().updateTable("shop").set({ phone: "(555) 010-0000" }).where("id", "=", 1).execute();
      if (before === undefined) delete process.env.EMAIL_REPLY_TO;
      else process.env.EMAIL_REPLY_TO = before;
    }
  });

  it("serves only the link's own photos marked for the customer, with private headers", async () => {
    const job = await makeJob(db());
    const other = await makeJob(db());
    const staff = await makeStaff(db(), "tech");
    const shown = await addPhoto(job.id, staff.id, { caption: "shown", visible: true });
    const hidden = await addPhoto(job.id, staff.id, { caption: "hidden", visible: false });
    const otherShown = await addPhoto(other.id, staff.id, { caption: "other", visible: true });
    const { token } = await issuedToken(job.id);

    const ok = await photo(token, shown, "?size=thumb");
    expect(ok.status).toBe(200);
    expect(ok.headers.get("content-type")).toBe("image/webp");
    expect(ok.headers.get("referrer-policy")).toBe("no-referrer");
    expect(ok.headers.get("x-robots-tag")).toContain("noindex");
    expect(ok.headers.get("cache-control")).toBe("no-store");
    expect((await sharp(Buffer.from(await ok.arrayBuffer())).metadata()).format).toBe("webp");
    expect((await photo(token, hidden)).status).toBe(404);
    expect((await photo(token, otherShown)).status).toBe(404);
    expect((await photo(token, "1e3")).status).toBe(404);
  });

  it("a link that no longer works gets a plain page with the shop's phone", async () => {
    const html = renderToStaticMarkup(await StatusLinkNotFound());
    expect(html).toContain("This status link no longer works");
    expect(html).toContain("(555) 010-0000");
    expect(html).toContain("Test Upfit");
  });
});
