import "server-only";
import { render } from "@react-email/render";
import { createElement, type ReactElement } from "react";
import { getOrderDetail, getOrderNumberById } from "@/db/queries/orders";
import { insertOutboxMessage } from "@/db/queries/outbox";
import { getShopIdentity } from "@/db/queries/shops";
import type { EmailOutboxRow } from "@/db/schema";
import type { Tx } from "@/db/tx";
import { OrderConfirmedEmail, orderConfirmedSubject } from "@/emails/order-confirmed";
import { OrderDeliveredEmail, orderDeliveredSubject } from "@/emails/order-delivered";
import { OrderReadyEmail, orderReadySubject } from "@/emails/order-ready";
import { OrderShippedEmail, orderShippedSubject } from "@/emails/order-shipped";
import { mailSettings } from "@/lib/mail/config";
import { formatValidity, outboxMessageId } from "@/lib/mail/format";
import type { OutgoingMessage } from "@/lib/mail/transport";
import { formatMoney } from "@/lib/pricing";
import { shippingNote } from "./safety";

/** The order messages the customer receives, one per order and kind (outbox kinds `order-confirmed` …). */
export const ORDER_MESSAGE_KINDS = ["confirmed", "ready", "shipped", "delivered"] as const;
export type OrderMessageKind = (typeof ORDER_MESSAGE_KINDS)[number];
const PREFIX = "order-";

/** Whether an outbox row is an order message. */
export function isOrderMessage(kind: string): boolean {
  return ORDER_MESSAGE_KINDS.some((k) => kind === `${PREFIX}${k}`);
}

/** The storefront addresses an order message links to. */
export function orderUrls(appUrl: string, shopSlug: string, orderNumber: string) {
  const page = `${appUrl.replace(/\/+$/, "")}/s/${encodeURIComponent(shopSlug)}/orders/${encodeURIComponent(orderNumber)}`;
  const certificate = `${appUrl.replace(/\/+$/, "")}/api/v1/shops/${encodeURIComponent(shopSlug)}/orders/${encodeURIComponent(orderNumber)}/certificate`;
  return { page, certificate };
}

/**
 * Records an order message in the outbox inside the caller's transaction. One per order and kind
 * (the dedupe key): an order that goes back to testing and is ready again does not say so twice.
 * The subject is written now; the body is rendered from the order when the queue sends it.
 */
export async function enqueueOrderMessage(
  tx: Tx,
  m: { shopId: string; orderId: string; orderNumber: string; quoteNumber: string; kind: OrderMessageKind; toEmail: string; carrier?: string },
): Promise<void> {
  const subject =
    m.kind === "confirmed"
      ? orderConfirmedSubject(m)
      : m.kind === "ready"
        ? orderReadySubject(m)
        : m.kind === "shipped"
          ? orderShippedSubject({ orderNumber: m.orderNumber, carrier: m.carrier ?? "the carrier" })
          : orderDeliveredSubject(m);
  await insertOutboxMessage(tx, m.shopId, {
    kind: `${PREFIX}${m.kind}`,
    dedupeKey: `${PREFIX}${m.kind}:${m.orderId}`,
    toEmail: m.toEmail,
    subject,
    quoteRevisionId: null,
    orderId: m.orderId,
  });
}

/** The message an order outbox row stands for, rendered from the order as it is now. */
export async function buildOrderMessage(row: EmailOutboxRow): Promise<OutgoingMessage> {
  if (!row.orderId) throw new Error("the order of this message no longer exists");
  const shop = await getShopIdentity(row.shopId);
  if (!shop) throw new Error("the shop of this message no longer exists");
  const number = await getOrderNumberById(row.shopId, row.orderId);
  const detail = number ? await getOrderDetail(row.shopId, number) : null;
  if (!detail) throw new Error("the order of this message no longer exists");
  const o = detail.order;
  const settings = mailSettings();
  const urls = orderUrls(settings.appUrl, shop.slug, o.number);
  const common = { shopName: shop.name, orderNumber: o.number, quoteNumber: detail.quoteNumber, orderUrl: urls.page };
  let email: ReactElement;
  switch (row.kind) {
    case `${PREFIX}confirmed`:
      email = createElement(OrderConfirmedEmail, {
        ...common,
        paid: formatMoney(o.amountPaid, o.currency),
        total: formatMoney(o.total, o.currency),
        dueDate: formatValidity(o.dueDate),
        quantity: o.quantity,
      });
      break;
    case `${PREFIX}ready`:
      email = createElement(OrderReadyEmail, { ...common, quantity: o.quantity, certificateUrl: urls.certificate });
      break;
    case `${PREFIX}shipped`:
      email = createElement(OrderShippedEmail, {
        ...common,
        carrier: o.carrier ?? "the carrier",
        trackingReference: o.trackingReference ?? "",
        shippingNote: shippingNote(detail.arrangement.cell.technology),
      });
      break;
    case `${PREFIX}delivered`:
      email = createElement(OrderDeliveredEmail, { ...common, certificateUrl: urls.certificate });
      break;
    default:
      throw new Error(`no message template for outbox kind "${row.kind}"`);
  }
  const [html, text] = await Promise.all([render(email), render(email, { plainText: true })]);
  return { to: row.toEmail, subject: row.subject, html, text, messageId: outboxMessageId(row.id, settings.from) };
}
