import type { Metadata } from "next";
import Link from "next/link";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { listQuotes } from "@/db/queries/quotes";
import { requireShopPage } from "@/lib/auth/guards";
import { ownerScope } from "@/lib/auth/ownership";
import { formatMoney } from "@/lib/pricing";
import { quoteList } from "@/lib/validation/lists";
import { QUOTE_STATUS_LABELS, QUOTE_STATUSES } from "@/lib/vocabulary";

export const metadata: Metadata = { title: "Quotes" };

/** Every quote of the shop: staff read quotes here, on the desk (the storefront is the customer's). */
export default async function DeskQuotesPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<Record<string, string | string[]>> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "quote:read-all", `/desk/${shop}/quotes`);
  const { query: q } = quoteList.parse(await searchParams);
  const page = await listQuotes(ctx.shop.id, ownerScope(ctx, "quote"), q);
  const state = quoteList.state(`/desk/${shop}/quotes`, q, page);
  return (
    <div className="space-y-6">
      <PageHeader title="Quotes">Every quote {ctx.shop.name} has issued, with its current revision, total and validity.</PageHeader>
      <ListView
        state={state}
        caption="Quotes"
        empty={{ none: "No quotes yet: they appear here when a customer chooses an arrangement.", noMatch: "No quotes match." }}
        filters={[
          { name: "q", label: "Number or customer", value: q.q },
          { name: "status", label: "Status", value: q.status, options: [{ value: "all", label: "All" }, ...QUOTE_STATUSES.map((s) => ({ value: s, label: QUOTE_STATUS_LABELS[s] }))] },
        ]}
        columns={[
          { label: "Quote", sortKey: "number" },
          { label: "Customer", sortKey: "customer" },
          { label: "Status", sortKey: "status" },
          { label: "Banks", align: "right" },
          { label: "Total", sortKey: "total", align: "right" },
          { label: "Valid until", sortKey: "validUntil" },
          { label: "Issued", sortKey: "created" },
        ]}
      >
        {page.rows.map((r) => (
          <tr key={r.id} className="border-t border-ink-100" data-testid={`desk-quote-${r.number}`}>
            <td className="whitespace-nowrap px-3 py-2">
              <Link href={`/desk/${shop}/quotes/${r.number}`} className="font-medium text-copper-700 hover:underline">
                {r.number}
              </Link>
              <span className="ml-1 text-ink-500">r{r.revision}</span>
            </td>
            <td className="px-3 py-2">
              {r.customerName}
              <span className="block text-xs text-ink-500">{r.customerEmail}</span>
            </td>
            <td className="px-3 py-2">{QUOTE_STATUS_LABELS[r.status]}</td>
            <td className="num px-3 py-2 text-right">{r.quantity}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-right">{formatMoney(r.total, r.currency)}</td>
            <td className="num whitespace-nowrap px-3 py-2">{r.validUntil}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{r.createdAt.toISOString().slice(0, 10)}</td>
          </tr>
        ))}
      </ListView>
    </div>
  );
}
