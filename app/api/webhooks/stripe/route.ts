import { jsonError } from "@/lib/http/json-error";
import { readBodyLimited } from "@/lib/http/read-json";
import { EventNotYetPlaceable, handleStripeEvent } from "@/lib/payments/events";
import { verifyWebhook } from "@/lib/payments/stripe";

/** A payment-service event is a few kilobytes; anything near this is not one. */
const MAX_EVENT_BYTES = 512 * 1024;

/**
 * POST /api/webhooks/stripe — the payment service's events, signed (`Stripe-Signature`) with the
 * endpoint's secret and verified on the raw body. Not a shop route (the event names its shop) and
 * not subject to the cross-site check (a signed server-to-server call carries no cookies): the
 * signature is its only credential. A bad signature, or a time outside the 300 s tolerance, is a
 * 400. Each event is handled once, in the transaction of its effects; 200 only after that commits,
 * so a failure is a 500 that the service (or the reconciliation job) tries again.
 */
export async function POST(request: Request) {
  const bytes = await readBodyLimited(request, MAX_EVENT_BYTES);
  if (bytes === null) return jsonError(400, "The body is too large for an event.");
  const verified = verifyWebhook(Buffer.from(bytes), request.headers.get("stripe-signature"));
  if (!verified.ok) return jsonError(400, "The signature does not verify.", [{ path: "stripe-signature", message: verified.reason }]);
  try {
    const result = await handleStripeEvent(verified.event, "webhook");
    return Response.json({ received: true, duplicate: result.duplicate, outcome: result.outcome });
  } catch (error) {
    if (error instanceof EventNotYetPlaceable) return jsonError(409, "This event is about a payment not confirmed here yet; send it again later.");
    console.error(`[payments] webhook ${verified.event.type} ${verified.event.id} failed:`, error);
    return jsonError(500, "The event could not be handled now; send it again.");
  }
}
