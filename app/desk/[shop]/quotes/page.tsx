import type { Metadata } from "next";
import Link from "next/link";
import { FilterForm, ListTable, Pager } from "@/components/ui/list-controls";
import { listQuotes } from "@/db/queries/quotes";
import { requireShopPage } from "@/lib/auth/guards";
import { formatMoney } from "@/lib/pricing";
import { quoteListQuerySchema } from "@/lib/validation/quote";
import { QUOTE_STATUS_LABELS } from "@/lib/vocabulary";

export const metadata: Metadata = { title: "Quotes" };


export default async function DeskQuotesPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<Record<string, string>> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "quote:read-all");
  const q = quoteListQuerySchema.parse(await searchParams);
  const { rows, total } = await listQuotes(ctx.shop.id, { all: true }, q);
  const base = `/desk/${shop}/quotes`;
  const keep = { q: q.q, status: q.status === "all" ? undefined : q.status, sort: q.sort, dir: q.dir, size: q.size === 20 ? undefined : q.size };
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold">Quotes</h1>
        <p className="mt-1 text-sm text-ink-600">Every quote {ctx.shop.name} has issued, with its current revision, total and validity.</p>
      </div>
      <FilterForm
        fields={[
          { name: "q", label: "Number or customer", value: q.q },
          { name: "status", label: "Status", value: q.status, options: [{ value: "all", label: "All" }, { value: "issued", label: "Issued" }, { value: "accepted", label: "Accepted" }, { value: "expired", label: "Expired" }, { value: "withdrawn", label: "Withdrawn" }] }
        ]}
        sort={q.sort}
        dir={q.dir}
      />
      <ListTable
        base={base} params={keep} sort={q.sort} dir={q.dir}
        columns={[
          { label: "Quote", sortKey: "number" },
          { label: "Customer" },
          { label: "Status" },
          { label: "Banks", align: "right" },
          { label: "Total", sortKey: "total" },
          { label: "Valid until", sortKey: "validUntil" },
          { label: "Issued", sortKey: "created" },
        ]}
      >
            {rows.length === 0 ? (
              <tr>
                <td colSpan={7} className="px-3 py-6 text-center text-ink-500">No quotes match.</td>
              </tr>
            ) : (
              rows.map((r) => (
                <tr key={r.id} className="border-t border-ink-100" data-testid={`desk-quote-${r.number}`}>
                  <td className="px-3 py-2">
                    <Link href={`/s/${shop}/quotes/${r.number}`} className="font-medium text-copper-700 hover:underline">{r.number}</Link>
                    <span className="ml-1 text-ink-500">r{r.revision}</span>
                  </td>
                  <td className="px-3 py-2">
                    {r.customerName}
                    <span className="block text-xs text-ink-500">{r.customerEmail}</span>
                  </td>
                  <td className="px-3 py-2">{QUOTE_STATUS_LABELS[r.status]}</td>
                  <td className="num px-3 py-2 text-right">{r.quantity}</td>
                  <td className="num px-3 py-2">{formatMoney(r.total, r.currency)}</td>
                  <td className="num px-3 py-2">{r.validUntil}</td>
                  <td className="num px-3 py-2 text-ink-600">{r.createdAt.toISOString().slice(0, 10)}</td>
                </tr>
              ))
            )}
          </ListTable>
      <Pager base={base} params={keep} page={q.page} size={q.size} total={total} />
    </div>
  );
}
