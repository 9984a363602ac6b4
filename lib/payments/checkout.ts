import "server-only";
import { randomUUID } from "node:crypto";
import Stripe from "stripe";
import { getOpenPayment, insertPayment, lockQuoteForCheckout, markPaymentExpired, paymentTotals } from "@/db/queries/payments";
import { lockOrderOfQuote } from "@/db/queries/orders";
import { getShopSettings } from "@/db/queries/shops";
import { withShop } from "@/db/tx";
import type { ActionResult } from "@/lib/auth/guards";
import type { ShopContext } from "@/lib/auth/context";
import { env } from "@/lib/env";
import { Dec } from "@/lib/pricing/decimal";
import { acceptQuoteRevisionIn } from "@/lib/quoting/lifecycle";
import { revisionSheet } from "@/lib/quoting/revision-sheet";
import { isExpired } from "@/lib/quoting/validity";
import { isQuoteNumber } from "@/lib/quoting/quote-number";
import type { CheckoutRequest, CheckoutResponse } from "@/lib/validation/orders";
import { arrangementLabel, PAYMENT_KIND_LABELS } from "@/lib/vocabulary";
import { amountFor, checkoutLines, linesTotal, payableKinds } from "./amounts";
import { stripe } from "./stripe";

/** An open checkout is handed out again only while it has at least this long to live. */
const REUSE_MARGIN_MS = 10 * 60 * 1000;

const NOT_FOUND = { ok: false, code: "not-found", message: "No such quote." } as const;
const conflict = (message: string) => ({ ok: false as const, code: "conflict" as const, message });

/** The metadata every checkout carries (on the session and its payment intent), so each event finds its shop, quote and payment. */
export interface CheckoutMetadata {
  shop_id: string;
  shop: string;
  quote: string;
  revision: string;
  revision_id: string;
  payment: string;
  kind: string;
  [key: string]: string;
}

const base = () => env.APP_URL.replace(/\/+$/, "");

/** Where the payment page sends the customer back: the success page (which waits for the webhook) and the quote. */
export function checkoutUrls(shopSlug: string, quoteNumber: string) {
  const quote = `${base()}/s/${encodeURIComponent(shopSlug)}/quotes/${encodeURIComponent(quoteNumber)}`;
  return { success: `${quote}/paid?session={CHECKOUT_SESSION_ID}`, cancel: `${quote}?checkout=cancelled` };
}

/** Whether an open checkout's session has been paid meanwhile, so no other may be opened (we only learn it from its event). */
async function closeOpenSession(sessionId: string): Promise<"closed" | "paid"> {
  try {
    await stripe().checkout.sessions.expire(sessionId);
    return "closed";
  } catch (error) {
    if (!(error instanceof Stripe.errors.StripeError)) throw error;
    const session = await stripe().checkout.sessions.retrieve(sessionId);
    if (session.status === "complete") return "paid";
    if (session.status === "expired") return "closed";
    throw error;
  }
}

/**
 * Opens (or hands out again) the Checkout Session for the quote's own customer to pay an accepted
 * quote revision: the whole amount, the shop's deposit, or the balance after a deposit. The quote
 * row is locked while this runs, so two tabs take turns: the second finds the first's open
 * checkout and gets the same one; a paid quote offers nothing more to pay.
 *
 * Acceptance is the quote's life, not payment's: before the first payment the revision is accepted
 * here through the quote's own move (`acceptQuoteRevisionIn`, lib/quoting/lifecycle.ts: only the
 * latest sent revision, not expired, superseded, declined or withdrawn, once, with its
 * `quote.accepted` event) in this same transaction; a revision accepted already is answered again.
 * The storefront's "Accept and pay" button calls the `startCheckout` action
 * (app/s/[shop]/quotes/[number]/actions.ts), and so does the JSON route; both come here.
 */
export async function openCheckout(ctx: ShopContext, input: CheckoutRequest & { number: string }, now = new Date()): Promise<ActionResult<CheckoutResponse>> {
  if (!isQuoteNumber(input.number)) return NOT_FOUND;
  const shopId = ctx.shop.id;
  const settings = await getShopSettings(shopId);
  const depositPercent = settings?.pricingRules.depositPercent ?? 0;

  return withShop(shopId, async (tx): Promise<ActionResult<CheckoutResponse>> => {
    const q = await lockQuoteForCheckout(tx, shopId, input.number);
    if (!q || q.customerUserId !== ctx.user.id) return NOT_FOUND;
    if (input.revision !== q.currentRevision) {
      return conflict(`Revision ${input.revision} has been superseded by revision ${q.currentRevision}; read the latest revision before paying.`);
    }
    const order = await lockOrderOfQuote(tx, shopId, q.quoteId);
    if (order && ["cancelled", "refunded"].includes(order.status)) return conflict(`Order ${order.number} for this quote is ${order.status}.`);
    if (!order) {
      // the accept move (or the acceptance already made), in this transaction
      const accepted = await acceptQuoteRevisionIn(tx, ctx, { number: q.number, revision: input.revision }, now);
      if (!accepted.ok) return accepted;
      // accepted but never paid, and past its validity since: the shop quotes it again
      if (isExpired(q.validUntil, now)) return conflict(`This quote expired on ${q.validUntil}; ask the shop for a new revision.`);
    }

    const totals = await paymentTotals(tx, shopId, q.quoteId);
    const money = { depositPercent, paid: totals.paid, total: q.total, currency: q.currency };
    const kinds = payableKinds(money);
    if (kinds.length === 0) return conflict(order ? `Quote ${q.number} is paid in full (order ${order.number}).` : `Quote ${q.number} is paid in full.`);
    if (!kinds.includes(input.kind)) {
      const offered = kinds.map((k) => PAYMENT_KIND_LABELS[k].toLowerCase()).join(" or the ");
      return conflict(`${PAYMENT_KIND_LABELS[input.kind]} is not offered for this quote now; pay the ${offered}.`);
    }
    const amount = amountFor(input.kind, money);

    const open = await getOpenPayment(tx, shopId, q.quoteId);
    if (open) {
      const same = open.kind === input.kind && open.quoteRevisionId === q.revisionId && new Dec(open.amount).equals(amount);
      const fresh = open.checkoutUrl !== null && open.expiresAt !== null && open.expiresAt.getTime() - now.getTime() > REUSE_MARGIN_MS;
      if (same && fresh && open.checkoutUrl) return { ok: true, data: { url: open.checkoutUrl, sessionId: open.stripeSessionId } };
      if ((await closeOpenSession(open.stripeSessionId)) === "paid") {
        return conflict("A payment for this quote has just been made and is being confirmed; its order will appear shortly.");
      }
      await markPaymentExpired(tx, shopId, open.id);
    }

    const paymentId = randomUUID();
    // the sell prices the customer accepted: a revision with added lines or an estimator's
    // discount is paid as one line for its banks and those lines together
    const sheet = revisionSheet(q);
    const bankLine = sheet.lines[0];
    const bank = `Capacitor bank ${arrangementLabel(q.arrangement)}, ${q.arrangement.cell.sku} cells`;
    const composite = sheet.lines.length > 1 || sheet.discount !== null || !bankLine;
    const lines = checkoutLines({
      kind: input.kind,
      currency: q.currency,
      quoteNumber: q.number,
      revision: q.revision,
      bankName: composite ? `${q.quantity} × ${bank}, with the quote's other lines${sheet.discount ? " and its discount" : ""}` : bank,
      quantity: composite ? 1 : q.quantity,
      unitPrice: composite ? sheet.subtotal : bankLine.unitPrice,
      discountPct: bankLine?.breakPct ?? "0",
      subtotal: sheet.subtotal,
      taxPct: sheet.taxPct,
      tax: sheet.tax,
      total: q.total,
      amount,
    });
    const metadata: CheckoutMetadata = {
      shop_id: shopId,
      shop: ctx.shop.slug,
      quote: q.number,
      revision: String(q.revision),
      revision_id: q.revisionId,
      payment: paymentId,
      kind: input.kind,
    };
    const urls = checkoutUrls(ctx.shop.slug, q.number);
    let session: Stripe.Checkout.Session;
    try {
      session = await stripe().checkout.sessions.create(
        {
          mode: "payment",
          line_items: lines.map((l) => ({
            quantity: l.quantity,
            price_data: { currency: q.currency.toLowerCase(), unit_amount: l.unitAmount, product_data: { name: l.name } },
          })),
          success_url: urls.success,
          cancel_url: urls.cancel,
          client_reference_id: q.revisionId,
          customer_email: ctx.user.email,
          metadata,
          payment_intent_data: { description: `${ctx.shop.name}: quote ${q.number}, revision ${q.revision} (${PAYMENT_KIND_LABELS[input.kind]})`, metadata },
        },
        { idempotencyKey: `checkout-${paymentId}` },
      );
    } catch (error) {
      if (error instanceof Stripe.errors.StripeInvalidRequestError) return conflict(`The payment service refused this checkout: ${error.message}`);
      throw error;
    }
    if (!session.url || session.amount_total !== linesTotal(lines)) throw new Error(`checkout session ${session.id} does not ask for the amount it was given`);
    await insertPayment(tx, shopId, {
      id: paymentId,
      quoteId: q.quoteId,
      quoteRevisionId: q.revisionId,
      customerUserId: ctx.user.id,
      kind: input.kind,
      amount,
      currency: q.currency,
      stripeSessionId: session.id,
      checkoutUrl: session.url,
      expiresAt: new Date(session.expires_at * 1000),
    });
    return { ok: true, data: { url: session.url, sessionId: session.id } };
  });
}
