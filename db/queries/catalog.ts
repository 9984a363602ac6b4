import "server-only";
import { and, asc, count, eq } from "drizzle-orm";
import { catalogCells, catalogComponents, shops } from "@/db/schema";
import { db } from "@/db";
import { withShop } from "@/db/tx";
import { DEFAULT_RELIABILITY_SETTINGS } from "@/lib/bank/reliability-settings";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { DEFAULT_PRICING_RULES, readPricingRules } from "@/lib/pricing/defaults";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import type { ShopCatalog } from "@/lib/quoting/types";
import { getShopSettings } from "./shops";
import type { CatalogListQuery } from "@/lib/validation/lists";
import { containsText, readPage, sortedBy } from "./paging";

export async function listActiveCells(shopId: string) {
  return withShop(shopId, (tx) =>
    tx
      .select()
      .from(catalogCells)
      .where(and(eq(catalogCells.shopId, shopId), eq(catalogCells.isActive, true))),
  );
}

export async function listActiveComponents(shopId: string) {
  return withShop(shopId, (tx) =>
    tx
      .select()
      .from(catalogComponents)
      .where(and(eq(catalogComponents.shopId, shopId), eq(catalogComponents.isActive, true))),
  );
}

/** A loaded catalog and the version of the shop's catalog it was read at. */
interface CachedCatalog {
  version: number;
  catalog: ShopCatalog;
}

/** Catalogs this process has loaded, most recently used last; a few hundred shops' worth at most. */
const CACHE_LIMIT = 256;
const state = globalThis as unknown as { faradsmithCatalogCache?: Map<string, CachedCatalog> };
const cache = (state.faradsmithCatalogCache ??= new Map<string, CachedCatalog>());

function deepFreeze<T>(value: T): T {
  if (value && typeof value === "object" && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const v of Object.values(value)) deepFreeze(v);
  }
  return value;
}

/** The shop's catalog version now (every change to cells, components or settings moves it). */
async function currentCatalogVersion(shopId: string): Promise<number | null> {
  const [row] = await db.select({ v: shops.catalogVersion }).from(shops).where(eq(shops.id, shopId)).limit(1);
  return row?.v ?? null;
}

/**
 * Everything one search and one quote need from a shop, read once: design factors, pricing rules,
 * auto-quote limits and failure/yield/life settings (the defaults when the shop has no settings row), active cells and active
 * components. Searching and quoting are pure functions of this (lib/quoting/priced-search.ts).
 *
 * Kept in this process for as long as the shop's `catalog_version` (db/schema/auth.ts) is the one
 * it was read at: every call reads the version from PostgreSQL (or takes the one the caller read
 * with the shop), so a change made through any app server, or in the database itself, is seen by
 * the next request on every server. The version is read before the rows, so a catalog is never
 * kept under a version newer than its data. The object is frozen: callers share it.
 */
export async function loadShopCatalog(shopId: string, knownVersion?: number): Promise<ShopCatalog> {
  const version = knownVersion ?? (await currentCatalogVersion(shopId));
  const hit = cache.get(shopId);
  if (hit && version !== null && hit.version === version) {
    cache.delete(shopId);
    cache.set(shopId, hit);
    return hit.catalog;
  }
  const catalog = deepFreeze(await readShopCatalog(shopId));
  if (version !== null) {
    cache.delete(shopId);
    cache.set(shopId, { version, catalog });
    if (cache.size > CACHE_LIMIT) cache.delete(cache.keys().next().value as string);
  }
  return catalog;
}

async function readShopCatalog(shopId: string): Promise<ShopCatalog> {
  // one transaction: the three reads see the same committed state
  const [settings, cells, components] = await withShop(shopId, async () => [
    await getShopSettings(shopId),
    await listActiveCells(shopId),
    await listActiveComponents(shopId),
  ]);
  return {
    factors: settings?.designFactors ?? DEFAULT_DESIGN_FACTORS,
    rules: settings ? readPricingRules(settings.pricingRules) : DEFAULT_PRICING_RULES,
    autoQuoteLimits: settings?.autoQuoteLimits ?? DEFAULT_AUTO_QUOTE_LIMITS,
    reliability: { ...DEFAULT_RELIABILITY_SETTINGS, ...settings?.reliabilitySettings },
    cells,
    components,
  };
}

/** Active catalog lines per technology, for the storefront's "what we build from". */
export async function countActiveCellsByTechnology(shopId: string) {
  return withShop(shopId, (tx) =>
    tx
      .select({ technology: catalogCells.technology, lines: count() })
      .from(catalogCells)
      .where(and(eq(catalogCells.shopId, shopId), eq(catalogCells.isActive, true)))
      .groupBy(catalogCells.technology)
      .orderBy(asc(catalogCells.technology)),
  );
}

const CATALOG_SORTS = {
  sku: catalogCells.sku,
  capacitance: catalogCells.capacitanceF,
  voltage: catalogCells.ratedVoltageV,
  esr: catalogCells.esrOhm,
  cost: catalogCells.unitCost,
  stock: catalogCells.stock,
  lead: catalogCells.leadTimeDays,
};

/** A page of the shop's catalog cells (active or not), filtered and sorted; ties by SKU. */
export async function listCatalogCells(shopId: string, q: CatalogListQuery) {
  const where = and(
    eq(catalogCells.shopId, shopId),
    q.technology === "all" ? undefined : eq(catalogCells.technology, q.technology),
    containsText(q.q, catalogCells.sku, catalogCells.manufacturer, catalogCells.series),
  );
  return withShop(shopId, (tx) =>
    readPage(
      q,
      () => tx.select({ n: count() }).from(catalogCells).where(where),
      (limit, offset) =>
        tx
          .select()
          .from(catalogCells)
          .where(where)
          .orderBy(...sortedBy(CATALOG_SORTS, q, asc(catalogCells.sku), asc(catalogCells.id)))
          .limit(limit)
          .offset(offset),
    ),
  );
}
