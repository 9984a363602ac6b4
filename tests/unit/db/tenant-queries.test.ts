/**
 * A static check beside row-level security: in db/queries, a statement run on the app's bare client
 * (`db.select…`, `db.execute…`) never names a tenant table (one with a shop_id column). Such a query
 * runs outside withShop, where the database refuses tenant tables; this finds it before any test
 * has to exercise it. Statements on a caller's `tx` or inside `withShop(shopId, (tx) => …)` pass.
 */
import fs from "node:fs";
import path from "node:path";
import { getTableColumns, getTableName, is } from "drizzle-orm";
import { PgTable } from "drizzle-orm/pg-core";
import { describe, expect, it } from "vitest";
import * as schema from "@/db/schema";

const tenantTables = Object.entries(schema).filter(([, t]) => is(t, PgTable) && "shopId" in getTableColumns(t as PgTable)) as [string, PgTable][];
/** What a statement may call a tenant table: its export in db/schema, or its SQL name in raw SQL. */
const tenantNames = tenantTables.flatMap(([exportName, t]) => [exportName, getTableName(t)]);

/** Each statement on the bare client: from `db.` to the end of its expression statement. */
function bareClientStatements(source: string): string[] {
  const code = source.replace(/\/\*[\s\S]*?\*\//g, "").replace(/\/\/[^\n]*/g, "");
  const found: string[] = [];
  const start = /(?<![\w.])db\s*\.\s*(select|insert|update|delete|execute|query|transaction)\b/g;
  for (let m = start.exec(code); m; m = start.exec(code)) {
    let depth = 0;
    let end = m.index;
    for (; end < code.length; end++) {
      const ch = code[end];
      if (ch === "(" || ch === "{" || ch === "[") depth++;
      else if (ch === ")" || ch === "}" || ch === "]") {
        if (depth === 0) break;
        depth--;
      } else if (ch === ";" && depth === 0) break;
    }
    found.push(code.slice(m.index, end));
  }
  return found;
}

function tenantTablesNamed(statement: string): string[] {
  return [...new Set(tenantNames.filter((name) => new RegExp(`(?<![\\w$])${name}(?![\\w$])`).test(statement)))];
}

describe("db/queries: tenant tables only inside withShop", () => {
  it("knows the tenant tables from the schema", () => {
    expect(tenantTables.map(([name]) => name)).toEqual(expect.arrayContaining(["quotes", "members", "catalogCells", "emailOutbox", "auditEvents"]));
    expect(tenantTables.map(([name]) => name)).not.toContain("users");
  });

  it("finds a bare-client statement that names one, and lets tx and withShop pass", () => {
    const bad = `export async function f(shopId: string) {\n  return db.select().from(quotes).where(eq(quotes.number, "1"));\n}`;
    const raw = "const r = await db.execute(sql`select * from email_outbox where status = ${s}`);";
    const fine = `export async function g(shopId: string) {\n  await db.select().from(users);\n  return withShop(shopId, (tx) => tx.select().from(quotes));\n}`;
    expect(bareClientStatements(bad).flatMap(tenantTablesNamed)).toEqual(["quotes"]);
    expect(bareClientStatements(raw).flatMap(tenantTablesNamed)).toEqual(["email_outbox"]);
    expect(bareClientStatements(fine).flatMap(tenantTablesNamed)).toEqual([]);
  });

  const dir = path.resolve("db/queries");
  it.each(fs.readdirSync(dir).filter((f) => f.endsWith(".ts")))("%s", (file) => {
    const offending = bareClientStatements(fs.readFileSync(path.join(dir, file), "utf8"))
      .map((statement) => ({ statement: statement.replace(/\s+/g, " ").slice(0, 120), tables: tenantTablesNamed(statement) }))
      .filter((s) => s.tables.length > 0);
    expect(offending, "run these inside withShop(shopId, (tx) => …) (db/tx.ts)").toEqual([]);
  });
});
