// Local fake of the hosted payment service, as the `stripe` SDK (23.x) talks to it: checkout
// sessions (create, retrieve), the hosted checkout page with Pay and Cancel, and the signed webhook
// it POSTs to the app. Started by fakes/server.mjs on the same port; state in `payments.json`.
// Dependency-free. See fakes/README.md.
//
// What the SDK sends and expects (read from its source and exercised end to end):
// - requests go to `{protocol}://{host}:{port}/v1/...` with `Authorization: Bearer sk_…`; bodies are
//   `application/x-www-form-urlencoded` with bracketed keys (`line_items[0][price_data][currency]=usd`);
// - answers are JSON; an error is `{ error: { type, message } }` with a 4xx/5xx status;
// - `webhooks.constructEvent(body, header, secret)` checks the header
//   `Stripe-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<body>" with the secret>`
//   and refuses a `t` more than 300 s away from now.

import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";

const FORM_LIMIT = 256 * 1024;
const SESSION_ID_RE = /^cs_[A-Za-z0-9_]{8,80}$/;

/** `a[b][0][c]=1` form fields into nested objects and arrays, as the SDK encodes them. */
export function parseForm(text) {
  const out = {};
  for (const pair of text.split("&")) {
    if (!pair) continue;
    const eq = pair.indexOf("=");
    const rawKey = decodeURIComponent((eq < 0 ? pair : pair.slice(0, eq)).replace(/\+/g, " "));
    const value = eq < 0 ? "" : decodeURIComponent(pair.slice(eq + 1).replace(/\+/g, " "));
    const m = /^([^[\]]+)((?:\[[^[\]]*\])*)$/.exec(rawKey);
    if (!m) continue;
    const keys = [m[1], ...[...m[2].matchAll(/\[([^[\]]*)\]/g)].map((k) => k[1])];
    let node = out;
    for (let i = 0; i < keys.length; i++) {
      const key = keys[i];
      if (key === "__proto__" || key === "constructor" || key === "prototype") break;
      if (i === keys.length - 1) {
        node[key] = value;
      } else {
        const nextIsIndex = /^\d+$/.test(keys[i + 1]);
        node[key] ??= nextIsIndex ? [] : {};
        node = node[key];
      }
    }
  }
  return out;
}

/** The signature header the SDK's `webhooks.constructEvent` verifies. */
export function signPayload(payload, secret, timestamp = Math.floor(Date.now() / 1000)) {
  const v1 = crypto.createHmac("sha256", secret).update(`${timestamp}.${payload}`).digest("hex");
  return `t=${timestamp},v1=${v1}`;
}

const apiError = (status, type, message, param) => ({ status, body: { error: { type, message, ...(param ? { param } : {}) } } });
const escapeHtml = (s) => String(s).replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]);
const money = (cents, currency) => `${(cents / 100).toFixed(2)} ${String(currency).toUpperCase()}`;
const randomId = (prefix) => `${prefix}_${crypto.randomBytes(12).toString("hex")}`;

/**
 * The payments part of the fake. `handle(req, res, url, helpers)` answers and returns true for its
 * own paths (`/v1/…`, `/pay/…`, `/__fake/payments…`), false for anything else.
 */
export function createPaymentsFake({ dataDir, webhookUrl, webhookSecret, log = () => {} }) {
  const file = path.join(dataDir, "payments.json");
  let state = { sessions: [], deliveries: [] };
  if (fs.existsSync(file)) {
    try {
      state = JSON.parse(fs.readFileSync(file, "utf8"));
    } catch {
      // a file cut short by a crash: start empty
    }
  }
  const config = { webhookUrl: webhookUrl ?? null, webhookSecret: webhookSecret ?? "whsec_local_fake" };
  let failNext = { count: 0, status: 500 };
  let duplicateNext = 0;
  const save = () => {
    const tmp = `${file}.${process.pid}.tmp`;
    fs.writeFileSync(tmp, JSON.stringify(state, null, 1));
    fs.renameSync(tmp, file);
  };
  const findSession = (id) => state.sessions.find((s) => s.id === id);

  function sessionView(s, baseUrl) {
    return {
      id: s.id,
      object: "checkout.session",
      mode: "payment",
      amount_total: s.amount_total,
      amount_subtotal: s.amount_total,
      currency: s.currency,
      client_reference_id: s.client_reference_id,
      metadata: s.metadata,
      payment_status: s.payment_status,
      status: s.status,
      success_url: s.success_url,
      cancel_url: s.cancel_url,
      payment_intent: s.payment_intent,
      created: s.created,
      livemode: false,
      url: s.status === "open" ? `${baseUrl}/pay/${s.id}` : null,
    };
  }

  function createSession(params, baseUrl) {
    if (params.mode !== "payment") return apiError(400, "invalid_request_error", "Only mode=payment is supported by the local fake.", "mode");
    for (const key of ["success_url", "cancel_url"]) {
      try {
        new URL(params[key]);
      } catch {
        return apiError(400, "invalid_request_error", `Missing or invalid ${key}.`, key);
      }
    }
    const items = Array.isArray(params.line_items) ? params.line_items : [];
    if (items.length === 0) return apiError(400, "invalid_request_error", "line_items is required.", "line_items");
    let total = 0;
    let currency = null;
    const lines = [];
    for (const [i, item] of items.entries()) {
      const pd = item?.price_data;
      const amount = Number(pd?.unit_amount);
      const quantity = Number(item?.quantity ?? 1);
      if (!pd || !Number.isSafeInteger(amount) || amount < 0) return apiError(400, "invalid_request_error", `line_items[${i}][price_data][unit_amount] must be a whole number of cents.`, `line_items[${i}]`);
      if (!Number.isSafeInteger(quantity) || quantity < 1) return apiError(400, "invalid_request_error", `line_items[${i}][quantity] must be a positive integer.`, `line_items[${i}]`);
      if (!/^[a-z]{3}$/.test(pd.currency ?? "")) return apiError(400, "invalid_request_error", `line_items[${i}][price_data][currency] must be a three-letter currency.`, `line_items[${i}]`);
      if (currency && pd.currency !== currency) return apiError(400, "invalid_request_error", "All line items must share one currency.", "line_items");
      currency = pd.currency;
      total += amount * quantity;
      lines.push({ name: String(pd.product_data?.name ?? "Item"), amount, quantity });
    }
    if (total < 50) return apiError(400, "invalid_request_error", "The amount must be at least 0.50.", "line_items");
    const s = {
      id: `cs_test_${crypto.randomBytes(16).toString("hex")}`,
      amount_total: total,
      currency,
      lines,
      client_reference_id: params.client_reference_id ?? null,
      metadata: params.metadata && typeof params.metadata === "object" ? params.metadata : {},
      payment_status: "unpaid",
      status: "open",
      success_url: params.success_url,
      cancel_url: params.cancel_url,
      payment_intent: null,
      created: Math.floor(Date.now() / 1000),
    };
    state.sessions.push(s);
    save();
    log(`checkout ${s.id} for ${money(total, currency)}`);
    return { status: 200, body: sessionView(s, baseUrl) };
  }

  /** POSTs one signed event to the app; a failed connection is tried twice more, a second apart. */
  async function deliver(event) {
    const payload = JSON.stringify(event, null, 2);
    const times = duplicateNext > 0 ? 2 : 1;
    if (duplicateNext > 0) duplicateNext--;
    for (let copy = 0; copy < times; copy++) {
      const record = { eventId: event.id, type: event.type, sessionId: event.data.object.id, copy: copy + 1, status: null, error: null, at: new Date().toISOString() };
      state.deliveries.push(record);
      if (!config.webhookUrl) {
        record.error = "no webhook URL set (PAYMENTS_WEBHOOK_URL)";
        save();
        continue;
      }
      for (let attempt = 0; attempt < 3; attempt++) {
        try {
          const res = await fetch(config.webhookUrl, {
            method: "POST",
            headers: { "content-type": "application/json", "stripe-signature": signPayload(payload, config.webhookSecret), "user-agent": "local-payments-fake" },
            body: payload,
          });
          record.status = res.status;
          record.error = null;
          await res.text().catch(() => "");
          break;
        } catch (err) {
          record.error = String(err?.cause?.code ?? err?.message ?? err);
          await new Promise((r) => setTimeout(r, 1000));
        }
      }
      log(`webhook ${event.type} ${event.id} copy ${copy + 1} → ${record.status ?? record.error}`);
      save();
    }
  }

  function eventFor(type, s, baseUrl) {
    return { id: randomId("evt"), object: "event", api_version: "2025-01-01", created: Math.floor(Date.now() / 1000), livemode: false, type, data: { object: sessionView(s, baseUrl) } };
  }

  function hostedPage(s) {
    const lines = s.lines.map((l) => `<li>${escapeHtml(l.name)}${l.quantity > 1 ? ` × ${l.quantity}` : ""}: <strong>${escapeHtml(money(l.amount * l.quantity, s.currency))}</strong></li>`).join("");
    const body =
      s.status === "open"
        ? `<ul>${lines}</ul>
<p class="total">Total <strong>${escapeHtml(money(s.amount_total, s.currency))}</strong></p>
<p class="note">Local test checkout: no card is asked for and no money moves.</p>
<form method="post" action="/pay/${s.id}/pay"><button type="submit" class="pay">Pay ${escapeHtml(money(s.amount_total, s.currency))}</button></form>
<form method="post" action="/pay/${s.id}/cancel"><button type="submit" class="cancel">Cancel</button></form>`
        : `<p>This checkout is ${escapeHtml(s.status)}.</p><p><a href="${escapeHtml(s.status === "complete" ? s.success_url.replace("{CHECKOUT_SESSION_ID}", s.id) : s.cancel_url)}">Back to the shop</a></p>`;
    return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>Checkout (local test)</title>
<style>body{font:18px/1.4 system-ui,sans-serif;max-width:28rem;margin:2rem auto;padding:0 1rem;color:#111}h1{font-size:1.4rem}
button{font:inherit;width:100%;min-height:48px;margin:.4rem 0;border-radius:8px;border:2px solid #1d4ed8;cursor:pointer}
.pay{background:#1d4ed8;color:#fff;font-weight:700}.cancel{background:#fff;color:#1d4ed8}.note{color:#444;font-size:.9rem}.total{font-size:1.2rem}</style></head>
<body><main><h1>Checkout (local test)</h1>${body}</main></body></html>`;
  }

  function sendJson(res, status, body) {
    const text = JSON.stringify(body);
    res.writeHead(status, { "content-type": "application/json", "content-length": Buffer.byteLength(text), "request-id": randomId("req") });
    res.end(text);
  }

  async function handle(req, res, url, { readBody, baseUrl }) {
    const p = url.pathname;

    // ----- the SDK's API ---------------------------------------------------------------------
    if (p.startsWith("/v1/")) {
      const auth = req.headers.authorization ?? "";
      if (!/^Bearer sk_[A-Za-z0-9_]+$/.test(auth)) {
        const e = apiError(401, "invalid_request_error", "Invalid API Key provided.");
        sendJson(res, e.status, e.body);
        return true;
      }
      const raw = req.method === "POST" ? (await readBody(req, FORM_LIMIT)).toString("utf8") : "";
      if (failNext.count > 0) {
        failNext.count--;
        const e = apiError(failNext.status, "api_error", "The local fake was told to fail this request.");
        sendJson(res, e.status, e.body);
        return true;
      }
      if (req.method === "POST" && p === "/v1/checkout/sessions") {
        const out = createSession(parseForm(raw), baseUrl);
        sendJson(res, out.status, out.body);
        return true;
      }
      const m = /^\/v1\/checkout\/sessions\/([^/]+)$/.exec(p);
      if (m && req.method === "GET") {
        const s = findSession(m[1]);
        if (!s) {
          const e = apiError(404, "invalid_request_error", `No such checkout.session: '${m[1]}'`, "id");
          sendJson(res, e.status, e.body);
        } else sendJson(res, 200, sessionView(s, baseUrl));
        return true;
      }
      const e = apiError(404, "invalid_request_error", `Unrecognized request URL (${req.method}: ${p}). The local fake knows checkout sessions only.`);
      sendJson(res, e.status, e.body);
      return true;
    }

    // ----- the hosted checkout page -------------------------------------------------------
    const page = /^\/pay\/([^/]+)(?:\/(pay|cancel))?$/.exec(p);
    if (page) {
      const s = SESSION_ID_RE.test(page[1]) ? findSession(page[1]) : undefined;
      if (!s) {
        res.writeHead(404, { "content-type": "text/html; charset=utf-8" });
        res.end("<!doctype html><title>Not found</title><p>No such checkout.</p>");
        return true;
      }
      if (req.method === "GET" && !page[2]) {
        const html = hostedPage(s);
        res.writeHead(200, { "content-type": "text/html; charset=utf-8", "cache-control": "no-store" });
        res.end(html);
        return true;
      }
      if (req.method === "POST" && page[2]) {
        await readBody(req, FORM_LIMIT);
        if (page[2] === "pay" && s.status === "open") {
          s.status = "complete";
          s.payment_status = "paid";
          s.payment_intent = randomId("pi");
          save();
          log(`checkout ${s.id} paid`);
          // Delivered before the browser is sent back, as the service usually manages; the app's
          // page still waits for it rather than trusting the return.
          await deliver(eventFor("checkout.session.completed", s, baseUrl));
        } else if (page[2] === "cancel" && s.status === "open") {
          log(`checkout ${s.id} cancelled by the payer`);
        }
        const to = page[2] === "pay" || s.status === "complete" ? s.success_url.replace("{CHECKOUT_SESSION_ID}", s.id) : s.cancel_url;
        res.writeHead(303, { location: to });
        res.end();
        return true;
      }
      res.writeHead(405, { allow: "GET, POST" });
      res.end();
      return true;
    }

    // ----- inspection and switches for tests ----------------------------------------------
    if (p === "/__fake/payments" && req.method === "GET") {
      sendJson(res, 200, { webhookUrl: config.webhookUrl, sessions: state.sessions.map((s) => ({ ...sessionView(s, baseUrl), lines: s.lines })), deliveries: state.deliveries });
      return true;
    }
    if (p.startsWith("/__fake/payments/") && req.method === "POST") {
      const raw = (await readBody(req, FORM_LIMIT)).toString("utf8");
      let body = {};
      try {
        body = raw ? JSON.parse(raw) : {};
      } catch {
        sendJson(res, 400, { error: "Body must be JSON" });
        return true;
      }
      const action = p.slice("/__fake/payments/".length);
      if (action === "fail-next") {
        const count = body?.count;
        const status = body?.status ?? 500;
        if (!Number.isInteger(count) || count < 0 || count > 1000) return sendJson(res, 400, { error: "`count` must be an integer from 0 to 1000" }), true;
        if (!Number.isInteger(status) || status < 400 || status > 599) return sendJson(res, 400, { error: "`status` must be an HTTP error status (400-599)" }), true;
        failNext = { count, status };
        sendJson(res, 200, { ok: true, count, status });
        return true;
      }
      if (action === "duplicate-next") {
        const count = body?.count;
        if (!Number.isInteger(count) || count < 0 || count > 1000) return sendJson(res, 400, { error: "`count` must be an integer from 0 to 1000" }), true;
        duplicateNext = count;
        sendJson(res, 200, { ok: true, count });
        return true;
      }
      if (action === "webhook") {
        if (body?.url !== undefined) config.webhookUrl = body.url;
        if (body?.secret !== undefined) config.webhookSecret = body.secret;
        sendJson(res, 200, { ok: true, webhookUrl: config.webhookUrl });
        return true;
      }
      // Pay or cancel without a browser, as pressing the hosted page's buttons does.
      const act = /^sessions\/([^/]+)\/(pay)$/.exec(action);
      if (act) {
        const s = findSession(act[1]);
        if (!s) return sendJson(res, 404, { error: "No such checkout" }), true;
        if (s.status !== "open") return sendJson(res, 409, { error: `The checkout is ${s.status}` }), true;
        s.status = "complete";
        s.payment_status = "paid";
        s.payment_intent = randomId("pi");
        save();
        await deliver(eventFor("checkout.session.completed", s, baseUrl));
        sendJson(res, 200, { ok: true, session: sessionView(s, baseUrl) });
        return true;
      }
      sendJson(res, 404, { error: "Unknown payments inspection route" });
      return true;
    }
    return false;
  }

  return {
    handle,
    reset() {
      state = { sessions: [], deliveries: [] };
      failNext = { count: 0, status: 500 };
      duplicateNext = 0;
      save();
    },
  };
}
