"use client";
import { flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { useMemo, useState } from "react";
import type { PricedOption } from "@/lib/quoting/types";
import { optionId } from "@/lib/validation/quote";
import { arrangementLabel } from "@/lib/vocabulary";
import { optionColumns } from "./option-columns";

/** Most options side by side. */
export const MAX_COMPARED = 4;

/** The options as a sortable table; a row's radio (or a click on the row) puts it in focus. */
export function OptionTable({
  options,
  currency,
  focus,
  onFocus,
  compare,
  onCompareChange,
  rankedBy = "price",
}: {
  options: PricedOption[];
  /** the order the options arrive in: the table starts sorted that way, and says so (aria-sort) */
  rankedBy?: "price" | "life";
  currency: string;
  focus: string | null;
  onFocus: (id: string) => void;
  /** the options picked for the side-by-side comparison (at most MAX_COMPARED) */
  compare: string[];
  onCompareChange: (id: string, picked: boolean) => void;
}) {
  const [sorting, setSorting] = useState<SortingState>(() => [rankedBy === "life" ? { id: "life", desc: true } : { id: "price", desc: false }]);
  const columns = useMemo(() => optionColumns(currency), [currency]);
  const table = useReactTable({
    data: options,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    // a column is always sorted one way or the other; ties keep the ranking's order (the rows' index)
    enableSortingRemoval: false,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getRowId: optionId,
  });
  return (
    <div>
      <p className="mb-1 text-xs text-ink-600 md:hidden" aria-hidden="true">
        The table scrolls sideways: swipe it for energy, ESR, mass, lead time and price →
      </p>
      {/* a scrolling region takes focus, so a keyboard can scroll it */}
      <div
        role="region"
        aria-label="Arrangements (the table scrolls sideways)"
        tabIndex={0}
        className="scroll-cue relative rounded-lg shadow-sm ring-1 ring-ink-100"
        data-testid="options-table-frame"
      >
        <table className="min-w-full text-left text-sm" data-testid="options-table">
          <caption className="sr-only">Arrangements; sort by a column heading, choose a row to see its diagram and charts</caption>
          <thead className="border-b border-ink-100 bg-ink-50 text-[11px] uppercase tracking-wide text-ink-600">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                <th scope="col" className="px-2 py-2">
                  <span className="sr-only">Focus</span>
                </th>
                {hg.headers.map((h) => {
                  const dir = h.column.getIsSorted();
                  return (
                    <th
                      key={h.id}
                      scope="col"
                      aria-sort={dir === "asc" ? "ascending" : dir === "desc" ? "descending" : "none"}
                      className="px-2 py-2 font-medium"
                    >
                      <button
                        type="button"
                        onClick={h.column.getToggleSortingHandler()}
                        className="inline-flex items-center gap-1 text-left uppercase hover:text-ink-900"
                      >
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden="true" className="text-ink-500">
                          {dir === "asc" ? "▲" : dir === "desc" ? "▼" : "↕"}
                        </span>
                      </button>
                    </th>
                  );
                })}
                <th scope="col" className="px-2 py-2 font-medium">
                  Compare
                </th>
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-ink-100">
            {table.getRowModel().rows.map((row) => {
              const focused = row.id === focus;
              const o = row.original;
              return (
                <tr
                  key={row.id}
                  onClick={() => onFocus(row.id)}
                  className={`cursor-pointer ${focused ? "bg-copper-50" : "hover:bg-ink-50"}`}
                  aria-selected={focused}
                  data-option={row.id}
                >
                  <td className="px-2 py-2">
                    <input
                      type="radio"
                      name="focused-option"
                      checked={focused}
                      onChange={() => onFocus(row.id)}
                      aria-label={`Focus ${o.cell.sku} ${arrangementLabel(o)}`}
                      className="accent-copper-500"
                    />
                  </td>
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-2 py-2 align-top">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                  <td className="px-2 py-2 align-top" onClick={(e) => e.stopPropagation()}>
                    <input
                      type="checkbox"
                      checked={compare.includes(row.id)}
                      disabled={!compare.includes(row.id) && compare.length >= MAX_COMPARED}
                      onChange={(e) => onCompareChange(row.id, e.target.checked)}
                      aria-label={`Compare ${o.cell.sku} ${arrangementLabel(o)}`}
                      className="h-4 w-4 accent-copper-500"
                    />
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </div>
  );
}
