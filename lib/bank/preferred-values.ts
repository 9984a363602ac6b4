import type { ResistorSeries } from "./types";

/**
 * IEC 60063 preferred-number series, one decade. E12 and E24 are 2-digit values (E24 keeps its
 * historic values such as 2.7, 3.3 … 8.2 that differ from 10^(i/24) rounded); E48 and E96 are
 * 3-digit values, written here as 100…976 and scaled to 1.00…9.76.
 */
export const E12: readonly number[] = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2];

export const E24: readonly number[] = [1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1];

const E96_DIGITS = [
  100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130, 133, 137, 140, 143, 147, 150, 154, 158, 162, 165, 169, 174, 178, 182, 187, 191, 196, 200, 205,
  210, 215, 221, 226, 232, 237, 243, 249, 255, 261, 267, 274, 280, 287, 294, 301, 309, 316, 324, 332, 340, 348, 357, 365, 374, 383, 392, 402, 412, 422, 432,
  442, 453, 464, 475, 487, 499, 511, 523, 536, 549, 562, 576, 590, 604, 619, 634, 649, 665, 681, 698, 715, 732, 750, 768, 787, 806, 825, 845, 866, 887, 909,
  931, 953, 976,
];

export const E96: readonly number[] = E96_DIGITS.map((d) => d / 100);

/** E48 is every other E96 value. */
export const E48: readonly number[] = E96_DIGITS.filter((_, i) => i % 2 === 0).map((d) => d / 100);

export const PREFERRED_SERIES: Record<ResistorSeries, readonly number[]> = { E12, E24, E48, E96 };

/** relative slack so that 4.7e3 computed as 4699.999999 still counts as 4.7 kΩ */
const EPS = 1e-9;

function decadeOf(value: number): number {
  return Math.floor(Math.log10(value));
}

/** Largest preferred value of `series` that is not above `value` (value > 0). */
export function largestPreferredAtMost(value: number, series: ResistorSeries): number {
  if (!(value > 0) || !Number.isFinite(value)) throw new RangeError("value must be a positive number");
  const table = PREFERRED_SERIES[series];
  // start one decade high so a rounding error in log10 cannot skip the right decade
  let decade = decadeOf(value) + 1;
  for (let attempt = 0; attempt < 4; attempt++, decade--) {
    const scale = 10 ** decade;
    for (let i = table.length - 1; i >= 0; i--) {
      const candidate = (table[i] as number) * scale;
      if (candidate <= value * (1 + EPS)) return Number(candidate.toPrecision(12));
    }
  }
  throw new RangeError("no preferred value found");
}

/** Smallest preferred value of `series` that is not below `value` (value > 0). */
export function smallestPreferredAtLeast(value: number, series: ResistorSeries): number {
  if (!(value > 0) || !Number.isFinite(value)) throw new RangeError("value must be a positive number");
  const table = PREFERRED_SERIES[series];
  let decade = decadeOf(value) - 1;
  for (let attempt = 0; attempt < 4; attempt++, decade++) {
    const scale = 10 ** decade;
    for (let i = 0; i < table.length; i++) {
      const candidate = (table[i] as number) * scale;
      if (candidate >= value * (1 - EPS)) return Number(candidate.toPrecision(12));
    }
  }
  throw new RangeError("no preferred value found");
}

/** Standard resistor power ratings in watts (common practice). */
export const RESISTOR_POWER_RATINGS: readonly number[] = [0.125, 0.25, 0.5, 1, 2, 3, 5, 10, 25, 50, 100];

/** Smallest standard power rating ≥ watts, or null when above the largest (100 W). */
export function smallestPowerRatingAtLeast(watts: number): number | null {
  for (const rating of RESISTOR_POWER_RATINGS) if (rating >= watts) return rating;
  return null;
}
