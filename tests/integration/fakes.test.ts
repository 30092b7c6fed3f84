import { createHmac } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { Resend } from "resend";
import { UTApi, UTFile, createRouteHandler, createUploadthing, type FileRouter } from "uploadthing/server";
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { startFakes, type Fakes } from "@/fakes/server.mjs";

const API_KEY = "sk_test_coldcreek_upfit";
const APP_ID = "coldcreekapp";
const TOKEN = Buffer.from(JSON.stringify({ apiKey: API_KEY, appId: APP_ID, regions: ["local1"] })).toString("base64");
const OFFICE = "Cold Creek Upfit <office@cold-creek.example>";
// A tiny but real PNG (signature + IHDR start): enough for type checks downstream.
const PNG = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 6, 0, 0, 0]);

const tempDirs: string[] = [];
function tempDir() {
  const dir = mkdtempSync(path.join(tmpdir(), "baywright-fakes-"));
  tempDirs.push(dir);
  return dir;
}

type EmailRecord = { id: string; to: string[]; subject: string; html: string | null; text: string | null; idempotencyKey: string | null; createdAt: string };
type UploadRecord = {
  key: string;
  name: string;
  size: number;
  type: string;
  status: string;
  metadata: unknown;
  serverData: unknown;
  signatureVerified: boolean;
  callbackVia: "stream" | "post" | null;
};

async function getJson<T>(url: string): Promise<T> {
  const res = await fetch(url);
  expect(res.status).toBe(200);
  return (await res.json()) as T;
}
const postJson = (url: string, body: unknown, headers: Record<string, string> = {}) =>
  fetch(url, { method: "POST", headers: { "content-type": "application/json", ...headers }, body: JSON.stringify(body) });

// Builds a presigned ingest URL the way the uploadthing server SDK does.
function presign(base: string, key: string, data: Record<string, string | number>, opts: { apiKey?: string; ttlMs?: number } = {}) {
  const u = new URL(`${base}/${key}`);
  u.searchParams.append("expires", String(Date.now() + (opts.ttlMs ?? 60_000)));
  for (const [k, v] of Object.entries(data)) u.searchParams.append(k, encodeURIComponent(String(v)));
  u.searchParams.append("signature", `hmac-sha256=${createHmac("sha256", opts.apiKey ?? API_KEY).update(u.toString()).digest("hex")}`);
  return u.href;
}

function putFile(url: string, bytes: Uint8Array<ArrayBuffer>, name: string, type: string) {
  const form = new FormData();
  form.append("file", new Blob([bytes], { type }), name);
  return fetch(url, { method: "PUT", body: form, headers: { Range: "bytes=0-" } });
}

/** A stand-in for the app: a node server around a fetch-style handler. */
async function serve(handler: (req: Request) => Promise<Response>) {
  const server = http.createServer(async (req, res) => {
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const body = chunks.length ? Buffer.concat(chunks) : undefined;
    const request = new Request(`http://${req.headers.host}${req.url}`, {
      method: req.method,
      headers: req.headers as Record<string, string>,
      body: req.method === "GET" || req.method === "HEAD" ? undefined : body,
    });
    const response = await handler(request);
    res.writeHead(response.status, Object.fromEntries(response.headers));
    res.end(Buffer.from(await response.arrayBuffer()));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    url,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

let fake: Fakes;

beforeAll(async () => {
  fake = await startFakes({ port: 0, dataDir: tempDir(), token: TOKEN });
});
afterAll(async () => {
  await fake.close();
  for (const dir of tempDirs) rmSync(dir, { recursive: true, force: true });
});
beforeEach(async () => {
  const res = await fetch(`${fake.url}/__fake/reset`, { method: "POST" });
  expect(res.status).toBe(200);
});

describe("e-mail (resend API)", () => {
  const resend = () => new Resend("re_test_key", { baseUrl: `${fake.url}/resend` });

  it("stores a message sent through the resend SDK and answers GET /emails/:id", async () => {
    const { data, error } = await resend().emails.send({
      from: OFFICE,
      to: ["fleet@long-haul.example"],
      subject: "Your truck is ready for pickup",
      html: "<p>Unit 42 is ready.</p>",
      text: "Unit 42 is ready.",
      replyTo: "office@cold-creek.example",
      tags: [{ name: "kind", value: "ready_for_pickup" }],
    });
    expect(error).toBeNull();
    expect(data?.id).toMatch(/^[0-9a-f-]{36}$/);

    const stored = await getJson<EmailRecord[]>(`${fake.url}/__fake/emails`);
    expect(stored).toHaveLength(1);
    expect(stored[0]).toMatchObject({
      id: data!.id,
      to: ["fleet@long-haul.example"],
      subject: "Your truck is ready for pickup",
      html: "<p>Unit 42 is ready.</p>",
      text: "Unit 42 is ready.",
      idempotencyKey: null,
    });
    expect(Date.parse(stored[0].createdAt)).not.toBeNaN();

    const got = await resend().emails.get(data!.id);
    expect(got.data).toMatchObject({ object: "email", id: data!.id, reply_to: ["office@cold-creek.example"], subject: "Your truck is ready for pickup" });
    const missing = await resend().emails.get("00000000-0000-4000-8000-000000000000");
    expect(missing.error).toMatchObject({ statusCode: 404, name: "not_found" });
  });

  it("refuses a request without a bearer key like the service does", async () => {
    const res = await postJson(`${fake.url}/resend/emails`, { from: OFFICE, to: "a@b.example", subject: "x", text: "y" });
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ statusCode: 401, name: "missing_api_key" });
    expect(await getJson<unknown[]>(`${fake.url}/__fake/emails`)).toHaveLength(0);
  });

  it("honours Idempotency-Key: the same key twice stores one message and returns one id", async () => {
    const payload = { from: OFFICE, to: "owner@ridge-haul.example", subject: "Status link", text: "Follow your job here." };
    const first = await resend().emails.send(payload, { idempotencyKey: "outbox-17" });
    const second = await resend().emails.send(payload, { idempotencyKey: "outbox-17" });
    expect(first.error).toBeNull();
    expect(second.data?.id).toBe(first.data?.id);

    const changed = await resend().emails.send({ ...payload, subject: "Another" }, { idempotencyKey: "outbox-17" });
    expect(changed.error).toMatchObject({ statusCode: 409, name: "invalid_idempotent_request" });

    const stored = await getJson<EmailRecord[]>(`${fake.url}/__fake/emails`);
    expect(stored).toHaveLength(1);
    expect(stored[0].idempotencyKey).toBe("outbox-17");
  });

  it("fails the next N requests on demand; a retry loop then stores exactly one message", async () => {
    const arm = await postJson(`${fake.url}/__fake/fail-emails`, { count: 3, status: 503 });
    expect(arm.status).toBe(200);

    const client = resend();
    const errors: unknown[] = [];
    let id: string | undefined;
    for (let attempt = 0; attempt < 6 && !id; attempt++) {
      const { data, error } = await client.emails.send(
        { from: OFFICE, to: "fleet@long-haul.example", subject: "Coating is back", text: "Parts are back from the coater." },
        { idempotencyKey: "outbox-99" },
      );
      if (error) errors.push(error);
      else id = data?.id;
    }
    expect(errors).toHaveLength(3);
    expect(errors[0]).toMatchObject({ statusCode: 503, name: "application_error" });
    expect(id).toBeDefined();
    const stored = await getJson<EmailRecord[]>(`${fake.url}/__fake/emails`);
    expect(stored.map((e) => e.id)).toEqual([id]);
  });

  it("answers 422 validation_error for a message with neither html nor text, and for a missing `to`", async () => {
    const noBody = await resend().emails.send({ from: OFFICE, to: "a@cold-creek.example", subject: "Empty" } as never);
    expect(noBody.data).toBeNull();
    expect(noBody.error).toMatchObject({ statusCode: 422, name: "validation_error" });
    expect(noBody.error?.message).toMatch(/html|text/);

    const noTo = await resend().emails.send({ from: OFFICE, subject: "Nobody", text: "x" } as never);
    expect(noTo.error).toMatchObject({ statusCode: 422, name: "validation_error" });
    expect(await getJson<unknown[]>(`${fake.url}/__fake/emails`)).toHaveLength(0);
  });

  it("keeps attachments the SDK sends (bytes base64, name, type) and refuses one without content or name", async () => {
    const bytes = Buffer.from("%PDF-1.3 quote");
    const { error } = await resend().emails.send({ from: OFFICE, to: "fleet@long-haul.example", subject: "Quote", text: "Attached.", attachments: [{ filename: "WO-26-0001-quote-v1.pdf", contentType: "application/pdf", content: bytes }] });
    expect(error).toBeNull();
    const [stored] = await getJson<(EmailRecord & { attachments: { filename: string; content: string; content_type: string }[] })[]>(`${fake.url}/__fake/emails`);
    expect(stored.attachments).toEqual([{ filename: "WO-26-0001-quote-v1.pdf", content: bytes.toString("base64"), content_type: "application/pdf" }]);

    const noContent = await resend().emails.send({ from: OFFICE, to: "fleet@long-haul.example", subject: "Quote", text: "Attached.", attachments: [{ filename: "quote.pdf" }] });
    expect(noContent.error).toMatchObject({ statusCode: 422, name: "validation_error" });
    const noName = await resend().emails.send({ from: OFFICE, to: "fleet@long-haul.example", subject: "Quote", text: "Attached.", attachments: [{ content: bytes }] });
    expect(noName.error).toMatchObject({ statusCode: 422, name: "validation_error" });
    expect(await getJson<unknown[]>(`${fake.url}/__fake/emails`)).toHaveLength(1);
  });

  it("sends a batch, and refuses a whole strict batch when one message is invalid", async () => {
    const ok = await resend().batch.send([
      { from: OFFICE, to: "a@cold-creek.example", subject: "One", text: "1" },
      { from: OFFICE, to: "b@cold-creek.example", subject: "Two", html: "<b>2</b>" },
    ]);
    expect(ok.error).toBeNull();
    expect(ok.data?.data).toHaveLength(2);

    const bad = await resend().batch.send([
      { from: OFFICE, to: "c@cold-creek.example", subject: "Three", text: "3" },
      { from: OFFICE, to: "d@cold-creek.example", subject: "Four" } as never,
    ]);
    expect(bad.error).toMatchObject({ statusCode: 422, name: "validation_error" });
    expect(bad.error?.message).toContain("emails[1]");

    const stored = await getJson<EmailRecord[]>(`${fake.url}/__fake/emails`);
    expect(stored.map((e) => e.subject)).toEqual(["One", "Two"]);
  });

  it("refuses an e-mail body over 1 MB with 413", async () => {
    const { error } = await resend().emails.send({ from: OFFICE, to: "a@cold-creek.example", subject: "Huge", html: "x".repeat(1024 * 1024 + 10) });
    expect(error).toMatchObject({ statusCode: 413 });
    expect(await getJson<unknown[]>(`${fake.url}/__fake/emails`)).toHaveLength(0);
  });
});

describe("uploads (uploadthing ingest), raw HTTP", () => {
  /** Plays the app's callback endpoint: checks the signature, reports a result, records what came. */
  async function callbackReceiver(opts: { apiKey?: string; status?: number; callbackData?: unknown } = {}) {
    const received: { headers: Headers; body: string; url: string; signatureValid: boolean }[] = [];
    const app = await serve(async (req) => {
      const body = await req.text();
      const expected = `hmac-sha256=${createHmac("sha256", opts.apiKey ?? API_KEY).update(body).digest("hex")}`;
      const signatureValid = req.headers.get("x-uploadthing-signature") === expected;
      received.push({ headers: req.headers, body, url: req.url, signatureValid });
      if (opts.status) return new Response("no", { status: opts.status });
      const { file, origin } = JSON.parse(body);
      const r = await postJson(`${origin}/callback-result`, { fileKey: file.key, callbackData: opts.callbackData ?? { photoId: `photo-${file.key}` } }, { "x-uploadthing-api-key": API_KEY });
      expect(await r.json()).toEqual({ ok: true });
      return Response.json(null);
    });
    return { ...app, received };
  }

  it("route-metadata → HEAD → PUT multipart → signed callback → serverData; GET /f/key serves the same bytes", async () => {
    const app = await callbackReceiver();
    try {
      const key = "rawKey0001";
      const reg = await postJson(
        `${fake.url}/route-metadata`,
        { fileKeys: [key], metadata: { jobId: "job-17" }, isDev: false, callbackUrl: `${app.url}/api/uploadthing?slug=jobPhoto`, callbackSlug: "jobPhoto", awaitServerData: true },
        { "x-uploadthing-api-key": API_KEY },
      );
      expect(await reg.json()).toEqual({ ok: true });

      const name = "rear tank – left side.png";
      const url = presign(fake.url, key, {
        "x-ut-identifier": APP_ID,
        "x-ut-file-name": name,
        "x-ut-file-size": PNG.length,
        "x-ut-file-type": "image/png",
        "x-ut-slug": "jobPhoto",
        "x-ut-content-disposition": "inline",
      });
      const head = await fetch(url, { method: "HEAD" });
      expect(head.status).toBe(200);
      expect(head.headers.get("x-ut-range-start")).toBe("0");
      expect(head.headers.get("access-control-expose-headers")).toContain("x-ut-range-start");

      const put = await putFile(url, PNG, "blob", "image/png");
      expect(put.status).toBe(200);
      const answer = await put.json();
      expect(answer).toMatchObject({ ufsUrl: `${fake.url}/f/${key}`, url: `${fake.url}/f/${key}`, serverData: { photoId: `photo-${key}` } });
      expect(answer.fileHash).toMatch(/^[0-9a-f]{32}$/);

      expect(app.received).toHaveLength(1);
      const cb = app.received[0];
      expect(cb.signatureValid).toBe(true);
      expect(cb.headers.get("uploadthing-hook")).toBe("callback");
      expect(new URL(cb.url).searchParams.get("slug")).toBe("jobPhoto");
      expect(JSON.parse(cb.body)).toMatchObject({
        status: "uploaded",
        origin: fake.url,
        metadata: { jobId: "job-17" },
        file: { key, name, size: PNG.length, type: "image/png", customId: null, fileHash: answer.fileHash },
      });

      const file = await fetch(`${fake.url}/f/${key}`);
      expect(file.status).toBe(200);
      expect(file.headers.get("content-type")).toBe("image/png");
      expect(new Uint8Array(await file.arrayBuffer())).toEqual(PNG);

      const uploads = await getJson<UploadRecord[]>(`${fake.url}/__fake/uploads`);
      expect(uploads).toMatchObject([{ key, name, size: PNG.length, status: "Uploaded", metadata: { jobId: "job-17" }, serverData: { photoId: `photo-${key}` }, signatureVerified: true }]);
    } finally {
      await app.close();
    }
  });

  it("refuses a tampered or expired presigned URL, and a body whose size differs from the signed one", async () => {
    const data = { "x-ut-identifier": APP_ID, "x-ut-file-name": "a.png", "x-ut-file-size": PNG.length, "x-ut-file-type": "image/png" };
    const good = presign(fake.url, "tamperKey1", data);
    const tampered = good.replace("a.png", "b.png");
    expect((await putFile(tampered, PNG, "a.png", "image/png")).status).toBe(403);
    expect((await fetch(tampered, { method: "HEAD" })).status).toBe(403);

    const expired = presign(fake.url, "tamperKey2", data, { ttlMs: -1000 });
    expect((await putFile(expired, PNG, "a.png", "image/png")).status).toBe(403);

    const wrongKey = presign(fake.url, "tamperKey3", data, { apiKey: "sk_someone_else" });
    expect((await putFile(wrongKey, PNG, "a.png", "image/png")).status).toBe(403);

    const shortBody = await putFile(good, PNG.subarray(0, 10), "a.png", "image/png");
    expect(shortBody.status).toBe(400);
    expect(await getJson<unknown[]>(`${fake.url}/__fake/uploads`)).toHaveLength(0);

    expect((await putFile(good, PNG, "a.png", "image/png")).status).toBe(200);
  });

  it("with awaitServerData false, answers the PUT at once and still records the callback result", async () => {
    const app = await callbackReceiver({ callbackData: { photoId: "late-1" } });
    try {
      const key = "noWaitKey01";
      await postJson(`${fake.url}/route-metadata`, { fileKeys: [key], metadata: {}, isDev: false, callbackUrl: `${app.url}/cb`, callbackSlug: "jobPhoto", awaitServerData: false }, { "x-uploadthing-api-key": API_KEY });
      const put = await putFile(presign(fake.url, key, { "x-ut-identifier": APP_ID, "x-ut-file-name": "a.png", "x-ut-file-size": PNG.length, "x-ut-slug": "jobPhoto" }), PNG, "a.png", "image/png");
      expect(put.status).toBe(200);
      expect((await put.json()).serverData).toBeNull();
      await vi.waitFor(async () => {
        expect(await getJson<UploadRecord[]>(`${fake.url}/__fake/uploads`)).toMatchObject([{ key, status: "Uploaded", serverData: { photoId: "late-1" } }]);
      });
    } finally {
      await app.close();
    }
  });

  it("fails the PUT when the app's callback refuses it, and marks the upload failed", async () => {
    const app = await callbackReceiver({ status: 401 });
    try {
      const key = "refusedKey1";
      await postJson(`${fake.url}/route-metadata`, { fileKeys: [key], metadata: {}, isDev: false, callbackUrl: `${app.url}/cb`, callbackSlug: "jobPhoto", awaitServerData: true }, { "x-uploadthing-api-key": API_KEY });
      const put = await putFile(presign(fake.url, key, { "x-ut-identifier": APP_ID, "x-ut-file-name": "a.png", "x-ut-file-size": PNG.length, "x-ut-slug": "jobPhoto" }), PNG, "a.png", "image/png");
      expect(put.status).toBe(500);
      expect((await put.json()).error).toContain("401");
      expect(await getJson<UploadRecord[]>(`${fake.url}/__fake/uploads`)).toMatchObject([{ key, status: "Failed" }]);
    } finally {
      await app.close();
    }
  });

  it("refuses an upload over 20 MB with 413", async () => {
    const big = new Uint8Array(20 * 1024 * 1024 + 1);
    const url = presign(fake.url, "bigKey0001", { "x-ut-identifier": APP_ID, "x-ut-file-name": "big.bin", "x-ut-file-size": big.length });
    const put = await putFile(url, big, "big.bin", "application/octet-stream");
    expect(put.status).toBe(413);
    expect(await getJson<unknown[]>(`${fake.url}/__fake/uploads`)).toHaveLength(0);
  });

  it("answers CORS preflights for browser uploads from another origin", async () => {
    const res = await fetch(`${fake.url}/someKey01`, {
      method: "OPTIONS",
      headers: { Origin: "http://127.0.0.1:3000", "Access-Control-Request-Method": "PUT", "Access-Control-Request-Headers": "range, x-uploadthing-version, b3, traceparent" },
    });
    expect(res.status).toBe(204);
    expect(res.headers.get("access-control-allow-origin")).toBe("*");
    expect(res.headers.get("access-control-allow-methods")).toContain("PUT");
    expect(res.headers.get("access-control-allow-headers")).toContain("x-uploadthing-version");
  });

  it("keeps messages and files across a restart on the same data dir, and forgets them on reset", async () => {
    const dir = tempDir();
    let first: Fakes | undefined = await startFakes({ port: 0, dataDir: dir, token: TOKEN });
    let second: Fakes | undefined;
    try {
      const resend = new Resend("re_test_key", { baseUrl: `${first.url}/resend` });
      const sent = await resend.emails.send({ from: OFFICE, to: "fleet@long-haul.example", subject: "Kept", text: "still here" }, { idempotencyKey: "keep-1" });
      const put = await putFile(presign(first.url, "keptKey001", { "x-ut-identifier": APP_ID, "x-ut-file-name": "kept.png", "x-ut-file-size": PNG.length, "x-ut-file-type": "image/png" }), PNG, "kept.png", "image/png");
      expect(put.status).toBe(200);
      await first.close();
      first = undefined;

      second = await startFakes({ port: 0, dataDir: dir });
      const emails = await getJson<EmailRecord[]>(`${second.url}/__fake/emails`);
      expect(emails.map((e) => e.id)).toEqual([sent.data!.id]);
      const again = await new Resend("re_test_key", { baseUrl: `${second.url}/resend` }).emails.send(
        { from: OFFICE, to: "fleet@long-haul.example", subject: "Kept", text: "still here" },
        { idempotencyKey: "keep-1" },
      );
      expect(again.data?.id).toBe(sent.data!.id);
      const file = await fetch(`${second.url}/f/keptKey001`);
      expect(new Uint8Array(await file.arrayBuffer())).toEqual(PNG);

      await fetch(`${second.url}/__fake/reset`, { method: "POST" });
      expect(await getJson<unknown[]>(`${second.url}/__fake/emails`)).toHaveLength(0);
      expect((await fetch(`${second.url}/f/keptKey001`)).status).toBe(404);
    } finally {
      await first?.close();
      await second?.close();
    }
  });
});

describe("uploads through the uploadthing SDK", () => {
  beforeAll(() => {
    vi.stubEnv("UPLOADTHING_TOKEN", TOKEN);
    vi.stubEnv("UPLOADTHING_API_URL", fake.url);
    vi.stubEnv("UPLOADTHING_INGEST_URL", fake.url);
    // The SDK builds http:// file URLs only for a host containing "local"; 127.0.0.1 gets https://.
    vi.stubEnv("UPLOADTHING_UFS_HOST", `localhost:${new URL(fake.url).port}`);
    vi.stubEnv("UPLOADTHING_UFS_APP_ID_LOCATION", "path");
    vi.stubEnv("UPLOADTHING_LOG_LEVEL", "Error");
  });
  afterAll(() => {
    vi.unstubAllEnvs();
  });

  it("UTApi: uploadFiles, listFiles, getFileUrls, renameFiles, private access and deleteFiles", async () => {
    const utapi = new UTApi();
    const up = await utapi.uploadFiles(new UTFile([PNG], "hitch plate.png", { customId: "photo-301" }));
    expect(up.error).toBeNull();
    const key = up.data!.key;
    expect(up.data).toMatchObject({ name: "hitch plate.png", size: PNG.length, type: "image/png", customId: "photo-301" });
    const served = await fetch(up.data!.ufsUrl);
    expect(new Uint8Array(await served.arrayBuffer())).toEqual(PNG);

    const listed = await utapi.listFiles();
    expect(listed.files).toMatchObject([{ key, name: "hitch plate.png", customId: "photo-301", status: "Uploaded", size: PNG.length }]);
    expect((await utapi.getFileUrls(key)).data).toEqual([{ key, url: `${fake.url}/f/${key}` }]);
    expect((await utapi.renameFiles({ customId: "photo-301", newName: "hitch-plate-final.png" })).success).toBe(true);
    expect((await utapi.listFiles()).files[0].name).toBe("hitch-plate-final.png");
    expect(await utapi.getUsageInfo()).toMatchObject({ totalBytes: PNG.length, filesUploaded: 1 });

    await utapi.updateACL(key, "private");
    expect((await fetch(`${fake.url}/f/${key}`)).status).toBe(403);
    const requested = await utapi.getSignedURL(key, { expiresIn: 60 });
    expect((await fetch(requested.ufsUrl)).status).toBe(200);
    const { ufsUrl } = await utapi.generateSignedURL(key, { expiresIn: 60 });
    expect(ufsUrl.startsWith(`http://localhost:${new URL(fake.url).port}/a/${APP_ID}/${key}?`)).toBe(true);
    const privately = await fetch(ufsUrl);
    expect(privately.status).toBe(200);
    expect(new Uint8Array(await privately.arrayBuffer())).toEqual(PNG);
    expect((await fetch(ufsUrl.replace(/signature=[^&]+/, "signature=hmac-sha256%3D00"))).status).toBe(403);

    expect(await utapi.deleteFiles(key)).toMatchObject({ success: true, deletedCount: 1 });
    expect((await utapi.listFiles()).files).toHaveLength(0);
    expect((await fetch(`${fake.url}/f/${key}`)).status).toBe(404);
  });

  it("refuses UTApi calls without an api key", async () => {
    const res = await postJson(`${fake.url}/v6/listFiles`, {});
    expect(res.status).toBe(401);
  });

  // The app's route handler, served for real: the fake must register, verify, call back and
  // hand the handler's onUploadComplete result to the uploader.
  async function uploadThroughRouteHandler(opts: { isDev: boolean; fail?: boolean }) {
    const completed: { metadata: unknown; file: { key: string; name: string; ufsUrl: string } }[] = [];
    const f = createUploadthing();
    const router = {
      jobPhoto: f({ image: { maxFileSize: "4MB", maxFileCount: 1 } })
        .middleware(() => ({ jobId: "job-17", uploadedBy: "tech-2" }))
        .onUploadComplete(({ metadata, file }) => {
          if (opts.fail) throw new Error("not a photo");
          completed.push({ metadata, file });
          return { photoId: `photo-${file.key.slice(0, 8)}` };
        }),
    } satisfies FileRouter;
    const handler = createRouteHandler({ router, config: { token: TOKEN, ingestUrl: fake.url, isDev: opts.isDev, logLevel: opts.fail ? "None" : "Error" } });
    const app = await serve(handler);
    try {
      const action = await postJson(`${app.url}/api/uploadthing?actionType=upload&slug=jobPhoto`, {
        files: [{ name: "wet kit pump.png", size: PNG.length, type: "image/png", lastModified: Date.now() }],
        input: null,
      });
      expect(action.status).toBe(200);
      const [presigned] = (await action.json()) as { url: string; key: string }[];
      expect(presigned.url.startsWith(`${fake.url}/${presigned.key}?`)).toBe(true);

      const head = await fetch(presigned.url, { method: "HEAD" });
      expect(head.headers.get("x-ut-range-start")).toBe("0");
      const put = await putFile(presigned.url, PNG, "wet kit pump.png", "image/png");
      return { put, presigned, completed };
    } finally {
      await app.close();
    }
  }

  it("route handler in production mode: callback with signature, serverData back to the uploader", async () => {
    const { put, presigned, completed } = await uploadThroughRouteHandler({ isDev: false });
    expect(put.status).toBe(200);
    const answer = await put.json();
    expect(answer.serverData).toEqual({ photoId: `photo-${presigned.key.slice(0, 8)}` });
    expect(completed).toHaveLength(1);
    expect(completed[0].metadata).toEqual({ jobId: "job-17", uploadedBy: "tech-2" });
    expect(completed[0].file).toMatchObject({ key: presigned.key, name: "wet kit pump.png", ufsUrl: answer.ufsUrl });
    expect(await getJson<UploadRecord[]>(`${fake.url}/__fake/uploads`)).toMatchObject([
      { key: presigned.key, signatureVerified: true, callbackVia: "post", metadata: { jobId: "job-17" } },
    ]);
  });

  it("route handler in dev mode: callbacks stream back as NDJSON on the open route-metadata response", async () => {
    const { put, presigned, completed } = await uploadThroughRouteHandler({ isDev: true });
    expect(put.status).toBe(200);
    expect((await put.json()).serverData).toEqual({ photoId: `photo-${presigned.key.slice(0, 8)}` });
    expect(completed.map((c) => c.file.key)).toEqual([presigned.key]);
    expect(await getJson<UploadRecord[]>(`${fake.url}/__fake/uploads`)).toMatchObject([{ key: presigned.key, callbackVia: "stream", signatureVerified: true }]);
  });

  it("route handler whose onUploadComplete throws: the uploader gets an error, the upload is marked failed", async () => {
    const original = fake;
    fake = await startFakes({ port: 0, dataDir: tempDir(), token: TOKEN, callbackTimeoutMs: 800 });
    try {
      const { put, presigned } = await uploadThroughRouteHandler({ isDev: false, fail: true });
      expect(put.status).toBe(500);
      expect((await put.json()).error).toMatch(/onUploadComplete/);
      expect(await getJson<UploadRecord[]>(`${fake.url}/__fake/uploads`)).toMatchObject([{ key: presigned.key, status: "Failed" }]);
    } finally {
      await fake.close();
      fake = original;
    }
  });
});
