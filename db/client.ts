import { drizzle } from "drizzle-orm/node-postgres";
import { Pool } from "pg";
import * as schema from "./schema";

/**
 * A Drizzle client over its own pool; the app uses db/index.ts, scripts and tests call this.
 *
 * When PostgreSQL restarts or a connection drops, node-postgres reports it as an "error" event: on
 * the pool for an idle connection, on the connection itself for one a request holds (inside a
 * transaction, between two statements). Either would end the process if nobody listened. Here the
 * pool's is logged and the connection's is left to the statement it breaks; the pool discards a
 * broken connection when it comes back, and the next query opens a fresh one. Requests that were
 * using a connection at that moment fail with the database's error; the server itself carries on
 * (tests/integration/faults.test.ts). Waiting for a connection is bounded, so a database that is
 * down makes requests fail instead of hang.
 */
export function createDb(url: string, max = 10) {
  const pool = new Pool({ connectionString: url, max, connectionTimeoutMillis: 10_000, idleTimeoutMillis: 30_000 });
  pool.on("error", (error) => console.error(`[db] an idle database connection failed and was dropped: ${error.message}`));
  pool.on("connect", (client) => client.on("error", () => undefined));
  return { db: drizzle(pool, { schema, casing: "snake_case" }), pool };
}

export type Db = ReturnType<typeof createDb>["db"];
