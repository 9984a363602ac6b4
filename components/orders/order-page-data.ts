import "server-only";
import { getOrderDetail, listLatestTests, listOrderHistory } from "@/db/queries/orders";
import { listPaymentsOfQuote, listRefundsOfQuote } from "@/db/queries/payments";
import { banksNotPassed } from "@/lib/orders/test-limits";
import { isOrderNumber } from "@/lib/orders/order-number";

/** Everything an order page shows, read once: the order with its frozen revision, its moves, payments, refunds and latest tests. */
export async function loadOrderPage(shopId: string, number: string) {
  const detail = isOrderNumber(number) ? await getOrderDetail(shopId, number) : null;
  if (!detail) return null;
  const o = detail.order;
  const [history, payments, refunds, tests] = await Promise.all([
    listOrderHistory(shopId, o.id),
    listPaymentsOfQuote(shopId, o.quoteId),
    listRefundsOfQuote(shopId, o.quoteId),
    listLatestTests(shopId, o.id),
  ]);
  const { missing, failed } = banksNotPassed(o.quantity, tests);
  return { detail, history, payments, refunds, tests, certified: missing.length === 0 && failed.length === 0 };
}

export type OrderPageData = NonNullable<Awaited<ReturnType<typeof loadOrderPage>>>;
