import { index, integer, pgTable, text, timestamp } from "drizzle-orm/pg-core";

/**
 * Request counters shared by every app server: one row per limiter and client, a fixed window
 * that ends at `window_ends_at`. Counted with one atomic upsert (db/queries/rate-limits.ts);
 * rows whose window has ended are swept. Not a shop's data: keys are addresses and paths.
 */
export const rateLimits = pgTable(
  "rate_limits",
  {
    key: text().primaryKey(),
    count: integer().notNull(),
    windowEndsAt: timestamp({ withTimezone: true }).notNull(),
  },
  (t) => [index("rate_limits_window_ends_idx").on(t.windowEndsAt)],
);

/**
 * Failed sign-ins per account, from any address: after a few, the account waits before the next
 * try, and the wait doubles with each further failure (db/queries/sign-in-failures.ts). Keyed by a
 * SHA-256 of the normalized e-mail, so addresses typed at the sign-in form are not stored.
 */
export const signInFailures = pgTable(
  "sign_in_failures",
  {
    accountKey: text().primaryKey(),
    failures: integer().notNull(),
    lastFailureAt: timestamp({ withTimezone: true }).notNull(),
    lockedUntil: timestamp({ withTimezone: true }),
  },
  (t) => [index("sign_in_failures_last_failure_idx").on(t.lastFailureAt)],
);
