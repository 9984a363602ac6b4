import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { listQuotes } from "@/db/queries/quotes";
import { requireShopPage } from "@/lib/auth/guards";
import { ownerScope, reads } from "@/lib/auth/ownership";
import { formatMoney } from "@/lib/pricing";
import { quoteList } from "@/lib/validation/lists";
import { QUOTE_STATUS_LABELS, QUOTE_STATUSES } from "@/lib/vocabulary";

export const metadata: Metadata = { title: "My quotes" };

/** A customer's own quotes, each with its PDF. Staff read the shop's quotes on the desk. */
export default async function MyQuotesPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<Record<string, string | string[]>> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, reads("quote"), `/s/${shop}/quotes`);
  const scope = ownerScope(ctx, "quote");
  if (scope.all) redirect(`/desk/${shop}/quotes`);
  const { query: q } = quoteList.parse(await searchParams);
  const page = await listQuotes(ctx.shop.id, scope, q);
  const state = quoteList.state(`/s/${shop}/quotes`, q, page);
  return (
    <div className="space-y-6">
      <PageHeader title="My quotes">
        Every quote {ctx.shop.name} has sent you, with its PDF. Signed in as {ctx.user.email}.
      </PageHeader>
      <ListView
        state={state}
        caption="My quotes"
        empty={{ none: "No quotes yet: describe a bank on the storefront and choose an arrangement to get one.", noMatch: "No quotes match." }}
        filters={[
          { name: "q", label: "Quote number", value: q.q },
          { name: "status", label: "Status", value: q.status, options: [{ value: "all", label: "All" }, ...QUOTE_STATUSES.map((s) => ({ value: s, label: QUOTE_STATUS_LABELS[s] }))] },
        ]}
        columns={[
          { label: "Quote", sortKey: "number" },
          { label: "Status", sortKey: "status" },
          { label: "Banks", align: "right" },
          { label: "Total", sortKey: "total", align: "right" },
          { label: "Valid until", sortKey: "validUntil" },
          { label: "Issued", sortKey: "created" },
          { label: "PDF" },
        ]}
      >
        {page.rows.map((r) => (
          <tr key={r.id} className="border-t border-ink-100" data-testid={`quote-row-${r.number}`}>
            <td className="whitespace-nowrap px-3 py-2">
              <Link href={`/s/${shop}/quotes/${r.number}`} className="font-medium text-copper-700 hover:underline">
                {r.number}
              </Link>
              <span className="ml-1 text-ink-500">r{r.revision}</span>
            </td>
            <td className="px-3 py-2">{QUOTE_STATUS_LABELS[r.status]}</td>
            <td className="num px-3 py-2 text-right">{r.quantity}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-right">{formatMoney(r.total, r.currency)}</td>
            <td className="num whitespace-nowrap px-3 py-2">{r.validUntil}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{r.createdAt.toISOString().slice(0, 10)}</td>
            <td className="px-3 py-2">
              <a href={`/api/v1/shops/${shop}/quotes/${r.number}/pdf`} download className="text-copper-700 hover:underline" aria-label={`PDF of ${r.number}`}>
                PDF
              </a>
            </td>
          </tr>
        ))}
      </ListView>
    </div>
  );
}
