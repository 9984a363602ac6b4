import Link from "next/link";
import { LateBadge, OrderStatusBadge } from "@/components/orders/order-status";
import type { OrderListRow } from "@/db/queries/orders";
import { boardStage, isLate, ORDER_STAGES } from "@/lib/orders/stages";
import { ORDER_STATUS_LABELS, type OrderStatus } from "@/lib/vocabulary";

type Column = { key: OrderStatus | "closed"; label: string; rows: OrderListRow[] };

/**
 * The floor at a glance: a column per stage (an order on hold stays in the stage it stopped at,
 * marked), then the orders closed lately; within a column the soonest due first, late ones marked.
 */
export function OrderBoard({ shop, rows, today }: { shop: string; rows: OrderListRow[]; today: string }) {
  const columns: Column[] = [
    ...ORDER_STAGES.map((s) => ({ key: s, label: ORDER_STATUS_LABELS[s], rows: [] as OrderListRow[] })),
    { key: "closed", label: "Cancelled or refunded", rows: [] },
  ];
  for (const r of rows) {
    const stage = r.status === "cancelled" || r.status === "refunded" ? "closed" : boardStage(r);
    columns.find((c) => c.key === stage)?.rows.push(r);
  }
  return (
    <div className="-mx-6 overflow-x-auto px-6 pb-2" data-testid="order-board" role="region" aria-label="Orders by stage (scrolls sideways)" tabIndex={0}>
      <div className="flex min-w-max gap-3">
        {columns.map((c) => (
          <section key={c.key} className="w-60 shrink-0 rounded-lg bg-ink-50 p-2" aria-labelledby={`col-${c.key}`} data-testid={`board-${c.key}`}>
            <h2 id={`col-${c.key}`} className="flex items-center justify-between px-1 pb-2 text-sm font-semibold text-ink-800">
              {c.label}
              <span className="num rounded-full bg-white px-2 text-xs font-medium text-ink-600">{c.rows.length}</span>
            </h2>
            <ul className="space-y-2">
              {c.rows.map((r) => (
                <li key={r.id}>
                  <Link
                    href={`/desk/${shop}/orders/${r.number}`}
                    className="block rounded-md bg-white p-3 text-sm shadow-sm ring-1 ring-ink-100 hover:ring-copper-500"
                    data-testid={`card-${r.number}`}
                  >
                    <span className="flex items-center justify-between gap-2">
                      <span className="font-semibold text-copper-700">{r.number}</span>
                      {isLate(r, today) ? <LateBadge /> : null}
                    </span>
                    <span className="mt-1 block truncate text-ink-700">{r.customerName}</span>
                    <span className="num mt-1 block text-xs text-ink-500">
                      {r.quantity} bank{r.quantity === 1 ? "" : "s"} · due {r.dueDate}
                    </span>
                    {r.status === "on-hold" || c.key === "closed" ? (
                      <span className="mt-1 block">
                        <OrderStatusBadge status={r.status} heldFrom={r.heldFrom} />
                      </span>
                    ) : null}
                  </Link>
                </li>
              ))}
              {c.rows.length === 0 ? <li className="px-1 text-xs text-ink-500">None</li> : null}
            </ul>
          </section>
        ))}
      </div>
    </div>
  );
}
