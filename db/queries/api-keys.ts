import "server-only";
import { and, asc, count, eq, isNull, sql } from "drizzle-orm";
import { apiKeys, users, type ApiKeyRow } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";
import type { ApiKeyScope } from "@/lib/auth/api-key-scopes";
import type { ApiKeyListQuery } from "@/lib/validation/lists";
import { containsText, readPage, sortedBy, type Page } from "./paging";

/** A shop's API keys: made, listed, found by the hash of a presented secret, touched on use, revoked. */

export interface NewApiKey {
  name: string;
  prefix: string;
  secretHash: string;
  scopes: ApiKeyScope[];
  createdByUserId: string;
}

export async function insertApiKey(tx: Tx, shopId: string, k: NewApiKey): Promise<ApiKeyRow> {
  const [row] = await tx
    .insert(apiKeys)
    .values({ shopId, ...k })
    .returning();
  if (!row) throw new Error("api key insert returned no row");
  return row;
}

/** The key of this shop whose secret hashes to `secretHash`, with its creator; null when none. */
export async function findApiKey(shopId: string, secretHash: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({ key: apiKeys, creatorName: users.name, creatorEmail: users.email })
      .from(apiKeys)
      .leftJoin(users, eq(users.id, apiKeys.createdByUserId))
      .where(and(eq(apiKeys.shopId, shopId), eq(apiKeys.secretHash, secretHash)))
      .limit(1);
    return row ?? null;
  });
}

/** Marks a key as used now. */
export async function touchApiKey(tx: Tx, shopId: string, keyId: string): Promise<void> {
  await tx
    .update(apiKeys)
    .set({ lastUsedAt: sql`now()` })
    .where(and(eq(apiKeys.shopId, shopId), eq(apiKeys.id, keyId)));
}

/** Revokes a live key of the shop; the revoked row, or null when there is no such live key. */
export async function revokeApiKeyRow(tx: Tx, shopId: string, keyId: string, byUserId: string): Promise<ApiKeyRow | null> {
  const [row] = await tx
    .update(apiKeys)
    .set({ revokedAt: sql`now()`, revokedByUserId: byUserId })
    .where(and(eq(apiKeys.shopId, shopId), eq(apiKeys.id, keyId), isNull(apiKeys.revokedAt)))
    .returning();
  return row ?? null;
}

export interface ApiKeyListRow {
  id: string;
  name: string;
  prefix: string;
  scopes: ApiKeyScope[];
  createdAt: Date;
  createdByName: string | null;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
}

const KEY_SORTS = {
  name: apiKeys.name,
  created: apiKeys.createdAt,
  used: apiKeys.lastUsedAt,
  // live keys first
  status: sql`(${apiKeys.revokedAt} is not null)`,
};

/** A page of the shop's keys (never their hashes), filtered by status and name. */
export async function listApiKeys(shopId: string, q: ApiKeyListQuery): Promise<Page<ApiKeyListRow>> {
  return withShop(shopId, (tx) => {
    const where = and(
      eq(apiKeys.shopId, shopId),
      q.status === "all" ? undefined : q.status === "live" ? isNull(apiKeys.revokedAt) : sql`${apiKeys.revokedAt} is not null`,
      containsText(q.q, apiKeys.name, apiKeys.prefix),
    );
    return readPage(
      q,
      () => tx.select({ n: count() }).from(apiKeys).where(where),
      (limit, offset) =>
        tx
          .select({
            id: apiKeys.id,
            name: apiKeys.name,
            prefix: apiKeys.prefix,
            scopes: apiKeys.scopes,
            createdAt: apiKeys.createdAt,
            createdByName: users.name,
            lastUsedAt: apiKeys.lastUsedAt,
            revokedAt: apiKeys.revokedAt,
          })
          .from(apiKeys)
          .leftJoin(users, eq(users.id, apiKeys.createdByUserId))
          .where(where)
          .orderBy(...sortedBy(KEY_SORTS, q, asc(apiKeys.name), asc(apiKeys.id)))
          .limit(limit)
          .offset(offset),
    );
  });
}
