import { getDb } from "@/db";
import { wakeDispatcher } from "@/server/email/loop";
import { ApiError } from "@/server/http/errors";
import { json, respond } from "@/server/http/respond";
import { applyPaymentEvent, type PaymentEvent } from "@/server/money/payments";
import { verifyWebhook, WebhookSignatureError } from "@/server/payments/service";

const MAX_BYTES = 256 * 1024;

/**
 * The payment service's webhook: the only way the shop learns a customer paid. The raw body is
 * checked against its signature with the service's SDK before anything is read from it; each event
 * is applied once, keyed by its id. 200 for applied or already applied, 400 for anything refused
 * (a line in the server log says why; the body of the event is never logged).
 */
export async function POST(req: Request) {
  return respond(async () => {
    const declared = Number(req.headers.get("content-length") ?? "0");
    if (declared > MAX_BYTES) throw new ApiError("validation", "The event is too large.");
    const raw = await req.text();
    if (raw.length > MAX_BYTES) throw new ApiError("validation", "The event is too large.");
    let event;
    try {
      event = verifyWebhook(raw, req.headers.get("stripe-signature"));
    } catch (err) {
      if (err instanceof WebhookSignatureError) {
        console.warn(`payments webhook: refused, signature not verified (${err.message})`);
        throw new ApiError("validation", "The webhook signature is missing or does not match.");
      }
      throw err;
    }
    if (typeof event?.id !== "string" || typeof event?.type !== "string" || event.id.length > 255) {
      console.warn("payments webhook: refused, the event has no id or type");
      throw new ApiError("validation", "The event has no id or type.");
    }
    const result = await applyPaymentEvent(getDb(), event as unknown as PaymentEvent);
    if (result.outcome === "refused") {
      console.warn(`payments webhook: refused event ${event.id} ${event.type}: ${result.reason}`);
      throw new ApiError("validation", `Event refused: ${result.reason}.`);
    }
    // The customer's receipt went into the outbox with the payment: send it now, not at the next poll.
    if (result.outcome === "applied") wakeDispatcher();
    return json({ received: true, outcome: result.outcome });
  });
}
