import Link from "next/link";
import { notFound } from "next/navigation";
import { OrderSummary } from "@/components/orders/order-summary";
import { OrderTimeline } from "@/components/orders/order-timeline";
import { loadOrderPage } from "@/components/orders/order-page-data";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { isoDay } from "@/lib/orders/due-date";
import { allowedMoves, isCancellable } from "@/lib/orders/stages";
import { testLimitsOf } from "@/lib/orders/test-limits";
import { refundableOf } from "@/lib/payments/refunds";
import { formatMoney } from "@/lib/pricing";
import { Dec } from "@/lib/pricing/decimal";
import { CancelForm } from "../_components/cancel-form";
import { MoveForm } from "../_components/move-form";
import { RefundForm } from "../_components/refund-form";
import { TestForm } from "../_components/test-form";
import { TestLimitsTable, TestResults } from "../_components/test-results";

export async function generateMetadata({ params }: { params: Promise<{ number: string }> }) {
  return { title: `Order ${(await params).number}` };
}

function Panel({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
      <h2 className="mb-3 text-sm font-semibold text-ink-800">{title}</h2>
      {children}
    </section>
  );
}

/** One order on the desk: where it stands, its moves, its tests against their limits, the traveler, refunds and cancellation. */
export default async function DeskOrderPage({ params }: { params: Promise<{ shop: string; number: string }> }) {
  const { shop, number } = await params;
  const ctx = await requireShopPage(shop, "order:read-all", `/desk/${shop}/orders/${number}`);
  const data = await loadOrderPage(ctx.shop.id, number);
  if (!data) notFound();
  const { detail } = data;
  const o = detail.order;
  const mayMove = can(ctx.role, "order:update-status");
  const mayRefund = can(ctx.role, "order:refund");
  const limits = testLimitsOf(detail.arrangement, detail.requirement);
  const { left } = mayRefund ? await refundableOf(ctx.shop.id, o.quoteId) : { left: "0" };
  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={`/desk/${shop}/orders`} className="hover:underline">
          Orders
        </Link>{" "}
        / {o.number}
      </nav>
      <OrderSummary
        detail={detail}
        today={isoDay(new Date())}
        quoteHref={`/desk/${shop}/quotes/${detail.quoteNumber}`}
        certificateHref={data.certified ? `/api/v1/shops/${shop}/orders/${o.number}/certificate` : null}
        payments={data.payments}
        refunds={data.refunds}
      >
        <a
          href={`/api/v1/shops/${shop}/orders/${o.number}/traveler`}
          download
          className="inline-flex rounded-md bg-white px-4 py-2 text-sm font-medium ring-1 ring-ink-200 hover:bg-ink-50"
        >
          Build traveler (PDF)
        </a>
      </OrderSummary>

      <div className="grid gap-4 lg:grid-cols-2">
        <div className="space-y-4">
          {mayMove ? (
            <Panel title="Move the order">
              <MoveForm key={o.status} shop={shop} number={o.number} from={o.status} moves={allowedMoves(o).filter((m) => m !== "cancelled")} />
            </Panel>
          ) : null}
          {mayMove && isCancellable(o) ? (
            <Panel title="Cancel before kitting">
              <CancelForm
                shop={shop}
                number={o.number}
                from={o.status}
                paid={formatMoney(o.amountPaid, o.currency)}
                mayRefund={mayRefund && new Dec(left).greaterThan(0)}
              />
            </Panel>
          ) : null}
          {mayRefund && new Dec(left).greaterThan(0) ? (
            <Panel title="Refund">
              <RefundForm shop={shop} number={o.number} left={left} currency={o.currency} />
            </Panel>
          ) : null}
          <OrderTimeline status={o.status} entries={data.history} showActors />
        </div>
        <div className="space-y-4">
          <Panel title="Acceptance tests">
            <div className="space-y-4">
              <TestLimitsTable limits={limits} technology={detail.arrangement.cell.technology} />
              {mayMove && o.status === "testing" ? (
                <TestForm shop={shop} number={o.number} quantity={o.quantity} positions={limits.positions} holdMinutes={limits.minHoldMinutes} />
              ) : (
                <p className="text-sm text-ink-600">Tests are recorded while the order is in testing.</p>
              )}
              <TestResults quantity={o.quantity} tests={data.tests} />
            </div>
          </Panel>
        </div>
      </div>
    </div>
  );
}
