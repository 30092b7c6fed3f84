import "server-only";
import Stripe from "stripe";
import { z } from "zod";

/**
 * The hosted payment service through its official SDK. The same code talks to the real service
 * (real keys, no PAYMENTS_API_URL) or to the local fake (`fakes/payments.mjs`): PAYMENTS_API_URL
 * becomes the SDK's host, port and protocol options. Nothing here sees a card: the customer types
 * it on the service's own page.
 */
const paymentsEnvSchema = z.object({
  PAYMENTS_SECRET_KEY: z.string().trim().regex(/^(sk|rk)_[A-Za-z0-9_]+$/, "PAYMENTS_SECRET_KEY must be a secret key starting sk_ (or rk_).").optional(),
  PAYMENTS_WEBHOOK_SECRET: z.string().trim().regex(/^whsec_[A-Za-z0-9_]+$/, "PAYMENTS_WEBHOOK_SECRET must be the webhook signing secret starting whsec_.").optional(),
  // Unset against the real service; the local fake's URL otherwise.
  PAYMENTS_API_URL: z.url({ message: "PAYMENTS_API_URL must be a URL such as http://127.0.0.1:4010." }).optional(),
  PAYMENTS_CURRENCY: z.string().trim().regex(/^[a-z]{3}$/, "PAYMENTS_CURRENCY must be a three-letter currency in lower case, such as usd.").default("usd"),
});
export type PaymentsEnv = z.infer<typeof paymentsEnvSchema>;

export function paymentsEnv(): PaymentsEnv {
  const blankless = Object.fromEntries(Object.entries(process.env).filter(([, v]) => v !== ""));
  const parsed = paymentsEnvSchema.safeParse(blankless);
  if (!parsed.success) throw new Error(`Payment settings in the environment are not valid: ${parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
  return parsed.data;
}

/** Whether the shop takes card payments online (a secret key is set). */
export function paymentsConfigured(): boolean {
  try {
    return Boolean(paymentsEnv().PAYMENTS_SECRET_KEY);
  } catch {
    return false;
  }
}

let cached: { key: string; url: string | undefined; client: Stripe } | null = null;

function client(env: PaymentsEnv): Stripe {
  const key = env.PAYMENTS_SECRET_KEY;
  if (!key) throw new PaymentServiceError("Online payment is not set up for this shop (PAYMENTS_SECRET_KEY).");
  if (cached && cached.key === key && cached.url === env.PAYMENTS_API_URL) return cached.client;
  const target = env.PAYMENTS_API_URL ? new URL(env.PAYMENTS_API_URL) : null;
  const instance = new Stripe(key, {
    maxNetworkRetries: 1,
    timeout: 20_000,
    telemetry: false,
    ...(target ? { host: target.hostname, port: target.port || (target.protocol === "https:" ? 443 : 80), protocol: target.protocol === "https:" ? "https" : "http" } : {}),
  });
  cached = { key, url: env.PAYMENTS_API_URL, client: instance };
  return instance;
}

/** The service could not be reached or refused the request: nothing was charged. */
export class PaymentServiceError extends Error {}

export interface CheckoutRequest {
  amountCents: number;
  /** What the customer sees on the service's page, e.g. "Deposit, work order WO-26-0012". */
  description: string;
  successUrl: string;
  cancelUrl: string;
  /** Kept on the session and echoed in the webhook: our checkout row's id. */
  reference: string;
  /** Makes a retried request create one session, not two. */
  idempotencyKey: string;
}

export async function createCheckoutSession(req: CheckoutRequest): Promise<{ sessionId: string; url: string; currency: string }> {
  const env = paymentsEnv();
  try {
    const session = await client(env).checkout.sessions.create(
      {
        mode: "payment",
        line_items: [{ quantity: 1, price_data: { currency: env.PAYMENTS_CURRENCY, unit_amount: req.amountCents, product_data: { name: req.description } } }],
        success_url: req.successUrl,
        cancel_url: req.cancelUrl,
        client_reference_id: req.reference,
        metadata: { checkout: req.reference },
      },
      { idempotencyKey: req.idempotencyKey },
    );
    if (!session.url) throw new PaymentServiceError("The payment service gave no page to send the customer to.");
    return { sessionId: session.id, url: session.url, currency: session.currency ?? env.PAYMENTS_CURRENCY };
  } catch (err) {
    if (err instanceof PaymentServiceError) throw err;
    // The SDK's error carries the service's message; never the request (no payment detail is in it anyway).
    const message = err instanceof Error ? err.message : String(err);
    throw new PaymentServiceError(`The payment service refused or did not answer: ${message}`);
  }
}

export async function retrieveCheckoutSession(sessionId: string): Promise<{ id: string; paymentStatus: string; amountTotal: number | null; currency: string | null }> {
  const s = await client(paymentsEnv()).checkout.sessions.retrieve(sessionId);
  return { id: s.id, paymentStatus: s.payment_status, amountTotal: s.amount_total, currency: s.currency };
}

/** A webhook event whose signature the SDK has checked (header, secret, and a timestamp within 5 minutes). */
export function verifyWebhook(rawBody: string, signature: string | null): Stripe.Event {
  const env = paymentsEnv();
  if (!env.PAYMENTS_WEBHOOK_SECRET) throw new WebhookSignatureError("no webhook secret is set (PAYMENTS_WEBHOOK_SECRET)");
  if (!signature) throw new WebhookSignatureError("the signature header is missing");
  // The SDK needs an instance for its webhooks helper; no key is used for verifying.
  const sdk = env.PAYMENTS_SECRET_KEY ? client(env) : new Stripe("sk_unused_for_webhooks");
  try {
    return sdk.webhooks.constructEvent(rawBody, signature, env.PAYMENTS_WEBHOOK_SECRET);
  } catch (err) {
    throw new WebhookSignatureError(err instanceof Error ? err.message.split("\n")[0] : "the signature does not match");
  }
}

export class WebhookSignatureError extends Error {}
