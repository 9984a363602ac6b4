import path from "node:path";
import { sql } from "drizzle-orm";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { afterAll, describe, expect, it } from "vitest";
import { createDb } from "@/db/client";
import { adminStatement } from "./helpers";

// the tables' owner creates and migrates databases
const base = new URL(process.env.MIGRATION_DATABASE_URL!);
const scratch = `faradsmith_migrate_${process.pid}`;

describe("migrations", () => {
  afterAll(async () => {
    await adminStatement(`DROP DATABASE IF EXISTS "${scratch}" WITH (FORCE)`);
  });

  it("apply to an empty database, twice without harm, and every tenant table leads its indexes with shop_id", async () => {
    await adminStatement(`CREATE DATABASE "${scratch}"`);
    const url = new URL(base);
    url.pathname = `/${scratch}`;
    const { db, pool } = createDb(url.toString(), 1);
    try {
      await migrate(db, { migrationsFolder: path.resolve("drizzle") });
      await migrate(db, { migrationsFolder: path.resolve("drizzle") });
      const tables = await db.execute<{ table_name: string }>(sql`select table_name from information_schema.tables where table_schema = 'public' order by 1`);
      const names = tables.rows.map((r) => r.table_name);
      for (const t of [
        "users",
        "sessions",
        "accounts",
        "verifications",
        "shops",
        "members",
        "invitations",
        "shop_settings",
        "catalog_cells",
        "catalog_components",
      ]) {
        expect(names).toContain(t);
      }
      // Every table with a shop_id column: shop_id is NOT NULL and every index on it starts with it.
      const tenant = await db.execute<{ table_name: string; is_nullable: string }>(
        sql`select table_name, is_nullable from information_schema.columns where table_schema = 'public' and column_name = 'shop_id'`,
      );
      expect(tenant.rows.length).toBeGreaterThanOrEqual(5);
      for (const row of tenant.rows) expect(row.is_nullable, row.table_name).toBe("NO");
      const indexes = await db.execute<{ tablename: string; indexname: string; indexdef: string }>(
        sql`select tablename, indexname, indexdef from pg_indexes where schemaname = 'public'`,
      );
      for (const { table_name } of tenant.rows) {
        const own = indexes.rows.filter((i) => i.tablename === table_name && !i.indexname.endsWith("_pkey"));
        for (const i of own) expect(i.indexdef, i.indexname).toMatch(/\(shop_id[,)]/);
      }
    } finally {
      await pool.end();
    }
  });
});
