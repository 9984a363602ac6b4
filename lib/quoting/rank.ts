/**
 * Ranking priced options (DESIGN.md §3.2, "rank by price; mark the Pareto-optimal set over
 * (price, mass, volume); return the best dozen"). Pure, exact: prices are compared as decimals.
 */
import { Decimal } from "decimal.js";
import type { Topology } from "@/lib/bank";

/** Options shown for one requirement: "the best dozen". */
export const SHOWN = 12;

/** What ranking reads of an option. */
export interface RankableOption {
  /** per-bank sell price as a decimal string; null when the option could not be priced */
  price: { perBank: string } | null;
  mass: number;
  volume: number;
  leadTimeDays: number;
  cell: { sku: string };
  seriesCount: number;
  topology: Topology;
}

const TOPOLOGY_ORDER: Record<Topology, number> = { "series-of-parallel-groups": 0, "parallel-of-series-strings": 1 };

/** Exact price order, unpriced last; ties by mass, volume, lead time, part number, N_s, topology. */
export function comparePriced(a: RankableOption, b: RankableOption): number {
  if (a.price && b.price) {
    const d = new Decimal(a.price.perBank).comparedTo(b.price.perBank);
    if (d !== 0) return d;
  } else if (a.price || b.price) {
    return a.price ? -1 : 1;
  }
  const f = a.mass - b.mass || a.volume - b.volume || a.leadTimeDays - b.leadTimeDays;
  if (f !== 0) return f;
  if (a.cell.sku !== b.cell.sku) return a.cell.sku < b.cell.sku ? -1 : 1;
  return a.seriesCount - b.seriesCount || TOPOLOGY_ORDER[a.topology] - TOPOLOGY_ORDER[b.topology];
}

/** Expected life first (longest first, options without life data last), then the price order. */
export function compareByLife(a: RankableOption & LifeRankable, b: RankableOption & LifeRankable): number {
  const la = a.life?.lifeHours ?? -1;
  const lb = b.life?.lifeHours ?? -1;
  return lb - la || comparePriced(a, b);
}

/** What ranking by life reads of an option. */
export interface LifeRankable {
  life: { lifeHours: number | null } | null;
}

/** b is at least as good as a in price, mass and volume, and better in one (both priced). */
function dominates(b: RankableOption, a: RankableOption): boolean {
  if (!a.price || !b.price) return false;
  const p = new Decimal(b.price.perBank).comparedTo(a.price.perBank);
  return p <= 0 && b.mass <= a.mass && b.volume <= a.volume && (p < 0 || b.mass < a.mass || b.volume < a.volume);
}

/**
 * The best `limit` options in exact price order (or another order given), each marked
 * Pareto-optimal when it is priced and no other priced option among ALL those given dominates it
 * over (price, mass, volume).
 */
export function rankPriced<T extends RankableOption>(
  options: readonly T[],
  limit = SHOWN,
  compare: (a: T, b: T) => number = comparePriced,
): (T & { pareto: boolean })[] {
  const order = options.map((_, i) => i).sort((i, j) => compare(options[i] as T, options[j] as T) || i - j);
  return order.slice(0, Math.max(0, limit)).map((i) => {
    const o = options[i] as T;
    return { ...o, pareto: o.price !== null && !options.some((b) => b !== o && dominates(b, o)) };
  });
}
