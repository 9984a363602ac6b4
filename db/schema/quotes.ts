import { date, index, integer, jsonb, numeric, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { Requirement } from "@/lib/bank/types";
import type { PriceSheet } from "@/lib/pricing/price-sheet";
import type { BankPrice } from "@/lib/pricing/types";
import type { ChosenRecord, FrozenCell, PricedOption, RevisionDesign } from "@/lib/quoting/types";
import { QUOTE_STATUSES, REQUEST_STATUSES } from "../../lib/vocabulary";
import { users } from "./auth";
import { shopColumn, createdAtColumn, updatedAtColumn } from "./columns";

export const requestStatusEnum = pgEnum("request_status", REQUEST_STATUSES);
export const quoteStatusEnum = pgEnum("quote_status", QUOTE_STATUSES);
export const priceLineKindEnum = pgEnum("price_line_kind", ["material", "labour", "overhead"]);

/** What a customer asked for (DESIGN.md §3.2), kept with what the engine and the shop did with it. */
export const bankRequests = pgTable(
  "bank_requests",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    customerUserId: text()
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    status: requestStatusEnum().notNull(),
    requirement: jsonb().$type<Requirement>().notNull(),
    notes: text().notNull().default(""),
    /** why the request went to the estimators instead of being auto-quoted */
    reviewReasons: jsonb().$type<string[]>().notNull().default([]),
    /** the option the customer chose, as the server priced it (or its identity when no longer offered) */
    chosenOption: jsonb().$type<ChosenRecord>(),
    /** the client's token for one submit: a double submit finds the same request */
    idempotencyKey: text(),
    createdAt: createdAtColumn(),
    updatedAt: updatedAtColumn(),
  },
  (t) => [
    index("bank_requests_shop_status_idx").on(t.shopId, t.status, t.createdAt),
    index("bank_requests_shop_customer_idx").on(t.shopId, t.customerUserId),
    uniqueIndex("bank_requests_shop_idempotency_uq").on(t.shopId, t.idempotencyKey),
  ],
);

/** Drawings and specifications uploaded with a request; the bytes live outside public/ (UPLOAD_DIR). */
export const requestAttachments = pgTable(
  "request_attachments",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    uploadedByUserId: text()
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    requestId: uuid().references(() => bankRequests.id, { onDelete: "set null" }),
    fileName: text().notNull(),
    contentType: text().notNull(),
    sizeBytes: integer().notNull(),
    sha256: text().notNull(),
    storageKey: text().notNull(),
    createdAt: createdAtColumn(),
  },
  (t) => [
    index("request_attachments_shop_request_idx").on(t.shopId, t.requestId),
    index("request_attachments_shop_uploader_idx").on(t.shopId, t.uploadedByUserId),
  ],
);

/** A quote, numbered per shop (Q-2026-0001); its figures live in immutable revisions. */
export const quotes = pgTable(
  "quotes",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    requestId: uuid()
      .notNull()
      .references(() => bankRequests.id, { onDelete: "restrict" }),
    customerUserId: text()
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    number: text().notNull(),
    /** the latest revision's state (lib/quoting/quote-states.ts); each revision's own is in quote_moves */
    status: quoteStatusEnum().notNull().default("sent"),
    currentRevision: integer().notNull().default(1),
    /** the customer asked for a change that no revision has answered yet */
    changeRequestedAt: timestamp({ withTimezone: true }),
    /** the client's token for one choice: a double submit finds the same quote */
    idempotencyKey: text().notNull(),
    createdAt: createdAtColumn(),
    updatedAt: updatedAtColumn(),
  },
  (t) => [
    uniqueIndex("quotes_shop_number_uq").on(t.shopId, t.number),
    uniqueIndex("quotes_shop_idempotency_uq").on(t.shopId, t.idempotencyKey),
    index("quotes_shop_customer_idx").on(t.shopId, t.customerUserId, t.createdAt),
    index("quotes_shop_created_idx").on(t.shopId, t.createdAt),
  ],
);

/**
 * One frozen revision: arrangement, cell figures, requirement and every price. Never updated (a
 * trigger refuses it); its state moves are rows in quote_moves.
 */
export const quoteRevisions = pgTable(
  "quote_revisions",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    quoteId: uuid()
      .notNull()
      .references(() => quotes.id, { onDelete: "cascade" }),
    revision: integer().notNull(),
    requirement: jsonb().$type<Requirement>().notNull(),
    /** the arrangement option as the search priced it (lib/quoting/types.ts PricedOption) */
    arrangement: jsonb().$type<PricedOption>().notNull(),
    /** the cell's catalog data at the time of the quote */
    cell: jsonb().$type<FrozenCell>().notNull(),
    /** the full price build-up of the bank (lib/pricing BankPrice): staff only */
    pricing: jsonb().$type<BankPrice>().notNull(),
    /**
     * the sell prices the customer sees: the bank line, added lines, discount, tax and total
     * (lib/pricing/price-sheet.ts); null on revisions frozen before it was kept (revisionSheet derives it)
     */
    sheet: jsonb().$type<PriceSheet>(),
    /** how the bank was arrived at, with the estimator's overrides or custom tree; null: the customer's own choice */
    design: jsonb().$type<RevisionDesign>(),
    /** the shop's note to the customer with this revision (what changed and why) */
    note: text().notNull().default(""),
    currency: text().notNull(),
    quantity: integer().notNull(),
    subtotal: numeric({ precision: 16, scale: 4 }).notNull(),
    tax: numeric({ precision: 16, scale: 4 }).notNull(),
    total: numeric({ precision: 16, scale: 4 }).notNull(),
    validUntil: date().notNull(),
    createdByUserId: text().references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAtColumn(),
  },
  (t) => [uniqueIndex("quote_revisions_shop_quote_rev_uq").on(t.shopId, t.quoteId, t.revision)],
);

export const quoteLines = pgTable(
  "quote_lines",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    revisionId: uuid()
      .notNull()
      .references(() => quoteRevisions.id, { onDelete: "cascade" }),
    position: integer().notNull(),
    code: text().notNull(),
    kind: priceLineKindEnum().notNull(),
    description: text().notNull(),
    quantity: numeric({ precision: 16, scale: 4 }).notNull(),
    unit: text().notNull(),
    unitPrice: numeric({ precision: 16, scale: 4 }).notNull(),
    amount: numeric({ precision: 16, scale: 4 }).notNull(),
  },
  (t) => [uniqueIndex("quote_lines_shop_revision_pos_uq").on(t.shopId, t.revisionId, t.position)],
);

/** Per-shop, per-year counters for document numbers (Q-2026-0001, O-2026-0001). */
export const shopCounters = pgTable(
  "shop_counters",
  {
    shopId: shopColumn(),
    kind: text().notNull(),
    year: integer().notNull(),
    value: integer().notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.kind, t.year] })],
);

export type BankRequestRow = typeof bankRequests.$inferSelect;
export type QuoteRow = typeof quotes.$inferSelect;
export type QuoteRevisionRow = typeof quoteRevisions.$inferSelect;
export type QuoteLineRow = typeof quoteLines.$inferSelect;
