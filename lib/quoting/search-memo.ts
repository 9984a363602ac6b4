/**
 * Recent priced searches, kept per process: the same requirement against the same version of a
 * shop's catalog always prices the same (searchPricedOptions is pure), so a repeated search — an
 * integration polling, a customer going back and forth on the storefront — is answered from memory.
 * The key holds the catalog version (db/schema/auth.ts catalog_version), so a change to the catalog
 * or the rules is never answered from an older search; older entries simply age out. Bounded: the
 * most recently used few hundred searches.
 */
import type { Requirement } from "@/lib/bank";
import { searchPricedOptions, type PricedSearch } from "./priced-search";
import type { ShopCatalog } from "./types";

const LIMIT = 256;
const state = globalThis as unknown as { faradsmithSearchMemo?: Map<string, PricedSearch> };
const memo = (state.faradsmithSearchMemo ??= new Map<string, PricedSearch>());

/** `searchPricedOptions(catalog, requirement)`, from memory when this shop's catalog version was searched for it lately. */
export function memoizedSearch(shopId: string, catalogVersion: number, catalog: ShopCatalog, requirement: Requirement): PricedSearch {
  const key = `${shopId}\u0000${catalogVersion}\u0000${JSON.stringify(requirement)}`;
  const hit = memo.get(key);
  if (hit) {
    memo.delete(key);
    memo.set(key, hit);
    return hit;
  }
  const result = Object.freeze(searchPricedOptions(catalog, requirement));
  memo.set(key, result);
  if (memo.size > LIMIT) memo.delete(memo.keys().next().value as string);
  return result;
}
