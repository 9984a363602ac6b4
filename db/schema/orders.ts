import { sql } from "drizzle-orm";
import { boolean, date, index, integer, jsonb, numeric, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { TestCheck, TestLimits, TestMeasurement } from "@/lib/orders/types";
import { ORDER_STATUSES, PAYMENT_KINDS, PAYMENT_STATUSES } from "../../lib/vocabulary";
import { users } from "./auth";
import { quoteRevisions, quotes } from "./quotes";
import { shopColumn, createdAtColumn, updatedAtColumn } from "./columns";

export const orderStatusEnum = pgEnum("order_status", ORDER_STATUSES);
export const paymentStatusEnum = pgEnum("payment_status", PAYMENT_STATUSES);
export const paymentKindEnum = pgEnum("payment_kind", PAYMENT_KINDS);

/**
 * One Checkout Session the app opened for a quote: what it asks for (the whole quote, the deposit
 * or the balance), and what the payment service has since said of it (paid, expired, refunded).
 * At most one open checkout per quote (a partial unique index), so two tabs share one.
 */
export const payments = pgTable(
  "payments",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    quoteId: uuid()
      .notNull()
      .references(() => quotes.id, { onDelete: "restrict" }),
    quoteRevisionId: uuid()
      .notNull()
      .references(() => quoteRevisions.id, { onDelete: "restrict" }),
    customerUserId: text()
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    kind: paymentKindEnum().notNull(),
    status: paymentStatusEnum().notNull().default("open"),
    /** what the checkout asks for, in `currency` */
    amount: numeric({ precision: 16, scale: 4 }).notNull(),
    currency: text().notNull(),
    stripeSessionId: text().notNull(),
    checkoutUrl: text(),
    expiresAt: timestamp({ withTimezone: true }),
    stripePaymentIntentId: text(),
    /** what the payment service says was paid (set on completion) */
    amountReceived: numeric({ precision: 16, scale: 4 }),
    paidAt: timestamp({ withTimezone: true }),
    /** the charge's running refunded total as `charge.refunded` last reported it */
    chargeRefunded: numeric({ precision: 16, scale: 4 }).notNull().default("0"),
    createdAt: createdAtColumn(),
    updatedAt: updatedAtColumn(),
  },
  (t) => [
    uniqueIndex("payments_shop_session_uq").on(t.shopId, t.stripeSessionId),
    uniqueIndex("payments_shop_quote_open_uq")
      .on(t.shopId, t.quoteId)
      .where(sql`${t.status} = 'open'`),
    index("payments_shop_quote_idx").on(t.shopId, t.quoteId, t.createdAt),
    index("payments_shop_paid_idx").on(t.shopId, t.paidAt),
  ],
);

/** A refund of (part of) a payment: asked for by the shop's manager or made at the payment service; its state comes from the webhooks. */
export const paymentRefunds = pgTable(
  "payment_refunds",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    paymentId: uuid()
      .notNull()
      .references(() => payments.id, { onDelete: "cascade" }),
    stripeRefundId: text().notNull(),
    amount: numeric({ precision: 16, scale: 4 }).notNull(),
    currency: text().notNull(),
    /** the payment service's state: pending, succeeded, failed, canceled, requires_action */
    status: text().notNull(),
    /** why, in the manager's words ("" for a refund made outside the app) */
    reason: text().notNull().default(""),
    requestedByUserId: text().references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAtColumn(),
    updatedAt: updatedAtColumn(),
  },
  (t) => [uniqueIndex("payment_refunds_shop_refund_uq").on(t.shopId, t.stripeRefundId), index("payment_refunds_shop_payment_idx").on(t.shopId, t.paymentId)],
);

/**
 * Every payment-service event the app has handled, by the service's own event id: a webhook
 * delivered twice, or one the reconciliation job finds again, is recognised and changes nothing.
 * Written in the same transaction as the event's effects. Not a tenant table: an event is matched
 * to its shop only by what it carries, and unknown types are acknowledged without one.
 */
export const stripeEvents = pgTable(
  "stripe_events",
  {
    id: text().primaryKey(),
    type: text().notNull(),
    /** the id of the object the event is about (cs_…, ch_…, re_…) */
    objectId: text(),
    /** how it arrived: "webhook" or "reconciliation" */
    source: text().notNull(),
    /** what handling it did, in a few words */
    outcome: text().notNull(),
    stripeCreatedAt: timestamp({ withTimezone: true }).notNull(),
    handledAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("stripe_events_handled_idx").on(t.handledAt)],
);

/** An order, numbered per shop (O-2026-0001): one per paid quote, built from its frozen revision. */
export const orders = pgTable(
  "orders",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    number: text().notNull(),
    quoteId: uuid()
      .notNull()
      .references(() => quotes.id, { onDelete: "restrict" }),
    quoteRevisionId: uuid()
      .notNull()
      .references(() => quoteRevisions.id, { onDelete: "restrict" }),
    customerUserId: text()
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    status: orderStatusEnum().notNull(),
    /** the stage an order on hold goes back to */
    heldFrom: orderStatusEnum(),
    currency: text().notNull(),
    /** the quote revision's total */
    total: numeric({ precision: 16, scale: 4 }).notNull(),
    amountPaid: numeric({ precision: 16, scale: 4 }).notNull().default("0"),
    amountRefunded: numeric({ precision: 16, scale: 4 }).notNull().default("0"),
    quantity: integer().notNull(),
    /** YYYY-MM-DD: parts lead time and build time from the day it was paid (lib/orders/due-date.ts) */
    dueDate: date().notNull(),
    carrier: text(),
    trackingReference: text(),
    createdAt: createdAtColumn(),
    updatedAt: updatedAtColumn(),
  },
  (t) => [
    uniqueIndex("orders_shop_number_uq").on(t.shopId, t.number),
    uniqueIndex("orders_shop_quote_uq").on(t.shopId, t.quoteId),
    index("orders_shop_status_due_idx").on(t.shopId, t.status, t.dueDate),
    index("orders_shop_customer_idx").on(t.shopId, t.customerUserId, t.createdAt),
    index("orders_shop_created_idx").on(t.shopId, t.createdAt),
  ],
);

/** Every move of an order: from, to, who (null: the payment service or the system), when and why. Never updated. */
export const orderStatusHistory = pgTable(
  "order_status_history",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    orderId: uuid()
      .notNull()
      .references(() => orders.id, { onDelete: "cascade" }),
    fromStatus: orderStatusEnum(),
    toStatus: orderStatusEnum().notNull(),
    actorUserId: text().references(() => users.id, { onDelete: "set null" }),
    note: text().notNull().default(""),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("order_status_history_shop_order_idx").on(t.shopId, t.orderId, t.at)],
);

/** One test of one built bank: what was measured, the limits it was judged against, and the verdict. The latest per bank counts. */
export const orderTestRecords = pgTable(
  "order_test_records",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    orderId: uuid()
      .notNull()
      .references(() => orders.id, { onDelete: "cascade" }),
    /** which bank of the order, from 1 */
    bank: integer().notNull(),
    measured: jsonb().$type<TestMeasurement>().notNull(),
    limits: jsonb().$type<TestLimits>().notNull(),
    checks: jsonb().$type<TestCheck[]>().notNull(),
    isPassed: boolean().notNull(),
    note: text().notNull().default(""),
    testedByUserId: text().references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAtColumn(),
  },
  (t) => [index("order_test_records_shop_order_idx").on(t.shopId, t.orderId, t.bank, t.createdAt)],
);

export type PaymentRow = typeof payments.$inferSelect;
export type PaymentRefundRow = typeof paymentRefunds.$inferSelect;
export type OrderRow = typeof orders.$inferSelect;
export type OrderStatusHistoryRow = typeof orderStatusHistory.$inferSelect;
export type OrderTestRecordRow = typeof orderTestRecords.$inferSelect;
