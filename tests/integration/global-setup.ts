import path from "node:path";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { createDb } from "@/db/client";
import { isDatabaseEmpty, seedDemo } from "@/db/seed";

/** Once per run: the test database is migrated and holds the demo shops. */
export default async function setup() {
  const url = process.env.DATABASE_URL;
  if (!url || !/_test(_\d+)?$/.test(url)) throw new Error(`integration tests need DATABASE_URL pointing at a *_test database (got ${url ?? "nothing"}); run them with npm test`);
  const { db, pool } = createDb(url, 2);
  try {
    await migrate(db, { migrationsFolder: path.resolve("drizzle") });
    if (await isDatabaseEmpty(db)) await seedDemo(db);
  } finally {
    await pool.end();
  }
}
