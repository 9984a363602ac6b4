import { drizzle } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import * as schema from "./schema";

/** A Drizzle client over its own pool; the app uses db/index.ts, scripts and tests call this. */
export function createDb(url: string, max = 10) {
  const pool = new Pool({ connectionString: url, max });
  return { db: drizzle(pool, { schema, casing: "snake_case" }), pool };
}

export type Db = ReturnType<typeof createDb>["db"];
