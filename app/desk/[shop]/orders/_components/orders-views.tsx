import Link from "next/link";

/** The two ways to look at the shop's orders: the board by stage, or the sortable list. */
export function OrdersViews({ shop, current }: { shop: string; current: "board" | "list" }) {
  const tab = (active: boolean) =>
    `rounded-md px-3 py-1.5 text-sm font-medium ${active ? "bg-ink-800 text-white" : "text-ink-700 ring-1 ring-ink-200 hover:bg-ink-50"}`;
  return (
    <nav aria-label="Order views" className="flex gap-2">
      <Link href={`/desk/${shop}/orders`} className={tab(current === "board")} aria-current={current === "board" ? "page" : undefined}>
        Board
      </Link>
      <Link href={`/desk/${shop}/orders/list`} className={tab(current === "list")} aria-current={current === "list" ? "page" : undefined}>
        List
      </Link>
    </nav>
  );
}
