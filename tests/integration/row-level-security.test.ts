/**
 * Row-level security (drizzle/0009_row-level-security.sql, db/tx.ts): the database itself keeps
 * shops apart. The app's queries run as a role without BYPASSRLS that owns no table; inside
 * withShop(A) a query that forgot its `where shop_id` sees, changes and writes only shop A's rows,
 * and outside any withShop a tenant table refuses to answer at all.
 */
import { getTableColumns, getTableName, is, sql } from "drizzle-orm";
import { PgTable } from "drizzle-orm/pg-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { createDb } from "@/db/client";
import * as schema from "@/db/schema";
import { bankRequests, catalogCells, emailOutbox, members, quotes } from "@/db/schema";
import { listShopsOfUser } from "@/db/queries/members";
import { listPublicShops } from "@/db/queries/shops";
import { listWaitingOutboxIds } from "@/db/queries/outbox";
import { listQuotesPastValidity } from "@/db/queries/quote-life";
import { findPaymentByIntent } from "@/db/queries/payments";
import { listDueDeliveries } from "@/db/queries/webhooks";
import { withShop, withUser } from "@/db/tx";
import { env } from "@/lib/env";
import { createQuote, createShop, MARLOW_REQUIREMENT, type TestShop } from "./fixtures";
import { ownerDb } from "./owner-db";

/** Every table with a shop_id column, by its SQL name. */
const TENANT_TABLES = (Object.values(schema) as unknown[])
  .filter((t): t is PgTable => is(t, PgTable) && "shopId" in getTableColumns(t))
  .map((t) => getTableName(t));

const databaseError = (error: unknown) => {
  let e = error as { code?: string; message?: string; cause?: unknown } | undefined;
  for (let i = 0; i < 4 && e; i++) {
    if (typeof e.code === "string") return { code: e.code, message: e.message ?? "" };
    e = e.cause as typeof e;
  }
  return { code: "", message: String(error) };
};

let A: TestShop;
let B: TestShop;
let bQuote = "";

beforeAll(async () => {
  A = await createShop("kestrel");
  B = await createShop("marlow");
  await createQuote(A, A.customers[0]);
  bQuote = await createQuote(B, B.customers[0], MARLOW_REQUIREMENT);
});

describe("a query that forgets its where shop_id", () => {
  it("sees only the scoped shop's rows in every tenant table, though the other shop has rows there", async () => {
    expect(TENANT_TABLES.length).toBeGreaterThanOrEqual(10);
    for (const table of TENANT_TABLES) {
      const all = await ownerDb.execute<{ shop_id: string }>(sql`select distinct shop_id from ${sql.identifier(table)}`);
      const seen = await withShop(A.id, async (tx) => (await tx.execute<{ shop_id: string }>(sql`select distinct shop_id from ${sql.identifier(table)}`)).rows);
      expect(
        seen.every((r) => r.shop_id === A.id),
        table,
      ).toBe(true);
      // B's rows exist (where B has any) and stayed out of sight
      if (all.rows.some((r) => r.shop_id === B.id))
        expect(
          seen.some((r) => r.shop_id === B.id),
          table,
        ).toBe(false);
    }
    // the tables B certainly has rows in
    const bHas = await ownerDb.execute<{ n: number }>(sql`select count(*)::int as n from quotes where shop_id = ${B.id}`);
    expect(bHas.rows[0]?.n).toBe(1);
    const quotesSeenFromA = await withShop(A.id, (tx) => tx.select({ shopId: quotes.shopId }).from(quotes));
    expect(quotesSeenFromA.map((q) => q.shopId)).toEqual([A.id]);
  });

  it("changes and deletes only the scoped shop's rows, and cannot write a row into another shop", async () => {
    const stockOfB = async () => (await ownerDb.execute<{ s: number }>(sql`select sum(stock)::int as s from catalog_cells where shop_id = ${B.id}`)).rows[0]?.s;
    const before = await stockOfB();
    const changed = await withShop(A.id, (tx) => tx.update(catalogCells).set({ stock: 12345 }).returning({ shopId: catalogCells.shopId }));
    expect(new Set(changed.map((c) => c.shopId))).toEqual(new Set([A.id]));
    expect(await stockOfB()).toBe(before);
    const deleted = await withShop(A.id, (tx) => tx.delete(emailOutbox).returning({ shopId: emailOutbox.shopId }));
    expect(deleted.every((d) => d.shopId === A.id)).toBe(true);
    expect((await ownerDb.execute<{ n: number }>(sql`select count(*)::int as n from email_outbox where shop_id = ${B.id}`)).rows[0]?.n).toBe(1);
    const intoB = withShop(A.id, (tx) =>
      tx.insert(bankRequests).values({
        shopId: B.id,
        customerUserId: B.customers[0].id,
        status: "needs-review",
        requirement: { maxVoltage: 10, capacitance: 1 },
        chosenOption: null,
      }),
    );
    await expect(intoB.catch((e: unknown) => Promise.reject(databaseError(e)))).rejects.toMatchObject({
      message: expect.stringMatching(/row-level security/),
    });
  });

  it("outside any withShop, fails loudly instead of answering", async () => {
    for (const table of TENANT_TABLES) {
      const r = await db.execute(sql`select shop_id from ${sql.identifier(table)} limit 1`).then(
        () => null,
        (e: unknown) => databaseError(e),
      );
      // a table with no row at all has nothing to check; every tenant table here has rows
      expect(r, table).toMatchObject({ code: "42501", message: expect.stringMatching(/outside withShop/) });
    }
  });

  it("my shops: withUser sees one person's own memberships across shops, and nobody else's, and no shop's data", async () => {
    // A's manager also joins B as a customer
    await withShop(B.id, (tx) => tx.insert(members).values({ id: crypto.randomUUID(), shopId: B.id, userId: A.manager.id, role: "customer" }));
    const mine = await listShopsOfUser(A.manager.id);
    expect(mine.map((s) => [s.slug, s.role]).sort()).toEqual(
      [
        [A.slug, "manager"],
        [B.slug, "customer"],
      ].sort(),
    );
    const visible = await withUser(A.manager.id, (tx) => tx.select({ userId: members.userId }).from(members));
    expect(new Set(visible.map((m) => m.userId))).toEqual(new Set([A.manager.id]));
    expect(await withUser(A.manager.id, (tx) => tx.select({ id: quotes.id }).from(quotes))).toEqual([]);
  });

  it("the cross-shop functions hand out only what their one caller needs", async () => {
    const shops = await listPublicShops();
    expect(shops.map((s) => s.slug)).toEqual(expect.arrayContaining([A.slug, B.slug]));
    expect(Object.keys(shops[0] ?? {}).sort()).toEqual(["currency", "name", "slug", "tagline"]);
    const waiting = await listWaitingOutboxIds();
    expect(waiting.some((w) => w.shopId === B.id)).toBe(true);
    expect(Object.keys(waiting[0] ?? {}).sort()).toEqual(["id", "shopId"]);
    // the webhook worker's and the payment webhook's lookups: callable by the app's role, ids only
    const due = await listDueDeliveries(5);
    expect(due.every((d) => Object.keys(d).sort().join() === "id,shopId")).toBe(true);
    expect(await findPaymentByIntent("pi_nobody_has_this")).toBeNull();
    // the quote expiry's lookup: every sent quote is past a far-off day, in every shop, as shop and number only
    const past = await listQuotesPastValidity("9999-12-31", 5000);
    expect(past).toContainEqual({ shopId: B.id, number: bQuote });
    expect(past.every((q) => Object.keys(q).sort().join() === "number,shopId")).toBe(true);
  });
});

describe("the app's role cannot step around the policies", () => {
  const app = createDb(env.DATABASE_URL, 1);
  afterAll(() => app.pool.end());
  const attempt = (statement: string) =>
    app.db.execute(sql.raw(statement)).then(
      () => "allowed",
      (e: unknown) => databaseError(e).message,
    );

  it("has no BYPASSRLS, is no superuser and owns no table", async () => {
    const [role] = (
      await app.db.execute<{ rolsuper: boolean; rolbypassrls: boolean; owned: number }>(
        sql`select rolsuper, rolbypassrls, (select count(*)::int from pg_tables where schemaname = 'public' and tableowner = current_user) as owned from pg_roles where rolname = current_user`,
      )
    ).rows;
    expect(role).toEqual({ rolsuper: false, rolbypassrls: false, owned: 0 });
  });

  it("every tenant table has its policy enabled and forced (a new tenant table needs enable_shop_isolation)", async () => {
    const rows = await ownerDb.execute<{ relname: string; relrowsecurity: boolean; relforcerowsecurity: boolean; policies: number }>(
      sql`select c.relname, c.relrowsecurity, c.relforcerowsecurity,
            (select count(*)::int from pg_policy p where p.polrelid = c.oid and p.polname = 'shop_isolation') as policies
          from pg_class c join pg_namespace n on n.oid = c.relnamespace
          where n.nspname = 'public' and c.relkind = 'r'
            and exists (select 1 from pg_attribute a where a.attrelid = c.oid and a.attname = 'shop_id' and not a.attisdropped)`,
    );
    expect(rows.rows.map((r) => r.relname).sort()).toEqual([...TENANT_TABLES].sort());
    for (const r of rows.rows) expect(r, r.relname).toMatchObject({ relrowsecurity: true, relforcerowsecurity: true, policies: 1 });
  });

  it.each([
    ["turn row security off for its session", "set row_security = off; select * from quotes", /row-level security/],
    ["disable the policy", "alter table quotes disable row level security", /must be owner/],
    ["drop the policy", "drop policy shop_isolation on quotes", /must be owner/],
    ["become the owner", "set role faradsmith", /permission denied/],
    ["empty a tenant table", "truncate quotes", /permission denied/],
    ["grant itself bypass", "alter role current_user bypassrls", /must be superuser/],
    ["re-create a table's policy", "select enable_shop_isolation('quotes')", /permission denied for function/],
    ["change the policy's function", "create or replace function app_shop_id() returns text language sql as $$ select null::text $$", /permission denied/],
  ])("cannot %s", async (_what, statement, refusal) => {
    expect(await attempt(statement)).toMatch(refusal);
  });
});
