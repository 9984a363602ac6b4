import Link from "next/link";
import { ListView } from "@/components/ui/list-controls";
import type { OrderListRow } from "@/db/queries/orders";
import type { Page } from "@/db/queries/paging";
import { isLate } from "@/lib/orders/stages";
import { formatMoney } from "@/lib/pricing";
import type { ListState } from "@/lib/validation/list-query";
import type { OrderListQuery } from "@/lib/validation/lists";
import { ORDER_STATUS_LABELS, ORDER_STATUSES } from "@/lib/vocabulary";
import { LateBadge, OrderStatusBadge } from "./order-status";

/**
 * The order list, as the desk shows every order of the shop (with its customer) and as the
 * storefront shows a customer their own. Rows link to the order on the same side; late ones are marked.
 */
export function OrderList({
  shop,
  side,
  q,
  page,
  state,
  today,
}: {
  shop: string;
  side: "desk" | "storefront";
  q: OrderListQuery;
  page: Page<OrderListRow>;
  state: ListState;
  today: string;
}) {
  const desk = side === "desk";
  const base = desk ? `/desk/${shop}/orders` : `/s/${shop}/orders`;
  return (
    <ListView
      state={state}
      caption={desk ? "Orders" : "My orders"}
      empty={{
        none: desk ? "No orders yet: they appear here when a customer's payment is confirmed." : "No orders yet: accept and pay a quote to place one.",
        noMatch: "No orders match.",
      }}
      filters={[
        { name: "q", label: desk ? "Order, quote or customer" : "Order or quote number", value: q.q },
        {
          name: "status",
          label: "Status",
          value: q.status,
          options: [
            { value: "all", label: "All" },
            { value: "open", label: "On the floor" },
            ...ORDER_STATUSES.map((s) => ({ value: s, label: ORDER_STATUS_LABELS[s] })),
          ],
        },
        {
          name: "timing",
          label: "Due",
          value: q.timing,
          options: [
            { value: "all", label: "Any" },
            { value: "late", label: "Late" },
          ],
        },
      ]}
      columns={[
        { label: "Order", sortKey: "number" },
        { label: "Quote" },
        ...(desk ? [{ label: "Customer", sortKey: "customer" }] : []),
        { label: "Status", sortKey: "status" },
        { label: "Banks", align: "right" as const },
        { label: "Total", sortKey: "total", align: "right" as const },
        { label: "Paid", align: "right" as const },
        { label: "Due", sortKey: "due" },
        { label: "Placed", sortKey: "created" },
      ]}
    >
      {page.rows.map((r) => (
        <tr key={r.id} className="border-t border-ink-100" data-testid={`order-row-${r.number}`}>
          <td className="whitespace-nowrap px-3 py-2">
            <Link href={`${base}/${r.number}`} className="font-medium text-copper-700 hover:underline">
              {r.number}
            </Link>
          </td>
          <td className="whitespace-nowrap px-3 py-2 text-ink-600">{r.quoteNumber}</td>
          {desk ? (
            <td className="px-3 py-2">
              {r.customerName}
              <span className="block text-xs text-ink-500">{r.customerEmail}</span>
            </td>
          ) : null}
          <td className="px-3 py-2">
            <OrderStatusBadge status={r.status} heldFrom={r.heldFrom} />
          </td>
          <td className="num px-3 py-2 text-right">{r.quantity}</td>
          <td className="num whitespace-nowrap px-3 py-2 text-right">{formatMoney(r.total, r.currency)}</td>
          <td className="num whitespace-nowrap px-3 py-2 text-right">{formatMoney(r.amountPaid, r.currency)}</td>
          <td className="num whitespace-nowrap px-3 py-2">
            {r.dueDate} {isLate(r, today) ? <LateBadge /> : null}
          </td>
          <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{r.createdAt.toISOString().slice(0, 10)}</td>
        </tr>
      ))}
    </ListView>
  );
}
