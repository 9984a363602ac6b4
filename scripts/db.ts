/**
 * Database chores for the start and test commands, run as the migration role
 * (MIGRATION_DATABASE_URL, the tables' owner; DATABASE_URL when it is not set): `migrate` applies
 * the committed SQL migrations and prepares the app's role (DATABASE_URL) for them
 * (db/prepare.ts); `setup` does that and loads the demo data when the database is empty; `reset`
 * empties every table and loads the demo data again (tests only).
 */
import { sql } from "drizzle-orm";
import { createDb } from "../db/client";
import { prepareDatabase } from "../db/prepare";
import { isDatabaseEmpty, seedDemo } from "../db/seed";

const appUrl = process.env.DATABASE_URL;
if (!appUrl) throw new Error("DATABASE_URL is not set");
const ownerUrl = process.env.MIGRATION_DATABASE_URL ?? appUrl;

async function main() {
  const command = process.argv[2] ?? "setup";
  await prepareDatabase({ ownerUrl, appUrl: appUrl! });
  if (command !== "setup" && command !== "reset") return;
  const { db, pool } = createDb(ownerUrl, 2);
  try {
    if (command === "reset") await db.execute(sql`TRUNCATE shops, users, verifications RESTART IDENTITY CASCADE`);
    if (await isDatabaseEmpty(db)) {
      await seedDemo(db);
      console.log("[faradsmith] demo data loaded");
    }
  } finally {
    await pool.end();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
