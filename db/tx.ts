import "server-only";
import { sql } from "drizzle-orm";
import type { Db } from "./client";
import { db } from "./index";

/**
 * A transaction handle from `db.transaction(async (tx) => …)`. Query functions that must join the
 * caller's transaction (a quote with its revision, lines, counter and outbox row) take it first.
 */
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/** Where a query may run: inside a transaction, or on the client itself. */
export type Executor = Tx | Db;

/**
 * Runs `fn` in one transaction on the app's client: the db/queries writes it calls with `tx`
 * commit together or not at all. lib/ opens transactions only through this.
 */
export function inTransaction<T>(fn: (tx: Tx) => Promise<T>): Promise<T> {
  return db.transaction(fn);
}

/**
 * Runs `fn` in one transaction scoped to one shop: `app.shop_id` is set for the transaction (and
 * only for it), which the row-level security policies on tenant tables read, so a query that forgot
 * its `where shop_id` still sees nothing of another shop. Tenant reads and writes in db/queries run
 * through it; functions that take a caller's `tx` rely on the caller having opened it this way.
 */
export function withShop<T>(shopId: string, fn: (tx: Tx) => Promise<T>): Promise<T> {
  return db.transaction(async (tx) => {
    await tx.execute(sql`select set_config('app.shop_id', ${shopId}, true)`);
    return fn(tx);
  });
}

/** Whether PostgreSQL refused a write for a unique constraint (SQLSTATE 23505), however the driver wrapped it. */
export function isUniqueViolation(error: unknown): boolean {
  let e: unknown = error;
  for (let i = 0; i < 4 && e && typeof e === "object"; i++) {
    if ((e as { code?: unknown }).code === "23505") return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}
