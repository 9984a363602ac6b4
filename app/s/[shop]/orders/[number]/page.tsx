import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { OrderSummary } from "@/components/orders/order-summary";
import { OrderTimeline } from "@/components/orders/order-timeline";
import { loadOrderPage } from "@/components/orders/order-page-data";
import { PaySection } from "@/components/orders/pay-section";
import { getShopSettings } from "@/db/queries/shops";
import { requireShopPage } from "@/lib/auth/guards";
import { maySee, ownerScope, reads } from "@/lib/auth/ownership";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { isoDay } from "@/lib/orders/due-date";
import { handlingRules } from "@/lib/orders/safety";

export async function generateMetadata({ params }: { params: Promise<{ number: string }> }) {
  return { title: `Order ${(await params).number}` };
}

/** One order as its customer follows it: where it stands, the timeline, payments, the certificate and how to handle the bank. */
export default async function CustomerOrderPage({ params }: { params: Promise<{ shop: string; number: string }> }) {
  const { shop, number } = await params;
  const ctx = await requireShopPage(shop, reads("order"), `/s/${shop}/orders/${number}`);
  if (ownerScope(ctx, "order").all) redirect(`/desk/${shop}/orders/${encodeURIComponent(number)}`);
  const data = await loadOrderPage(ctx.shop.id, number);
  if (!data || !maySee(ctx, "order", data.detail.order.customerUserId)) notFound();
  const { detail } = data;
  const o = detail.order;
  const settings = await getShopSettings(ctx.shop.id);
  const safety = handlingRules({
    technology: detail.arrangement.cell.technology,
    maxVoltage: detail.requirement.maxVoltage,
    safeVoltage: (settings?.designFactors ?? DEFAULT_DESIGN_FACTORS).safeVoltage,
    storedEnergy: detail.arrangement.storedEnergy,
  });
  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={`/s/${shop}/orders`} className="hover:underline">
          My orders
        </Link>{" "}
        / {o.number}
      </nav>
      <OrderSummary
        detail={detail}
        today={isoDay(new Date())}
        quoteHref={`/s/${shop}/quotes/${detail.quoteNumber}`}
        certificateHref={data.certified ? `/api/v1/shops/${shop}/orders/${o.number}/certificate` : null}
        payments={data.payments}
        refunds={data.refunds}
      />
      {!["cancelled", "refunded"].includes(o.status) ? <PaySection shop={ctx.shop} number={detail.quoteNumber} cancelled={false} onlyBalance /> : null}
      <OrderTimeline status={o.status} entries={data.history} showActors={false} />
      <section className="rounded-lg border-l-4 border-hazard-500 bg-hazard-100 p-4" aria-labelledby="handling-title">
        <h2 id="handling-title" className="text-sm font-semibold text-hazard-700">
          Handling the bank
        </h2>
        <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-ink-800">
          {safety.map((s) => (
            <li key={s}>{s}</li>
          ))}
        </ul>
      </section>
    </div>
  );
}
