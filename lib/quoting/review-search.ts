/**
 * The engine's options for a request under review, with the estimator's per-request overrides:
 * other design factors than the shop's, retired cells offered, longer series strings considered.
 * Every override is worded for the quote ("Voltage derating: 1 → 0.9") and recorded on the
 * revision it leads to. Pure: the catalog comes in loaded.
 */
import type { DesignFactors, Requirement } from "@/lib/bank";
import { searchPricedOptions, type PricedSearch } from "./priced-search";
import { OVERRIDABLE_FACTORS, type CatalogCell, type DesignOverrides, type OverridableFactor, type OverrideNote, type ShopCatalog } from "./types";

/** Each factor an estimator may change: its name, its bounds and how it reads (fractions as percentages). */
export const FACTOR_OVERRIDES: Record<OverridableFactor, { label: string; min: number; max: number; percent: boolean; hint: string }> = {
  voltageDerating: { label: "Voltage derating", min: 0.5, max: 1, percent: false, hint: "Each cell works at most at this share of its rated voltage." },
  capacitanceFade: { label: "End-of-life capacitance fade", min: 0, max: 0.6, percent: true, hint: "Capacitance lost by the end of the bank's life." },
  esrGrowth: { label: "End-of-life ESR growth", min: 0, max: 3, percent: true, hint: "ESR gained by the end of the bank's life." },
  matchingTolerance: { label: "Cell matching tolerance", min: 0, max: 0.3, percent: true, hint: "How closely the shop grades cells that share a string." },
  balancingFactor: { label: "Balancing factor", min: 1, max: 100, percent: false, hint: "Balancing current as a multiple of the cells' leakage." },
};

/** The shop's own search: no overrides. */
export const NO_OVERRIDES: DesignOverrides = { factors: {}, includeRetiredCells: false, longerStrings: 1 };

/** The shop's factors with the estimator's overrides in place. */
export function effectiveFactors(shop: DesignFactors, overrides: DesignOverrides): DesignFactors {
  const out: DesignFactors = { ...shop };
  for (const key of OVERRIDABLE_FACTORS) {
    const v = overrides.factors[key];
    if (v !== undefined) out[key] = v;
  }
  return out;
}

function formatFactor(key: OverridableFactor, value: number): string {
  return FACTOR_OVERRIDES[key].percent ? `${Number((value * 100).toPrecision(6))} %` : String(Number(value.toPrecision(6)));
}

/**
 * The overrides as the quote records them, against the shop's factors; the chosen cell is named
 * when it is a retired one, and the chosen string when it is longer than the shop would offer.
 */
export function overrideNotes(shop: DesignFactors, overrides: DesignOverrides, chosen?: { sku: string; retired: boolean }): OverrideNote[] {
  const notes: OverrideNote[] = [];
  for (const key of OVERRIDABLE_FACTORS) {
    const v = overrides.factors[key];
    if (v !== undefined && v !== shop[key]) notes.push({ label: FACTOR_OVERRIDES[key].label, from: formatFactor(key, shop[key]), to: formatFactor(key, v) });
  }
  if (overrides.longerStrings !== NO_OVERRIDES.longerStrings) {
    notes.push({ label: "Strings longer than the shortest safe one", from: `up to ${NO_OVERRIDES.longerStrings}`, to: `up to ${overrides.longerStrings}` });
  }
  if (chosen?.retired) notes.push({ label: "Retired cell offered", from: "not offered", to: chosen.sku });
  return notes;
}

/** The catalog a review searches: the shop's, with its retired cells when the estimator allows them. */
export function reviewCatalog(catalog: ShopCatalog, retired: readonly CatalogCell[], overrides: DesignOverrides): ShopCatalog {
  return {
    ...catalog,
    factors: effectiveFactors(catalog.factors, overrides),
    cells: overrides.includeRetiredCells ? [...catalog.cells, ...retired] : catalog.cells,
  };
}

/** The engine's priced options for the request under the overrides (the same search customers get, widened). */
export function searchWithOverrides(catalog: ShopCatalog, retired: readonly CatalogCell[], requirement: Requirement, overrides: DesignOverrides): PricedSearch {
  return searchPricedOptions(reviewCatalog(catalog, retired, overrides), requirement, { longerStrings: overrides.longerStrings });
}

/** The range an estimator may type for a factor, as its field hint says it: "0 % to 30 %", "0.5 to 1". */
export function factorRange(key: OverridableFactor): string {
  const f = FACTOR_OVERRIDES[key];
  return `${formatFactor(key, f.min)} to ${formatFactor(key, f.max)}`;
}
