import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { listBoardOrders } from "@/db/queries/orders";
import { requireShopPage } from "@/lib/auth/guards";
import { isoDay } from "@/lib/orders/due-date";
import { isLate } from "@/lib/orders/stages";
import { OrderBoard } from "./_components/order-board";
import { OrdersViews } from "./_components/orders-views";

export const metadata: Metadata = { title: "Orders board" };

/** The orders board: every order on the floor by stage, and those closed in the last 30 days. */
export default async function OrdersBoardPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "order:read-all", `/desk/${shop}/orders`);
  const today = isoDay(new Date());
  const { rows, more } = await listBoardOrders(ctx.shop.id);
  const late = rows.filter((r) => isLate(r, today)).length;
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <PageHeader title="Orders">
          Paid orders through kitting, assembly, test and shipping. {late > 0 ? `${late} late: past their due date and still on the floor.` : "None is late."}
        </PageHeader>
        <OrdersViews shop={shop} current="board" />
      </div>
      {more ? (
        <p className="text-sm text-ink-600">The board shows the first {rows.length} orders by due date; the list view pages through all of them.</p>
      ) : null}
      <OrderBoard shop={shop} rows={rows} today={today} />
    </div>
  );
}
