import "server-only";
import { ilike, or, sql, type AnyColumn, type SQL, type SQLWrapper } from "drizzle-orm";
import type { SortDir } from "@/lib/validation/list-query";

/**
 * The paging helpers every list query uses: a sort key is looked up in the query's own whitelist of
 * columns (never taken from the URL as SQL), ties are broken by the query's stable keys, the filtered
 * set is counted and the asked page is read — the last page when the URL asked beyond it.
 */

export interface Page<T> {
  rows: T[];
  /** rows in the filtered set */
  total: number;
  /** the page read (the last one when the asked page is beyond it) */
  page: number;
  size: number;
}

/** ORDER BY the whitelisted column for `sort` in `dir` (empty values last), then the tie-breakers. */
export function sortedBy<S extends string>(columns: Record<S, SQLWrapper>, q: { sort: S; dir: SortDir }, ...ties: SQL[]): SQL[] {
  const column = columns[q.sort];
  return [q.dir === "asc" ? sql`${column} asc nulls last` : sql`${column} desc nulls last`, ...ties];
}

/** A status column ranked in the given order (what needs attention first) rather than alphabetically. */
export function ranked(column: AnyColumn, order: readonly string[]): SQL {
  return sql`(case ${column} ${sql.join(
    order.map((value, i) => sql`when ${value} then ${i}`),
    sql` `,
  )} else ${order.length} end)`;
}

/** Case-insensitive "contains" over any of the columns; no condition for an empty search. */
export function containsText(text: string, ...columns: AnyColumn[]): SQL | undefined {
  if (!text) return undefined;
  const like = `%${text.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
  return or(...columns.map((c) => ilike(c, like)));
}

/** Counts the filtered set, then reads the asked page (or the last one). */
export async function readPage<T>(
  q: { page: number; size: number },
  count: () => Promise<{ n: number }[]>,
  read: (limit: number, offset: number) => Promise<T[]>,
): Promise<Page<T>> {
  const total = (await count())[0]?.n ?? 0;
  const page = Math.min(q.page, Math.max(1, Math.ceil(total / q.size)));
  const rows = total === 0 ? [] : await read(q.size, (page - 1) * q.size);
  return { rows, total, page, size: q.size };
}
