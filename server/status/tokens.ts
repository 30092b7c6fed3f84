import "server-only";
import { createHash, createHmac, randomBytes } from "node:crypto";
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { dirname } from "node:path";
import { statusLinkSecretPath } from "@/db/paths";
import { emailEnv } from "@/server/email/env";

/**
 * A status link's token is HMAC-SHA256(secret, nonce) in base64url: 256 bits, unguessable without
 * the secret. The database keeps only the token's SHA-256 and the random nonce; the secret lives
 * outside the database (STATUS_LINK_SECRET, or a file beside it), so a copied database opens no
 * status page. The dispatcher can still derive the same token again for a retried e-mail, which
 * keeps the message byte-identical under its idempotency key.
 */
const TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/;

const secrets = new Map<string, Buffer>();

function linkSecret(): Buffer {
  const fromEnv = emailEnv().STATUS_LINK_SECRET;
  if (fromEnv) return Buffer.from(fromEnv, "utf8");
  const file = statusLinkSecretPath();
  const cached = secrets.get(file);
  if (cached) return cached;
  if (!existsSync(file)) {
    mkdirSync(dirname(file), { recursive: true });
    try {
      writeFileSync(file, randomBytes(32).toString("hex"), { flag: "wx", mode: 0o600 });
    } catch (err) {
      // Another process wrote it first; read theirs.
      if ((err as NodeJS.ErrnoException).code !== "EEXIST") throw err;
    }
    chmodSync(file, 0o600);
  }
  const secret = Buffer.from(readFileSync(file, "utf8").trim(), "utf8");
  secrets.set(file, secret);
  return secret;
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export function deriveToken(nonce: string): string {
  return createHmac("sha256", linkSecret()).update(`status-link:${nonce}`, "utf8").digest("base64url");
}

export function newLinkSecrets() {
  const nonce = randomBytes(16).toString("base64url");
  const token = deriveToken(nonce);
  return { nonce, token, tokenHash: hashToken(token) };
}

/** The token again, or null when the secret changed since the link was issued. */
export function tokenFor(link: { nonce: string; token_hash: string }): string | null {
  const token = deriveToken(link.nonce);
  return hashToken(token) === link.token_hash ? token : null;
}

export function looksLikeToken(raw: string): boolean {
  return TOKEN_PATTERN.test(raw);
}

export function appUrl(): string {
  return emailEnv().APP_URL.replace(/\/+$/, "");
}

export function statusUrl(token: string): string {
  return `${appUrl()}/status/${token}`;
}

/**
 * A key for another purpose, derived from the same secret (HMAC with a label), so the shop keeps
 * one secret outside the database. Used for the signed-in device cookie.
 */
export function derivedKey(label: string): Buffer {
  return createHmac("sha256", linkSecret()).update(`baywright:${label}`).digest();
}
