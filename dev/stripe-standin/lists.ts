/**
 * Stripe's cursor paging: `limit` (1–100, default 10), `starting_after` (the page after an id) or
 * `ending_before` (the page before it), answered as `{ object: "list", data, has_more, url }`.
 * The items come in the list's own order (newest first for events and refunds).
 */
import { noSuch, paramError } from "./errors";
import { listJson, type Json, type JsonObject } from "./objects";
import type { Params } from "./params";

export interface Page<T> {
  items: T[];
  hasMore: boolean;
}

export function paginate<T extends { id: string }>(all: readonly T[], params: Params, objectName: string): Page<T> {
  const limit = params.limit === undefined ? 10 : (params.limit as number);
  if (!Number.isInteger(limit) || limit < 1 || limit > 100) throw paramError("Invalid limit: must be at least 1 and at most 100", "limit");
  const after = params.starting_after as string | undefined;
  const before = params.ending_before as string | undefined;
  if (after !== undefined && before !== undefined) {
    throw paramError("You may only specify one of these parameters: ending_before, starting_after.", "ending_before", "parameters_exclusive");
  }
  if (before !== undefined) {
    const at = all.findIndex((x) => x.id === before);
    if (at === -1) throw noSuch(objectName, before, "ending_before");
    const start = Math.max(0, at - limit);
    return { items: all.slice(start, at), hasMore: start > 0 };
  }
  let start = 0;
  if (after !== undefined) {
    const at = all.findIndex((x) => x.id === after);
    if (at === -1) throw noSuch(objectName, after, "starting_after");
    start = at + 1;
  }
  return { items: all.slice(start, start + limit), hasMore: start + limit < all.length };
}

export function pageJson<T>(page: Page<T>, toJson: (item: T) => JsonObject, url: string): JsonObject {
  return listJson(page.items.map(toJson) as Json[], page.hasMore, url);
}

/** `created` as an integer (exact second) or a range `{ gt, gte, lt, lte }`. */
export function matchesCreated(created: number, filter: Params[string] | undefined): boolean {
  if (filter === undefined) return true;
  if (typeof filter === "number") return created === filter;
  if (typeof filter !== "object" || Array.isArray(filter)) return true;
  const r = filter as Record<string, number>;
  return (
    (r.gt === undefined || created > r.gt) &&
    (r.gte === undefined || created >= r.gte) &&
    (r.lt === undefined || created < r.lt) &&
    (r.lte === undefined || created <= r.lte)
  );
}
