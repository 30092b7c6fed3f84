import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import sharp from "sharp";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import * as jobPhotos from "@/app/api/jobs/[id]/photos/route";
import * as photoItem from "@/app/api/photos/[id]/route";
import { PhotosSection } from "@/app/(shop)/jobs/[id]/photos-section";
import { findJob } from "@/server/jobs/queries";
import type { Role } from "@/db/schema";
import { type Fakes, startFakes } from "@/fakes/server.mjs";
import { checkAndDerive } from "@/server/photos/process";
import { photoPath } from "@/server/photos/store";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

const TOKEN = Buffer.from(JSON.stringify({ apiKey: "sk_test_photo_bench", appId: "photobenchapp", regions: ["local1"] })).toString("base64");
const dirs: string[] = [];
const tempDir = () => {
  const dir = mkdtempSync(path.join(tmpdir(), "baywright-photos-"));
  dirs.push(dir);
  return dir;
};

let fake: Fakes;
let app: { url: string; close(): Promise<void> };

/** The app's upload route served over HTTP: the fake calls it back like the real service would. */
async function serveUploadRoute() {
  const route = await import("@/app/api/uploadthing/route");
  const server = http.createServer(async (req, res) => {
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const request = new Request(`http://${req.headers.host}${req.url}`, {
      method: req.method,
      headers: req.headers as Record<string, string>,
      body: req.method === "GET" || req.method === "HEAD" ? undefined : Buffer.concat(chunks),
    });
    const handler = req.method === "GET" ? route.GET : route.POST;
    const response = await handler(request as never);
    res.writeHead(response.status, Object.fromEntries(response.headers));
    res.end(Buffer.from(await response.arrayBuffer()));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  return {
    url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

beforeAll(async () => {
  fake = await startFakes({ port: 0, dataDir: tempDir(), token: TOKEN });
  process.env.UPLOADTHING_TOKEN = TOKEN;
  process.env.UPLOADTHING_INGEST_URL = fake.url;
  process.env.UPLOADTHING_API_URL = fake.url;
  process.env.UPLOADTHING_UFS_HOST = `localhost:${new URL(fake.url).port}`;
  process.env.UPLOADTHING_UFS_APP_ID_LOCATION = "path";
  process.env.UPLOADTHING_LOG_LEVEL = "None";
  process.env.PHOTOS_DIR = tempDir();
  app = await serveUploadRoute();
  // The app's own address: the uploader's writes carry it as their Origin.
  process.env.APP_URL = app.url;
});
afterAll(async () => {
  await app?.close();
  await fake?.close();
  for (const dir of dirs) rmSync(dir, { recursive: true, force: true });
});
beforeEach(async () => {
  await fetch(`${fake.url}/__fake/reset`, { method: "POST" });
});

async function as(role: Role) {
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

/** A photo as a phone takes it: JPEG with the camera's make, a GPS position and (held sideways) an orientation tag. */
function phonePhoto(colour: { r: number; g: number; b: number }, width = 1600, height = 1200, orientation = 1) {
  return sharp({ create: { width, height, channels: 3, background: colour } })
    .withExif({ IFD0: { Make: "Bench camera" }, IFD3: { GPSLatitudeRef: "N", GPSLatitude: "41/1 30/1 0/1", GPSLongitudeRef: "W", GPSLongitude: "90/1 15/1 0/1" } })
    .withMetadata({ orientation })
    .jpeg({ quality: 85 })
    .toBuffer();
}

type FileSpec = { name: string; type: string; bytes: Uint8Array; declaredSize?: number };

/** What the browser's uploader does: ask the app for presigned URLs, then PUT each file to the upload service. */
async function upload(files: FileSpec[], input: unknown, opts: { cookie?: string; headers?: Record<string, string> } = {}) {
  const action = await fetch(`${app.url}/api/uploadthing?actionType=upload&slug=jobPhoto`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: app.url, ...(opts.cookie ? { cookie: opts.cookie } : {}), ...opts.headers },
    body: JSON.stringify({ files: files.map((f) => ({ name: f.name, size: f.declaredSize ?? f.bytes.length, type: f.type, lastModified: Date.now() })), input }),
  });
  const body = await action.json();
  if (action.status !== 200) return { status: action.status, body, results: [] as { status: number; serverData: any; key: string }[] };
  const presigned = body as { url: string; key: string }[];
  const results = [];
  for (let i = 0; i < presigned.length; i++) {
    const form = new FormData();
    form.append("file", new Blob([Buffer.from(files[i].bytes)], { type: files[i].type }), files[i].name);
    const put = await fetch(presigned[i].url, { method: "PUT", body: form, headers: { Range: "bytes=0-" } });
    const answer = await put.json();
    results.push({ status: put.status, serverData: answer.serverData, key: presigned[i].key });
  }
  return { status: action.status, body, results };
}

async function uploadsAtFake(): Promise<{ key: string; status: string }[]> {
  return (await fetch(`${fake.url}/__fake/uploads`)).json();
}

describe("uploading photos through the upload service", () => {
  it("a tech uploads two photos: recorded hidden from the customer, upright, without location data, with a thumbnail", async () => {
    const { staff, cookie } = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    const jpeg = await phonePhoto({ r: 180, g: 70, b: 30 }, 1600, 1200, 6);
    const png = await sharp({ create: { width: 900, height: 1400, channels: 3, background: { r: 20, g: 90, b: 160 } } }).png().toBuffer();
    const original = await sharp(jpeg).metadata();
    expect([original.exif?.includes(Buffer.from("Bench camera")), original.orientation]).toEqual([true, 6]);

    const done = await upload(
      [
        { name: "tank seam.jpg", type: "image/jpeg", bytes: jpeg },
        { name: "sump.png", type: "image/png", bytes: png },
      ],
      { jobId: job.id, stage: "fabricate", caption: "Sump welded" },
      { cookie },
    );
    expect(done.status).toBe(200);
    expect(done.results.map((r) => r.status)).toEqual([200, 200]);
    const ids = done.results.map((r) => r.serverData.photoId as number);
    expect(ids.every((id) => Number.isInteger(id))).toBe(true);

    const rows = await db().selectFrom("photo").selectAll().where("job_id", "=", job.id).orderBy("id").execute();
    expect(rows).toHaveLength(2);
    expect(rows[0]).toMatchObject({ stage: "fabricate", caption: "Sump welded", customer_visible: 0, uploaded_by: staff.id, original_type: "image/jpeg", original_name: "tank seam.jpg", width: 1200, height: 1600 });
    expect(rows[1]).toMatchObject({ original_type: "image/png", width: 900, height: 1400 });

    for (const row of rows) {
      const display = await sharp(photoPath(job.id, row.upload_key, "display")).metadata();
      const thumb = await sharp(photoPath(job.id, row.upload_key, "thumb")).metadata();
      expect(display.format).toBe("webp");
      expect([display.exif, display.orientation, thumb.exif]).toEqual([undefined, undefined, undefined]);
      expect(Math.max(thumb.width!, thumb.height!)).toBe(480);
    }
    // The original, still carrying the GPS position, does not stay at the upload service.
    expect(await uploadsAtFake()).toEqual([]);

    const listed = await readBody(await jobPhotos.GET(request(`/api/jobs/${job.id}/photos`, { cookie }), params({ id: String(job.id) })));
    expect(listed.photos.map((p: { id: number }) => p.id).sort()).toEqual([...ids].sort());
    expect(listed.photos[0]).toMatchObject({ customerVisible: false, uploadedBy: staff.name });
  });

  it("refuses a file that is not an image though it is named .jpg, by its bytes: nothing recorded, the upload removed", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db());
    const fakeJpeg = new TextEncoder().encode("#!/bin/sh\necho this is a shell script, not a photo\n".repeat(20));
    const done = await upload([{ name: "pump.jpg", type: "image/jpeg", bytes: fakeJpeg }], { jobId: job.id, stage: "queued" }, { cookie });
    expect(done.status).toBe(200);
    expect(done.results[0].status).toBe(200);
    expect(done.results[0].serverData.refused).toMatch(/pump\.jpg: That file is not a photo/);
    expect(await db().selectFrom("photo").select("id").where("job_id", "=", job.id).execute()).toEqual([]);
    expect(await uploadsAtFake()).toEqual([]);
  });

  it("refuses an SVG: declared as one before any upload, and renamed .jpg after it by its bytes", async () => {
    const { cookie } = await as("office");
    const job = await makeJob(db());
    const svg = new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script><rect width="10" height="10"/></svg>');
    const declared = await upload([{ name: "logo.svg", type: "image/svg+xml", bytes: svg }], { jobId: job.id, stage: "queued" }, { cookie });
    expect(declared.status).toBe(400);
    expect(declared.body.message).toMatch(/logo\.svg is not a JPEG, PNG or WebP photo/);
    expect(await uploadsAtFake()).toEqual([]);

    const renamed = await upload([{ name: "logo.jpg", type: "image/jpeg", bytes: svg }], { jobId: job.id, stage: "queued" }, { cookie });
    expect(renamed.results[0].serverData.refused).toMatch(/not a photo/);
    expect(await db().selectFrom("photo").select("id").where("job_id", "=", job.id).execute()).toEqual([]);
  });

  it("refuses a photo over 8 MB before it is sent, and refuses the bytes of one that is too big however it got there", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db());
    const big = await upload([{ name: "huge.jpg", type: "image/jpeg", bytes: new Uint8Array(16), declaredSize: 9 * 1024 * 1024 }], { jobId: job.id, stage: "queued" }, { cookie });
    expect(big.status).toBe(413);
    expect(big.body.message).toMatch(/huge\.jpg is 9\.0 MB; the limit is 8 MB/);
    expect(await uploadsAtFake()).toEqual([]);

    const oversized = new Uint8Array(8 * 1024 * 1024 + 1);
    oversized.set([0xff, 0xd8, 0xff, 0xe0]);
    expect(await checkAndDerive(oversized)).toEqual({ ok: false, reason: "The photo is 8.0 MB; the limit is 8 MB." });
  });

  it("refuses a photo over 50 megapixels by its header, saying what to do, and records nothing", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db());
    // 8000 × 7000 = 56 million pixels, a small file all the same (one flat colour).
    const huge = await sharp({ create: { width: 8000, height: 7000, channels: 3, background: { r: 90, g: 120, b: 140 } } }).jpeg({ quality: 30 }).toBuffer();
    expect(huge.length).toBeLessThan(8 * 1024 * 1024);
    const done = await upload([{ name: "panorama.jpg", type: "image/jpeg", bytes: huge }], { jobId: job.id, stage: "queued" }, { cookie });
    expect(done.results[0].status).toBe(200);
    expect(done.results[0].serverData.refused).toBe(
      "panorama.jpg: The photo is 8000 × 7000 pixels (56 megapixels); the shop takes up to 50 megapixels, what a phone camera makes. Send it at the camera's normal size, or shrink it first.",
    );
    expect(await db().selectFrom("photo").select("id").where("job_id", "=", job.id).execute()).toEqual([]);
    expect(await uploadsAtFake()).toEqual([]);
  });

  it("takes a photo just under 50 megapixels", async () => {
    // 7000 × 7000 = 49 million pixels.
    const large = await sharp({ create: { width: 7000, height: 7000, channels: 3, background: { r: 40, g: 40, b: 40 } } }).jpeg({ quality: 30 }).toBuffer();
    const check = await checkAndDerive(large);
    expect(check).toMatchObject({ ok: true, type: "image/jpeg", width: 2048, height: 2048 });
  });

  it("refuses more than ten photos at once, HEIC with advice, and a job that does not exist", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db());
    const tiny = await sharp({ create: { width: 8, height: 8, channels: 3, background: "#888" } }).jpeg().toBuffer();
    const eleven = Array.from({ length: 11 }, (_, i) => ({ name: `p${i}.jpg`, type: "image/jpeg", bytes: tiny }));
    const tooMany = await upload(eleven, { jobId: job.id, stage: "queued" }, { cookie });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.message).toMatch(/at most 10 photos/);

    const heic = await upload([{ name: "IMG_0001.HEIC", type: "image/heic", bytes: tiny }], { jobId: job.id, stage: "queued" }, { cookie });
    expect(heic.status).toBe(400);
    expect(heic.body.message).toMatch(/HEIC photos cannot be read here/);

    const noJob = await upload([{ name: "a.jpg", type: "image/jpeg", bytes: tiny }], { jobId: 999999, stage: "queued" }, { cookie });
    expect(noJob.status).toBe(404);
    const badStage = await upload([{ name: "a.jpg", type: "image/jpeg", bytes: tiny }], { jobId: job.id, stage: "painting" }, { cookie });
    expect(badStage.status).toBe(400);
    expect(await uploadsAtFake()).toEqual([]);
  });

  it("refuses a part of another job", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db());
    const other = await makeJob(db());
    const now = new Date().toISOString();
    const part = await db()
      .insertInto("part" as never)
      .values({ job_id: other.id, name: "Reservoir", kind: "reservoir", material: "aluminum", needs_leak_test: 1, needs_coating: 1, created_at: now, updated_at: now } as never)
      .returning("id" as never)
      .executeTakeFirstOrThrow();
    const tiny = await sharp({ create: { width: 8, height: 8, channels: 3, background: "#888" } }).jpeg().toBuffer();
    const wrong = await upload([{ name: "a.jpg", type: "image/jpeg", bytes: tiny }], { jobId: job.id, stage: "queued", partId: (part as { id: number }).id }, { cookie });
    expect(wrong.status).toBe(400);
    expect(wrong.body.message).toBe("That part is not on this job.");
    const right = await upload([{ name: "a.jpg", type: "image/jpeg", bytes: tiny }], { jobId: other.id, stage: "queued", partId: (part as { id: number }).id }, { cookie });
    expect(right.results[0].serverData.photoId).toBeGreaterThan(0);
    const listed = await readBody(await jobPhotos.GET(request(`/api/jobs/${other.id}/photos`, { cookie }), params({ id: String(other.id) })));
    expect(listed.photos).toMatchObject([{ id: right.results[0].serverData.photoId, partId: (part as { id: number }).id, partName: "Reservoir" }]);
  });

  it("removes the original from the upload service even when the photo cannot be saved", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db());
    const photosDirBefore = process.env.PHOTOS_DIR;
    // A file where the photos folder should be: saving the cleaned copies fails.
    const blocked = path.join(tempDir(), "not-a-folder");
    writeFileSync(blocked, "");
    process.env.PHOTOS_DIR = blocked;
    // The server logs why; here that is expected, not a stray error.
    const logged = vi.spyOn(console, "error").mockImplementation(() => undefined);
    try {
      const done = await upload([{ name: "gps.jpg", type: "image/jpeg", bytes: await phonePhoto({ r: 60, g: 120, b: 60 }) }], { jobId: job.id, stage: "queued" }, { cookie });
      expect(done.status).toBe(200);
      expect(done.results[0]).toMatchObject({ status: 200, serverData: { failed: "gps.jpg: the shop's server could not save this photo. Send it again; if that fails too, tell the office." } });
    } finally {
      process.env.PHOTOS_DIR = photosDirBefore;
    }
    expect(logged).toHaveBeenCalledWith(expect.stringMatching(/^Photo gps\.jpg \(upload \S+\) could not be kept:/), expect.anything());
    expect(await db().selectFrom("photo").select("id").where("job_id", "=", job.id).execute()).toEqual([]);
    // The original still carries its GPS position: it must not stay at the upload service.
    expect(await uploadsAtFake()).toEqual([]);
  });

  it("refuses an upload without a session, a cross-site one, and a forged completion callback", async () => {
    const job = await makeJob(db());
    const tiny = await sharp({ create: { width: 8, height: 8, channels: 3, background: "#888" } }).jpeg().toBuffer();
    const anonymous = await upload([{ name: "a.jpg", type: "image/jpeg", bytes: tiny }], { jobId: job.id, stage: "queued" });
    expect(anonymous.status).toBe(401);
    expect(anonymous.body.error.code).toBe("unauthenticated");
    expect((await fetch(`${app.url}/api/uploadthing`)).status).toBe(401);

    const { cookie } = await as("tech");
    const crossSite = await upload([{ name: "a.jpg", type: "image/jpeg", bytes: tiny }], { jobId: job.id, stage: "queued" }, { cookie, headers: { "sec-fetch-site": "cross-site" } });
    expect(crossSite.status).toBe(403);

    const forged = await fetch(`${app.url}/api/uploadthing?slug=jobPhoto`, {
      method: "POST",
      headers: { "content-type": "application/json", "uploadthing-hook": "callback", "x-uploadthing-signature": "hmac-sha256=00" },
      body: JSON.stringify({ status: "uploaded", origin: fake.url, metadata: { jobId: job.id, stage: "queued", partId: null, caption: "", uploadedBy: "x" }, file: { key: "forgedKey1", name: "a.jpg", size: 1, type: "image/jpeg", url: "http://x/f/forgedKey1", ufsUrl: "http://x/f/forgedKey1", appUrl: "http://x", fileHash: "00", customId: null } }),
    });
    expect(forged.status).toBe(400);
    expect(await db().selectFrom("photo").select("id").where("upload_key", "=", "forgedKey1").execute()).toEqual([]);
  });
});

describe("photos for staff: viewing, captions, visibility, deleting", () => {
  async function onePhoto() {
    const { cookie } = await as("tech");
    const job = await makeJob(db(), { stage: "install" });
    const done = await upload([{ name: "pump.jpg", type: "image/jpeg", bytes: await phonePhoto({ r: 90, g: 90, b: 90 }, 3000, 2000) }], { jobId: job.id, stage: "install" }, { cookie });
    return { job, id: done.results[0].serverData.photoId as number };
  }

  it("serves the cleaned photo and its thumbnail to staff only", async () => {
    const { id } = await onePhoto();
    const { cookie } = await as("tech");
    const full = await photoItem.GET(request(`/api/photos/${id}`, { cookie }), params({ id: String(id) }));
    expect(full.status).toBe(200);
    expect(full.headers.get("content-type")).toBe("image/webp");
    const fullMeta = await sharp(Buffer.from(await full.arrayBuffer())).metadata();
    expect([fullMeta.width, fullMeta.height]).toEqual([2048, 1365]);
    const thumb = await photoItem.GET(request(`/api/photos/${id}?size=thumb`, { cookie }), params({ id: String(id) }));
    expect((await sharp(Buffer.from(await thumb.arrayBuffer())).metadata()).width).toBe(480);

    expect((await photoItem.GET(request(`/api/photos/${id}`), params({ id: String(id) }))).status).toBe(401);
    expect((await photoItem.GET(request(`/api/photos/abc`, { cookie }), params({ id: "abc" }))).status).toBe(400);
    expect((await photoItem.GET(request(`/api/photos/99999`, { cookie }), params({ id: "99999" }))).status).toBe(404);
  });

  it("any staff member edits the caption and customer visibility; bad input changes nothing", async () => {
    const { id } = await onePhoto();
    const { cookie } = await as("tech");
    const patch = (body: unknown) => photoItem.PATCH(request(`/api/photos/${id}`, { method: "PATCH", cookie, body }), params({ id: String(id) }));
    const res = await patch({ caption: "Pump on the PTO", customerVisible: true });
    expect(res.status).toBe(200);
    expect((await readBody(res)).photo).toMatchObject({ id, caption: "Pump on the PTO", customerVisible: true });

    const bad = await patch({ caption: "x".repeat(301), customerVisible: "yes", owner: "me" });
    expect(bad.status).toBe(400);
    expect(Object.keys((await readBody(bad)).error.details.fields)).toEqual(expect.arrayContaining(["caption", "customerVisible"]));
    expect(await db().selectFrom("photo").select(["caption", "customer_visible"]).where("id", "=", id).executeTakeFirst()).toEqual({ caption: "Pump on the PTO", customer_visible: 1 });
  });

  it("a photo card on the job page names its part and shows the time on the shop's clock", async () => {
    await ensureShop(db());
    const { staff, cookie } = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    const part = await db()
      .insertInto("part")
      .values({ job_id: job.id, name: "Hose carrier", kind: "bracket", material: "carbon_steel", shape: "other", geometry: null, needs_leak_test: 0, needs_coating: 1, notes: "", rework_count: 0, reworked_at: null, rework_note: "", created_at: "2031-12-01T00:00:00.000Z", updated_at: "2031-12-01T00:00:00.000Z" })
      .returning("id")
      .executeTakeFirstOrThrow();
    const tiny = await sharp({ create: { width: 8, height: 8, channels: 3, background: "#777" } }).jpeg().toBuffer();
    const tagged = await upload([{ name: "carrier.jpg", type: "image/jpeg", bytes: tiny }], { jobId: job.id, stage: "fabricate", partId: part.id, caption: "Carrier tacked" }, { cookie });
    const untagged = await upload([{ name: "truck.jpg", type: "image/jpeg", bytes: tiny }], { jobId: job.id, stage: "fabricate", caption: "Truck in the bay" }, { cookie });
    // 05:16 UTC on 2 Dec is 23:16 on 1 Dec at a shop on US/Central time.
    await db().updateTable("photo").set({ created_at: "2031-12-02T05:16:00.000Z" }).where("job_id", "=", job.id).execute();
    await db().updateTable("shop").set({ time_zone: "US/Central" }).where("id", "=", 1).execute();

    const render = async () => {
      const section = await PhotosSection({ job: (await findJob(db(), job.id))!, user: { id: staff.id, name: staff.name, email: "", role: "tech" } });
      return renderToStaticMarkup(createElement(QueryClientProvider, { client: new QueryClient() }, section));
    };
    const cards = (await render()).split('data-testid="photo-card"').slice(1);
    expect(cards).toHaveLength(2);
    const [carrier, truck] = [tagged, untagged].map((u) => cards.find((c) => c.includes(`/api/photos/${u.results[0].serverData.photoId}?size=thumb`))!);
    expect(carrier).toMatch(/Part:<\/span> Hose carrier/);
    expect(truck).not.toContain("Part:");
    for (const card of [carrier, truck]) {
      expect(card).toContain("1 Dec, 23:16");
      expect(card).not.toContain("2 Dec, 05:16");
    }
    await db().updateTable("shop").set({ time_zone: "UTC" }).where("id", "=", 1).execute();
    try {
      expect(await render()).toContain("2 Dec, 05:16");
    } finally {
      await db().updateTable("shop").set({ time_zone: "US/Central" }).where("id", "=", 1).execute();
    }
  });

  it("only office and owner delete; the files go with the record", async () => {
    const { id, job } = await onePhoto();
    const key = (await db().selectFrom("photo").select("upload_key").where("id", "=", id).executeTakeFirstOrThrow()).upload_key;
    const tech = await as("tech");
    const del = (cookie: string) => photoItem.DELETE(request(`/api/photos/${id}`, { method: "DELETE", cookie }), params({ id: String(id) }));
    expect((await del(tech.cookie)).status).toBe(403);
    expect(existsSync(photoPath(job.id, key, "display"))).toBe(true);
    const office = await as("office");
    expect((await del(office.cookie)).status).toBe(200);
    expect(existsSync(photoPath(job.id, key, "display"))).toBe(false);
    expect(existsSync(photoPath(job.id, key, "thumb"))).toBe(false);
    expect((await del(office.cookie)).status).toBe(404);
  });
});
