import "server-only";
import { and, count, countDistinct, eq, gte, inArray, or, sql } from "drizzle-orm";
import { orders, paymentRefunds, payments, quotes } from "@/db/schema";
import { withShop } from "@/db/tx";

/**
 * The manager's figures, each one query in the shop's own transaction. Money is summed by
 * PostgreSQL's numeric (exact) and read as decimal strings.
 */

/** Quotes issued, accepted and paid since `from` (the start of this month). */
export async function quoteFunnel(shopId: string, from: Date): Promise<{ sent: number; accepted: number; paid: number }> {
  return withShop(shopId, async (tx) => {
    const [sent] = await tx
      .select({ n: count() })
      .from(quotes)
      .where(and(eq(quotes.shopId, shopId), gte(quotes.createdAt, from)));
    // accepted this month: marked accepted this month, or paid this month (a paid quote was accepted)
    const [accepted] = await tx
      .select({ n: countDistinct(quotes.id) })
      .from(quotes)
      .leftJoin(orders, and(eq(orders.shopId, quotes.shopId), eq(orders.quoteId, quotes.id)))
      .where(and(eq(quotes.shopId, shopId), or(and(eq(quotes.status, "accepted"), gte(quotes.updatedAt, from)), gte(orders.createdAt, from))));
    const [paid] = await tx
      .select({ n: count() })
      .from(orders)
      .where(and(eq(orders.shopId, shopId), gte(orders.createdAt, from)));
    return { sent: sent?.n ?? 0, accepted: accepted?.n ?? 0, paid: paid?.n ?? 0 };
  });
}

/** Of the quotes issued since `from`, how many became orders (the conversion over that cohort). */
export async function quoteConversion(shopId: string, from: Date): Promise<{ quotes: number; ordered: number }> {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({ quotes: count(quotes.id), ordered: count(orders.id) })
      .from(quotes)
      .leftJoin(orders, and(eq(orders.shopId, quotes.shopId), eq(orders.quoteId, quotes.id)))
      .where(and(eq(quotes.shopId, shopId), gte(quotes.createdAt, from)));
    return { quotes: row?.quotes ?? 0, ordered: row?.ordered ?? 0 };
  });
}

export interface RevenueMonth {
  /** YYYY-MM (UTC) */
  month: string;
  received: string;
  refunded: string;
}

/** Money received and refunded per calendar month (UTC) since `from`, in `currency`, exact. */
export async function revenueByMonth(shopId: string, currency: string, from: Date): Promise<RevenueMonth[]> {
  return withShop(shopId, async (tx) => {
    const monthOf = (col: typeof payments.paidAt | typeof paymentRefunds.createdAt) =>
      sql<string>`to_char(date_trunc('month', ${col} at time zone 'UTC'), 'YYYY-MM')`;
    const received = await tx
      .select({ month: monthOf(payments.paidAt), sum: sql<string>`sum(${payments.amountReceived})::text` })
      .from(payments)
      .where(and(eq(payments.shopId, shopId), eq(payments.status, "paid"), eq(payments.currency, currency), gte(payments.paidAt, from)))
      .groupBy(sql`1`);
    const refunded = await tx
      .select({ month: monthOf(paymentRefunds.createdAt), sum: sql<string>`sum(${paymentRefunds.amount})::text` })
      .from(paymentRefunds)
      .where(
        and(
          eq(paymentRefunds.shopId, shopId),
          eq(paymentRefunds.currency, currency),
          inArray(paymentRefunds.status, ["succeeded", "pending"]),
          gte(paymentRefunds.createdAt, from),
        ),
      )
      .groupBy(sql`1`);
    const months = new Map<string, RevenueMonth>();
    for (const r of received) months.set(r.month, { month: r.month, received: r.sum, refunded: "0" });
    for (const r of refunded) months.set(r.month, { ...(months.get(r.month) ?? { month: r.month, received: "0" }), refunded: r.sum });
    return [...months.values()].sort((a, b) => a.month.localeCompare(b.month));
  });
}
