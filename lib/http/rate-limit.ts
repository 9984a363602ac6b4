/**
 * A fixed-window request counter per client key, in this server's memory. Enough for one app
 * server; behind a load balancer the same interface would sit on a shared store.
 */
export function createRateLimiter({ limit, windowMs }: { limit: number; windowMs: number }) {
  const windows = new Map<string, { start: number; count: number }>();
  return {
    /** Counts a request; answers whether it is allowed and, if not, how many seconds to wait. */
    hit(key: string, now = Date.now()): { allowed: true; remaining: number } | { allowed: false; retryAfterSeconds: number } {
      let w = windows.get(key);
      if (!w || now - w.start >= windowMs) {
        w = { start: now, count: 0 };
        windows.set(key, w);
        if (windows.size > 50_000) {
          for (const [k, v] of windows) if (now - v.start >= windowMs) windows.delete(k);
        }
      }
      w.count += 1;
      if (w.count > limit) return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil((w.start + windowMs - now) / 1000)) };
      return { allowed: true, remaining: limit - w.count };
    },
  };
}

/** The client's address as the nearest proxy reports it, or the loopback default. */
export function clientKey(headers: Headers): string {
  const forwarded = headers.get("x-forwarded-for")?.split(",")[0]?.trim();
  return forwarded || headers.get("x-real-ip") || "direct";
}
