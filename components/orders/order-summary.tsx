import Link from "next/link";
import type { OrderDetail } from "@/db/queries/orders";
import { balanceOf } from "@/lib/payments/amounts";
import { isLate } from "@/lib/orders/stages";
import { formatMoney } from "@/lib/pricing";
import { Dec } from "@/lib/pricing/decimal";
import { arrangementLabel, PAYMENT_KIND_LABELS, type PaymentKind } from "@/lib/vocabulary";
import { LateBadge, OrderStatusBadge } from "./order-status";

export interface PaymentLine {
  id: string;
  kind: PaymentKind;
  status: string;
  amount: string;
  amountReceived: string | null;
  currency: string;
  paidAt: Date | null;
}

export interface RefundLine {
  id: string;
  amount: string;
  currency: string;
  status: string;
  reason: string;
  createdAt: Date;
}

/**
 * The head of an order page, the same for the customer and the desk: number, status, due date,
 * the bank, what was paid and refunded, shipping, and the certificate once every bank has passed.
 */
export function OrderSummary({
  detail,
  today,
  quoteHref,
  certificateHref,
  payments,
  refunds,
  children,
}: {
  detail: OrderDetail;
  today: string;
  quoteHref: string;
  /** null until every bank has passed its test */
  certificateHref: string | null;
  payments: PaymentLine[];
  refunds: RefundLine[];
  /** actions beside the summary (pay the balance, the traveler) */
  children?: React.ReactNode;
}) {
  const o = detail.order;
  const m = (a: string) => formatMoney(a, o.currency);
  const balance = balanceOf(o.total, o.amountPaid, o.currency);
  const rows: { label: string; value: React.ReactNode }[] = [
    { label: "Quote", value: <Link href={quoteHref} className="text-copper-700 hover:underline">{`${detail.quoteNumber}, revision ${detail.revision}`}</Link> },
    { label: "Bank", value: `${o.quantity} × ${arrangementLabel(detail.arrangement)}, ${detail.arrangement.cell.sku} cells` },
    {
      label: "Due",
      value: (
        <span className="num">
          {o.dueDate} {isLate(o, today) ? <LateBadge /> : null}
        </span>
      ),
    },
    { label: "Total", value: <span className="num">{m(o.total)}</span> },
    {
      label: "Paid",
      value: (
        <span className="num" data-testid="order-paid">
          {m(o.amountPaid)}
        </span>
      ),
    },
  ];
  if (new Dec(o.amountRefunded).greaterThan(0)) rows.push({ label: "Refunded", value: <span className="num">{m(o.amountRefunded)}</span> });
  if (new Dec(balance).greaterThan(0) && !["cancelled", "refunded"].includes(o.status))
    rows.push({ label: "Balance due", value: <span className="num font-semibold">{m(balance)}</span> });
  if (o.carrier) rows.push({ label: "Shipped with", value: `${o.carrier}, tracking ${o.trackingReference ?? ""}` });
  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <p className="text-sm text-ink-600">{detail.shopName}</p>
          <h1 className="text-2xl font-semibold">
            Order <span data-testid="order-number">{o.number}</span>
          </h1>
          <p className="mt-1 flex flex-wrap items-center gap-2 text-sm text-ink-600">
            <span data-testid="order-status">
              <OrderStatusBadge status={o.status} heldFrom={o.heldFrom} />
            </span>
            placed {o.createdAt.toISOString().slice(0, 10)} for {detail.customerName}
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          {certificateHref ? (
            <a href={certificateHref} download className="inline-flex rounded-md bg-copper-600 px-4 py-2 text-sm font-medium text-white hover:bg-copper-700">
              Download the test certificate
            </a>
          ) : null}
          {children}
        </div>
      </header>
      <div className="grid gap-4 md:grid-cols-2">
        <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
          <h2 className="text-sm font-semibold text-ink-800">The order</h2>
          <dl className="mt-2 divide-y divide-ink-100 text-sm">
            {rows.map((r) => (
              <div key={r.label} className="grid grid-cols-[8rem_1fr] gap-3 py-1.5">
                <dt className="text-ink-600">{r.label}</dt>
                <dd className="text-ink-900">{r.value}</dd>
              </div>
            ))}
          </dl>
        </section>
        <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
          <h2 className="text-sm font-semibold text-ink-800">Payments and refunds</h2>
          <ul className="mt-2 divide-y divide-ink-100 text-sm">
            {payments
              .filter((p) => p.status === "paid")
              .map((p) => (
                <li key={p.id} className="flex justify-between gap-3 py-1.5">
                  <span>
                    {PAYMENT_KIND_LABELS[p.kind]} <span className="text-xs text-ink-500">{p.paidAt?.toISOString().slice(0, 10)}</span>
                  </span>
                  <span className="num">{formatMoney(p.amountReceived ?? p.amount, p.currency)}</span>
                </li>
              ))}
            {refunds.map((r) => (
              <li key={r.id} className="flex justify-between gap-3 py-1.5">
                <span>
                  Refund{r.status === "succeeded" ? "" : ` (${r.status})`}
                  {r.reason ? <span className="block text-xs text-ink-500">{r.reason}</span> : null}
                </span>
                <span className="num">−{formatMoney(r.amount, r.currency)}</span>
              </li>
            ))}
          </ul>
        </section>
      </div>
    </div>
  );
}
