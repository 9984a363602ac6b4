import { index, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { ApiKeyScope } from "@/lib/auth/api-key-scopes";
import { users } from "./auth";
import { shopColumn, createdAtColumn } from "./columns";

/**
 * A shop's API keys for its own systems (ERP, stock): named, scoped, revocable. Only a SHA-256 of
 * the secret is stored (the secret is shown once, when the key is made); the prefix is kept to tell
 * keys apart in lists and logs. A revoked key stays for the audit log and never works again.
 */
export const apiKeys = pgTable(
  "api_keys",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    name: text().notNull(),
    /** the first characters of the secret, e.g. "fsk_3kQ9x": safe to show */
    prefix: text().notNull(),
    /** hex SHA-256 of the whole secret */
    secretHash: text().notNull(),
    scopes: jsonb().$type<ApiKeyScope[]>().notNull(),
    createdByUserId: text().references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAtColumn(),
    lastUsedAt: timestamp({ withTimezone: true }),
    revokedAt: timestamp({ withTimezone: true }),
    revokedByUserId: text().references(() => users.id, { onDelete: "set null" }),
  },
  (t) => [uniqueIndex("api_keys_shop_secret_hash_uq").on(t.shopId, t.secretHash), index("api_keys_shop_created_idx").on(t.shopId, t.createdAt)],
);

export type ApiKeyRow = typeof apiKeys.$inferSelect;
