import "server-only";
import { and, count, eq, gte, lte, sql } from "drizzle-orm";
import { bankRequests, quoteRevisions, quotes } from "@/db/schema";
import { withShop } from "@/db/tx";

/**
 * What needs doing today at a shop, counted for the desk's Today page: requests waiting for an
 * estimator, and issued quotes whose current revision lapses within `days` (from `today`, YYYY-MM-DD).
 */
export async function countTodayWork(shopId: string, today: string, days: number): Promise<{ needsReview: number; expiringQuotes: number }> {
  const until = new Date(Date.parse(`${today}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
  return withShop(shopId, async (tx) => {
    const [review] = await tx
      .select({ n: count() })
      .from(bankRequests)
      .where(and(eq(bankRequests.shopId, shopId), eq(bankRequests.status, "needs-review")));
    const [expiring] = await tx
      .select({ n: count() })
      .from(quotes)
      .innerJoin(
        quoteRevisions,
        and(eq(quoteRevisions.shopId, quotes.shopId), eq(quoteRevisions.quoteId, quotes.id), eq(quoteRevisions.revision, quotes.currentRevision)),
      )
      .where(
        and(eq(quotes.shopId, shopId), eq(quotes.status, "sent"), gte(quoteRevisions.validUntil, today), lte(quoteRevisions.validUntil, sql`${until}::date`)),
      );
    return { needsReview: review?.n ?? 0, expiringQuotes: expiring?.n ?? 0 };
  });
}
