/**
 * Quotes made before a quote had a life of moves keep their meaning through the migrations: an
 * "issued" quote is a sent one (and can still be accepted), accepted, expired and withdrawn ones
 * stay so, and each has the moves that led there. The database is migrated to just before the
 * change, filled as the app then wrote quotes, and migrated the rest of the way.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { sql } from "drizzle-orm";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { afterAll, describe, expect, it } from "vitest";
import { createDb } from "@/db/client";
import { adminStatement } from "./helpers";

// as the migration role (it owns the tables and reads across shops, as migrations do)
const base = new URL(process.env.MIGRATION_DATABASE_URL!);
const scratch = `faradsmith_quote_life_${process.pid}`;
/** the last migration before quotes had moves */
const BEFORE = "0007_catalog-keeping-pricing-versions-api-keys";

/** A copy of the migrations folder that ends at `last`. */
function migrationsUpTo(last: string): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-migrations-"));
  const journal = JSON.parse(fs.readFileSync(path.resolve("drizzle/meta/_journal.json"), "utf8")) as { entries: { tag: string }[] };
  const cut = journal.entries.findIndex((e) => e.tag === last);
  if (cut < 0) throw new Error(`no migration ${last}`);
  fs.mkdirSync(path.join(dir, "meta"));
  fs.writeFileSync(path.join(dir, "meta/_journal.json"), JSON.stringify({ ...journal, entries: journal.entries.slice(0, cut + 1) }));
  for (const e of journal.entries.slice(0, cut + 1)) fs.copyFileSync(path.resolve(`drizzle/${e.tag}.sql`), path.join(dir, `${e.tag}.sql`));
  return dir;
}

describe("the quote-life migrations", () => {
  afterAll(async () => {
    await adminStatement(`DROP DATABASE IF EXISTS "${scratch}" WITH (FORCE)`);
  });

  it("keep every existing quote's meaning and give it the moves that led to its state", async () => {
    await adminStatement(`CREATE DATABASE "${scratch}"`);
    const url = new URL(base);
    url.pathname = `/${scratch}`;
    const { db, pool } = createDb(url.toString(), 1);
    const partial = migrationsUpTo(BEFORE);
    try {
      await migrate(db, { migrationsFolder: partial });
      // rows as the app wrote them before: one quote per old status (invented shop and people)
      await db.execute(sql`insert into shops (id, name, slug) values ('s1', 'Old Shop', 'old-shop')`);
      await db.execute(sql`insert into users (id, name, email) values ('u1', 'Old Customer', 'old.customer@old-shop.example')`);
      for (const [i, status] of (["issued", "accepted", "expired", "withdrawn"] as const).entries()) {
        const requestId = `00000000-0000-4000-8000-00000000010${i}`;
        const quoteId = `00000000-0000-4000-8000-00000000020${i}`;
        await db.execute(
          sql`insert into bank_requests (id, shop_id, customer_user_id, status, requirement) values (${requestId}, 's1', 'u1', 'quoted', '{"maxVoltage":48,"capacitance":10}')`,
        );
        await db.execute(
          sql`insert into quotes (id, shop_id, request_id, customer_user_id, number, status, idempotency_key) values (${quoteId}, 's1', ${requestId}, 'u1', ${`Q-2026-000${i + 1}`}, ${status}, ${`key-${i}`})`,
        );
        await db.execute(sql`insert into quote_revisions (shop_id, quote_id, revision, requirement, arrangement, cell, pricing, currency, quantity, subtotal, tax, total, valid_until)
          values ('s1', ${quoteId}, 1, '{}', '{}', '{}', '{}', 'EUR', 1, '100', '20', '120', '2026-03-01')`);
      }
      await migrate(db, { migrationsFolder: path.resolve("drizzle") });

      const quotes = await db.execute<{ number: string; status: string }>(sql`select number, status::text from quotes order by number`);
      expect(quotes.rows.map((r) => [r.number, r.status])).toEqual([
        ["Q-2026-0001", "sent"],
        ["Q-2026-0002", "accepted"],
        ["Q-2026-0003", "expired"],
        ["Q-2026-0004", "withdrawn"],
      ]);
      const moves = await db.execute<{ number: string; moves: string }>(
        sql`select q.number, string_agg(coalesce(m.from_status::text, '∅') || '→' || m.to_status::text, ' ' order by m.from_status nulls first) as moves
            from quote_moves m join quotes q on q.id = m.quote_id group by q.number order by q.number`,
      );
      expect(moves.rows.map((r) => [r.number, r.moves])).toEqual([
        ["Q-2026-0001", "∅→sent"],
        ["Q-2026-0002", "∅→sent sent→accepted"],
        ["Q-2026-0003", "∅→sent sent→expired"],
        ["Q-2026-0004", "∅→sent sent→withdrawn"],
      ]);
      // and the old revisions are frozen from now on
      await expect(db.execute(sql`update quote_revisions set total = '1' where shop_id = 's1'`)).rejects.toMatchObject({
        cause: { message: expect.stringMatching(/frozen/) },
      });
    } finally {
      await pool.end();
      fs.rmSync(partial, { recursive: true, force: true });
    }
  });
});
