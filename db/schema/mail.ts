import { index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { OUTBOX_STATUSES } from "../../lib/vocabulary";
import { quoteMessages } from "./quote-life";
import { orders } from "./orders";
import { bankRequests, quoteRevisions } from "./quotes";
import { shopColumn, createdAtColumn } from "./columns";

export const emailStatusEnum = pgEnum("email_status", OUTBOX_STATUSES);

/**
 * The shop's e-mail outbox. A row is written in the same transaction as what it announces; a
 * pg-boss job delivers it with retries and back-off. `dedupeKey` makes a message one per event.
 */
export const emailOutbox = pgTable(
  "email_outbox",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    kind: text().notNull(),
    dedupeKey: text().notNull(),
    toEmail: text().notNull(),
    subject: text().notNull(),
    quoteRevisionId: uuid().references(() => quoteRevisions.id, { onDelete: "set null" }),
    /** the request a "needs review" notice is about */
    requestId: uuid().references(() => bankRequests.id, { onDelete: "set null" }),
    /** the thread message a "new message" notice carries */
    quoteMessageId: uuid().references(() => quoteMessages.id, { onDelete: "set null" }),
    /** the order an order message is about (confirmed, ready, shipped, delivered) */
    orderId: uuid().references(() => orders.id, { onDelete: "set null" }),
    status: emailStatusEnum().notNull().default("waiting"),
    attempts: integer().notNull().default(0),
    lastError: text(),
    messageId: text(),
    sentAt: timestamp({ withTimezone: true }),
    createdAt: createdAtColumn(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("email_outbox_shop_dedupe_uq").on(t.shopId, t.dedupeKey), index("email_outbox_shop_status_idx").on(t.shopId, t.status, t.createdAt)],
);

export type EmailOutboxRow = typeof emailOutbox.$inferSelect;
