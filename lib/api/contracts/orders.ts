import { z } from "zod";
import { defineRoute } from "@/lib/api/contract";
import { orderList } from "@/lib/validation/lists";
import { checkoutRequestSchema, checkoutResponseSchema, checkoutStateQuerySchema, checkoutStateSchema, ordersResponseSchema } from "@/lib/validation/orders";
import { EXAMPLE_SHOP, REFUSED, shopParams } from "./shared";

const quoteParams = shopParams.extend({ number: z.string().meta({ description: "the quote number", example: "Q-2026-0001" }) });
const orderParams = shopParams.extend({ number: z.string().meta({ description: "the order number", example: "O-2026-0001" }) });

export const startCheckout = defineRoute({
  method: "POST",
  path: "/api/v1/shops/{shop}/quotes/{number}/checkout",
  operationId: "startCheckout",
  tag: "Orders",
  summary: "Pay for an accepted quote",
  description:
    "For the quote's own customer: a hosted payment page (Stripe Checkout) for the accepted revision — the whole amount, the shop's deposit, or the balance after a deposit. While a page for the same quote is still open, the same one is given again, so two tabs pay once. Another customer's quote is not found; a superseded, expired, unaccepted or already paid quote is a 409 saying which.",
  access: "member",
  params: quoteParams,
  body: { json: checkoutRequestSchema },
  ok: { status: 200, description: "Where to send the customer to pay, and the session's id.", json: checkoutResponseSchema },
  errors: {
    400: "The body is wrong: `issues` names the field.",
    401: REFUSED.signedOut,
    403: `${REFUSED.notMember} Staff cannot pay for a customer. ${REFUSED.crossSite}`,
    404: "No such shop, or no such quote of this customer.",
    409: "The quote cannot be paid now: not accepted, superseded, expired, or paid already.",
    429: REFUSED.rateLimited,
  },
});

export const checkoutState = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/quotes/{number}/checkout",
  operationId: "getCheckoutState",
  tag: "Orders",
  summary: "Where a payment stands",
  description:
    "Whether one checkout of the quote is still open, paid or expired, and its order's number once the payment service has confirmed it: what the payment page's return address polls. The quote's customer and the shop's staff; anyone else gets 404.",
  access: "member",
  apiKey: "quotes:read",
  params: quoteParams,
  query: checkoutStateQuerySchema,
  ok: { status: 200, description: "The checkout's state.", json: checkoutStateSchema },
  errors: {
    400: "`session` is not a checkout session id: `issues` names it.",
    401: REFUSED.signedOut,
    403: REFUSED.notMember,
    404: "No such shop, quote or checkout this member may see.",
  },
});

export const listOrders = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/orders",
  operationId: "listOrders",
  tag: "Orders",
  summary: "Orders and their history",
  description:
    "A page of orders with what was paid and refunded, the due date and each status change: every order of the shop for its staff, a customer's own for a customer. Searches numbers and customers; filters by status (`open`: still on the floor) and timing (`late`).",
  access: "member",
  apiKey: "orders:read",
  params: shopParams,
  query: orderList.querySchema,
  ok: { status: 200, description: "A page of orders.", json: ordersResponseSchema },
  errors: { 400: "A query value the list does not take: `issues` names it.", 401: REFUSED.signedOut, 403: REFUSED.notMember, 404: REFUSED.noShop },
  examples: [{ title: "Late orders still on the floor", params: { shop: EXAMPLE_SHOP }, query: { status: "open", timing: "late" } }],
});

export const orderTraveler = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/orders/{number}/traveler",
  operationId: "getOrderTraveler",
  tag: "Orders",
  summary: "An order's build traveler (PDF)",
  description:
    "The shop floor's document for one order: the frozen arrangement, numbered cell positions, balancing resistors and bleeder, assembly notes, test steps with their limits, and the safety block. For the shop's staff.",
  access: "member",
  apiKey: "orders:read",
  params: orderParams,
  ok: { status: 200, description: "The traveler PDF (Content-Disposition names the file).", file: ["application/pdf"] },
  errors: { 401: REFUSED.signedOut, 403: REFUSED.notMember, 404: "No such shop or order." },
});

export const orderCertificate = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/orders/{number}/certificate",
  operationId: "getOrderCertificate",
  tag: "Orders",
  summary: "An order's test certificate (PDF)",
  description:
    "What each built bank measured against the limits derived from the frozen specification, once every bank has passed. For the order's customer and the shop's staff; anyone else gets 404.",
  access: "member",
  apiKey: "orders:read",
  params: orderParams,
  ok: { status: 200, description: "The certificate PDF (Content-Disposition names the file).", file: ["application/pdf"] },
  errors: {
    401: REFUSED.signedOut,
    403: REFUSED.notMember,
    404: "No such shop, or no such order this member may see.",
    409: "Not every bank of the order has passed its test yet.",
  },
});
