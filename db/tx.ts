import "server-only";
import { AsyncLocalStorage } from "node:async_hooks";
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

/** The transaction `withShop` / `withUser` opened, while its callback runs. */
interface Scope {
  tx: Tx;
  shopId: string | null;
  userId: string | null;
  /** false once the callback has finished: work it left running must not use the transaction */
  open: boolean;
}

const scopes = new AsyncLocalStorage<Scope>();

function currentScope(): Scope | undefined {
  const scope = scopes.getStore();
  return scope?.open ? scope : undefined;
}

async function scoped<T>(settings: { shopId: string | null; userId: string | null }, fn: (tx: Tx) => Promise<T>): Promise<T> {
  return db.transaction(async (tx) => {
    await tx.execute(sql`select set_config('app.shop_id', ${settings.shopId ?? ""}, true), set_config('app.user_id', ${settings.userId ?? ""}, true)`);
    const scope: Scope = { tx, ...settings, open: true };
    try {
      return await scopes.run(scope, () => fn(tx));
    } finally {
      scope.open = false;
    }
  });
}

/**
 * Runs `fn` in one transaction on the app's client, with no shop: for tables that belong to no
 * shop (accounts, rate limits). Tenant tables refuse to be read or written in it.
 */
export function inTransaction<T>(fn: (tx: Tx) => Promise<T>): Promise<T> {
  return db.transaction(fn);
}

/**
 * Runs `fn` in one transaction scoped to one shop: `app.shop_id` is set for the transaction (and
 * only for it), which the row-level security policies on tenant tables read, so a query that forgot
 * its `where shop_id` still sees nothing of another shop, and a tenant query run outside any
 * `withShop` fails loudly (DEVELOPERS.md, "Row-level security").
 *
 * Called again for the same shop while `fn` runs (a query function calling another), it joins the
 * transaction already open instead of opening a second one: everything inside commits together.
 */
export function withShop<T>(shopId: string, fn: (tx: Tx) => Promise<T>): Promise<T> {
  const scope = currentScope();
  if (scope && scope.shopId === shopId) return fn(scope.tx);
  return scoped({ shopId, userId: null }, fn);
}

/**
 * Runs `fn` in one transaction that sees one person's own memberships across shops (`app.user_id`;
 * the `members` table's second policy) and no shop's data: the "my shops" list.
 */
export function withUser<T>(userId: string, fn: (tx: Tx) => Promise<T>): Promise<T> {
  const scope = currentScope();
  if (scope && scope.userId === userId && scope.shopId === null) return fn(scope.tx);
  return scoped({ shopId: null, userId }, fn);
}

/** The shop whose `withShop` transaction is running here, if any. */
export function currentShopId(): string | null {
  return currentScope()?.shopId ?? null;
}

/**
 * The app's client for better-auth's adapter: inside `withShop` / `withUser` it is that
 * transaction (so the organization plugin's reads and writes of `members` obey the same policies
 * and commit with our own writes), elsewhere the client itself.
 */
export const ambientDb: Db = new Proxy(db, {
  get(target, property) {
    const base = (currentScope()?.tx ?? target) as object;
    const value: unknown = Reflect.get(base, property);
    return typeof value === "function" ? value.bind(base) : value;
  },
});

/** Whether PostgreSQL refused a write for a unique constraint (SQLSTATE 23505), however the driver wrapped it. */
export function isUniqueViolation(error: unknown): boolean {
  let e: unknown = error;
  for (let i = 0; i < 4 && e && typeof e === "object"; i++) {
    if ((e as { code?: unknown }).code === "23505") return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}
