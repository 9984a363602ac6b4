"use client";
import { createColumnHelper } from "@tanstack/react-table";
import Link from "next/link";
import type { QuoteListRow } from "@/db/queries/quotes";
import { formatMoney } from "@/lib/pricing";
import { QUOTE_STATUS_LABELS } from "@/lib/vocabulary";

/** A quote row as it arrives in JSON (dates as strings). */
export type QuoteListItem = Omit<QuoteListRow, "createdAt"> & { createdAt: string };


const column = createColumnHelper<QuoteListItem>();

/** Columns of the quote list; the ids match the sort keys the route takes. */
export function quoteColumns(shop: string, showCustomer: boolean) {
  return [
    column.accessor("number", {
      id: "number",
      header: "Quote",
      cell: (c) => (
        <Link href={`/s/${shop}/quotes/${c.getValue()}`} className="font-medium text-copper-700 hover:underline">
          {c.getValue()}
        </Link>
      ),
    }),
    column.accessor("revision", { id: "revision", header: "Revision", enableSorting: false, cell: (c) => `r${c.getValue()}` }),
    ...(showCustomer ? [column.accessor("customerName", { id: "customer", header: "Customer", enableSorting: false })] : []),
    column.accessor("status", { id: "status", header: "Status", enableSorting: false, cell: (c) => QUOTE_STATUS_LABELS[c.getValue()] }),
    column.accessor("quantity", { id: "quantity", header: "Banks", enableSorting: false }),
    column.accessor("total", { id: "total", header: "Total", cell: (c) => <span className="num">{formatMoney(c.getValue(), c.row.original.currency)}</span> }),
    column.accessor("validUntil", { id: "validUntil", header: "Valid until", cell: (c) => <span className="num">{c.getValue()}</span> }),
    column.accessor("createdAt", { id: "created", header: "Issued", cell: (c) => <span className="num">{c.getValue().slice(0, 10)}</span> }),
  ];
}
