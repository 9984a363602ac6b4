import "server-only";
import type Stripe from "stripe";
import { lockOrderOfQuote } from "@/db/queries/orders";
import {
  claimStripeEvent,
  findPaymentByIntent,
  lockPayment,
  lockQuoteById,
  markPaymentExpired,
  markPaymentPaid,
  raiseChargeRefunded,
  setPaymentIntent,
  setStripeEventOutcome,
  upsertRefund,
} from "@/db/queries/payments";
import { getShopIdentity } from "@/db/queries/shops";
import { inTransaction, withShop, type Tx } from "@/db/tx";
import { createOrderForPayment, settleOrder } from "@/lib/orders/settle";
import { fromMinorUnits } from "@/lib/pricing";
import { dispatchOutbox } from "@/lib/mail/outbox";

/**
 * The payment service's events, handled exactly once. Each event is claimed by its id in the same
 * transaction as its effects (db/queries/payments.ts `claimStripeEvent`): copies delivered at once
 * wait for the first to commit and then change nothing; a failure rolls the claim back with the
 * effects, so the next delivery (or the reconciliation job) handles it again. Within a shop the
 * quote row is locked first, then the payment, then the order, so events about one quote take turns.
 *
 * Events record facts (a payment received, a charge's refunded total, a refund) and the order is
 * settled from the facts each time, so they may arrive in any order: a refund that comes before its
 * payment's completion is recorded against the payment and counted once the order exists.
 */

export type EventSource = "webhook" | "reconciliation";

/** The event types that change payments and orders; the reconciliation job lists these. */
export const HANDLED_EVENT_TYPES = [
  "checkout.session.completed",
  "checkout.session.async_payment_succeeded",
  "checkout.session.expired",
  "charge.refunded",
  "refund.created",
  "refund.updated",
  "charge.refund.updated",
] as const satisfies readonly Stripe.Event.Type[];

type Handled = (typeof HANDLED_EVENT_TYPES)[number];

/** An event about a payment the app cannot place yet (a refund of a payment intent no completion has named): retried later. */
export class EventNotYetPlaceable extends Error {}

export interface EventResult {
  duplicate: boolean;
  outcome: string;
}

const idOf = (v: string | { id: string } | null | undefined): string | null => (v == null ? null : typeof v === "string" ? v : v.id);

interface Placement {
  shopId: string;
  paymentId: string | null;
  sessionId: string | null;
  paymentIntentId: string | null;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function isHandled(type: string): type is Handled {
  return (HANDLED_EVENT_TYPES as readonly string[]).includes(type);
}

function objectIdOf(event: Stripe.Event): string | null {
  const o = event.data.object as { id?: unknown };
  return typeof o.id === "string" ? o.id : null;
}

/** Which shop and payment an event is about: our metadata first, else the payment intent we recorded. */
async function place(event: Stripe.Event & { type: Handled }): Promise<Placement | null> {
  const object = event.data.object as { id: string; metadata?: Record<string, string> | null; payment_intent?: string | { id: string } | null };
  const metadata = object.metadata ?? {};
  const session = event.type.startsWith("checkout.session.");
  const paymentIntentId = idOf(object.payment_intent);
  if (metadata.shop_id && metadata.payment && UUID.test(metadata.payment) && (await getShopIdentity(metadata.shop_id))) {
    return { shopId: metadata.shop_id, paymentId: metadata.payment, sessionId: session ? object.id : null, paymentIntentId };
  }
  if (!session && paymentIntentId) {
    const found = await findPaymentByIntent(paymentIntentId);
    if (found) return { shopId: found.shopId, paymentId: found.paymentId, sessionId: null, paymentIntentId };
  }
  return null;
}

/** Handles one verified event (from a webhook or the reconciliation job), at most once however often it comes. */
export async function handleStripeEvent(event: Stripe.Event, source: EventSource): Promise<EventResult> {
  const claim = { id: event.id, type: event.type, objectId: objectIdOf(event), source, stripeCreatedAt: new Date(event.created * 1000) };
  if (!isHandled(event.type)) return acknowledge(claim, "not needed");
  const handled = event as Stripe.Event & { type: Handled };
  const placement = await place(handled);
  if (!placement) {
    // a refund of a payment intent we have not seen completed yet: answer non-2xx so it comes again
    if (!event.type.startsWith("checkout.session.")) throw new EventNotYetPlaceable(`${event.type} ${event.id}: no payment of this shop's is known for it yet`);
    return acknowledge(claim, "not a checkout of ours");
  }
  const result = await withShop(placement.shopId, async (tx): Promise<EventResult> => {
    if (!(await claimStripeEvent(tx, claim))) return { duplicate: true, outcome: "already handled" };
    const outcome = await apply(tx, placement, handled);
    await setStripeEventOutcome(tx, event.id, outcome);
    return { duplicate: false, outcome };
  });
  if (!result.duplicate) {
    try {
      await dispatchOutbox();
    } catch (error) {
      // the messages wait in the outbox; the queue's sweep sends them
      console.error(`[payments] dispatchOutbox failed after ${event.type} ${event.id}:`, error);
    }
  }
  return result;
}

async function acknowledge(claim: Parameters<typeof claimStripeEvent>[1], outcome: string): Promise<EventResult> {
  return inTransaction(async (tx) => {
    const fresh = await claimStripeEvent(tx, claim);
    if (fresh) await setStripeEventOutcome(tx, claim.id, outcome);
    return { duplicate: !fresh, outcome: fresh ? outcome : "already handled" };
  });
}

/** Finds the event's payment and locks, in order, its quote, the payment itself and the quote's order. */
async function lockPlaced(tx: Tx, p: Placement) {
  const by = p.paymentId ? { id: p.paymentId } : p.sessionId ? { sessionId: p.sessionId } : { paymentIntentId: p.paymentIntentId ?? "" };
  const first = await lockPaymentNoWait(tx, p.shopId, by);
  if (!first) return null;
  await lockQuoteById(tx, p.shopId, first.quoteId);
  const payment = await lockPayment(tx, p.shopId, { id: first.id });
  if (!payment) return null;
  return { payment, order: await lockOrderOfQuote(tx, p.shopId, payment.quoteId) };
}

/** The payment's row without a lock (to learn its quote, which is locked first). */
function lockPaymentNoWait(tx: Tx, shopId: string, by: Parameters<typeof lockPayment>[2]) {
  return lockPayment(tx, shopId, by, { lock: false });
}

async function apply(tx: Tx, p: Placement, event: Stripe.Event & { type: Handled }): Promise<string> {
  const at = new Date(event.created * 1000);
  const found = await lockPlaced(tx, p);
  if (!found) return "no payment of this shop's matches";
  const { payment } = found;
  let order = found.order;

  switch (event.type) {
    case "checkout.session.completed":
    case "checkout.session.async_payment_succeeded": {
      const session = event.data.object;
      if (session.id !== payment.stripeSessionId) return "session does not match the payment";
      if (session.payment_status !== "paid") return `awaiting payment (${session.payment_status})`;
      if (payment.status === "paid") return "payment already recorded";
      const received = fromMinorUnits(session.amount_total ?? 0, (session.currency ?? payment.currency).toUpperCase());
      await markPaymentPaid(tx, p.shopId, payment.id, { paymentIntentId: idOf(session.payment_intent), amountReceived: received, paidAt: at });
      const paid = { ...payment, status: "paid" as const, amountReceived: received };
      const made = !order;
      order ??= await createOrderForPayment(tx, p.shopId, paid, at);
      const settled = await settleOrder(tx, p.shopId, order, at);
      return [made ? `order ${order.number} made` : `payment recorded on ${order.number}`, settled].filter(Boolean).join("; ");
    }
    case "checkout.session.expired": {
      const expired = await markPaymentExpired(tx, p.shopId, payment.id);
      return expired ? "checkout expired" : `checkout was already ${payment.status}`;
    }
    case "charge.refunded": {
      const charge = event.data.object;
      const intent = idOf(charge.payment_intent);
      if (intent) await setPaymentIntent(tx, p.shopId, payment.id, intent);
      await raiseChargeRefunded(tx, p.shopId, payment.id, fromMinorUnits(charge.amount_refunded, charge.currency.toUpperCase()));
      const settled = order ? await settleOrder(tx, p.shopId, order, at) : "";
      return settled || (order ? "refund already counted" : "refund recorded; no order yet");
    }
    case "refund.created":
    case "refund.updated":
    case "charge.refund.updated": {
      const refund = event.data.object;
      const intent = idOf(refund.payment_intent);
      if (intent) await setPaymentIntent(tx, p.shopId, payment.id, intent);
      await upsertRefund(tx, p.shopId, {
        paymentId: payment.id,
        stripeRefundId: refund.id,
        amount: fromMinorUnits(refund.amount, refund.currency.toUpperCase()),
        currency: refund.currency.toUpperCase(),
        status: refund.status ?? "pending",
        reason: refund.metadata?.reason,
      });
      const settled = order ? await settleOrder(tx, p.shopId, order, at) : "";
      return settled || (order ? "refund already counted" : "refund recorded; no order yet");
    }
  }
}
