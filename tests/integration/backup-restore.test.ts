/**
 * `npm run db:backup` and `npm run db:restore`: a backup of the test database restores into a
 * fresh database with the same rows in every table, and a quote renders to the same PDF text
 * (pdftotext, poppler-utils) from either; restoring over a database that holds data is refused
 * without --force, and --into never reuses an existing database.
 */
import { execFileSync, spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { Client } from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { chooseArrangement, exploreArrangements } from "@/app/s/[shop]/actions";
import { getQuoteByNumber } from "@/db/queries/quotes";
import { demoPeople } from "@/db/seed/people";
import { env } from "@/lib/env";
import { EMPTY_REQUEST_FORM } from "@/lib/validation/request-form";
import { actAs, shopBySlug } from "./helpers";

const K = "kestrel-bank-works";
const restored = `faradsmith_restore_${process.pid}`;
const backupDir = fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-backups-"));
/** The database as the tables' owner (who backs up, restores and counts every shop's rows) or as the app's role. */
const urlOf = (database: string, as: "owner" | "app" = "owner") => {
  const u = new URL(as === "owner" ? (process.env.MIGRATION_DATABASE_URL ?? "") : env.DATABASE_URL);
  u.pathname = `/${database}`;
  return u.toString();
};
const current = new URL(env.DATABASE_URL).pathname.slice(1);

function run(script: string, args: string[], extraEnv: Record<string, string> = {}) {
  const r = spawnSync(process.execPath, [script, ...args], { encoding: "utf8", env: { ...process.env, BACKUP_DIR: backupDir, ...extraEnv }, timeout: 120_000 });
  return { status: r.status, output: `${r.stdout}${r.stderr}` };
}

/**
 * Rows per table of the app's own schemas (public, and drizzle's migration log), counted as the
 * tables' owner (it sees every shop's rows). The job queue's schema (pgboss) is not in backups.
 */
async function rowCounts(url: string): Promise<Record<string, number>> {
  const client = new Client({ connectionString: url });
  await client.connect();
  try {
    const tables = await client.query<{ schema: string; name: string }>(
      "SELECT table_schema AS schema, table_name AS name FROM information_schema.tables WHERE table_type = 'BASE TABLE' AND table_schema IN ('public', 'drizzle') ORDER BY 1, 2",
    );
    const counts: Record<string, number> = {};
    for (const t of tables.rows) {
      const r = await client.query<{ n: number }>(`SELECT count(*)::int AS n FROM "${t.schema}"."${t.name}"`);
      counts[`${t.schema}.${t.name}`] = r.rows[0]?.n ?? 0;
    }
    return counts;
  } finally {
    await client.end();
  }
}

async function admin(statement: string) {
  const client = new Client({ connectionString: urlOf("postgres") });
  await client.connect();
  try {
    await client.query(statement);
  } finally {
    await client.end();
  }
}

function pdfText(databaseUrl: string, shopId: string, revisionId: string): string {
  const out = path.join(backupDir, `quote-${Math.random().toString(36).slice(2)}.pdf`);
  // tests/support/tsconfig.render.json maps "server-only" to an empty module, as vitest does
  const r = spawnSync(
    path.resolve("node_modules/.bin/tsx"),
    ["--tsconfig", "tests/support/tsconfig.render.json", "tests/support/render-quote-pdf.ts", shopId, revisionId, out],
    {
      encoding: "utf8",
      env: { ...process.env, DATABASE_URL: databaseUrl, MAIL_WORKER: "off" },
      timeout: 120_000,
    },
  );
  if (r.status !== 0) throw new Error(`rendering failed: ${r.stdout}${r.stderr}`);
  return execFileSync("pdftotext", ["-layout", out, "-"], { encoding: "utf8" });
}

describe("backup and restore", () => {
  let backup = "";
  let shopId = "";
  let revisionId = "";

  beforeAll(async () => {
    // at least one quote to compare
    shopId = (await shopBySlug(K)).id;
    await actAs(null);
    const explored = await exploreArrangements(K, { ...EMPTY_REQUEST_FORM, maxVoltage: "48 V", minVoltage: "24 V", sizeFor: "energy", energy: "20 kJ" });
    if (!explored.ok) throw new Error("no arrangements");
    const o = explored.data.options[0]!;
    await actAs(demoPeople[K].customers[0].email);
    const chosen = await chooseArrangement(K, {
      idempotencyKey: crypto.randomUUID(),
      requirement: { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 1 },
      option: { cellSku: o.cell.sku, topology: o.topology, seriesCount: o.seriesCount, parallelCount: o.parallelCount },
    });
    if (!chosen.ok || chosen.data.kind !== "quote") throw new Error("no quote");
    revisionId = (await getQuoteByNumber(shopId, chosen.data.quoteNumber))!.revisionId;

    const r = run("scripts/db-backup.mjs", []);
    expect(r.status, r.output).toBe(0);
    const files = fs.readdirSync(backupDir).filter((f) => f.endsWith(".dump"));
    expect(files).toHaveLength(1);
    backup = path.join(backupDir, files[0]!);
  });

  afterAll(async () => {
    await admin(`DROP DATABASE IF EXISTS "${restored}" WITH (FORCE)`);
    fs.rmSync(backupDir, { recursive: true, force: true });
  });

  it("writes a timestamped custom-format dump that only its owner can read", () => {
    expect(path.basename(backup)).toMatch(/^faradsmith-faradsmith_test\w*-\d{4}-\d{2}-\d{2}T\d{2}-\d{2}-\d{2}-\d{3}Z\.dump$/);
    // pg_dump's custom format begins with the magic "PGDMP" (PostgreSQL docs, pg_dump; from memory)
    expect(fs.readFileSync(backup).subarray(0, 5).toString("latin1")).toBe("PGDMP");
    expect(fs.statSync(backup).mode & 0o777).toBe(0o600);
  });

  it("restores into a fresh database with the same rows in every table and the same quote PDF text", async () => {
    const r = run("scripts/db-restore.mjs", [backup, "--into", restored]);
    expect(r.status, r.output).toBe(0);
    const before = await rowCounts(urlOf(current));
    const after = await rowCounts(urlOf(restored));
    expect(Object.keys(after)).toEqual(Object.keys(before));
    for (const table of [
      "public.shops",
      "public.users",
      "public.members",
      "public.quotes",
      "public.quote_revisions",
      "public.quote_lines",
      "public.catalog_cells",
    ]) {
      expect(after[table], table).toBe(before[table]);
      expect(after[table], table).toBeGreaterThan(0);
    }
    expect(after).toEqual(before);
    // the restored database has a job queue of its own, owned by the app's role (backups leave the
    // queue out: waiting e-mails are queued again from the outbox when a server starts)
    const client = new Client({ connectionString: urlOf(restored) });
    await client.connect();
    const queue = await client.query<{ n: number }>("SELECT count(*)::int AS n FROM pg_tables WHERE schemaname = 'pgboss' AND tableowner = $1", [
      new URL(env.DATABASE_URL).username,
    ]);
    await client.end();
    expect(queue.rows[0]?.n).toBeGreaterThan(0);
    // both rendered by the app's code as the app's role: the restore gave that role its rights again
    const original = pdfText(env.DATABASE_URL, shopId, revisionId);
    expect(original.length).toBeGreaterThan(200);
    expect(pdfText(urlOf(restored, "app"), shopId, revisionId)).toBe(original);
  });

  it("refuses to restore over a database that holds data, and --into an existing one", async () => {
    const before = await rowCounts(urlOf(current));
    const over = run("scripts/db-restore.mjs", [backup]);
    expect(over.status).not.toBe(0);
    expect(over.output).toContain("--force");
    const again = run("scripts/db-restore.mjs", [backup, "--into", restored]);
    expect(again.status).not.toBe(0);
    expect(again.output).toContain("exists already");
    expect(await rowCounts(urlOf(current))).toEqual(before);
  });

  it("--force puts the backup in place of the configured database and keeps what it replaced aside", async () => {
    const name = `${restored}_b`;
    await admin(`CREATE DATABASE "${name}"`);
    try {
      const target = urlOf(name);
      const as = { MIGRATION_DATABASE_URL: target, DATABASE_URL: urlOf(name, "app") };
      // an empty database takes a restore without --force
      const first = run("scripts/db-restore.mjs", [backup], as);
      expect(first.status, first.output).toBe(0);
      const client = new Client({ connectionString: target });
      await client.connect();
      await client.query("DELETE FROM quote_lines; DELETE FROM email_outbox");
      await client.end();
      const changed = await rowCounts(target);
      expect(run("scripts/db-restore.mjs", [backup], as).status).not.toBe(0);
      const forced = run("scripts/db-restore.mjs", [backup, "--force"], as);
      expect(forced.status, forced.output).toBe(0);
      expect(await rowCounts(target)).toEqual(await rowCounts(urlOf(restored)));
      const kept = /kept as (\S+);/.exec(forced.output)?.[1];
      expect(kept).toBeDefined();
      expect(await rowCounts(urlOf(kept!))).toEqual(changed);
    } finally {
      const c = new Client({ connectionString: urlOf("postgres") });
      await c.connect();
      const names = await c.query<{ datname: string }>("SELECT datname FROM pg_database WHERE datname LIKE $1", [`${name}%`]);
      await c.end();
      for (const { datname } of names.rows) await admin(`DROP DATABASE IF EXISTS "${datname}" WITH (FORCE)`);
    }
  });
});
