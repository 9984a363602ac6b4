import { sql } from "drizzle-orm";
import { boolean, index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { SHOP_EVENT_TYPES, WEBHOOK_DELIVERY_STATES, WEBHOOK_ENDPOINT_STATES, type ShopEventType } from "../../lib/vocabulary";
import { users } from "./auth";
import { shopEvents } from "./records";
import { shopColumn, createdAtColumn } from "./columns";

export const webhookEndpointStateEnum = pgEnum("webhook_endpoint_state", WEBHOOK_ENDPOINT_STATES);
export const webhookDeliveryStateEnum = pgEnum("webhook_delivery_state", WEBHOOK_DELIVERY_STATES);

/**
 * Where a shop's own systems hear of its events: an http(s) address, the events it takes, and its
 * signing secret, kept encrypted (AES-256-GCM under WEBHOOK_SECRET_KEY, lib/webhooks/secrets.ts)
 * because the server must sign with it; only its last four characters are readable here.
 */
export const webhookEndpoints = pgTable(
  "webhook_endpoints",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    url: text().notNull(),
    description: text().notNull().default(""),
    events: text({ enum: SHOP_EVENT_TYPES }).array().$type<ShopEventType[]>().notNull(),
    secretCiphertext: text().notNull(),
    secretHint: text().notNull(),
    state: webhookEndpointStateEnum().notNull().default("active"),
    /** since when every attempt has failed; null while the last one succeeded */
    failingSince: timestamp({ withTimezone: true }),
    disabledAt: timestamp({ withTimezone: true }),
    disabledReason: text(),
    createdByUserId: text().references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAtColumn(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("webhook_endpoints_shop_created_idx").on(t.shopId, t.createdAt)],
);

/**
 * One delivery of one shop event to one endpoint, through its attempts: written with the event
 * (db/queries/shop-events.ts), or by a replay. The log the desk shows per endpoint.
 */
export const webhookDeliveries = pgTable(
  "webhook_deliveries",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    endpointId: uuid()
      .notNull()
      .references(() => webhookEndpoints.id, { onDelete: "cascade" }),
    eventId: uuid()
      .notNull()
      .references(() => shopEvents.id, { onDelete: "cascade" }),
    eventType: text({ enum: SHOP_EVENT_TYPES }).notNull(),
    /** sent again from the log: the same event (and event id) once more */
    isReplay: boolean().notNull().default(false),
    state: webhookDeliveryStateEnum().notNull().default("waiting"),
    attempts: integer().notNull().default(0),
    lastStatusCode: integer(),
    lastDurationMs: integer(),
    lastError: text(),
    /** the start of the receiver's last answer, for the log */
    lastResponse: text(),
    /** when the next attempt is due; null once delivered, given up or cancelled */
    nextAttemptAt: timestamp({ withTimezone: true }),
    lastAttemptAt: timestamp({ withTimezone: true }),
    deliveredAt: timestamp({ withTimezone: true }),
    createdAt: createdAtColumn(),
    updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("webhook_deliveries_shop_endpoint_idx").on(t.shopId, t.endpointId, t.createdAt),
    // an event reaches an endpoint once from its cause; replays add rows of their own
    uniqueIndex("webhook_deliveries_first_uq")
      .on(t.shopId, t.endpointId, t.eventId)
      .where(sql`not ${t.isReplay}`),
    // what is due, for the dispatcher (db/queries/webhooks.ts listDueDeliveries)
    index("webhook_deliveries_due_idx")
      .on(t.shopId, t.nextAttemptAt)
      .where(sql`${t.state} in ('waiting', 'retrying')`),
  ],
);

export type WebhookEndpointRow = typeof webhookEndpoints.$inferSelect;
export type WebhookDeliveryRow = typeof webhookDeliveries.$inferSelect;
