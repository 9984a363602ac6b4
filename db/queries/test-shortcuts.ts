import "server-only";
import { and, eq } from "drizzle-orm";
import { quotes } from "@/db/schema";
import { withShop } from "@/db/tx";

/**
 * TESTS ONLY, until the quote's own accept move lands: marks a quote accepted without any of the
 * accept rules (latest sent revision, not expired, once), so that checkout can be tested. Nothing
 * in app/ or lib/ calls it.
 */
export async function markQuoteAcceptedForTests(shopId: string, number: string): Promise<void> {
  await withShop(shopId, (tx) =>
    tx
      .update(quotes)
      .set({ status: "accepted" })
      .where(and(eq(quotes.shopId, shopId), eq(quotes.number, number))),
  );
}
