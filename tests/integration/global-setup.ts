import { Client } from "pg";
import { createDb } from "@/db/client";
import { prepareDatabase } from "@/db/prepare";
import { isDatabaseEmpty, seedDemo } from "@/db/seed";

/**
 * Once per run: the test database is migrated, prepared for the app's role and holds the demo
 * shops. Each test file then works in a copy of it (tests/integration/setup.ts); the copies are
 * dropped when the run ends. DATABASE_URL is the app's role (under row-level security),
 * MIGRATION_DATABASE_URL the tables' owner.
 */
export default async function setup() {
  const url = process.env.DATABASE_URL;
  const ownerUrl = process.env.MIGRATION_DATABASE_URL;
  if (!url || !/_test(_\d+)?$/.test(url) || !ownerUrl)
    throw new Error(
      `integration tests need DATABASE_URL and MIGRATION_DATABASE_URL pointing at a *_test database (got ${url ?? "nothing"}); run them with npm test`,
    );
  await prepareDatabase({ ownerUrl, appUrl: url });
  const { db, pool } = createDb(ownerUrl, 2);
  try {
    if (await isDatabaseEmpty(db)) await seedDemo(db);
  } finally {
    await pool.end();
  }
  return async function teardown() {
    const template = new URL(url).pathname.slice(1);
    const admin = new URL(ownerUrl);
    admin.pathname = "/postgres";
    const client = new Client({ connectionString: admin.toString() });
    await client.connect();
    try {
      const copies = await client.query<{ datname: string }>("SELECT datname FROM pg_database WHERE datname LIKE $1", [`${template}\\_file\\_%`]);
      for (const { datname } of copies.rows) await client.query(`DROP DATABASE IF EXISTS "${datname}" WITH (FORCE)`);
    } finally {
      await client.end();
    }
  };
}
