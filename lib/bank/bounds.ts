import { formatQuantity } from "../quantities";

/**
 * Upper bounds on every number a client may hand to the engine, and the caps that bound the
 * engine's own loops. One place: the public JSON schemas (lib/validation/bank.ts), the storefront
 * form (lib/validation/request-form.ts) and the search (arrangement-search.ts) read them here.
 *
 * Each bound sits well above anything a capacitor-bank shop builds, so no real request meets it,
 * and well below the point where floating-point counts stop being exact (2^53), so no request can
 * make a loop run away. Figures marked "from memory" are recalled, not looked up.
 */

/** 2 MV: the highest-voltage capacitor banks built (pulsed-power and impulse test banks) reach about 1 MV (from memory). */
export const MAX_VOLTAGE = 2e6;

/** 1 GJ: the largest capacitor banks built (laser-fusion and pulsed-magnet facilities) store a few hundred MJ (from memory). */
export const MAX_ENERGY = 1e9;

/** 1 GW of constant-power backup: a bank at the energy bound emptied in one second; ride-through banks carry kW to a few MW. */
export const MAX_POWER = 1e9;

/** One day (s): capacitor backup lasts seconds to minutes, and self-discharge empties any bank within days (common practice). */
export const MAX_SECONDS = 86_400;

/** 100 MF: 20,000 of the largest supercapacitor cells (a few kF each, from memory) in parallel. */
export const MAX_CAPACITANCE = 1e8;

/** 10 MA: pulsed-power banks deliver a few MA (from memory); backup banks kA at most. */
export const MAX_CURRENT = 1e7;

/** 1 kΩ of ESR: small electrolytic cells reach tens of ohms (from memory). */
export const MAX_RESISTANCE = 1e3;

/** 1,000 t: beyond any bank; the largest ship in a few containers. */
export const MAX_MASS = 1e6;

/** 1,000 m³: about thirty shipping containers. */
export const MAX_VOLUME = 1e3;

/** −100 °C: below the coldest air measured on Earth (about −89 °C, from memory). */
export const MIN_AMBIENT_TEMPERATURE = -100;

/** 200 °C: above the top of any capacitor's range (film reaches about 125–150 °C, from memory), so no cell runs there. */
export const MAX_AMBIENT_TEMPERATURE = 200;

/** 100 years: far beyond the life of any capacitor (sealed cells age out within a few decades, common practice). */
export const MAX_LIFE_YEARS = 100;

/** 10 m: longer than any capacitor cell or bank enclosure (a cell's dimensions in the catalog). */
export const MAX_LENGTH = 10;

/** Banks per request: a year of a large production line. */
export const MAX_QUANTITY = 100_000;

/** Most cells in one bank (the network evaluator takes the same bound): hand-built banks hold hundreds. */
export const MAX_CELLS_PER_BANK = 20_000;

/**
 * Longest series string the search considers: 2 MV needs no more than 1,700 film cells of 1.2 kV,
 * and 5,000 supercapacitor cells make 13.5 kV. Above it the search stops and says so.
 */
export const MAX_SERIES_COUNT = 5_000;

/** Most strings longer than the shortest safe one an estimator may have the search consider (each adds one series count per cell). */
export const MAX_LONGER_STRINGS = 8;

/** Most cells in parallel (per group or strings side by side): every cell of the bank in one group. */
export const MAX_PARALLEL_COUNT = MAX_CELLS_PER_BANK;

/** The bounds by SI unit, for readers of typed quantities (the storefront form). */
export const MAX_BY_UNIT = {
  V: MAX_VOLTAGE,
  F: MAX_CAPACITANCE,
  J: MAX_ENERGY,
  W: MAX_POWER,
  s: MAX_SECONDS,
  A: MAX_CURRENT,
  Ω: MAX_RESISTANCE,
  kg: MAX_MASS,
  "m³": MAX_VOLUME,
  m: MAX_LENGTH,
} as const;

/** A bound as people read it in a field message: "2 MV", "1 GJ", "86,400 s", "1,000,000 kg". */
export function formatBound(max: number, unit: string): string {
  if (unit === "s" || unit === "kg" || unit === "m³") return `${max.toLocaleString("en-GB")} ${unit}`;
  return formatQuantity(max, unit);
}
