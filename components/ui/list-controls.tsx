import Link from "next/link";

type Params = Record<string, string | number | undefined>;

export function hrefWith(base: string, params: Params, change: Params) {
  const merged = { ...params, ...change };
  const qs = new URLSearchParams();
  for (const [k, v] of Object.entries(merged)) if (v !== undefined && v !== "") qs.set(k, String(v));
  const s = qs.toString();
  return s ? `${base}?${s}` : base;
}

/** A column header that sorts by its key through the URL (server-rendered lists). */
export function SortHeader({ base, params, sortKey, label, sort, dir }: { base: string; params: Params; sortKey: string; label: string; sort: string; dir: "asc" | "desc" }) {
  const active = sort === sortKey;
  const nextDir = active && dir === "asc" ? "desc" : "asc";
  return (
    <th scope="col" aria-sort={active ? (dir === "asc" ? "ascending" : "descending") : "none"} className="px-3 py-2 text-left font-medium">
      <Link href={hrefWith(base, params, { sort: sortKey, dir: nextDir, page: 1 })} className="inline-flex items-center gap-1 hover:underline">
        {label}
        <span aria-hidden className="text-ink-400">{active ? (dir === "asc" ? "▲" : "▼") : "↕"}</span>
      </Link>
    </th>
  );
}

export function Pager({ base, params, page, size, total }: { base: string; params: Params; page: number; size: number; total: number }) {
  const pages = Math.max(1, Math.ceil(total / size));
  const from = total === 0 ? 0 : (page - 1) * size + 1;
  const to = Math.min(total, page * size);
  return (
    <nav aria-label="Pages" className="flex items-center justify-between text-sm text-ink-600">
      <span>
        {from}–{to} of {total}
      </span>
      <span className="flex gap-2">
        {page > 1 ? <Link className="rounded px-2 py-1 ring-1 ring-ink-200 hover:bg-ink-100" href={hrefWith(base, params, { page: page - 1 })}>Previous</Link> : null}
        <span>
          Page {page} of {pages}
        </span>
        {page < pages ? <Link className="rounded px-2 py-1 ring-1 ring-ink-200 hover:bg-ink-100" href={hrefWith(base, params, { page: page + 1 })}>Next</Link> : null}
      </span>
    </nav>
  );
}

export type FilterField =
  | { name: string; label: string; value: string }
  | { name: string; label: string; value: string; options: { value: string; label: string }[] };

/** The filter bar of a server-rendered list: a GET form that keeps the current sort. */
export function FilterForm({ fields, sort, dir }: { fields: FilterField[]; sort: string; dir: string }) {
  const control = "mt-1 rounded-md border border-ink-200 px-3 py-1.5 text-sm";
  return (
    <form method="get" role="search" className="flex flex-wrap items-end gap-3 rounded-lg bg-white p-4 ring-1 ring-ink-100">
      {fields.map((f) => (
        <div key={f.name}>
          <label htmlFor={f.name} className="block text-xs font-medium text-ink-700">{f.label}</label>
          {"options" in f ? (
            <select id={f.name} name={f.name} defaultValue={f.value} className={control}>
              {f.options.map((o) => (
                <option key={o.value} value={o.value}>{o.label}</option>
              ))}
            </select>
          ) : (
            <input id={f.name} name={f.name} defaultValue={f.value} className={control} />
          )}
        </div>
      ))}
      <input type="hidden" name="sort" value={sort} />
      <input type="hidden" name="dir" value={dir} />
      <button className="rounded-md bg-ink-800 px-3 py-1.5 text-sm text-white">Filter</button>
    </form>
  );
}

export interface ListColumn {
  label: string;
  /** present when the list can be sorted by this column */
  sortKey?: string;
  align?: "left" | "right";
}

/** The table of a server-rendered list: headers that sort through the URL, rows as children. */
export function ListTable({ base, params, sort, dir, columns, children }: { base: string; params: Params; sort: string; dir: "asc" | "desc"; columns: ListColumn[]; children: React.ReactNode }) {
  return (
    <div className="overflow-x-auto rounded-lg bg-white ring-1 ring-ink-100">
      <table className="w-full text-sm">
        <thead className="bg-ink-50 text-ink-700">
          <tr>
            {columns.map((c) =>
              c.sortKey ? (
                <SortHeader key={c.label} base={base} params={params} sortKey={c.sortKey} label={c.label} sort={sort} dir={dir} />
              ) : (
                <th key={c.label} scope="col" className={`px-3 py-2 font-medium ${c.align === "right" ? "text-right" : "text-left"}`}>
                  {c.label}
                </th>
              ),
            )}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}
