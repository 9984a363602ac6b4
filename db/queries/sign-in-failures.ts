import "server-only";
import { createHash } from "node:crypto";
import { and, eq, gt, sql } from "drizzle-orm";
import { db } from "@/db";
import { signInFailures } from "@/db/schema";

/**
 * Failed sign-ins per account, whatever address they come from (a per-address limit alone lets
 * a botnet try one password per address). After `limit` failures within an hour the account
 * waits `FIRST_WAIT_SECONDS` before the next try, and each further failure doubles the wait up to
 * `LONGEST_WAIT_SECONDS`; a successful sign-in clears the count. Any e-mail is counted, whether an
 * account has it or not, so the answer says nothing about which addresses exist.
 */
export const FIRST_WAIT_SECONDS = 30;
export const LONGEST_WAIT_SECONDS = 15 * 60;

/** SHA-256 of the e-mail as the sign-in form reads it (trimmed, lower case). */
export function accountKey(email: string): string {
  return createHash("sha256").update(email.trim().toLowerCase()).digest("hex");
}

/** Seconds the account must still wait, or 0 when it may try now. */
export async function accountWaitSeconds(email: string): Promise<number> {
  const [row] = await db
    .select({ seconds: sql<number>`ceil(extract(epoch FROM ${signInFailures.lockedUntil} - now()))::int` })
    .from(signInFailures)
    .where(and(eq(signInFailures.accountKey, accountKey(email)), gt(signInFailures.lockedUntil, sql`now()`)))
    .limit(1);
  return row ? Math.max(1, row.seconds) : 0;
}

let lastSweep = 0;

/** Counts one failure in one atomic upsert; answers the count and the wait it starts (0: none). */
export async function recordSignInFailure(email: string, limit: number): Promise<{ failures: number; waitSeconds: number }> {
  if (Date.now() - lastSweep > 60_000) {
    lastSweep = Date.now();
    void sweepSignInFailures().catch((error) => console.error("[sign-in] sweep failed:", error));
  }
  const stale = sql`${signInFailures.lastFailureAt} < now() - interval '1 hour'`;
  const next = sql`(CASE WHEN ${stale} THEN 1 ELSE ${signInFailures.failures} + 1 END)`;
  const wait = (n: ReturnType<typeof sql>) =>
    sql`CASE WHEN ${n} >= ${limit} THEN now() + make_interval(secs => least(${LONGEST_WAIT_SECONDS}, ${FIRST_WAIT_SECONDS} * power(2, ${n} - ${limit}))) ELSE NULL END`;
  const [row] = await db
    .insert(signInFailures)
    .values({ accountKey: accountKey(email), failures: 1, lastFailureAt: sql`now()`, lockedUntil: wait(sql`1`) })
    .onConflictDoUpdate({ target: signInFailures.accountKey, set: { failures: next, lastFailureAt: sql`now()`, lockedUntil: wait(next) } })
    .returning({
      failures: signInFailures.failures,
      waitSeconds: sql<number>`coalesce(ceil(extract(epoch FROM ${signInFailures.lockedUntil} - now()))::int, 0)`,
    });
  return { failures: row?.failures ?? 1, waitSeconds: row?.waitSeconds ?? 0 };
}

/** A successful sign-in forgets the account's failures. */
export async function clearSignInFailures(email: string): Promise<void> {
  await db.delete(signInFailures).where(eq(signInFailures.accountKey, accountKey(email)));
}

/** Failures older than a day are of no use to the back-off. */
export async function sweepSignInFailures(): Promise<void> {
  await db
    .delete(signInFailures)
    .where(
      sql`${signInFailures.lastFailureAt} < now() - interval '1 day' AND (${signInFailures.lockedUntil} IS NULL OR ${signInFailures.lockedUntil} < now())`,
    );
}
