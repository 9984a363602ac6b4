import { describe, expect, it } from "vitest";
import { E12, E24, E48, E96, largestPreferredAtMost, smallestPowerRatingAtLeast, smallestPreferredAtLeast } from "@/lib/bank";

// Source: IEC 60063:2015, Preferred number series for resistors and capacitors.
describe("IEC 60063 preferred-number series", () => {
  it("have 12, 24, 48 and 96 values per decade, strictly increasing, within [1, 10)", () => {
    for (const [table, n] of [
      [E12, 12],
      [E24, 24],
      [E48, 48],
      [E96, 96],
    ] as const) {
      expect(table).toHaveLength(n);
      expect(table[0]).toBe(1);
      for (let i = 1; i < table.length; i++) expect(table[i]!).toBeGreaterThan(table[i - 1]!);
      expect(table.at(-1)!).toBeLessThan(10);
    }
  });

  it("E24 keeps its historic two-digit values (IEC 60063:2015, E24 table)", () => {
    expect(E24).toEqual([1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1]);
    // the historic values differ from 10^(i/24) rounded to 2 digits, e.g. 2.6 → 2.7, 2.9 → 3.0, 4.6 → 4.7, 8.3 → 8.2
    expect(Number((10 ** (10 / 24)).toFixed(1))).toBe(2.6);
    expect(E24[10]).toBe(2.7);
  });

  it("E12 is every other E24 value (IEC 60063:2015)", () => {
    expect(E12).toEqual(E24.filter((_, i) => i % 2 === 0));
  });

  it("E48 and E96 are 10^(i/n) rounded to three significant figures (IEC 60063:2015; the one exception, 920 in E192, is not in these series)", () => {
    E96.forEach((v, i) => expect(v).toBeCloseTo(Number((10 ** (i / 96)).toPrecision(3)), 9));
    E48.forEach((v, i) => expect(v).toBeCloseTo(Number((10 ** (i / 48)).toPrecision(3)), 9));
    expect(E96).toContain(4.75);
    expect(E48).toContain(4.64);
    expect(E48).not.toContain(4.75);
  });

  it("rounds down and up to the series across decades", () => {
    expect(largestPreferredAtMost(4699, "E24")).toBe(4300);
    expect(largestPreferredAtMost(4700, "E24")).toBe(4700);
    expect(largestPreferredAtMost(0.0999, "E12")).toBeCloseTo(0.082, 12);
    expect(largestPreferredAtMost(1000, "E96")).toBe(1000);
    expect(largestPreferredAtMost(9999, "E96")).toBe(9760);
    expect(smallestPreferredAtLeast(4701, "E24")).toBe(5100);
    expect(smallestPreferredAtLeast(9.2, "E24")).toBe(10);
    expect(smallestPreferredAtLeast(1e6, "E12")).toBe(1e6);
  });
});

describe("resistor power ratings (common practice)", () => {
  it("picks the smallest standard rating at or above the need", () => {
    expect(smallestPowerRatingAtLeast(0.1)).toBe(0.125);
    expect(smallestPowerRatingAtLeast(0.25)).toBe(0.25);
    expect(smallestPowerRatingAtLeast(4)).toBe(5);
    expect(smallestPowerRatingAtLeast(101)).toBeNull();
  });
});
