import "server-only";
import { and, desc, eq, inArray, sql } from "drizzle-orm";
import { db } from "@/db";
import { orders, paymentRefunds, payments, quoteRevisions, quotes, stripeEvents, users, type PaymentRow } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";
import type { PaymentKind } from "@/lib/vocabulary";

/**
 * Payments (one row per Checkout Session the app opened), their refunds, and the payment service's
 * events already handled. Tenant reads and writes take the caller's `withShop` transaction; the two
 * cross-shop reads (an event's shop by its payment intent; which event ids are known) serve the
 * webhook and the reconciliation job, never a member.
 */

/**
 * A quote and its current revision as checkout needs them, row-locked (`FOR UPDATE` on the quote)
 * until the caller's transaction ends: two tabs paying the same quote take turns here.
 */
export async function lockQuoteForCheckout(tx: Tx, shopId: string, number: string) {
  const [row] = await tx
    .select({
      quoteId: quotes.id,
      number: quotes.number,
      status: quotes.status,
      customerUserId: quotes.customerUserId,
      currentRevision: quotes.currentRevision,
      revisionId: quoteRevisions.id,
      revision: quoteRevisions.revision,
      currency: quoteRevisions.currency,
      quantity: quoteRevisions.quantity,
      total: quoteRevisions.total,
      validUntil: quoteRevisions.validUntil,
      pricing: quoteRevisions.pricing,
      arrangement: quoteRevisions.arrangement,
      sheet: quoteRevisions.sheet,
      design: quoteRevisions.design,
    })
    .from(quotes)
    .innerJoin(
      quoteRevisions,
      and(eq(quoteRevisions.shopId, quotes.shopId), eq(quoteRevisions.quoteId, quotes.id), eq(quoteRevisions.revision, quotes.currentRevision)),
    )
    .where(and(eq(quotes.shopId, shopId), eq(quotes.number, number)))
    .for("update", { of: quotes });
  return row ?? null;
}

/** Row-locks a quote by id (the webhook's serialisation point for one quote's payments and order). */
export async function lockQuoteById(tx: Tx, shopId: string, quoteId: string): Promise<boolean> {
  const [row] = await tx
    .select({ id: quotes.id })
    .from(quotes)
    .where(and(eq(quotes.shopId, shopId), eq(quotes.id, quoteId)))
    .for("update");
  return row !== undefined;
}

/** The quote's open checkout, if any (at most one: a partial unique index). */
export async function getOpenPayment(tx: Tx, shopId: string, quoteId: string): Promise<PaymentRow | null> {
  const [row] = await tx
    .select()
    .from(payments)
    .where(and(eq(payments.shopId, shopId), eq(payments.quoteId, quoteId), eq(payments.status, "open")))
    .limit(1);
  return row ?? null;
}

export interface NewPayment {
  id: string;
  quoteId: string;
  quoteRevisionId: string;
  customerUserId: string;
  kind: PaymentKind;
  amount: string;
  currency: string;
  stripeSessionId: string;
  checkoutUrl: string | null;
  expiresAt: Date | null;
}

export async function insertPayment(tx: Tx, shopId: string, p: NewPayment): Promise<void> {
  await tx.insert(payments).values({ shopId, ...p });
}

/** Marks an open checkout expired (its session expired or was closed for another); false when it was not open. */
export async function markPaymentExpired(tx: Tx, shopId: string, paymentId: string): Promise<boolean> {
  const rows = await tx
    .update(payments)
    .set({ status: "expired", checkoutUrl: null })
    .where(and(eq(payments.shopId, shopId), eq(payments.id, paymentId), eq(payments.status, "open")))
    .returning({ id: payments.id });
  return rows.length > 0;
}

/**
 * One payment, found by our id, its session or its payment intent (whichever the event carries),
 * row-locked unless `lock` is false (to learn its quote, which is locked first).
 */
export async function lockPayment(
  tx: Tx,
  shopId: string,
  by: { id?: string; sessionId?: string; paymentIntentId?: string },
  { lock = true }: { lock?: boolean } = {},
): Promise<PaymentRow | null> {
  const key =
    by.id !== undefined
      ? eq(payments.id, by.id)
      : by.sessionId !== undefined
        ? eq(payments.stripeSessionId, by.sessionId)
        : by.paymentIntentId !== undefined
          ? eq(payments.stripePaymentIntentId, by.paymentIntentId)
          : undefined;
  if (!key) return null;
  const query = tx
    .select()
    .from(payments)
    .where(and(eq(payments.shopId, shopId), key))
    .limit(1);
  const [row] = lock ? await query.for("update") : await query;
  return row ?? null;
}

/** Records a completed payment: what was received, through which payment intent, when. */
export async function markPaymentPaid(tx: Tx, shopId: string, paymentId: string, p: { paymentIntentId: string | null; amountReceived: string; paidAt: Date }) {
  await tx
    .update(payments)
    .set({
      status: "paid",
      stripePaymentIntentId: p.paymentIntentId ?? sql`${payments.stripePaymentIntentId}`,
      amountReceived: p.amountReceived,
      paidAt: p.paidAt,
      checkoutUrl: null,
    })
    .where(and(eq(payments.shopId, shopId), eq(payments.id, paymentId)));
}

/** Notes the payment intent of a payment (a refund event can name it before the completion arrives). */
export async function setPaymentIntent(tx: Tx, shopId: string, paymentId: string, paymentIntentId: string): Promise<void> {
  await tx
    .update(payments)
    .set({ stripePaymentIntentId: paymentIntentId })
    .where(and(eq(payments.shopId, shopId), eq(payments.id, paymentId), sql`${payments.stripePaymentIntentId} is null`));
}

/** Raises the charge's refunded total to `amount` (never lowers it: events may arrive in any order). */
export async function raiseChargeRefunded(tx: Tx, shopId: string, paymentId: string, amount: string): Promise<void> {
  await tx
    .update(payments)
    .set({ chargeRefunded: sql`greatest(${payments.chargeRefunded}, ${amount}::numeric)` })
    .where(and(eq(payments.shopId, shopId), eq(payments.id, paymentId)));
}

export interface RefundFact {
  paymentId: string;
  stripeRefundId: string;
  amount: string;
  currency: string;
  status: string;
  reason?: string;
  requestedByUserId?: string | null;
}

/**
 * Records a refund by the payment service's id: the manager's request and the webhook may each come
 * first; the second fills in what it knows (status from the service; reason and who asked from the app).
 */
export async function upsertRefund(tx: Tx, shopId: string, r: RefundFact): Promise<void> {
  await tx
    .insert(paymentRefunds)
    .values({
      shopId,
      paymentId: r.paymentId,
      stripeRefundId: r.stripeRefundId,
      amount: r.amount,
      currency: r.currency,
      status: r.status,
      reason: r.reason ?? "",
      requestedByUserId: r.requestedByUserId ?? null,
    })
    .onConflictDoUpdate({
      target: [paymentRefunds.shopId, paymentRefunds.stripeRefundId],
      set: {
        // a late "pending" never undoes a settled state
        status: sql`case when excluded.status = 'pending' then ${paymentRefunds.status} else excluded.status end`,
        ...(r.reason ? { reason: r.reason } : {}),
        ...(r.requestedByUserId ? { requestedByUserId: r.requestedByUserId } : {}),
      },
    });
}

/** Refunds that count (not failed or cancelled). */
const COUNTED_REFUND = sql`${paymentRefunds.status} not in ('failed', 'canceled')`;

/**
 * What has been paid for a quote and what has been refunded of it, in exact decimals: received on
 * paid payments; refunded per payment as the larger of the charge's running total and the sum of
 * its counted refunds (whichever event came last).
 */
export async function paymentTotals(tx: Tx, shopId: string, quoteId: string): Promise<{ paid: string; refunded: string }> {
  const refundSums = tx
    .select({ paymentId: paymentRefunds.paymentId, sum: sql<string>`sum(${paymentRefunds.amount})`.as("sum") })
    .from(paymentRefunds)
    .where(and(eq(paymentRefunds.shopId, shopId), COUNTED_REFUND))
    .groupBy(paymentRefunds.paymentId)
    .as("refund_sums");
  const [row] = await tx
    .select({
      paid: sql<string>`coalesce(sum(${payments.amountReceived}) filter (where ${payments.status} = 'paid'), 0)::text`,
      refunded: sql<string>`coalesce(sum(greatest(${payments.chargeRefunded}, coalesce(${refundSums.sum}, 0))), 0)::text`,
    })
    .from(payments)
    .leftJoin(refundSums, eq(refundSums.paymentId, payments.id))
    .where(and(eq(payments.shopId, shopId), eq(payments.quoteId, quoteId)));
  return { paid: row?.paid ?? "0", refunded: row?.refunded ?? "0" };
}

/** A quote's paid payments with what is left to refund on each, newest first (refunds come from the latest payment first). */
export async function listRefundablePayments(tx: Tx, shopId: string, quoteId: string) {
  const rows = await tx
    .select({
      id: payments.id,
      kind: payments.kind,
      currency: payments.currency,
      paymentIntentId: payments.stripePaymentIntentId,
      received: payments.amountReceived,
      refunded: sql<string>`greatest(${payments.chargeRefunded}, coalesce((select sum(${paymentRefunds.amount}) from ${paymentRefunds} where ${paymentRefunds.shopId} = ${payments.shopId} and ${paymentRefunds.paymentId} = ${payments.id} and ${COUNTED_REFUND}), 0))::text`,
    })
    .from(payments)
    .where(and(eq(payments.shopId, shopId), eq(payments.quoteId, quoteId), eq(payments.status, "paid")))
    .orderBy(desc(payments.paidAt));
  return rows;
}

/** The refunds of a quote's payments, newest first (the order page's refund list). */
export async function listRefundsOfQuote(shopId: string, quoteId: string) {
  return withShop(shopId, (tx) =>
    tx
      .select({
        id: paymentRefunds.id,
        amount: paymentRefunds.amount,
        currency: paymentRefunds.currency,
        status: paymentRefunds.status,
        reason: paymentRefunds.reason,
        createdAt: paymentRefunds.createdAt,
        requestedBy: users.name,
      })
      .from(paymentRefunds)
      .innerJoin(payments, and(eq(payments.shopId, paymentRefunds.shopId), eq(payments.id, paymentRefunds.paymentId)))
      .leftJoin(users, eq(users.id, paymentRefunds.requestedByUserId))
      .where(and(eq(paymentRefunds.shopId, shopId), eq(payments.quoteId, quoteId)))
      .orderBy(desc(paymentRefunds.createdAt))
      .limit(200),
  );
}

/** The payments of a quote, newest first (the order page's payment list). */
export async function listPaymentsOfQuote(shopId: string, quoteId: string) {
  return withShop(shopId, (tx) =>
    tx
      .select({
        id: payments.id,
        kind: payments.kind,
        status: payments.status,
        amount: payments.amount,
        amountReceived: payments.amountReceived,
        currency: payments.currency,
        paidAt: payments.paidAt,
        createdAt: payments.createdAt,
      })
      .from(payments)
      .where(and(eq(payments.shopId, shopId), eq(payments.quoteId, quoteId)))
      .orderBy(desc(payments.createdAt))
      .limit(200),
  );
}

/**
 * Where the success page stands on one checkout of a quote: the payment's state and the quote's
 * order number once the payment service has confirmed it. Null when the session is not this quote's.
 */
export async function getCheckoutState(shopId: string, quoteId: string, sessionId: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({ status: payments.status, kind: payments.kind, amount: payments.amount, currency: payments.currency, orderNumber: orders.number })
      .from(payments)
      .leftJoin(orders, and(eq(orders.shopId, payments.shopId), eq(orders.quoteId, payments.quoteId)))
      .where(and(eq(payments.shopId, shopId), eq(payments.quoteId, quoteId), eq(payments.stripeSessionId, sessionId)))
      .limit(1);
    return row ?? null;
  });
}

/** The quote's order and its paid total, for the quote page's pay panel (no lock). */
export async function getQuotePaymentState(shopId: string, quoteId: string) {
  return withShop(shopId, async (tx) => {
    const [order] = await tx
      .select({ number: orders.number, status: orders.status })
      .from(orders)
      .where(and(eq(orders.shopId, shopId), eq(orders.quoteId, quoteId)))
      .limit(1);
    const totals = await paymentTotals(tx, shopId, quoteId);
    const open = await getOpenPayment(tx, shopId, quoteId);
    return { order: order ?? null, ...totals, open: open ? { kind: open.kind, amount: open.amount } : null };
  });
}

/**
 * The shop and payment a payment intent belongs to, across shops: for an event that carries no
 * metadata of ours (a refund made at the payment service). Serves the webhook only.
 */
export async function findPaymentByIntent(paymentIntentId: string): Promise<{ shopId: string; paymentId: string } | null> {
  // a SECURITY DEFINER function (drizzle/0013_cross-shop-lookups.sql): the policies keep the app's role to one shop
  const { rows } = await db.execute<{ shop_id: string; payment_id: string }>(sql`select shop_id, payment_id from payment_of_intent(${paymentIntentId})`);
  const row = rows[0];
  return row ? { shopId: row.shop_id, paymentId: row.payment_id } : null;
}

// ---- the payment service's events --------------------------------------------------------------

export interface EventClaim {
  id: string;
  type: string;
  objectId: string | null;
  source: "webhook" | "reconciliation";
  stripeCreatedAt: Date;
}

/**
 * Claims an event for handling in the caller's transaction: true when it is new. A second delivery
 * of the same event waits here until the first commits, then finds it and answers false, so an
 * event's effects happen once however many copies arrive at once.
 */
export async function claimStripeEvent(tx: Tx, e: EventClaim): Promise<boolean> {
  const rows = await tx
    .insert(stripeEvents)
    .values({ ...e, outcome: "handling" })
    .onConflictDoNothing()
    .returning({ id: stripeEvents.id });
  return rows.length > 0;
}

/** What handling an event did, in a few words (kept with the claim). */
export async function setStripeEventOutcome(tx: Tx, id: string, outcome: string): Promise<void> {
  await tx.update(stripeEvents).set({ outcome }).where(eq(stripeEvents.id, id));
}

/** Which of these event ids have been handled already. */
export async function knownStripeEventIds(ids: readonly string[]): Promise<Set<string>> {
  if (ids.length === 0) return new Set();
  const rows = await db
    .select({ id: stripeEvents.id })
    .from(stripeEvents)
    .where(inArray(stripeEvents.id, [...ids]));
  return new Set(rows.map((r) => r.id));
}

/** How an event was handled, or null when it was not (tests and the reconciliation log). */
export async function getStripeEvent(id: string) {
  const [row] = await db.select().from(stripeEvents).where(eq(stripeEvents.id, id)).limit(1);
  return row ?? null;
}
