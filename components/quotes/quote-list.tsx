import Link from "next/link";
import { ListView } from "@/components/ui/list-controls";
import type { Page } from "@/db/queries/paging";
import type { QuoteListRow } from "@/db/queries/quotes";
import { formatMoney } from "@/lib/pricing";
import type { ListState } from "@/lib/validation/list-query";
import type { QuoteListQuery } from "@/lib/validation/lists";
import { QUOTE_LIST_STATUSES, QUOTE_STATUS_LABELS } from "@/lib/vocabulary";
import { QuoteStatusBadge } from "./quote-status";

/**
 * The quote list, as the desk shows every quote of the shop (with its customer) and as the
 * storefront shows a customer their own (with each PDF). Rows link to the quote on the same side.
 */
export function QuoteList({
  shop,
  side,
  q,
  page,
  state,
}: {
  shop: string;
  side: "desk" | "storefront";
  q: QuoteListQuery;
  page: Page<QuoteListRow>;
  state: ListState;
}) {
  const desk = side === "desk";
  const base = desk ? `/desk/${shop}/quotes` : `/s/${shop}/quotes`;
  return (
    <ListView
      state={state}
      caption={desk ? "Quotes" : "My quotes"}
      empty={{
        none: desk
          ? "No quotes yet: they appear here when a customer chooses an arrangement."
          : "No quotes yet: describe a bank on the storefront and choose an arrangement to get one.",
        noMatch: "No quotes match.",
      }}
      filters={[
        { name: "q", label: desk ? "Number or customer" : "Quote number", value: q.q },
        {
          name: "status",
          label: "Status",
          value: q.status,
          options: [{ value: "all", label: "All" }, ...QUOTE_LIST_STATUSES.map((s) => ({ value: s, label: QUOTE_STATUS_LABELS[s] }))],
        },
      ]}
      columns={[
        { label: "Quote", sortKey: "number" },
        ...(desk ? [{ label: "Customer", sortKey: "customer" }] : []),
        { label: "Status", sortKey: "status" },
        { label: "Banks", align: "right" as const },
        { label: "Total", sortKey: "total", align: "right" as const },
        { label: "Valid until", sortKey: "validUntil" },
        { label: "Issued", sortKey: "created" },
        ...(desk ? [] : [{ label: "PDF" }]),
      ]}
    >
      {page.rows.map((r) => (
        <tr key={r.id} className="border-t border-ink-100" data-testid={desk ? `desk-quote-${r.number}` : `quote-row-${r.number}`}>
          <td className="whitespace-nowrap px-3 py-2">
            <Link href={`${base}/${r.number}`} className="font-medium text-copper-700 hover:underline">
              {r.number}
            </Link>
            <span className="ml-1 text-ink-500">r{r.revision}</span>
          </td>
          {desk ? (
            <td className="px-3 py-2">
              {r.customerName}
              <span className="block text-xs text-ink-500">{r.customerEmail}</span>
            </td>
          ) : null}
          <td className="px-3 py-2">
            <QuoteStatusBadge status={r.status} />
            {r.changeRequestedAt && r.status !== "accepted" ? <span className="mt-1 block text-xs font-medium text-hazard-700">Change asked for</span> : null}
          </td>
          <td className="num px-3 py-2 text-right">{r.quantity}</td>
          <td className="num whitespace-nowrap px-3 py-2 text-right">{formatMoney(r.total, r.currency)}</td>
          <td className="num whitespace-nowrap px-3 py-2">{r.validUntil}</td>
          <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{r.createdAt.toISOString().slice(0, 10)}</td>
          {desk ? null : (
            <td className="px-3 py-2">
              <a href={`/api/v1/shops/${shop}/quotes/${r.number}/pdf`} download className="text-copper-700 hover:underline" aria-label={`PDF of ${r.number}`}>
                PDF
              </a>
            </td>
          )}
        </tr>
      ))}
    </ListView>
  );
}
