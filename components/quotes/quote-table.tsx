"use client";
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { flexRender, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { usePathname, useSearchParams } from "next/navigation";
import { fetchJson } from "@/lib/http/fetch-json";
import { quoteListQuerySchema, type QuoteListQuery } from "@/lib/validation/quote";
import { quoteColumns, type QuoteListItem } from "./quote-columns";

interface Page {
  rows: QuoteListItem[];
  total: number;
}

/**
 * Quotes fetched in the client from GET /api/v1/shops/{shop}/quotes; page, sort and filter live in
 * the URL, so a reload or a shared link shows the same list. The server renders the first page.
 */
export function QuoteTable({ shop, initial, initialQuery, showCustomer = false }: { shop: string; initial: Page; initialQuery: QuoteListQuery; showCustomer?: boolean }) {
  const pathname = usePathname();
  const search = useSearchParams();
  const q = quoteListQuerySchema.parse(Object.fromEntries(search.entries()));
  const qs = new URLSearchParams({ q: q.q, status: q.status, sort: q.sort, dir: q.dir, page: String(q.page), size: String(q.size) }).toString();
  const isInitial = JSON.stringify(q) === JSON.stringify(initialQuery);
  const { data, isFetching, error } = useQuery({
    queryKey: ["quotes", shop, qs],
    queryFn: () => fetchJson<Page>(`/api/v1/shops/${shop}/quotes?${qs}`),
    initialData: isInitial ? initial : undefined,
    placeholderData: keepPreviousData,
  });

  const setQuery = (change: Partial<QuoteListQuery>) => {
    const next = { ...q, ...change };
    const params = new URLSearchParams();
    if (next.q) params.set("q", next.q);
    if (next.status !== "all") params.set("status", next.status);
    if (next.sort !== "created") params.set("sort", next.sort);
    if (next.dir !== "desc") params.set("dir", next.dir);
    if (next.page !== 1) params.set("page", String(next.page));
    if (next.size !== 20) params.set("size", String(next.size));
    const s = params.toString();
    // the URL changes without a server round trip; the query below refetches from the route handler
    window.history.pushState(null, "", s ? `${pathname}?${s}` : pathname);
  };

  const rows = data?.rows ?? [];
  const total = data?.total ?? 0;
  const table = useReactTable({
    data: rows,
    columns: quoteColumns(shop, showCustomer),
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    rowCount: total,
  });
  const pages = Math.max(1, Math.ceil(total / q.size));

  return (
    <div className="space-y-3">
      <form
        role="search"
        className="flex flex-wrap items-end gap-3 rounded-lg bg-white p-4 ring-1 ring-ink-100"
        onSubmit={(e) => {
          e.preventDefault();
          const f = new FormData(e.currentTarget);
          setQuery({ q: String(f.get("q") ?? ""), status: quoteListQuerySchema.shape.status.parse(f.get("status")), page: 1 });
        }}
      >
        <div>
          <label htmlFor="quote-q" className="block text-xs font-medium text-ink-700">
            Quote number{showCustomer ? " or customer" : ""}
          </label>
          <input id="quote-q" name="q" defaultValue={q.q} className="mt-1 rounded-md border border-ink-200 px-3 py-1.5 text-sm" />
        </div>
        <div>
          <label htmlFor="quote-status" className="block text-xs font-medium text-ink-700">
            Status
          </label>
          <select id="quote-status" name="status" defaultValue={q.status} className="mt-1 rounded-md border border-ink-200 px-3 py-1.5 text-sm">
            <option value="all">All</option>
            <option value="issued">Issued</option>
            <option value="accepted">Accepted</option>
            <option value="expired">Expired</option>
            <option value="withdrawn">Withdrawn</option>
          </select>
        </div>
        <button className="rounded-md bg-ink-800 px-3 py-1.5 text-sm text-white">Filter</button>
        {isFetching ? <span className="text-xs text-ink-500" role="status">Loading…</span> : null}
      </form>
      {error ? (
        <p role="alert" className="rounded-md bg-danger-100 px-3 py-2 text-sm text-danger-700">
          {error.message}
        </p>
      ) : null}
      <div className="overflow-x-auto rounded-lg bg-white ring-1 ring-ink-100">
        <table className="w-full text-sm" data-testid="quote-table">
          <thead className="bg-ink-50 text-ink-700">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sortable = h.column.getCanSort();
                  const active = q.sort === h.column.id;
                  return (
                    <th key={h.id} scope="col" aria-sort={active ? (q.dir === "asc" ? "ascending" : "descending") : undefined} className="px-3 py-2 text-left font-medium">
                      {sortable ? (
                        <button
                          type="button"
                          className="inline-flex items-center gap-1 hover:underline"
                          onClick={() => setQuery({ sort: quoteListQuerySchema.shape.sort.parse(h.column.id), dir: active && q.dir === "asc" ? "desc" : "asc", page: 1 })}
                        >
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden className="text-ink-400">
                            {active ? (q.dir === "asc" ? "▲" : "▼") : "↕"}
                          </span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={table.getAllLeafColumns().length} className="px-3 py-6 text-center text-ink-500">
                  No quotes yet.
                </td>
              </tr>
            ) : (
              table.getRowModel().rows.map((row) => (
                <tr key={row.id} className="border-t border-ink-100" data-testid={`quote-row-${row.original.number}`}>
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      <nav aria-label="Pages" className="flex items-center justify-between text-sm text-ink-600">
        <span>
          {total === 0 ? 0 : (q.page - 1) * q.size + 1}–{Math.min(total, q.page * q.size)} of {total}
        </span>
        <span className="flex items-center gap-2">
          <button type="button" disabled={q.page <= 1} onClick={() => setQuery({ page: q.page - 1 })} className="rounded px-2 py-1 ring-1 ring-ink-200 hover:bg-ink-100 disabled:opacity-40">
            Previous
          </button>
          <span>
            Page {q.page} of {pages}
          </span>
          <button type="button" disabled={q.page >= pages} onClick={() => setQuery({ page: q.page + 1 })} className="rounded px-2 py-1 ring-1 ring-ink-200 hover:bg-ink-100 disabled:opacity-40">
            Next
          </button>
        </span>
      </nav>
    </div>
  );
}
