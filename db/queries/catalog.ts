import "server-only";
import { and, asc, count, eq } from "drizzle-orm";
import { db } from "@/db";
import { catalogCells, catalogComponents } from "@/db/schema";
import { DEFAULT_RELIABILITY_SETTINGS } from "@/lib/bank/reliability-settings";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { DEFAULT_PRICING_RULES, readPricingRules } from "@/lib/pricing/defaults";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import type { ShopCatalog } from "@/lib/quoting/types";
import { getShopSettings } from "./shops";
import type { CatalogListQuery } from "@/lib/validation/lists";
import { containsText, readPage, sortedBy } from "./paging";

export async function listActiveCells(shopId: string) {
  return db
    .select()
    .from(catalogCells)
    .where(and(eq(catalogCells.shopId, shopId), eq(catalogCells.isActive, true)));
}

export async function listActiveComponents(shopId: string) {
  return db
    .select()
    .from(catalogComponents)
    .where(and(eq(catalogComponents.shopId, shopId), eq(catalogComponents.isActive, true)));
}

/**
 * Everything one search and one quote need from a shop, read once: design factors, pricing rules,
 * auto-quote limits and failure/yield/life settings (the defaults when the shop has no settings row), active cells and active
 * components. Searching and quoting are pure functions of this (lib/quoting/priced-search.ts).
 */
export async function loadShopCatalog(shopId: string): Promise<ShopCatalog> {
  const [settings, cells, components] = await Promise.all([getShopSettings(shopId), listActiveCells(shopId), listActiveComponents(shopId)]);
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
  return db
    .select({ technology: catalogCells.technology, lines: count() })
    .from(catalogCells)
    .where(and(eq(catalogCells.shopId, shopId), eq(catalogCells.isActive, true)))
    .groupBy(catalogCells.technology)
    .orderBy(asc(catalogCells.technology));
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
  return readPage(
    q,
    () => db.select({ n: count() }).from(catalogCells).where(where),
    (limit, offset) =>
      db
        .select()
        .from(catalogCells)
        .where(where)
        .orderBy(...sortedBy(CATALOG_SORTS, q, asc(catalogCells.sku), asc(catalogCells.id)))
        .limit(limit)
        .offset(offset),
  );
}
