import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { OrderList } from "@/components/orders/order-list";
import { PageHeader } from "@/components/ui/page-header";
import { listOrders } from "@/db/queries/orders";
import { requireShopPage } from "@/lib/auth/guards";
import { ownerScope, reads } from "@/lib/auth/ownership";
import { isoDay } from "@/lib/orders/due-date";
import { orderList } from "@/lib/validation/lists";

export const metadata: Metadata = { title: "My orders" };

/** A customer's own orders. Staff follow the shop's orders on the desk. */
export default async function MyOrdersPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, reads("order"), `/s/${shop}/orders`);
  const scope = ownerScope(ctx, "order");
  if (scope.all) redirect(`/desk/${shop}/orders`);
  const { query: q } = orderList.parse(await searchParams);
  const today = isoDay(new Date());
  const page = await listOrders(ctx.shop.id, scope, q, today);
  return (
    <div className="space-y-6">
      <PageHeader title="My orders">Every order you have placed with {ctx.shop.name}, where it stands and when it is due.</PageHeader>
      <OrderList shop={shop} side="storefront" q={q} page={page} state={orderList.state(`/s/${shop}/orders`, q, page)} today={today} />
    </div>
  );
}
