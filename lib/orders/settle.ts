import "server-only";
import { nextShopNumber } from "@/db/queries/counters";
import { getRevisionForOrder, insertOrder, insertOrderHistory, updateOrder } from "@/db/queries/orders";
import { paymentTotals } from "@/db/queries/payments";
import { recordShopEvent } from "@/db/queries/shop-events";
import type { OrderRow, PaymentRow } from "@/db/schema";
import type { Tx } from "@/db/tx";
import { formatMoney } from "@/lib/pricing";
import { Dec } from "@/lib/pricing/decimal";
import { numberingYear } from "@/lib/quoting/quote-number";
import { dueDateOf, labourHoursOf } from "./due-date";
import { enqueueOrderMessage } from "./messages";
import { formatOrderNumber } from "./order-number";

/**
 * What the payment service's events do to orders, inside the event's own transaction (which has
 * locked the quote): the first confirmed payment of a quote makes its one order, numbered per shop
 * and year, due by its lead times, with "paid" as its first move and the "order confirmed" e-mail;
 * every payment or refund event then settles the order's amounts from the recorded facts, and an
 * order whose every payment has been returned becomes "refunded".
 */

/** Makes the quote's order for its first confirmed payment. */
export async function createOrderForPayment(tx: Tx, shopId: string, payment: PaymentRow, paidAt: Date): Promise<OrderRow> {
  const rev = await getRevisionForOrder(tx, shopId, payment.quoteRevisionId);
  if (!rev) throw new Error(`quote revision ${payment.quoteRevisionId} of payment ${payment.id} is not in this shop`);
  const year = numberingYear(paidAt);
  const number = formatOrderNumber(year, await nextShopNumber(tx, shopId, "order", year));
  const dueDate = dueDateOf({
    paidAt,
    leadTimeDays: rev.arrangement.leadTimeDays,
    labourHoursPerBank: labourHoursOf(rev.pricing.lines),
    quantity: rev.quantity,
  });
  const order = await insertOrder(tx, shopId, {
    number,
    quoteId: rev.quoteId,
    quoteRevisionId: rev.id,
    customerUserId: rev.customerUserId,
    currency: rev.currency,
    total: rev.total,
    quantity: rev.quantity,
    dueDate,
    createdAt: paidAt,
  });
  const paidNote = `${payment.kind === "deposit" ? "Deposit" : "Payment"} of ${formatMoney(payment.amountReceived ?? payment.amount, payment.currency)} received.`;
  await insertOrderHistory(tx, shopId, { orderId: order.id, fromStatus: null, toStatus: "paid", actorUserId: null, note: paidNote, at: paidAt });
  await recordShopEvent(tx, shopId, "order.status_changed", { order: number, quote: rev.quoteNumber, from: null, to: "paid", at: paidAt.toISOString() });
  await enqueueOrderMessage(tx, {
    shopId,
    orderId: order.id,
    orderNumber: number,
    quoteNumber: rev.quoteNumber,
    kind: "confirmed",
    toEmail: rev.customerEmail,
  });
  return order;
}

/**
 * Brings an order's paid and refunded amounts up to what the payments record, and moves it to
 * "refunded" once everything paid has been returned (a system move, kept in its history). Records
 * `payment.refunded` when the refunded amount grew. Answers what changed, in a few words.
 */
export async function settleOrder(tx: Tx, shopId: string, order: OrderRow, at: Date): Promise<string> {
  const { paid, refunded } = await paymentTotals(tx, shopId, order.quoteId);
  const paidD = new Dec(paid);
  const refundedD = new Dec(refunded);
  const before = new Dec(order.amountRefunded);
  const fullyRefunded = paidD.greaterThan(0) && refundedD.greaterThanOrEqualTo(paidD);
  const toRefunded = fullyRefunded && order.status !== "refunded";
  await updateOrder(tx, shopId, order.id, {
    amountPaid: paid,
    amountRefunded: refunded,
    ...(toRefunded ? { status: "refunded" as const, heldFrom: null } : {}),
  });
  const money = (a: InstanceType<typeof Dec>) => formatMoney(a.toFixed(), order.currency);
  const said: string[] = [];
  if (refundedD.greaterThan(before)) {
    await recordShopEvent(tx, shopId, "payment.refunded", {
      order: order.number,
      amount: refundedD.minus(before).toFixed(),
      refunded: refundedD.toFixed(),
      paid: paidD.toFixed(),
      currency: order.currency,
      at: at.toISOString(),
    });
    said.push(`${money(refundedD.minus(before))} refunded`);
  }
  if (toRefunded) {
    await insertOrderHistory(tx, shopId, {
      orderId: order.id,
      fromStatus: order.status,
      toStatus: "refunded",
      actorUserId: null,
      note: `Everything paid (${money(paidD)}) has been refunded.`,
      // when we learned of it: the service's event times are whole seconds and may read earlier than a staff move just made
      at: new Date(Math.max(at.getTime(), Date.now())),
    });
    await recordShopEvent(tx, shopId, "order.status_changed", { order: order.number, from: order.status, to: "refunded", at: at.toISOString() });
    said.push("order refunded");
  }
  return said.join(", ");
}
