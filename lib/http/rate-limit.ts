/**
 * Fixed-window request limits. A limiter counts requests per client key in a store; the store
 * answers "count this one and say whether it may pass" in one atomic step, so two app servers
 * sharing the store (PostgreSQL, db/queries/rate-limits.ts) share the limit. The in-memory
 * store here serves unit tests and single-process tools.
 */
export type RateDecision = { allowed: true; remaining: number } | { allowed: false; retryAfterSeconds: number };

export interface RateRule {
  limit: number;
  windowSeconds: number;
}

export interface RateLimitStore {
  consume(key: string, rule: RateRule): Promise<RateDecision>;
}

/** The key for callers whose address cannot be trusted: they share one bucket (never one each). */
export const UNRESOLVED_CLIENT = "unresolved";

/** Counts in this process's memory; `clock` in milliseconds. */
export function memoryRateLimitStore(clock: () => number = Date.now): RateLimitStore {
  const windows = new Map<string, { endsAt: number; count: number }>();
  return {
    async consume(key, rule) {
      const now = clock();
      let w = windows.get(key);
      if (!w || now >= w.endsAt) {
        w = { endsAt: now + rule.windowSeconds * 1000, count: 0 };
        windows.set(key, w);
        if (windows.size > 50_000) for (const [k, v] of windows) if (now >= v.endsAt) windows.delete(k);
      }
      w.count += 1;
      if (w.count > rule.limit) return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil((w.endsAt - now) / 1000)) };
      return { allowed: true, remaining: rule.limit - w.count };
    },
  };
}

/**
 * A named limit: `limit` requests per `windowSeconds` per client. `hit(client)` counts one request
 * for the client's key (`null`: an address that cannot be trusted, counted in one shared bucket).
 */
export function createRateLimiter({ name, limit, windowSeconds, store }: { name: string; limit: number; windowSeconds: number; store: RateLimitStore }) {
  return {
    hit(client: string | null): Promise<RateDecision> {
      return store.consume(`${name}:${client ?? UNRESOLVED_CLIENT}`, { limit, windowSeconds });
    },
  };
}

export type RateLimiter = ReturnType<typeof createRateLimiter>;
