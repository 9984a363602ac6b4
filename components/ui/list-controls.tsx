import Link from "next/link";
import type { ListState, SortDir } from "@/lib/validation/list-query";

/**
 * The table shell of every list: a filter form, headers that sort through the URL, the rows (given
 * by the page as <tr> elements) and a pager. All state lives in the URL (lib/validation/list-query.ts),
 * so a reload, the back button or a shared link shows the same list.
 */

type Params = Record<string, string | number | undefined>;

function hrefWith(base: string, params: Params, change: Params = {}): string {
  const merged = { ...params, ...change };
  const qs = new URLSearchParams();
  for (const [k, v] of Object.entries(merged)) if (v !== undefined && v !== "") qs.set(k, String(v));
  const s = qs.toString();
  return s ? `${base}?${s}` : base;
}

type FilterField =
  | { name: string; label: string; value: string; placeholder?: string }
  | { name: string; label: string; value: string; options: readonly { value: string; label: string }[] };

interface ListColumn {
  label: string;
  /** present when the list can be sorted by this column */
  sortKey?: string;
  align?: "left" | "right";
}

const control = "mt-1 block max-w-full rounded-md border border-ink-200 bg-white px-3 py-1.5 text-sm";

/** The filter bar: a GET form that keeps the sort and page size and starts again at page 1. */
function FilterForm({ state, fields }: { state: ListState; fields: FilterField[] }) {
  const names = new Set(fields.map((f) => f.name));
  const kept = Object.entries(state.params).filter(([k]) => !names.has(k) && k !== "page");
  return (
    <form method="get" action={state.base} role="search" className="flex flex-wrap items-end gap-3 rounded-lg bg-white p-4 ring-1 ring-ink-100">
      {fields.map((f) => (
        <div key={f.name} className="min-w-0">
          <label htmlFor={`filter-${f.name}`} className="block text-xs font-medium text-ink-700">
            {f.label}
          </label>
          {"options" in f ? (
            <select id={`filter-${f.name}`} name={f.name} defaultValue={f.value} className={control}>
              {f.options.map((o) => (
                <option key={o.value} value={o.value}>
                  {o.label}
                </option>
              ))}
            </select>
          ) : (
            <input id={`filter-${f.name}`} name={f.name} type="search" defaultValue={f.value} placeholder={f.placeholder} className={control} />
          )}
        </div>
      ))}
      {kept.map(([k, v]) => (
        <input key={k} type="hidden" name={k} value={v} />
      ))}
      <button className="rounded-md bg-ink-800 px-3 py-1.5 text-sm font-medium text-white hover:bg-ink-900">Filter</button>
      {state.narrowed ? (
        <Link href={hrefWith(state.base, Object.fromEntries(kept))} className="py-1.5 text-sm text-ink-600 hover:underline">
          Clear
        </Link>
      ) : null}
    </form>
  );
}

/** A column header that sorts through the URL: the first click sorts the useful way, the next turns it round. */
function SortHeader({ state, column, sortKey }: { state: ListState; column: ListColumn; sortKey: string }) {
  const active = state.sort === sortKey;
  const first: SortDir = state.firstDirs[sortKey] ?? "asc";
  const nextDir: SortDir = active ? (state.dir === "asc" ? "desc" : "asc") : first;
  const { page: _page, dir: _dir, ...rest } = state.params;
  return (
    <th
      scope="col"
      aria-sort={active ? (state.dir === "asc" ? "ascending" : "descending") : "none"}
      className={`px-3 py-2 font-medium ${column.align === "right" ? "text-right" : "text-left"}`}
    >
      <Link href={hrefWith(state.base, rest, { sort: sortKey, dir: nextDir })} className="inline-flex items-center gap-1 whitespace-nowrap hover:underline">
        {column.label}
        <span aria-hidden className="text-ink-500">
          {active ? (state.dir === "asc" ? "▲" : "▼") : "↕"}
        </span>
      </Link>
    </th>
  );
}

/** The table: sortable headers, the page's rows, or a line saying why there are none. */
function ListTable({
  state,
  columns,
  caption,
  empty,
  children,
}: {
  state: ListState;
  columns: ListColumn[];
  caption: string;
  empty: { none: string; noMatch: string };
  children: React.ReactNode;
}) {
  return (
    <div className="scroll-cue rounded-lg ring-1 ring-ink-100">
      <table className="w-full text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-ink-50 text-ink-700">
          <tr>
            {columns.map((c) =>
              c.sortKey ? (
                <SortHeader key={c.label} state={state} column={c} sortKey={c.sortKey} />
              ) : (
                <th key={c.label} scope="col" className={`whitespace-nowrap px-3 py-2 font-medium ${c.align === "right" ? "text-right" : "text-left"}`}>
                  {c.label}
                </th>
              ),
            )}
          </tr>
        </thead>
        <tbody>
          {state.total === 0 ? (
            <tr>
              <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-500">
                {state.narrowed ? empty.noMatch : empty.none}
              </td>
            </tr>
          ) : (
            children
          )}
        </tbody>
      </table>
    </div>
  );
}

/** Where in the list we are, with the previous and next pages. Says nothing for an empty list. */
function Pager({ state }: { state: ListState }) {
  if (state.total === 0) return null;
  const pages = Math.max(1, Math.ceil(state.total / state.size));
  const from = (state.page - 1) * state.size + 1;
  const to = Math.min(state.total, state.page * state.size);
  const link = "rounded px-2 py-1 ring-1 ring-ink-200 hover:bg-ink-100";
  return (
    <nav aria-label="Pages" className="flex flex-wrap items-center justify-between gap-2 text-sm text-ink-600">
      <span className="num">
        {from}–{to} of {state.total}
      </span>
      {pages > 1 ? (
        <span className="flex items-center gap-2">
          {state.page > 1 ? (
            <Link className={link} href={hrefWith(state.base, state.params, { page: state.page - 1 === 1 ? undefined : state.page - 1 })}>
              Previous
            </Link>
          ) : null}
          <span className="num">
            Page {state.page} of {pages}
          </span>
          {state.page < pages ? (
            <Link className={link} href={hrefWith(state.base, state.params, { page: state.page + 1 })}>
              Next
            </Link>
          ) : null}
        </span>
      ) : null}
    </nav>
  );
}

/** A whole list: filters, table and pager, in the one arrangement every list uses. */
export function ListView({
  state,
  filters,
  columns,
  caption,
  empty,
  children,
}: {
  state: ListState;
  filters: FilterField[];
  columns: ListColumn[];
  caption: string;
  empty: { none: string; noMatch: string };
  children: React.ReactNode;
}) {
  return (
    <div className="space-y-3">
      {filters.length > 0 ? <FilterForm state={state} fields={filters} /> : null}
      <ListTable state={state} columns={columns} caption={caption} empty={empty}>
        {children}
      </ListTable>
      <Pager state={state} />
    </div>
  );
}
