/**
 * Database chores for the start and test commands: `migrate` applies the committed SQL
 * migrations with Drizzle's migrator; `setup` migrates and loads the demo data when the database
 * is empty; `reset` empties every table and loads the demo data again (tests only).
 */
import path from "node:path";
import { sql } from "drizzle-orm";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { createDb } from "../db/client";
import { isDatabaseEmpty, seedDemo } from "../db/seed";

const url = process.env.DATABASE_URL;
if (!url) throw new Error("DATABASE_URL is not set");

async function main() {
  const command = process.argv[2] ?? "setup";
  const { db, pool } = createDb(url!, 2);
  try {
    await migrate(db, { migrationsFolder: path.join(process.cwd(), "drizzle") });
    if (command === "reset") {
      await db.execute(sql`TRUNCATE shops, users, verifications RESTART IDENTITY CASCADE`);
    }
    if (command === "setup" || command === "reset") {
      if (await isDatabaseEmpty(db)) {
        await seedDemo(db);
        console.log("[faradsmith] demo data loaded");
      }
    }
  } finally {
    await pool.end();
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
