import { z } from "zod";
import { NUL_MESSAGE, hasNul } from "./text";
import { MAX_LIST_SEARCH_LENGTH } from "./limits";

/**
 * The one list-query parser. Every list (the desk's catalog, requests, quotes, team and outbox, and
 * a customer's quotes) keeps its search, filters, sort, direction, page and page size in the URL and
 * reads them through a list definition made here. Reading never throws: a value that is missing,
 * malformed or hostile falls back to the list's default, and is reported in `issues` so that a JSON
 * route handler can answer 400 while a page simply shows the default.
 */

export type SortDir = "asc" | "desc";

export const MAX_PAGE = 10_000;
export const MAX_PAGE_SIZE = 100;

type Choices = Record<string, readonly [string, ...string[]]>;
/** Filters whose values are not a fixed list (an action, a person's id): each value must match its shape. */
type OpenChoices = Record<string, RegExp>;

interface ListSpec<F extends Choices, S extends string, O extends OpenChoices> {
  /** whether the list has a search box (`q`) */
  search: boolean;
  /** each filter's values; the first is the default (usually "all") */
  filters: F;
  /** open filters: absent (no filter) by default; a value must match the pattern, whole */
  open?: O;
  /** each sort key with the direction its first click sorts in (the useful one for that column) */
  sorts: Record<S, SortDir>;
  /** the sort a list opens with, in its first-click direction */
  sort: NoInfer<S>;
  /** rows per page when the URL does not say */
  size: number;
}

type ListQuery<F extends Choices, S extends string, O extends OpenChoices> = { q: string; sort: S; dir: SortDir; page: number; size: number } & {
  -readonly [K in keyof F]: F[K][number];
} & {
  /** "" when the list is not filtered by it */
  -readonly [K in keyof O]: string;
};

interface ListIssue {
  path: string;
  message: string;
}

/** What the table shell needs to draw a list's filter form, sortable headers and pager. */
export interface ListState {
  /** the list's own address, e.g. /desk/kestrel-bank-works/quotes */
  base: string;
  /** the URL's values that differ from the defaults: links and the filter form keep them */
  params: Record<string, string>;
  sort: string;
  dir: SortDir;
  /** each sortable key's first-click direction */
  firstDirs: Record<string, SortDir>;
  /** the page shown (the last one when the URL asked beyond it) */
  page: number;
  size: number;
  total: number;
  /** whether a search or a filter narrows the list */
  narrowed: boolean;
}

/** Search text as a list uses it: no control characters (PostgreSQL text cannot hold NUL), trimmed, bounded. */
function cleanSearch(raw: string): string {
  return (
    raw
      // eslint-disable-next-line no-control-regex
      .replace(/[\u0000-\u001f\u007f]/g, " ")
      .trim()
      .slice(0, MAX_LIST_SEARCH_LENGTH)
      .trim()
  );
}

/** A URL value as one string: the first of repeated values; anything else is absent. */
function single(value: unknown): string | undefined {
  const v = Array.isArray(value) ? value[0] : value;
  return typeof v === "string" ? v : undefined;
}

function read(input: unknown, key: string): string | undefined {
  if (input instanceof URLSearchParams) return input.get(key) ?? undefined;
  if (typeof input !== "object" || input === null) return undefined;
  return single((input as Record<string, unknown>)[key]);
}

const whole = (max: number) =>
  z.coerce.number({ error: "Use a whole number." }).int("Use a whole number.").min(1, "Use a number from 1.").max(max, `Use a number up to ${max}.`);

export function defineList<const F extends Choices, const S extends string, const O extends OpenChoices = Record<never, RegExp>>(spec: ListSpec<F, S, O>) {
  type Q = ListQuery<F, S, O>;
  const open = Object.entries(spec.open ?? {});
  const sortKeys = Object.keys(spec.sorts) as [S, ...S[]];
  const fields: Record<string, z.ZodType> = {
    sort: z.enum(sortKeys, `Sort by one of: ${sortKeys.join(", ")}.`),
    dir: z.enum(["asc", "desc"], "Use asc or desc."),
    page: whole(MAX_PAGE),
    size: whole(MAX_PAGE_SIZE),
  };
  for (const [name, values] of Object.entries(spec.filters)) fields[name] = z.enum(values, `Use one of: ${values.join(", ")}.`);
  for (const [name, pattern] of open) {
    const whole = new RegExp(`^(?:${pattern.source})$`, pattern.flags.replace(/[gy]/g, ""));
    fields[name] = z.string().max(200, "Not a value this list takes.").regex(whole, "Not a value this list takes.");
  }

  const defaults = {
    q: "",
    sort: spec.sort,
    dir: spec.sorts[spec.sort],
    page: 1,
    size: spec.size,
    ...Object.fromEntries(Object.entries(spec.filters).map(([name, values]) => [name, values[0]])),
    ...Object.fromEntries(open.map(([name]) => [name, ""])),
  } as Q;

  /** Reads a list's URL (a page's searchParams, or a URLSearchParams): never throws. */
  function parse(input: unknown): { query: Q; issues: ListIssue[] } {
    const out: Record<string, unknown> = { ...defaults };
    const issues: ListIssue[] = [];
    if (spec.search) {
      const raw = read(input, "q") ?? "";
      out.q = cleanSearch(raw);
      // a page searches for the cleaned text; a JSON route says what was wrong with it
      if (hasNul(raw)) issues.push({ path: "q", message: NUL_MESSAGE });
    }
    for (const [name, schema] of Object.entries(fields)) {
      const raw = read(input, name);
      if (raw === undefined || raw.trim() === "") continue;
      const r = schema.safeParse(raw.trim());
      if (r.success) out[name] = r.data;
      else issues.push({ path: name, message: r.error.issues[0]?.message ?? "Not a value this list takes." });
    }
    // a sort without a direction sorts the useful way for that column
    if (read(input, "dir") === undefined || issues.some((i) => i.path === "dir")) out.dir = spec.sorts[out.sort as S];
    return { query: out as Q, issues };
  }

  /** The query's values that differ from the defaults, as URL parameters. */
  function params(q: Q): Record<string, string> {
    const p: Record<string, string> = {};
    if (q.q) p.q = q.q;
    for (const [name, values] of Object.entries(spec.filters)) {
      const v = (q as Record<string, unknown>)[name];
      if (v !== values[0]) p[name] = String(v);
    }
    for (const [name] of open) {
      const v = (q as Record<string, unknown>)[name];
      if (typeof v === "string" && v !== "") p[name] = v;
    }
    if (q.sort !== spec.sort) p.sort = q.sort;
    if (q.dir !== spec.sorts[q.sort]) p.dir = q.dir;
    if (q.page !== 1) p.page = String(q.page);
    if (q.size !== spec.size) p.size = String(q.size);
    return p;
  }

  /** The shell's state for a page of this list as the database returned it. */
  function state(base: string, q: Q, page: { page: number; size: number; total: number }): ListState {
    const shown = { ...q, page: page.page };
    const narrowed =
      q.q !== "" ||
      Object.entries(spec.filters).some(([name, values]) => (q as Record<string, unknown>)[name] !== values[0]) ||
      open.some(([name]) => (q as Record<string, unknown>)[name] !== "");
    return {
      base,
      params: params(shown),
      sort: q.sort,
      dir: q.dir,
      firstDirs: { ...spec.sorts },
      page: page.page,
      size: page.size,
      total: page.total,
      narrowed,
    };
  }

  /**
   * The list's URL parameters as a schema, for the API description: every one optional, with the
   * values each takes (parse() above is what reads them, forgivingly).
   */
  const querySchema = z.object({
    ...(spec.search ? { q: z.string().max(MAX_LIST_SEARCH_LENGTH).optional().meta({ description: "search text" }) } : {}),
    ...Object.fromEntries(
      Object.entries(spec.filters).map(([name, values]) => [
        name,
        z
          .enum(values)
          .optional()
          .meta({ description: `default ${values[0]}` }),
      ]),
    ),
    sort: z
      .enum(sortKeys)
      .optional()
      .meta({ description: `default ${spec.sort}` }),
    dir: z.enum(["asc", "desc"]).optional().meta({ description: "default: the column's useful direction" }),
    page: z.number().int().min(1).max(MAX_PAGE).optional().meta({ description: "default 1; past the last page answers the last page" }),
    size: z
      .number()
      .int()
      .min(1)
      .max(MAX_PAGE_SIZE)
      .optional()
      .meta({ description: `rows per page, default ${spec.size}` }),
  });

  return { spec, defaults, parse, params, state, querySchema };
}

/** A page of a list as a JSON route answers it: `{ rows, total, page, size }`. */
export function pageSchema<R extends z.ZodType>(row: R) {
  return z.object({
    rows: z.array(row),
    total: z.number().int().min(0).meta({ description: "rows in the filtered set" }),
    page: z.number().int().min(1).meta({ description: "the page read (the last one when the asked page is beyond it)" }),
    size: z.number().int().min(1),
  });
}

export type ListQueryOf<L extends { defaults: unknown }> = L["defaults"];
