// Local fake of the two hosted services Baywright talks to: e-mail (the resend HTTP API) and
// photo uploads (the uploadthing v7 ingest, its file host and the UTApi endpoints).
// One dependency-free process; state lives in a folder so it survives a restart.
// See fakes/README.md for the routes and the env the app sets to use it.

import crypto from "node:crypto";
import fs from "node:fs";
import http from "node:http";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { createPaymentsFake } from "./payments.mjs";

const MB = 1024 * 1024;
export const LIMITS = Object.freeze({
  emailBody: 1 * MB,
  uploadBody: 20 * MB,
  jsonBody: 1 * MB,
  batchSize: 100,
  recipients: 50,
});

const DAY_MS = 24 * 60 * 60 * 1000;
const REGISTRATION_TTL_MS = 60 * 60 * 1000; // matches the SDK's default presigned URL lifetime
const DEV_STREAM_MAX_MS = 10 * 60 * 1000;
const FILE_KEY_RE = /^[A-Za-z0-9_-]{1,128}$/;
const USAGE_LIMIT_BYTES = 2 * 1024 * MB;

class HttpError extends Error {
  constructor(status, body, headers = {}) {
    super(typeof body?.message === "string" ? body.message : String(body?.error ?? status));
    this.status = status;
    this.body = body;
    this.headers = headers;
  }
}

const resendError = (status, name, message) => new HttpError(status, { statusCode: status, name, message });
const utError = (status, message) => new HttpError(status, { error: message });

// ---------------------------------------------------------------------------------------------
// Persistence: append-only logs for immutable records, one JSON file for mutable upload records.

function createStore(dataDir) {
  const filesDir = path.join(dataDir, "files");
  const emailsPath = path.join(dataDir, "emails.ndjson");
  const idemPath = path.join(dataDir, "idempotency.ndjson");
  const uploadsPath = path.join(dataDir, "uploads.json");
  fs.mkdirSync(filesDir, { recursive: true });

  const readLines = (file) => {
    if (!fs.existsSync(file)) return [];
    const out = [];
    for (const line of fs.readFileSync(file, "utf8").split("\n")) {
      if (!line.trim()) continue;
      try {
        out.push(JSON.parse(line));
      } catch {
        // a line cut short by a crash mid-write: the rest of the log is still good
      }
    }
    return out;
  };

  const emails = readLines(emailsPath);
  const emailsById = new Map(emails.map((e) => [e.id, e]));
  const idempotency = new Map(readLines(idemPath).map((r) => [r.scopeKey, r]));
  let uploads = new Map();
  if (fs.existsSync(uploadsPath)) {
    try {
      uploads = new Map(JSON.parse(fs.readFileSync(uploadsPath, "utf8")).map((u) => [u.key, u]));
    } catch {
      uploads = new Map();
    }
  }

  const saveUploads = () => {
    const tmp = `${uploadsPath}.${process.pid}.tmp`;
    fs.writeFileSync(tmp, JSON.stringify([...uploads.values()], null, 1));
    fs.renameSync(tmp, uploadsPath);
  };

  return {
    emails,
    emailsById,
    idempotency,
    uploads,
    addEmails(list) {
      if (list.length === 0) return;
      fs.appendFileSync(emailsPath, list.map((e) => JSON.stringify(e) + "\n").join(""));
      for (const e of list) {
        emails.push(e);
        emailsById.set(e.id, e);
      }
    },
    addIdempotency(record) {
      fs.appendFileSync(idemPath, JSON.stringify(record) + "\n");
      idempotency.set(record.scopeKey, record);
    },
    filePath: (key) => path.join(filesDir, key),
    putUpload(record, bytes) {
      if (bytes) fs.writeFileSync(path.join(filesDir, record.key), bytes);
      uploads.set(record.key, record);
      saveUploads();
    },
    updateUploads() {
      saveUploads();
    },
    deleteUpload(key) {
      uploads.delete(key);
      fs.rmSync(path.join(filesDir, key), { force: true });
      saveUploads();
    },
    reset() {
      emails.length = 0;
      emailsById.clear();
      idempotency.clear();
      uploads.clear();
      fs.rmSync(emailsPath, { force: true });
      fs.rmSync(idemPath, { force: true });
      fs.rmSync(filesDir, { recursive: true, force: true });
      fs.mkdirSync(filesDir, { recursive: true });
      saveUploads();
    },
  };
}

// ---------------------------------------------------------------------------------------------
// HTTP helpers

function readBody(req, limit) {
  return new Promise((resolve, reject) => {
    const declared = Number(req.headers["content-length"]);
    if (Number.isFinite(declared) && declared > limit) {
      reject(tooLarge(limit));
      return;
    }
    const chunks = [];
    let size = 0;
    let over = false;
    req.on("data", (chunk) => {
      if (over) return; // keep draining so the client can read the 413, but hold nothing
      size += chunk.length;
      if (size > limit) {
        over = true;
        chunks.length = 0;
        return;
      }
      chunks.push(chunk);
    });
    req.on("end", () => (over ? reject(tooLarge(limit)) : resolve(Buffer.concat(chunks))));
    req.on("error", reject);
  });
}

function tooLarge(limit) {
  const err = new HttpError(413, null);
  err.limit = limit;
  return err;
}

function parseJson(buf, onError) {
  try {
    return JSON.parse(buf.toString("utf8") || "null");
  } catch {
    throw onError();
  }
}

function sendJson(res, status, body, headers = {}) {
  const text = JSON.stringify(body);
  res.writeHead(status, {
    "Content-Type": "application/json; charset=utf-8",
    "Content-Length": Buffer.byteLength(text),
    ...headers,
  });
  res.end(text);
}

function setCors(req, res) {
  res.setHeader("Access-Control-Allow-Origin", "*");
  // The browser client reads this header after its HEAD to learn where to resume an upload.
  res.setHeader("Access-Control-Expose-Headers", "x-ut-range-start");
}

function answerPreflight(req, res) {
  const asked = String(req.headers["access-control-request-headers"] ?? "");
  const allowed = /^[A-Za-z0-9_,\s-]*$/.test(asked) && asked.trim() ? asked : "content-type, range, x-uploadthing-version, b3, traceparent";
  const headers = {
    "Access-Control-Allow-Methods": "GET, HEAD, PUT, POST, OPTIONS",
    "Access-Control-Allow-Headers": allowed,
    "Access-Control-Max-Age": "600",
  };
  if (req.headers["access-control-request-private-network"] === "true") {
    headers["Access-Control-Allow-Private-Network"] = "true";
  }
  res.writeHead(204, headers);
  res.end();
}

// ---------------------------------------------------------------------------------------------
// Signing, as the uploadthing SDK does it: "hmac-sha256=" + hex HMAC-SHA256 with the api key.

const sign = (payload, apiKey) => `hmac-sha256=${crypto.createHmac("sha256", apiKey).update(payload).digest("hex")}`;

function safeEqual(a, b) {
  const ab = Buffer.from(a);
  const bb = Buffer.from(b);
  return ab.length === bb.length && crypto.timingSafeEqual(ab, bb);
}

// The SDK signs the whole URL (scheme, host, path, query without the signature) and appends
// `signature` last, so the signed text is rebuilt from the raw request line and the Host header.
function checkSignedUrl(req, url, apiKeys) {
  const raw = req.url ?? "";
  const m = /[?&]signature=([^&]*)$/.exec(raw);
  const expires = Number(url.searchParams.get("expires"));
  if (!m || !Number.isFinite(expires)) return { ok: false, reason: "Missing signature or expiry" };
  if (expires < Date.now()) return { ok: false, reason: "The presigned URL has expired" };
  if (apiKeys.length === 0) return { ok: true, verified: false };
  let signature;
  try {
    signature = decodeURIComponent(m[1]);
  } catch {
    return { ok: false, reason: "Invalid signature" };
  }
  const unsigned = raw.slice(0, m.index);
  const host = req.headers.host ?? "";
  for (const key of apiKeys) {
    for (const proto of ["http", "https"]) {
      if (safeEqual(sign(`${proto}://${host}${unsigned}`, key), signature)) return { ok: true, verified: true, apiKey: key };
    }
  }
  return { ok: false, reason: "Invalid signature" };
}

export function parseUploadthingToken(token) {
  let parsed;
  try {
    parsed = JSON.parse(Buffer.from(String(token), "base64").toString("utf8"));
  } catch {
    throw new Error("UPLOADTHING_TOKEN is not base64 of a JSON object");
  }
  if (typeof parsed?.apiKey !== "string" || !parsed.apiKey.startsWith("sk_") || typeof parsed.appId !== "string") {
    throw new Error('UPLOADTHING_TOKEN must hold { apiKey: "sk_…", appId, regions }');
  }
  return { apiKey: parsed.apiKey, appId: parsed.appId };
}

// ---------------------------------------------------------------------------------------------
// Minimal multipart/form-data reader: enough for the one `file` field the SDK sends.

function parseMultipart(buf, contentType) {
  const m = /boundary=(?:"([^"]+)"|([^;\s]+))/i.exec(contentType ?? "");
  if (!/^multipart\/form-data/i.test(contentType ?? "") || !m) throw utError(400, "Expected multipart/form-data");
  const boundary = m[1] ?? m[2];
  const delimiter = Buffer.from(`--${boundary}`);
  const next = Buffer.from(`\r\n--${boundary}`);
  const parts = [];
  let pos = buf.indexOf(delimiter);
  if (pos < 0) throw utError(400, "Malformed multipart body");
  for (;;) {
    pos += delimiter.length;
    if (buf[pos] === 0x2d && buf[pos + 1] === 0x2d) break;
    if (buf[pos] !== 0x0d || buf[pos + 1] !== 0x0a) throw utError(400, "Malformed multipart body");
    pos += 2;
    const headerEnd = buf.indexOf("\r\n\r\n", pos);
    if (headerEnd < 0) throw utError(400, "Malformed multipart body");
    const headers = {};
    for (const line of buf.subarray(pos, headerEnd).toString("utf8").split("\r\n")) {
      const i = line.indexOf(":");
      if (i > 0) headers[line.slice(0, i).trim().toLowerCase()] = line.slice(i + 1).trim();
    }
    const end = buf.indexOf(next, headerEnd + 4);
    if (end < 0) throw utError(400, "Malformed multipart body");
    const disposition = headers["content-disposition"] ?? "";
    parts.push({
      name: /\bname="([^"]*)"/i.exec(disposition)?.[1],
      filename: /\bfilename="([^"]*)"/i.exec(disposition)?.[1],
      type: headers["content-type"],
      data: buf.subarray(headerEnd + 4, end),
    });
    pos = end + 2;
  }
  return parts;
}

// ---------------------------------------------------------------------------------------------
// E-mail validation, shaped like the service's 422 answers.

const ADDRESS_RE = /^[^\s@<>]+@[^\s@<>]+\.[^\s@<>]+$/;
const validAddress = (s) => {
  if (typeof s !== "string") return false;
  const named = /^[^<>]*<([^<>]+)>$/.exec(s.trim());
  return ADDRESS_RE.test(named ? named[1].trim() : s.trim());
};
const TAG_RE = /^[A-Za-z0-9_-]{1,256}$/;

function validateEmail(body) {
  const fail = (message) => {
    throw resendError(422, "validation_error", message);
  };
  if (body === null || typeof body !== "object" || Array.isArray(body)) fail("The request body must be a JSON object.");
  const list = (field, required, max) => {
    const v = body[field];
    if (v === undefined || v === null) {
      if (required) fail(`Missing \`${field}\` field.`);
      return null;
    }
    const arr = Array.isArray(v) ? v : [v];
    if (arr.length === 0 && required) fail(`Missing \`${field}\` field.`);
    if (arr.length > max) fail(`Too many recipients in \`${field}\`: at most ${max}.`);
    for (const a of arr) {
      if (!validAddress(a)) fail(`Invalid \`${field}\` field. The email address needs to follow the \`email@example.com\` or \`Name <email@example.com>\` format.`);
    }
    return arr;
  };
  if (typeof body.from !== "string" || !body.from.trim()) fail("Missing `from` field.");
  if (!validAddress(body.from)) fail("Invalid `from` field. The email address needs to follow the `email@example.com` or `Name <email@example.com>` format.");
  const to = list("to", true, LIMITS.recipients);
  const cc = list("cc", false, LIMITS.recipients);
  const bcc = list("bcc", false, LIMITS.recipients);
  const replyTo = list("reply_to", false, LIMITS.recipients);
  if (typeof body.subject !== "string" || !body.subject.trim()) fail("Missing `subject` field.");
  const html = typeof body.html === "string" && body.html !== "" ? body.html : null;
  const text = typeof body.text === "string" && body.text !== "" ? body.text : null;
  if (html === null && text === null) fail("Missing `html` or `text` field.");
  if (body.headers != null) {
    if (typeof body.headers !== "object" || Array.isArray(body.headers)) fail("Invalid `headers` field.");
    for (const v of Object.values(body.headers)) if (typeof v !== "string") fail("Invalid `headers` field: values must be strings.");
  }
  if (body.tags != null) {
    if (!Array.isArray(body.tags)) fail("Invalid `tags` field.");
    for (const t of body.tags) {
      if (!TAG_RE.test(t?.name ?? "") || !TAG_RE.test(t?.value ?? "")) {
        fail("Invalid `tags` field. Tag names and values may only contain ASCII letters, numbers, underscores or dashes.");
      }
    }
  }
  if (body.attachments != null) {
    if (!Array.isArray(body.attachments)) fail("Invalid `attachments` field: it must be a list.");
    for (const a of body.attachments) {
      if (a === null || typeof a !== "object") fail("Invalid `attachments` field: each attachment is an object.");
      const hasContent = typeof a.content === "string" && a.content !== "";
      const hasPath = typeof a.path === "string" && a.path !== "";
      if (!hasContent && !hasPath) fail("Invalid `attachments` field: each attachment needs `content` (base64) or `path`.");
      if (hasContent && !/^[A-Za-z0-9+/]+={0,2}$/.test(a.content)) fail("Invalid `attachments` field: `content` must be base64.");
      if (hasContent && (typeof a.filename !== "string" || !a.filename.trim())) fail("Invalid `attachments` field: an attachment sent as `content` needs a `filename`.");
    }
  }
  return {
    from: body.from,
    to,
    cc,
    bcc,
    replyTo,
    subject: body.subject,
    html,
    text,
    headers: body.headers ?? null,
    tags: body.tags ?? null,
    attachments: Array.isArray(body.attachments) ? body.attachments : null,
    scheduledAt: body.scheduled_at ?? null,
  };
}

const emailView = (e) => ({
  object: "email",
  id: e.id,
  from: e.from,
  to: e.to,
  cc: e.cc,
  bcc: e.bcc,
  reply_to: e.replyTo,
  subject: e.subject,
  html: e.html,
  text: e.text,
  tags: e.tags ?? undefined,
  created_at: e.createdAt,
  scheduled_at: e.scheduledAt,
  last_event: e.scheduledAt ? "scheduled" : "delivered",
});

// ---------------------------------------------------------------------------------------------

/**
 * Start the fake. `port: 0` picks a free port. Resolves to `{ url, close() }`.
 * `token` (default: env UPLOADTHING_TOKEN) only adds a key the fake can check signatures with;
 * the key used for a route's callbacks is the one the app sent with `/route-metadata`.
 */
export async function startFakes(options = {}) {
  const {
    port = 4010,
    host = "127.0.0.1",
    dataDir = ".fakes-data",
    token = process.env.UPLOADTHING_TOKEN,
    callbackTimeoutMs = 30_000,
    registrationWaitMs = 5_000,
    paymentsWebhookUrl = process.env.PAYMENTS_WEBHOOK_URL,
    paymentsWebhookSecret = process.env.PAYMENTS_WEBHOOK_SECRET,
    log = () => {},
  } = options;

  const store = createStore(path.resolve(dataDir));
  const payments = createPaymentsFake({ dataDir: path.resolve(dataDir), webhookUrl: paymentsWebhookUrl, webhookSecret: paymentsWebhookSecret, log });
  const knownApiKeys = new Set();
  if (token) knownApiKeys.add(parseUploadthingToken(token).apiKey);

  let failNext = { count: 0, status: 500 };
  const registrations = new Map(); // fileKey → registration (memory only: it lives for one upload)
  const registrationWaiters = new Map(); // fileKey → [resolve]
  const callbackWaiters = new Map(); // fileKey → { resolve, reject }
  const openStreams = new Set();
  const timers = new Set();
  let baseUrl = "";

  const later = (ms, fn) => {
    const t = setTimeout(() => {
      timers.delete(t);
      fn();
    }, ms);
    t.unref?.();
    timers.add(t);
    return t;
  };
  const cancel = (t) => {
    clearTimeout(t);
    timers.delete(t);
  };

  const requireUtKey = (req) => {
    const key = req.headers["x-uploadthing-api-key"];
    if (typeof key !== "string" || !key.startsWith("sk_")) throw utError(401, "Missing or invalid x-uploadthing-api-key header");
    knownApiKeys.add(key);
    return key;
  };

  const fileUrls = (record) => ({
    url: `${baseUrl}/f/${record.key}`,
    appUrl: `${baseUrl}/a/${encodeURIComponent(record.appId ?? "app")}/${record.key}`,
    ufsUrl: `${baseUrl}/f/${record.key}`,
  });

  // ----- resend --------------------------------------------------------------------------------

  function storeEmails(inputs, idempotencyKey, batchId) {
    const createdAt = new Date().toISOString();
    const records = inputs.map((m, i) => ({
      id: crypto.randomUUID(),
      ...m,
      idempotencyKey: idempotencyKey ?? null,
      batchId: batchId ?? null,
      batchIndex: batchId ? i : null,
      createdAt,
    }));
    store.addEmails(records);
    for (const r of records) log(`email ${r.id} to ${r.to.join(", ")}: ${r.subject}`);
    return records;
  }

  async function handleResend(req, res, url) {
    const route = url.pathname.slice("/resend".length);
    const isSend = req.method === "POST" && (route === "/emails" || route === "/emails/batch");
    const raw = isSend ? await readBody(req, LIMITS.emailBody) : null;

    if (isSend && failNext.count > 0) {
      failNext.count -= 1;
      const status = failNext.status;
      const name = status === 429 ? "rate_limit_exceeded" : status >= 500 ? "application_error" : "validation_error";
      throw resendError(status, name, `Injected failure from the local fake (status ${status}).`);
    }

    const auth = req.headers.authorization ?? "";
    if (!/^Bearer\s+\S+/.test(auth)) {
      throw resendError(401, "missing_api_key", "Missing API key in the authorization header. Include the following header in the request: Authorization: Bearer YOUR_API_KEY");
    }

    if (isSend) {
      const idemKey = req.headers["idempotency-key"];
      if (idemKey !== undefined && (typeof idemKey !== "string" || idemKey.length < 1 || idemKey.length > 256)) {
        throw resendError(400, "invalid_idempotency_key", "The key must be between 1-256 chars.");
      }
      const scopeKey = idemKey ? `${route}\n${idemKey}` : null;
      const requestHash = crypto.createHash("sha256").update(raw).digest("hex");
      if (scopeKey) {
        const prior = store.idempotency.get(scopeKey);
        if (prior && Date.parse(prior.createdAt) > Date.now() - DAY_MS) {
          if (prior.requestHash !== requestHash) {
            throw resendError(409, "invalid_idempotent_request", "Same idempotency key used with a different request payload.");
          }
          return sendJson(res, prior.status, prior.response);
        }
      }
      const body = parseJson(raw, () => resendError(400, "validation_error", "The request body is not valid JSON."));

      let response;
      if (route === "/emails") {
        const [record] = storeEmails([validateEmail(body)], idemKey);
        response = { id: record.id };
      } else {
        if (!Array.isArray(body) || body.length === 0) throw resendError(422, "validation_error", "The request body must be a non-empty array of emails.");
        if (body.length > LIMITS.batchSize) throw resendError(422, "validation_error", `A batch holds at most ${LIMITS.batchSize} emails.`);
        const permissive = req.headers["x-batch-validation"] === "permissive";
        const valid = [];
        const errors = [];
        body.forEach((item, index) => {
          try {
            valid.push(validateEmail(item));
          } catch (err) {
            if (!(err instanceof HttpError)) throw err;
            if (!permissive) throw resendError(422, "validation_error", `emails[${index}]: ${err.body.message}`);
            errors.push({ index, message: err.body.message });
          }
        });
        const records = storeEmails(valid, idemKey, crypto.randomUUID());
        response = { data: records.map((r) => ({ id: r.id })) };
        if (permissive) response.errors = errors;
      }
      if (scopeKey) store.addIdempotency({ scopeKey, requestHash, status: 200, response, createdAt: new Date().toISOString() });
      return sendJson(res, 200, response);
    }

    if (req.method === "GET" && route === "/emails") {
      const data = [...store.emails].reverse().map(emailView);
      return sendJson(res, 200, { object: "list", has_more: false, data });
    }
    const m = /^\/emails\/([^/]+)$/.exec(route);
    if (req.method === "GET" && m) {
      const email = store.emailsById.get(decodeURIComponent(m[1]));
      if (!email) throw resendError(404, "not_found", "Email not found");
      return sendJson(res, 200, emailView(email));
    }
    throw resendError(404, "not_found", "The requested endpoint does not exist.");
  }

  // ----- inspection ------------------------------------------------------------------------------

  async function handleInspect(req, res, url) {
    const route = url.pathname.slice("/__fake".length);
    if (req.method === "GET" && route === "/emails") {
      const to = url.searchParams.get("to");
      const list = to ? store.emails.filter((e) => e.to.some((a) => a.includes(to))) : store.emails;
      return sendJson(res, 200, list);
    }
    if (req.method === "GET" && route === "/uploads") return sendJson(res, 200, [...store.uploads.values()]);
    if (req.method === "POST" && route === "/reset") {
      await readBody(req, LIMITS.jsonBody);
      store.reset();
      payments.reset();
      failNext = { count: 0, status: 500 };
      for (const reg of registrations.values()) reg.endStream?.();
      registrations.clear();
      return sendJson(res, 200, { ok: true });
    }
    if (req.method === "POST" && route === "/fail-emails") {
      const body = parseJson(await readBody(req, LIMITS.jsonBody), () => utError(400, "Body must be JSON"));
      const count = body?.count;
      const status = body?.status ?? 500;
      if (!Number.isInteger(count) || count < 0 || count > 1000) throw utError(400, "`count` must be an integer from 0 to 1000");
      if (!Number.isInteger(status) || status < 400 || status > 599) throw utError(400, "`status` must be an HTTP error status (400-599)");
      failNext = { count, status };
      return sendJson(res, 200, { ok: true, count, status });
    }
    throw utError(404, "Unknown inspection route");
  }

  // ----- uploadthing ingest ------------------------------------------------------------------

  function pruneRegistrations() {
    const cutoff = Date.now() - REGISTRATION_TTL_MS;
    for (const [key, reg] of registrations) if (reg.createdAt < cutoff) registrations.delete(key);
  }

  async function handleRouteMetadata(req, res) {
    const apiKey = requireUtKey(req);
    const body = parseJson(await readBody(req, LIMITS.jsonBody), () => utError(400, "Body must be JSON"));
    const fileKeys = body?.fileKeys;
    if (!Array.isArray(fileKeys) || fileKeys.length === 0 || !fileKeys.every((k) => typeof k === "string" && FILE_KEY_RE.test(k))) {
      throw utError(400, "`fileKeys` must be a non-empty array of file keys");
    }
    let callbackUrl;
    try {
      callbackUrl = new URL(body.callbackUrl);
    } catch {
      throw utError(400, "`callbackUrl` must be an absolute URL");
    }
    if (callbackUrl.protocol !== "http:" && callbackUrl.protocol !== "https:") throw utError(400, "`callbackUrl` must be http(s)");
    pruneRegistrations();

    const reg = {
      apiKey,
      metadata: body.metadata && typeof body.metadata === "object" && !Array.isArray(body.metadata) ? body.metadata : {},
      isDev: body.isDev === true,
      callbackUrl: callbackUrl.href,
      callbackSlug: typeof body.callbackSlug === "string" ? body.callbackSlug : null,
      awaitServerData: body.awaitServerData !== false,
      pending: new Set(fileKeys),
      stream: null,
      createdAt: Date.now(),
    };

    if (reg.isDev) {
      // Dev mode: the app cannot be assumed reachable, so callbacks travel back as NDJSON lines
      // on this very response, which stays open until every file of the request has arrived.
      res.writeHead(200, { "Content-Type": "application/x-ndjson", "Cache-Control": "no-store" });
      res.flushHeaders();
      reg.stream = res;
      openStreams.add(res);
      const endStream = () => {
        cancel(reg.streamTimer);
        if (reg.stream) {
          openStreams.delete(reg.stream);
          reg.stream.end();
          reg.stream = null;
        }
      };
      reg.endStream = endStream;
      reg.streamTimer = later(DEV_STREAM_MAX_MS, endStream);
      res.on("close", () => {
        openStreams.delete(res);
        if (reg.stream === res) reg.stream = null;
      });
    } else {
      sendJson(res, 200, { ok: true });
    }

    for (const key of fileKeys) {
      registrations.set(key, reg);
      for (const wake of registrationWaiters.get(key) ?? []) wake();
      registrationWaiters.delete(key);
    }
  }

  function waitForRegistration(key) {
    if (registrations.has(key)) return Promise.resolve(registrations.get(key));
    return new Promise((resolve) => {
      const list = registrationWaiters.get(key) ?? [];
      const t = later(registrationWaitMs, () => {
        registrationWaiters.delete(key);
        resolve(undefined);
      });
      list.push(() => {
        cancel(t);
        resolve(registrations.get(key));
      });
      registrationWaiters.set(key, list);
    });
  }

  function readSignedParams(url) {
    // The SDK runs encodeURIComponent on each value before URLSearchParams encodes it again.
    const get = (name) => {
      const v = url.searchParams.get(name);
      if (v === null) return undefined;
      try {
        return decodeURIComponent(v);
      } catch {
        throw utError(400, `Malformed query value for ${name}`);
      }
    };
    const size = Number(get("x-ut-file-size"));
    return {
      appId: get("x-ut-identifier"),
      name: get("x-ut-file-name"),
      size: Number.isFinite(size) ? size : undefined,
      type: get("x-ut-file-type"),
      slug: get("x-ut-slug"),
      customId: get("x-ut-custom-id") ?? null,
      contentDisposition: get("x-ut-content-disposition") ?? "inline",
      acl: get("x-ut-acl") ?? "public-read",
    };
  }

  function authoriseIngest(req, url, reg) {
    const keys = reg ? [reg.apiKey] : [...knownApiKeys];
    const check = checkSignedUrl(req, url, keys);
    if (!check.ok) throw utError(403, check.reason);
    return check;
  }

  async function handleIngestHead(req, res, url, key) {
    const params = readSignedParams(url);
    const reg = params.slug ? await waitForRegistration(key) : undefined;
    try {
      authoriseIngest(req, url, reg);
    } catch (err) {
      res.writeHead(err.status ?? 403);
      return res.end();
    }
    // Nothing is kept of a partial upload, so every upload starts from byte 0.
    res.writeHead(200, { "x-ut-range-start": "0", "Content-Length": "0" });
    res.end();
  }

  function deliverCallback(reg, record, payload) {
    const signature = sign(payload, reg.apiKey);
    if (reg.isDev && reg.stream) {
      record.callbackVia = "stream";
      reg.stream.write(JSON.stringify({ payload, signature, hook: "callback" }) + "\n");
      return Promise.resolve();
    }
    record.callbackVia = "post";
    const target = new URL(reg.callbackUrl);
    if (reg.callbackSlug && !target.searchParams.has("slug")) target.searchParams.set("slug", reg.callbackSlug);
    return fetch(target, {
      method: "POST",
      headers: {
        "Content-Type": "application/json",
        "uploadthing-hook": "callback",
        "x-uploadthing-signature": signature,
      },
      body: payload,
      signal: AbortSignal.timeout(callbackTimeoutMs),
    }).then(async (r) => {
      await r.arrayBuffer().catch(() => undefined);
      if (!r.ok) throw new Error(`the app answered the upload callback with ${r.status}`);
    });
  }

  function waitForCallbackResult(key) {
    let entry;
    const promise = new Promise((resolve, reject) => {
      const t = later(callbackTimeoutMs, () => {
        callbackWaiters.delete(key);
        reject(new Error("onUploadComplete did not report a result in time"));
      });
      entry = {
        resolve: (v) => {
          cancel(t);
          callbackWaiters.delete(key);
          resolve(v);
        },
        reject: (e) => {
          cancel(t);
          callbackWaiters.delete(key);
          reject(e);
        },
      };
    });
    callbackWaiters.set(key, entry);
    return { promise, entry };
  }

  async function handleIngestPut(req, res, url, key) {
    const params = readSignedParams(url);
    // Uploads started by the app's route handler carry the slug and must have been registered;
    // the dev-mode registration may still be in flight, so give it a moment.
    const reg = params.slug ? await waitForRegistration(key) : undefined;
    if (params.slug && !reg) {
      await readBody(req, LIMITS.uploadBody).catch(() => undefined);
      throw utError(400, "No route metadata was registered for this file key");
    }
    const check = authoriseIngest(req, url, reg);
    const body = await readBody(req, LIMITS.uploadBody);
    const part = parseMultipart(body, req.headers["content-type"]).find((p) => p.name === "file");
    if (!part) throw utError(400, "The multipart body has no `file` field");
    if (params.size !== undefined && part.data.length !== params.size) {
      throw utError(400, `File size mismatch: the presigned URL says ${params.size} bytes, the body has ${part.data.length}`);
    }

    const record = {
      key,
      id: key,
      appId: params.appId ?? null,
      name: params.name ?? part.filename ?? key,
      size: part.data.length,
      type: params.type || part.type || "application/octet-stream",
      customId: params.customId,
      acl: params.acl,
      contentDisposition: params.contentDisposition,
      slug: params.slug ?? null,
      metadata: reg?.metadata ?? null,
      fileHash: crypto.createHash("md5").update(part.data).digest("hex"),
      status: "Uploaded",
      signatureVerified: check.verified,
      callbackVia: null,
      serverData: null,
      callbackError: null,
      uploadedAt: Date.now(),
    };
    store.putUpload(record, part.data);
    log(`upload ${key} (${record.size} bytes, ${record.type})`);

    const urls = fileUrls(record);
    const answer = () => ({ ...urls, fileHash: record.fileHash, serverData: record.serverData });
    if (!reg) return sendJson(res, 200, answer());

    reg.pending.delete(key);
    registrations.delete(key);
    const payload = JSON.stringify({
      status: "uploaded",
      file: {
        name: record.name,
        size: record.size,
        type: record.type,
        customId: record.customId,
        key,
        url: urls.url,
        appUrl: urls.appUrl,
        ufsUrl: urls.ufsUrl,
        fileHash: record.fileHash,
      },
      // The route handler posts its `/callback-result` to this origin.
      origin: baseUrl,
      metadata: reg.metadata,
    });

    const { promise, entry } = waitForCallbackResult(key);
    entry.apiKey = reg.apiKey;
    const settled = promise.then(
      (result) => {
        record.serverData = result ?? null;
        store.updateUploads();
      },
      (err) => {
        record.status = "Failed";
        record.callbackError = err.message;
        store.updateUploads();
        throw err;
      },
    );
    deliverCallback(reg, record, payload).catch((err) => entry.reject(err));
    store.updateUploads();
    log(`callback for ${key} sent by ${record.callbackVia}`);
    if (reg.isDev && reg.pending.size === 0) reg.endStream?.();

    if (!reg.awaitServerData) {
      settled.catch(() => undefined);
      return sendJson(res, 200, answer());
    }
    try {
      await settled;
    } catch (err) {
      throw utError(500, `Upload callback failed: ${err.message}`);
    }
    return sendJson(res, 200, answer());
  }

  async function handleCallbackResult(req, res) {
    const apiKey = requireUtKey(req);
    const body = parseJson(await readBody(req, LIMITS.jsonBody), () => utError(400, "Body must be JSON"));
    const fileKey = body?.fileKey;
    if (typeof fileKey !== "string") throw utError(400, "`fileKey` is required");
    const waiter = callbackWaiters.get(fileKey);
    const record = store.uploads.get(fileKey);
    if (!waiter && !record) throw utError(404, "Unknown file key");
    if (waiter && waiter.apiKey !== apiKey) throw utError(403, "This file key belongs to another api key");
    if (typeof body.error === "string") {
      waiter?.reject(new Error(body.error));
    } else if (waiter) {
      waiter.resolve(body.callbackData ?? null);
    } else {
      record.serverData = body.callbackData ?? null; // arrived after the PUT stopped waiting
      store.updateUploads();
    }
    log(`callback result for ${fileKey}`);
    return sendJson(res, 200, { ok: true });
  }

  // ----- file host ---------------------------------------------------------------------------

  function serveFile(req, res, url, key) {
    const record = FILE_KEY_RE.test(key) ? store.uploads.get(key) : undefined;
    const file = record ? store.filePath(key) : null;
    if (!record || !fs.existsSync(file)) throw utError(404, "File not found");
    if (record.acl === "private") {
      const check = checkSignedUrl(req, url, [...knownApiKeys]);
      if (!check.ok || !check.verified) throw utError(403, "This file is private: use a signed URL");
    }
    const disposition = record.contentDisposition === "attachment" ? "attachment" : "inline";
    const headers = {
      "Content-Type": record.type,
      "Content-Length": String(record.size),
      "Content-Disposition": `${disposition}; filename*=UTF-8''${encodeURIComponent(record.name)}`,
      "Cache-Control": "private, max-age=60",
      ETag: `"${record.fileHash}"`,
      "X-Content-Type-Options": "nosniff",
      // Uploaded bytes are untrusted: never let them run as a page on this origin.
      "Content-Security-Policy": "sandbox; default-src 'none'; img-src 'self'; media-src 'self'",
    };
    res.writeHead(200, headers);
    if (req.method === "HEAD") return res.end();
    fs.createReadStream(file).pipe(res);
  }

  // ----- UTApi ----------------------------------------------------------------------------------

  async function handleUtApi(req, res, url) {
    if (req.method !== "POST") throw utError(405, "Method not allowed");
    const apiKey = requireUtKey(req);
    const body = parseJson(await readBody(req, LIMITS.jsonBody), () => utError(400, "Body must be JSON")) ?? {};
    const route = url.pathname.slice("/v6".length);
    const records = () => [...store.uploads.values()];
    const byCustomId = (id) => records().find((r) => r.customId === id);
    const select = () => {
      if (Array.isArray(body.fileKeys)) return body.fileKeys.map((k) => store.uploads.get(k)).filter(Boolean);
      if (Array.isArray(body.customIds)) return body.customIds.map(byCustomId).filter(Boolean);
      throw utError(400, "Send `fileKeys` or `customIds`");
    };
    const target = (u) => (typeof u?.fileKey === "string" ? store.uploads.get(u.fileKey) : typeof u?.customId === "string" ? byCustomId(u.customId) : undefined);

    switch (route) {
      case "/deleteFiles": {
        const found = select();
        for (const r of found) store.deleteUpload(r.key);
        return sendJson(res, 200, { success: true, deletedCount: found.length });
      }
      case "/getFileUrl":
        return sendJson(res, 200, { data: select().map((r) => ({ key: r.key, url: fileUrls(r).ufsUrl })) });
      case "/listFiles": {
        const limit = Number.isInteger(body.limit) && body.limit > 0 ? Math.min(body.limit, 5000) : 500;
        const offset = Number.isInteger(body.offset) && body.offset >= 0 ? body.offset : 0;
        const all = records();
        const files = all.slice(offset, offset + limit).map((r) => ({
          id: r.id,
          customId: r.customId ?? null,
          key: r.key,
          name: r.name,
          size: r.size,
          status: r.status,
          uploadedAt: r.uploadedAt,
        }));
        return sendJson(res, 200, { hasMore: offset + limit < all.length, files });
      }
      case "/renameFiles": {
        if (!Array.isArray(body.updates)) throw utError(400, "Send `updates`");
        for (const u of body.updates) {
          const r = target(u);
          if (r && typeof u.newName === "string" && u.newName) r.name = u.newName;
        }
        store.updateUploads();
        return sendJson(res, 200, { success: true });
      }
      case "/updateACL": {
        if (!Array.isArray(body.updates)) throw utError(400, "Send `updates`");
        if (!body.updates.every((u) => u?.acl === "public-read" || u?.acl === "private")) throw utError(400, "`acl` must be public-read or private");
        for (const u of body.updates) {
          const r = target(u);
          if (r) r.acl = u.acl;
        }
        store.updateUploads();
        return sendJson(res, 200, { success: true });
      }
      case "/getUsageInfo": {
        const total = records().reduce((n, r) => n + r.size, 0);
        return sendJson(res, 200, { totalBytes: total, appTotalBytes: total, filesUploaded: records().length, limitBytes: USAGE_LIMIT_BYTES });
      }
      case "/requestFileAccess": {
        const r = target(body);
        if (!r) throw utError(404, "File not found");
        const ttl = Number.isFinite(body.expiresIn) && body.expiresIn > 0 ? body.expiresIn : 3600;
        const u = new URL(`${baseUrl}/f/${r.key}`);
        u.searchParams.append("expires", String(Date.now() + ttl * 1000));
        u.searchParams.append("signature", sign(u.toString(), apiKey));
        return sendJson(res, 200, { url: u.href, ufsUrl: u.href });
      }
      default:
        throw utError(404, "Unknown UploadThing API route");
    }
  }

  // ----- router ------------------------------------------------------------------------------

  async function route(req, res) {
    setCors(req, res);
    if (req.method === "OPTIONS") return answerPreflight(req, res);
    const url = new URL(req.url ?? "/", baseUrl);
    const p = url.pathname;

    if (p === "/resend" || p.startsWith("/resend/")) return handleResend(req, res, url);
    if (p.startsWith("/v1/") || p.startsWith("/pay/") || p === "/__fake/payments" || p.startsWith("/__fake/payments/")) {
      if (await payments.handle(req, res, url, { readBody, baseUrl })) return;
    }
    if (p.startsWith("/__fake/")) return handleInspect(req, res, url);
    if (p.startsWith("/v6/")) return handleUtApi(req, res, url);
    if (p === "/route-metadata" && req.method === "POST") return handleRouteMetadata(req, res);
    if (p === "/callback-result" && req.method === "POST") return handleCallbackResult(req, res);
    if (req.method === "GET" || req.method === "HEAD") {
      const f = /^\/f\/([^/]+)$/.exec(p) ?? /^\/a\/[^/]+\/([^/]+)$/.exec(p);
      if (f) return serveFile(req, res, url, f[1]);
      if (p === "/" && req.method === "GET") {
        return sendJson(res, 200, { service: "baywright local fakes", emails: store.emails.length, uploads: store.uploads.size });
      }
    }
    const k = /^\/([^/]+)$/.exec(p);
    if (k && FILE_KEY_RE.test(k[1])) {
      if (req.method === "HEAD") return handleIngestHead(req, res, url, k[1]);
      if (req.method === "PUT") return handleIngestPut(req, res, url, k[1]);
    }
    throw utError(404, "Not found");
  }

  const server = http.createServer((req, res) => {
    route(req, res)
      .catch((err) => {
        if (res.headersSent) {
          res.destroy();
          return;
        }
        const isResend = (req.url ?? "").startsWith("/resend");
        if (err instanceof HttpError && err.status === 413) {
          const mb = Math.round(err.limit / MB);
          const body = isResend
            ? { statusCode: 413, name: "validation_error", message: `The request body is larger than ${mb} MB.` }
            : { error: `The request body is larger than ${mb} MB.` };
          sendJson(res, 413, body, { Connection: "close" });
          return;
        }
        if (err instanceof HttpError) {
          sendJson(res, err.status, err.body, err.headers);
          return;
        }
        log(`internal error on ${req.method} ${req.url}: ${err?.stack ?? err}`);
        sendJson(res, 500, isResend ? { statusCode: 500, name: "application_error", message: "Internal error in the local fake." } : { error: "Internal error in the local fake." });
      })
      .finally(() => log(`${req.method} ${pathOf(req.url)} ${res.statusCode}`));
  });

  await new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  const address = server.address();
  baseUrl = `http://${host}:${address.port}`;

  let closed;
  return {
    url: baseUrl,
    close() {
      closed ??= new Promise((resolve) => {
        for (const t of timers) clearTimeout(t);
        timers.clear();
        for (const w of callbackWaiters.values()) w.reject(new Error("the fake is shutting down"));
        for (const s of openStreams) s.end();
        openStreams.clear();
        server.close(() => resolve());
        server.closeAllConnections();
      });
      return closed;
    },
  };
}

const pathOf = (u) => (u ?? "").split("?")[0];

// ---------------------------------------------------------------------------------------------
// CLI: `node fakes/server.mjs`

const isMain = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const port = Number(process.env.FAKES_PORT ?? 4010);
  const dataDir = process.env.FAKES_DATA_DIR ?? ".fakes-data";
  const quiet = process.env.FAKES_QUIET === "1";
  const callbackTimeoutMs = Number(process.env.FAKES_CALLBACK_TIMEOUT_MS ?? 30_000);
  startFakes({
    port,
    dataDir,
    callbackTimeoutMs,
    log: quiet ? () => {} : (line) => console.log(`[fakes] ${line}`),
  }).then(
    (fakes) => {
      console.log(`fakes listening on ${fakes.url} (data in ${path.resolve(dataDir)})`);
      console.log(`  e-mail:  RESEND_BASE_URL=${fakes.url}/resend`);
      console.log(`  uploads: UPLOADTHING_INGEST_URL=${fakes.url}  UPLOADTHING_API_URL=${fakes.url}`);
      console.log(`  payments: PAYMENTS_API_URL=${fakes.url}  webhook to ${process.env.PAYMENTS_WEBHOOK_URL ?? "(PAYMENTS_WEBHOOK_URL unset)"}`);
      let stopping = false;
      const stop = () => {
        if (stopping) process.exit(1); // a second Ctrl-C: don't wait
        stopping = true;
        setTimeout(() => process.exit(0), 3000).unref(); // never hang a dev or CI script on shutdown
        fakes.close().then(() => process.exit(0));
      };
      process.on("SIGINT", stop);
      process.on("SIGTERM", stop);
    },
    (err) => {
      console.error(`fakes failed to start: ${err.message}`);
      process.exit(1);
    },
  );
}
