import { sql } from "drizzle-orm";
import { index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { WorkbenchDraft } from "@/lib/validation/workbench";
import { QUOTE_MESSAGE_KINDS } from "../../lib/vocabulary";
import { users } from "./auth";
import { bankRequests, quotes, quoteStatusEnum } from "./quotes";
import { shopColumn, createdAtColumn } from "./columns";

export const quoteMessageKindEnum = pgEnum("quote_message_kind", QUOTE_MESSAGE_KINDS);
export const quoteActorEnum = pgEnum("quote_actor", ["customer", "staff", "system"]);

/**
 * Every move of every quote revision (lib/quoting/quote-states.ts), append-only: a revision's state
 * is the `to_status` of its latest row. One acceptance per quote, at most (a unique index).
 */
export const quoteMoves = pgTable(
  "quote_moves",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    quoteId: uuid()
      .notNull()
      .references(() => quotes.id, { onDelete: "cascade" }),
    revision: integer().notNull(),
    /** null for the move that issued the revision */
    fromStatus: quoteStatusEnum(),
    toStatus: quoteStatusEnum().notNull(),
    actor: quoteActorEnum().notNull(),
    actorUserId: text().references(() => users.id, { onDelete: "set null" }),
    /** a decline's or a withdrawal's reason */
    reason: text(),
    createdAt: createdAtColumn(),
  },
  (t) => [
    index("quote_moves_shop_quote_idx").on(t.shopId, t.quoteId, t.createdAt),
    uniqueIndex("quote_moves_shop_quote_accepted_uq")
      .on(t.shopId, t.quoteId)
      .where(sql`${t.toStatus} = 'accepted'`),
    uniqueIndex("quote_moves_shop_quote_rev_to_uq").on(t.shopId, t.quoteId, t.revision, t.toStatus),
  ],
);

/** A quote's thread between its customer and the shop's staff, append-only; each message is e-mailed to the other side once. */
export const quoteMessages = pgTable(
  "quote_messages",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    quoteId: uuid()
      .notNull()
      .references(() => quotes.id, { onDelete: "cascade" }),
    /** the revision the customer was looking at, or the one the shop issued with it */
    revision: integer().notNull(),
    authorUserId: text().references(() => users.id, { onDelete: "set null" }),
    /** which side wrote it: the customer, or the shop's staff */
    side: text({ enum: ["customer", "shop"] }).notNull(),
    kind: quoteMessageKindEnum().notNull(),
    body: text().notNull(),
    createdAt: createdAtColumn(),
  },
  (t) => [index("quote_messages_shop_quote_idx").on(t.shopId, t.quoteId, t.createdAt)],
);

/**
 * The estimator's work in progress on a request (a new quote, or the next revision of its quote):
 * saved as they go, replaced on each save (a version guards against two tabs), gone when issued.
 */
export const quoteDrafts = pgTable(
  "quote_drafts",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    requestId: uuid()
      .notNull()
      .references(() => bankRequests.id, { onDelete: "cascade" }),
    body: jsonb().$type<WorkbenchDraft>().notNull(),
    version: integer().notNull().default(1),
    updatedByUserId: text().references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAtColumn(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("quote_drafts_shop_request_uq").on(t.shopId, t.requestId)],
);

export type QuoteMoveRow = typeof quoteMoves.$inferSelect;
export type QuoteMessageRow = typeof quoteMessages.$inferSelect;
export type QuoteDraftRow = typeof quoteDrafts.$inferSelect;
