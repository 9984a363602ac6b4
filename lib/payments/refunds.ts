import "server-only";
import Stripe from "stripe";
import { recordAudit } from "@/db/queries/audit";
import { getOrderDetail } from "@/db/queries/orders";
import { listRefundablePayments, upsertRefund } from "@/db/queries/payments";
import { withShop } from "@/db/tx";
import type { ActionResult } from "@/lib/auth/guards";
import type { ShopContext } from "@/lib/auth/context";
import { formatMoney, fromMinorUnits, minorUnits, toMinorUnits } from "@/lib/pricing";
import { Dec } from "@/lib/pricing/decimal";
import { stripe } from "./stripe";

export interface RefundRequest {
  number: string;
  /** a decimal in the order's currency */
  amount: string;
  reason: string;
  /** the form's one-submit key: a repeated submit asks the payment service for nothing new */
  idempotencyKey: string;
}

/** What is left to refund on an order: everything received less everything refunded. */
export async function refundableOf(
  shopId: string,
  quoteId: string,
): Promise<{ left: string; parts: { id: string; paymentIntentId: string | null; left: string }[] }> {
  const rows = await withShop(shopId, (tx) => listRefundablePayments(tx, shopId, quoteId));
  const parts = rows.map((r) => ({ id: r.id, paymentIntentId: r.paymentIntentId, left: new Dec(r.received ?? "0").minus(r.refunded).toFixed() }));
  const left = parts.reduce((sum, p) => sum.plus(Dec.max(0, p.left)), new Dec(0));
  return { left: left.toFixed(), parts };
}

/**
 * A manager refunds (part of) what an order's customer paid, with a reason the customer's order
 * page shows: one refund per payment through the SDK, taken from the latest payment first, each
 * with an idempotency key from the form's key (a double submit refunds once). The refund is
 * recorded as asked, with an audit entry; the order's amounts and status follow when the payment
 * service's refund events arrive (the webhook), never from here.
 */
export async function requestRefund(ctx: ShopContext, input: RefundRequest): Promise<ActionResult<{ requested: string; currency: string }>> {
  const shopId = ctx.shop.id;
  const detail = await getOrderDetail(shopId, input.number);
  if (!detail) return { ok: false, code: "not-found", message: "No such order." };
  const o = detail.order;
  const digits = minorUnits(o.currency);
  const amount = new Dec(input.amount);
  if (amount.decimalPlaces() > digits)
    return {
      ok: false,
      code: "invalid",
      message: "Please correct the marked fields.",
      fieldErrors: { amount: [`${o.currency} has ${digits} decimal places.`] },
    };
  if (amount.lessThanOrEqualTo(0))
    return { ok: false, code: "invalid", message: "Please correct the marked fields.", fieldErrors: { amount: ["Enter an amount above zero."] } };
  const { left, parts } = await refundableOf(shopId, o.quoteId);
  if (amount.greaterThan(left)) {
    return {
      ok: false,
      code: "invalid",
      message: "Please correct the marked fields.",
      fieldErrors: { amount: [`At most ${formatMoney(left, o.currency)} is left to refund on this order.`] },
    };
  }

  let rest = amount;
  const made: { paymentId: string; refund: Stripe.Refund }[] = [];
  for (const part of parts) {
    if (rest.lessThanOrEqualTo(0)) break;
    const take = Dec.min(rest, part.left);
    if (take.lessThanOrEqualTo(0) || !part.paymentIntentId) continue;
    try {
      const refund = await stripe().refunds.create(
        {
          payment_intent: part.paymentIntentId,
          amount: toMinorUnits(take.toFixed(digits), o.currency),
          reason: "requested_by_customer",
          metadata: { shop_id: shopId, shop: ctx.shop.slug, order: o.number, payment: part.id, reason: input.reason.slice(0, 500) },
        },
        { idempotencyKey: `refund-${input.idempotencyKey}-${part.id}` },
      );
      made.push({ paymentId: part.id, refund });
      rest = rest.minus(take);
    } catch (error) {
      if (!(error instanceof Stripe.errors.StripeError)) throw error;
      const done = amount.minus(rest);
      const message = `The payment service refused the refund: ${error.message}${done.greaterThan(0) ? ` (${formatMoney(done.toFixed(digits), o.currency)} was refunded before it did)` : ""}`;
      if (made.length === 0) return { ok: false, code: "conflict", message };
      await recordRefunds(ctx, o, made, input.reason);
      return { ok: false, code: "conflict", message };
    }
  }
  await recordRefunds(ctx, o, made, input.reason);
  return { ok: true, data: { requested: amount.toFixed(digits), currency: o.currency } };
}

async function recordRefunds(
  ctx: ShopContext,
  o: { id: string; number: string; currency: string },
  made: { paymentId: string; refund: Stripe.Refund }[],
  reason: string,
) {
  const shopId = ctx.shop.id;
  await withShop(shopId, async (tx) => {
    let total = new Dec(0);
    for (const { paymentId, refund } of made) {
      const amount = fromMinorUnits(refund.amount, o.currency);
      total = total.plus(amount);
      await upsertRefund(tx, shopId, {
        paymentId,
        stripeRefundId: refund.id,
        amount,
        currency: o.currency,
        status: refund.status ?? "pending",
        reason,
        requestedByUserId: ctx.user.id,
      });
    }
    await recordAudit(tx, shopId, {
      actorUserId: ctx.user.id,
      action: "order.refund",
      subjectType: "order",
      subjectId: o.id,
      summary: `Refund of ${formatMoney(total.toFixed(), o.currency)} on ${o.number}: ${reason}`,
      changes: { refunds: { from: null, to: made.map((m) => m.refund.id) } },
    });
  });
}
