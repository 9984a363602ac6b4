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
 * How many requests one trip to the database takes for a client at once: one (an exact count) for
 * limits under 200 a window, a hundredth of larger ones (at most 1,000), so a generous limit costs a
 * write per hundred requests, not per request.
 */
export function leaseSize(limit: number): number {
  return Math.max(1, Math.min(1000, Math.floor(limit / 100)));
}

interface Lease {
  tokens: number;
  expiresAt: number;
}

/**
 * Counters in PostgreSQL, shared by every app server: one INSERT … ON CONFLICT DO UPDATE counts
 * requests and starts a new window when the old one has ended, so concurrent requests on any
 * server cannot pass a stale read. The database's clock decides windows (app servers' clocks may
 * differ). About once a minute per server, ended windows are swept.
 *
 * A server takes `leaseSize(limit)` requests at a time for a client and serves the rest of them
 * from memory until they run out or the window ends. What it takes is granted against the shared
 * count, so a client never gets more than the limit across all servers; requests one server took
 * but did not use are lost, so with n servers a client may be refused up to (n − 1) · (lease − 1)
 * requests early. Small limits (sign-in, sign-up, the tests' own) lease one: exact.
 */
export function createPostgresRateLimitStore(database: Db): RateLimitStore {
  let lastSweep = 0;
  const leases = new Map<string, Lease>();
  return {
    async consume(key, rule) {
      const lease = leaseSize(rule.limit);
      const held = leases.get(key);
      if (held && held.tokens > 0 && Date.now() < held.expiresAt) {
        held.tokens -= 1;
        return { allowed: true, remaining: held.tokens };
      }
      const window = sql`make_interval(secs => ${rule.windowSeconds})`;
      const ended = sql`${rateLimits.windowEndsAt} <= now()`;
      const [row] = await database
        .insert(rateLimits)
        .values({ key, count: lease, windowEndsAt: sql`now() + ${window}` })
        .onConflictDoUpdate({
          target: rateLimits.key,
          set: {
            count: sql`CASE WHEN ${ended} THEN ${lease} ELSE ${rateLimits.count} + ${lease} END`,
            windowEndsAt: sql`CASE WHEN ${ended} THEN now() + ${window} ELSE ${rateLimits.windowEndsAt} END`,
          },
        })
        .returning({ count: rateLimits.count, secondsLeft: sql<number>`ceil(extract(epoch FROM ${rateLimits.windowEndsAt} - now()))::int` });
      if (Date.now() - lastSweep > SWEEP_EVERY_MS) {
        lastSweep = Date.now();
        void sweepRateLimits(database).catch((error) => console.error("[rate-limit] sweep failed:", error));
        const now = Date.now();
        for (const [k, l] of leases) if (l.expiresAt <= now) leases.delete(k);
      }
      const count = row?.count ?? lease;
      const secondsLeft = Math.max(1, row?.secondsLeft ?? rule.windowSeconds);
      const granted = Math.max(0, Math.min(lease, rule.limit - (count - lease)));
      if (granted === 0) return { allowed: false, retryAfterSeconds: secondsLeft };
      if (granted > 1 && leases.size < 100_000) leases.set(key, { tokens: granted - 1, expiresAt: Date.now() + secondsLeft * 1000 });
      else leases.delete(key);
      return { allowed: true, remaining: Math.max(0, rule.limit - count) + granted - 1 };
    },
  };
}

/** The app's store, on its one database client. */
export const postgresRateLimitStore = createPostgresRateLimitStore(db);
