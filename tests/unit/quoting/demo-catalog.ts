/**
 * The demo shops' catalogs (db/seed, invented parts) as loadShopCatalog would return them, without
 * a database: active rows only, the part number standing in for the row id, default design
 * factors and the shop's own pricing rules.
 */
import { kestrelCells, kestrelComponents } from "@/db/seed/catalog-kestrel";
import { marlowCells, marlowComponents } from "@/db/seed/catalog-marlow";
import { DEFAULT_DESIGN_FACTORS, DEFAULT_RELIABILITY_SETTINGS } from "@/lib/bank";
import { demoPricingRules } from "@/db/seed/pricing-rules";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import type { ShopCatalog } from "@/lib/quoting/types";

const SEEDS = {
  "kestrel-bank-works": { cells: kestrelCells, components: kestrelComponents },
  "marlow-pulse": { cells: marlowCells, components: marlowComponents },
} as const;

export function demoCatalog(slug: keyof typeof SEEDS): ShopCatalog {
  const seed = SEEDS[slug];
  return {
    factors: DEFAULT_DESIGN_FACTORS,
    rules: demoPricingRules[slug],
    autoQuoteLimits: DEFAULT_AUTO_QUOTE_LIMITS,
    reliability: DEFAULT_RELIABILITY_SETTINGS,
    cells: seed.cells
      .filter((c) => c.isActive !== false)
      .map(({ isActive: _a, createdAt: _c, updatedAt: _u, ...c }) => ({
        ...c,
        id: c.id ?? c.sku,
        diameterMm: c.diameterMm ?? null,
        lengthMm: c.lengthMm ?? null,
        widthMm: c.widthMm ?? null,
        stock: c.stock ?? 0,
        leadTimeDays: c.leadTimeDays ?? 0,
        minVoltageV: c.minVoltageV ?? null,
        ratedLifeHours: c.ratedLifeHours ?? null,
        ratedLifeTemperatureC: c.ratedLifeTemperatureC ?? null,
        minTemperatureC: c.minTemperatureC ?? null,
        maxTemperatureC: c.maxTemperatureC ?? null,
        thermalResistanceKPerW: c.thermalResistanceKPerW ?? null,
        coldCapacitanceFactor: c.coldCapacitanceFactor ?? null,
        coldEsrFactor: c.coldEsrFactor ?? null,
      })),
    components: seed.components
      .filter((c) => c.isActive !== false)
      .map((c) => ({
        id: c.id ?? c.sku,
        kind: c.kind,
        sku: c.sku,
        name: c.name,
        unitCost: c.unitCost,
        specs: c.specs ?? {},
        leadTimeDays: c.leadTimeDays ?? 0,
      })),
  };
}
