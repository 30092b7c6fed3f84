import "server-only";
import { Resend } from "resend";
import { emailEnv } from "./env";

export interface OutgoingEmail {
  from: string;
  to: string[];
  subject: string;
  html: string;
  text: string;
  replyTo?: string;
}

export type SendResult =
  | { ok: true; id: string | null }
  /** `retry`: worth another attempt later (service down, rate limit). `already_sent`: an earlier attempt under the same key got through. */
  | { ok: false; kind: "retry" | "permanent" | "already_sent"; reason: string };

export interface EmailSender {
  send(message: OutgoingEmail, idempotencyKey: string): Promise<SendResult>;
}

/** Classifies the service's answer; a network failure comes back as `application_error` without a status. */
export function classifySendError(error: { name?: string; message?: string; statusCode?: number | null }): SendResult {
  const status = error.statusCode ?? null;
  const reason = `${error.message || error.name || "unknown error"}${status ? ` (HTTP ${status})` : ""}`;
  if (error.name === "invalid_idempotent_request") return { ok: false, kind: "already_sent", reason };
  if (status === null || status === 409 || status === 429 || status >= 500) return { ok: false, kind: "retry", reason };
  return { ok: false, kind: "permanent", reason };
}

/** Sends through the resend SDK; RESEND_BASE_URL points it at the local fake. */
export function resendSender(apiKey: string, baseUrl?: string): EmailSender {
  const client = new Resend(apiKey, baseUrl ? { baseUrl } : undefined);
  return {
    async send(message, idempotencyKey) {
      let result: Awaited<ReturnType<typeof client.emails.send>>;
      try {
        result = await client.emails.send(
          { from: message.from, to: message.to, subject: message.subject, html: message.html, text: message.text, ...(message.replyTo ? { replyTo: message.replyTo } : {}) },
          { idempotencyKey },
        );
      } catch (err) {
        return { ok: false, kind: "retry", reason: err instanceof Error ? err.message : String(err) };
      }
      if (result.error) return classifySendError(result.error as { name?: string; message?: string; statusCode?: number | null });
      return { ok: true, id: result.data?.id ?? null };
    },
  };
}

/** The sender the environment describes, or null when e-mail is not set up (messages then wait). */
export function senderFromEnv(): EmailSender | null {
  const env = emailEnv();
  if (!env.RESEND_API_KEY) return null;
  return resendSender(env.RESEND_API_KEY, env.RESEND_BASE_URL);
}
