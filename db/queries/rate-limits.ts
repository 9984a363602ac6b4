import "server-only";
import { lt, sql } from "drizzle-orm";
import { db } from "@/db";
import type { Db } from "@/db/client";
import { rateLimits } from "@/db/schema";
import type { RateLimitStore } from "@/lib/http/rate-limit";

const SWEEP_EVERY_MS = 60_000;

/** Deletes counters whose window ended more than a minute ago; answers how many. */
export async function sweepRateLimits(database: Db = db): Promise<number> {
  const gone = await database
    .delete(rateLimits)
    .where(lt(rateLimits.windowEndsAt, sql`now() - interval '1 minute'`))
    .returning({ key: rateLimits.key });
  return gone.length;
}

/**
 * Counters in PostgreSQL, shared by every app server: one INSERT … ON CONFLICT DO UPDATE counts
 * the request and starts a new window when the old one has ended, so concurrent requests on any
 * server cannot pass a stale read. The database's clock decides windows (app servers' clocks may
 * differ). About once a minute per server, ended windows are swept.
 */
export function createPostgresRateLimitStore(database: Db): RateLimitStore {
  let lastSweep = 0;
  return {
    async consume(key, rule) {
      const window = sql`make_interval(secs => ${rule.windowSeconds})`;
      const ended = sql`${rateLimits.windowEndsAt} <= now()`;
      const [row] = await database
        .insert(rateLimits)
        .values({ key, count: 1, windowEndsAt: sql`now() + ${window}` })
        .onConflictDoUpdate({
          target: rateLimits.key,
          set: {
            count: sql`CASE WHEN ${ended} THEN 1 ELSE ${rateLimits.count} + 1 END`,
            windowEndsAt: sql`CASE WHEN ${ended} THEN now() + ${window} ELSE ${rateLimits.windowEndsAt} END`,
          },
        })
        .returning({ count: rateLimits.count, secondsLeft: sql<number>`ceil(extract(epoch FROM ${rateLimits.windowEndsAt} - now()))::int` });
      if (Date.now() - lastSweep > SWEEP_EVERY_MS) {
        lastSweep = Date.now();
        void sweepRateLimits(database).catch((error) => console.error("[rate-limit] sweep failed:", error));
      }
      const count = row?.count ?? 1;
      if (count > rule.limit) return { allowed: false, retryAfterSeconds: Math.max(1, row?.secondsLeft ?? rule.windowSeconds) };
      return { allowed: true, remaining: rule.limit - count };
    },
  };
}

/** The app's store, on its one database client. */
export const postgresRateLimitStore = createPostgresRateLimitStore(db);
