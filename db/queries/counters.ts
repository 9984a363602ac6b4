import "server-only";
import { sql } from "drizzle-orm";
import { shopCounters } from "@/db/schema";
import type { Tx } from "@/db/tx";

/**
 * The next number of a kind ("quote", later "order") in a shop and year, from 1. The upsert
 * row-locks the counter until the caller's transaction ends, so numbers are gap-free and unique
 * however many requests race; a rolled-back transaction gives its number back.
 */
export async function nextShopNumber(tx: Tx, shopId: string, kind: string, year: number): Promise<number> {
  const [row] = await tx
    .insert(shopCounters)
    .values({ shopId, kind, year, value: 1 })
    .onConflictDoUpdate({ target: [shopCounters.shopId, shopCounters.kind, shopCounters.year], set: { value: sql`${sql.raw('"shop_counters"."value"')} + 1` } })
    .returning({ value: shopCounters.value });
  if (!row) throw new Error("counter upsert returned no row");
  return row.value;
}
