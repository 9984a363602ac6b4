import type { Metadata } from "next";
import Link from "next/link";
import { RevenueChart } from "@/components/charts/revenue-chart";
import { LateBadge } from "@/components/orders/order-status";
import { PageHeader } from "@/components/ui/page-header";
import { quoteConversion, quoteFunnel, revenueByMonth } from "@/db/queries/dashboard";
import { countOrdersByStatus, listLateOrders } from "@/db/queries/orders";
import { getShopSettings } from "@/db/queries/shops";
import { requireShopPage } from "@/lib/auth/guards";
import { isoDay } from "@/lib/orders/due-date";
import { monthStart, revenueSeries, sharePercent } from "@/lib/orders/revenue";
import { formatMoney } from "@/lib/pricing";
import { ORDER_STATUS_LABELS, ORDER_STATUSES } from "@/lib/vocabulary";

export const metadata: Metadata = { title: "Dashboard" };

function Figure({ label, value, note }: { label: string; value: string; note?: string }) {
  return (
    <div className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
      <p className="text-sm text-ink-600">{label}</p>
      <p className="num mt-1 text-2xl font-semibold">{value}</p>
      {note ? <p className="mt-1 text-xs text-ink-500">{note}</p> : null}
    </div>
  );
}

/** How the shop is doing: this month's quotes, conversion, revenue by month, orders per stage and the late ones. */
export default async function DashboardPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "reports:read", `/desk/${shop}/dashboard`);
  const now = new Date();
  const today = isoDay(now);
  const settings = await getShopSettings(ctx.shop.id);
  const currency = settings?.currency ?? "EUR";
  const [funnel, conversion, revenue, stages, late] = await Promise.all([
    quoteFunnel(ctx.shop.id, monthStart(now)),
    quoteConversion(ctx.shop.id, monthStart(now, 11)),
    revenueByMonth(ctx.shop.id, currency, monthStart(now, 11)),
    countOrdersByStatus(ctx.shop.id),
    listLateOrders(ctx.shop.id, today),
  ]);
  const series = revenueSeries(revenue, now, currency);
  const thisMonth = series.at(-1);
  return (
    <div className="space-y-6">
      <PageHeader title="Dashboard">
        {ctx.shop.name} this month and over the last twelve; money in {currency}, summed exactly.
      </PageHeader>
      <div className="grid gap-4 sm:grid-cols-2 xl:grid-cols-5" data-testid="dashboard-figures">
        <Figure label="Quotes sent this month" value={String(funnel.sent)} />
        <Figure label="Accepted this month" value={String(funnel.accepted)} />
        <Figure label="Paid this month" value={String(funnel.paid)} />
        <Figure
          label="Conversion"
          value={sharePercent(conversion.ordered, conversion.quotes)}
          note={`${conversion.ordered} of ${conversion.quotes} quotes issued in the last 12 months became orders`}
        />
        <Figure label="Net revenue this month" value={formatMoney(thisMonth?.net ?? "0", currency)} note="received less refunded" />
      </div>
      <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="revenue-title">
        <h2 id="revenue-title" className="text-sm font-semibold text-ink-800">
          Revenue by month
        </h2>
        <RevenueChart points={series} currency={currency} />
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer text-ink-600">The figures</summary>
          <div className="scroll-cue" role="region" aria-label="Revenue by month, the figures" tabIndex={0}>
            <table className="mt-2 w-full text-sm">
              <thead className="text-ink-600">
                <tr>
                  <th scope="col" className="py-1 text-left font-medium">
                    Month
                  </th>
                  <th scope="col" className="py-1 text-right font-medium">
                    Received
                  </th>
                  <th scope="col" className="py-1 text-right font-medium">
                    Refunded
                  </th>
                  <th scope="col" className="py-1 text-right font-medium">
                    Net
                  </th>
                </tr>
              </thead>
              <tbody>
                {series.map((p) => (
                  <tr key={p.month} className="border-t border-ink-100">
                    <td className="num py-1">{p.month}</td>
                    <td className="num py-1 text-right">{formatMoney(p.received, currency)}</td>
                    <td className="num py-1 text-right">{formatMoney(p.refunded, currency)}</td>
                    <td className="num py-1 text-right">{formatMoney(p.net, currency)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </details>
      </section>
      <div className="grid gap-4 lg:grid-cols-2">
        <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="stages-title">
          <h2 id="stages-title" className="text-sm font-semibold text-ink-800">
            Orders per stage
          </h2>
          <ul className="mt-2 divide-y divide-ink-100 text-sm" data-testid="orders-per-stage">
            {ORDER_STATUSES.map((s) => (
              <li key={s} className="flex justify-between py-1.5">
                <Link href={`/desk/${shop}/orders/list?status=${s}`} className="hover:underline">
                  {ORDER_STATUS_LABELS[s]}
                </Link>
                <span className="num">{stages[s]}</span>
              </li>
            ))}
          </ul>
        </section>
        <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="late-title">
          <h2 id="late-title" className="text-sm font-semibold text-ink-800">
            Late orders
          </h2>
          {late.length === 0 ? (
            <p className="mt-2 text-sm text-ink-600">None: every order on the floor is within its due date.</p>
          ) : (
            <ul className="mt-2 divide-y divide-ink-100 text-sm">
              {late.map((o) => (
                <li key={o.id} className="flex flex-wrap justify-between gap-2 py-1.5">
                  <Link href={`/desk/${shop}/orders/${o.number}`} className="font-medium text-copper-700 hover:underline">
                    {o.number}
                  </Link>
                  <span>{o.customerName}</span>
                  <span className="num">
                    due {o.dueDate} <LateBadge />
                  </span>
                </li>
              ))}
            </ul>
          )}
          <Link href={`/desk/${shop}/orders/list?timing=late`} className="mt-2 inline-block text-sm text-copper-700 hover:underline">
            All late orders
          </Link>
        </section>
      </div>
    </div>
  );
}
