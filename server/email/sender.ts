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
  /** Files the message carries (a quote's PDF); the SDK sends the bytes base64-encoded. */
  attachments?: { filename: string; contentType: string; content: Buffer }[];
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

/**
 * How long one send may take. Well inside the dispatcher's lease, so a hung connection can never
 * let a second process claim the row while this one still waits on it.
 */
export const SEND_TIMEOUT_MS = 15_000;

/** Sends through the resend SDK; RESEND_BASE_URL points it at the local fake. */
export function resendSender(apiKey: string, baseUrl?: string, options: { timeoutMs?: number } = {}): EmailSender {
  const client = new Resend(apiKey, baseUrl ? { baseUrl } : undefined);
  const timeoutMs = options.timeoutMs ?? SEND_TIMEOUT_MS;
  const timedOut: SendResult = { ok: false, kind: "retry", reason: `The e-mail service did not answer within ${timeoutMs / 1000} s.` };
  return {
    async send(message, idempotencyKey) {
      // The SDK passes the signal to fetch and reports an abort as a failed request without a status.
      const signal = AbortSignal.timeout(timeoutMs);
      let result: Awaited<ReturnType<typeof client.emails.send>>;
      try {
        result = await client.emails.send(
          {
            from: message.from,
            to: message.to,
            subject: message.subject,
            html: message.html,
            text: message.text,
            ...(message.replyTo ? { replyTo: message.replyTo } : {}),
            ...(message.attachments?.length ? { attachments: message.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, content: a.content })) } : {}),
          },
          { idempotencyKey, signal },
        );
      } catch (err) {
        if (signal.aborted) return timedOut;
        return { ok: false, kind: "retry", reason: err instanceof Error ? err.message : String(err) };
      }
      if (result.error) return signal.aborted ? timedOut : classifySendError(result.error as { name?: string; message?: string; statusCode?: number | null });
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
