import { index, jsonb, pgTable, text, uuid } from "drizzle-orm/pg-core";
import { SHOP_EVENT_TYPES } from "../../lib/vocabulary";
import { users } from "./auth";
import { shopColumn, createdAtColumn } from "./columns";

/** One changed field of an audited record: what it was and what it became. */
export type AuditChange = { from: unknown; to: unknown };

/**
 * Who changed what in a shop, and when: one row per staff mutation (roles, catalog, prices,
 * quotes, orders, keys, settings). Written in the same transaction as the change it records
 * (db/queries/audit.ts); rows are never updated or deleted.
 */
export const auditEvents = pgTable(
  "audit_events",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    /** the signed-in person, or null when an API key or the system acted */
    actorUserId: text().references(() => users.id, { onDelete: "set null" }),
    /** the API key that acted, when one did (its id, never its secret) */
    actorKeyId: text(),
    /** what was done, as `<subject>.<verb>`: `catalog-cell.update`, `pricing-rules.save`, `member.role` */
    action: text().notNull(),
    subjectType: text().notNull(),
    subjectId: text(),
    /** one line a manager reads: "Unit cost of KBW-3000 from 41.20 to 39.80" */
    summary: text().notNull(),
    changes: jsonb().$type<Record<string, AuditChange>>(),
    createdAt: createdAtColumn(),
  },
  (t) => [index("audit_events_shop_created_idx").on(t.shopId, t.createdAt), index("audit_events_shop_subject_idx").on(t.shopId, t.subjectType, t.subjectId)],
);

export type AuditEventRow = typeof auditEvents.$inferSelect;

/**
 * Things that happened in a shop that its own systems may want to hear of (quote issued and
 * accepted, order moved, payment refunded, catalog imported): written in the same transaction as
 * their cause, with a stable id a receiver dedupes on; delivered to the shop's registered
 * endpoints as signed outbound webhooks.
 */
export const shopEvents = pgTable(
  "shop_events",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    type: text({ enum: SHOP_EVENT_TYPES }).notNull(),
    payload: jsonb().$type<Record<string, unknown>>().notNull(),
    createdAt: createdAtColumn(),
  },
  (t) => [index("shop_events_shop_created_idx").on(t.shopId, t.createdAt)],
);

export type ShopEventRow = typeof shopEvents.$inferSelect;
