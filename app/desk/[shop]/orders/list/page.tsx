import type { Metadata } from "next";
import { OrderList } from "@/components/orders/order-list";
import { PageHeader } from "@/components/ui/page-header";
import { listOrders } from "@/db/queries/orders";
import { requireShopPage } from "@/lib/auth/guards";
import { isoDay } from "@/lib/orders/due-date";
import { orderList } from "@/lib/validation/lists";
import { OrdersViews } from "../_components/orders-views";

export const metadata: Metadata = { title: "Orders list" };

/** Every order of the shop as a list: searched, filtered by status and lateness, sorted and paged through the URL. */
export default async function OrdersListPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "order:read-all", `/desk/${shop}/orders/list`);
  const { query: q } = orderList.parse(await searchParams);
  const today = isoDay(new Date());
  const page = await listOrders(ctx.shop.id, { all: true }, q, today);
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <PageHeader title="Orders">Every order of the shop, soonest due first.</PageHeader>
        <OrdersViews shop={shop} current="list" />
      </div>
      <OrderList shop={shop} side="desk" q={q} page={page} state={orderList.state(`/desk/${shop}/orders/list`, q, page)} today={today} />
    </div>
  );
}
