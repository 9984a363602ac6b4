import "server-only";
import { and, asc, count, desc, eq, ilike, or, type SQL } from "drizzle-orm";
import { db } from "@/db";
import { catalogCells, catalogComponents } from "@/db/schema";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { DEFAULT_PRICING_RULES } from "@/lib/pricing/defaults";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import type { ShopCatalog } from "@/lib/quoting/types";
import { getShopSettings } from "./shops";

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
 * Everything one search and one quote need from a shop, read once: design factors, pricing rules
 * and auto-quote limits (the defaults when the shop has no settings row), active cells and active
 * components. Searching and quoting are pure functions of this (lib/quoting/priced-search.ts).
 */
export async function loadShopCatalog(shopId: string): Promise<ShopCatalog> {
  const [settings, cells, components] = await Promise.all([getShopSettings(shopId), listActiveCells(shopId), listActiveComponents(shopId)]);
  return {
    factors: settings?.designFactors ?? DEFAULT_DESIGN_FACTORS,
    rules: settings?.pricingRules ?? DEFAULT_PRICING_RULES,
    autoQuoteLimits: settings?.autoQuoteLimits ?? DEFAULT_AUTO_QUOTE_LIMITS,
    cells,
    components,
  };
}

export interface CatalogListQuery {
  q: string;
  technology: "all" | "edlc" | "hybrid" | "electrolytic" | "film";
  sort: "sku" | "capacitance" | "voltage" | "cost" | "stock";
  dir: "asc" | "desc";
  page: number;
  size: number;
}

export async function listCatalogCells(shopId: string, q: CatalogListQuery) {
  const where: SQL[] = [eq(catalogCells.shopId, shopId)];
  if (q.technology !== "all") where.push(eq(catalogCells.technology, q.technology));
  if (q.q) {
    const like = `%${q.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    where.push(or(ilike(catalogCells.sku, like), ilike(catalogCells.manufacturer, like), ilike(catalogCells.series, like))!);
  }
  const column = {
    sku: catalogCells.sku,
    capacitance: catalogCells.capacitanceF,
    voltage: catalogCells.ratedVoltageV,
    cost: catalogCells.unitCost,
    stock: catalogCells.stock,
  }[q.sort];
  const rows = await db
    .select()
    .from(catalogCells)
    .where(and(...where))
    .orderBy(q.dir === "asc" ? asc(column) : desc(column), asc(catalogCells.id))
    .limit(q.size)
    .offset((q.page - 1) * q.size);
  const [t] = await db.select({ n: count() }).from(catalogCells).where(and(...where));
  return { rows, total: t?.n ?? 0 };
}
