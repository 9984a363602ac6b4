import { historiesOf, listOrders } from "@/db/queries/orders";
import { withShopApi } from "@/lib/auth/guards";
import { ownerScope, reads } from "@/lib/auth/ownership";
import { jsonError } from "@/lib/http/json-error";
import { isoDay } from "@/lib/orders/due-date";
import { moneyString } from "@/lib/pricing";
import { orderList } from "@/lib/validation/lists";
import { listOrders as contract } from "@/lib/api/contracts/orders";

/**
 * GET /api/v1/shops/{shop}/orders — `{ orders: [{ number, quoteNumber, status, amountPaid,
 * amountRefunded, total, dueDate, history: [{ status, at }] }], total, page, size }`: every order of
 * the shop for its staff, a customer's own for a customer. Takes the orders list's query (q,
 * status, timing, sort, dir, page, size); a value it does not take is a 400 naming it.
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(request, shop, reads("order"), async (ctx) => {
    const { query, issues } = orderList.parse(new URL(request.url).searchParams);
    if (issues.length > 0) return jsonError(400, "Invalid query.", issues);
    const page = await listOrders(ctx.shop.id, ownerScope(ctx, "order"), query, isoDay(new Date()));
    const histories = await historiesOf(
      ctx.shop.id,
      page.rows.map((r) => r.id),
    );
    const money = (amount: string, currency: string) => ({ amount: moneyString(amount, currency), currency });
    return contract.answer({
      orders: page.rows.map((r) => ({
        number: r.number,
        quoteNumber: r.quoteNumber,
        status: r.status,
        amountPaid: money(r.amountPaid, r.currency),
        amountRefunded: money(r.amountRefunded, r.currency),
        total: money(r.total, r.currency),
        dueDate: r.dueDate,
        history: (histories.get(r.id) ?? []).map((h) => ({ status: h.status, at: h.at.toISOString() })),
      })),
      total: page.total,
      page: page.page,
      size: page.size,
    });
  });
}
