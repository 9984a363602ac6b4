import { describe, expect, it } from "vitest";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import { checkAutoQuoteLimits } from "@/lib/quoting/auto-quote-limits";
import { formatQuoteNumber, isQuoteNumber, numberingYear } from "@/lib/quoting/quote-number";
import { isExpired, validUntilFrom } from "@/lib/quoting/validity";

describe("quote numbers", () => {
  // The Q-YYYY-NNNN shape is the product's own (DESIGN.md §5); zero padding to four digits.
  it.each([
    [2026, 1, "Q-2026-0001"],
    [2026, 2, "Q-2026-0002"],
    [2026, 42, "Q-2026-0042"],
    [2027, 9999, "Q-2027-9999"],
    [2027, 10000, "Q-2027-10000"],
  ])("year %i, sequence %i → %s", (year, seq, expected) => {
    expect(formatQuoteNumber(year, seq)).toBe(expected);
    expect(isQuoteNumber(expected)).toBe(true);
  });

  it.each([
    [2026, 0],
    [2026, -1],
    [2026, 1.5],
    [99, 1],
    [20260, 1],
  ])("refuses year %s, sequence %s", (year, seq) => {
    expect(() => formatQuoteNumber(year, seq)).toThrow(RangeError);
  });

  it("does not take other shapes for a quote number", () => {
    for (const s of ["Q-2026-001", "q-2026-0001", "O-2026-0001", "Q-2026-0001x", "../Q-2026-0001"]) expect(isQuoteNumber(s)).toBe(false);
  });

  it("counts the year in UTC: New Year's Eve 23:30 in UTC−5 is already the next year", () => {
    // 2025-12-31T23:30-05:00 = 2026-01-01T04:30Z
    expect(numberingYear(new Date("2025-12-31T23:30:00-05:00"))).toBe(2026);
    expect(numberingYear(new Date("2025-12-31T23:59:59Z"))).toBe(2025);
  });
});

describe("validity date", () => {
  // Calendar arithmetic checked by hand against the Gregorian calendar (2028 is a leap year,
  // 2026 is not: divisible by 4 and not by 100).
  it.each([
    ["2026-01-31T10:00:00Z", 30, "2026-03-02"],
    ["2026-02-28T23:59:59Z", 1, "2026-03-01"],
    ["2028-02-28T00:00:00Z", 1, "2028-02-29"],
    ["2026-12-15T08:00:00Z", 30, "2027-01-14"],
    ["2026-06-01T00:00:00Z", 0, "2026-06-01"],
  ])("from %s plus %i days is %s", (now, days, expected) => {
    expect(validUntilFrom(new Date(now), days)).toBe(expected);
  });

  it("refuses negative or fractional days", () => {
    expect(() => validUntilFrom(new Date(), -1)).toThrow(RangeError);
    expect(() => validUntilFrom(new Date(), 1.5)).toThrow(RangeError);
  });

  it("a quote is valid through its last day and expired the day after", () => {
    expect(isExpired("2026-03-02", new Date("2026-03-02T23:59:00Z"))).toBe(false);
    expect(isExpired("2026-03-02", new Date("2026-03-03T00:00:00Z"))).toBe(true);
  });
});

describe("auto-quote limits", () => {
  const limits = { maxVoltage: 100, maxStoredEnergy: 500_000, maxCellCount: 200 };

  it("passes a bank inside every limit, and one exactly at each limit", () => {
    expect(checkAutoQuoteLimits({ maxVoltage: 48, storedEnergy: 182_000, cellCount: 19 }, limits)).toEqual([]);
    expect(checkAutoQuoteLimits({ maxVoltage: 100, storedEnergy: 500_000, cellCount: 200 }, limits)).toEqual([]);
  });

  it("names each limit a bank is beyond", () => {
    const reasons = checkAutoQuoteLimits({ maxVoltage: 120, storedEnergy: 600_000, cellCount: 201 }, limits);
    expect(reasons).toHaveLength(3);
    expect(reasons[0]).toMatch(/Voltage 120 V is above the 100 V/);
    expect(reasons[1]).toMatch(/Stored energy 600 kJ is above the 500 kJ/);
    expect(reasons[2]).toMatch(/201 cells per bank is above the 200/);
  });

  it("checks one limit at a time", () => {
    expect(checkAutoQuoteLimits({ maxVoltage: 101, storedEnergy: 1, cellCount: 1 }, limits)).toHaveLength(1);
    expect(checkAutoQuoteLimits({ maxVoltage: 1, storedEnergy: 500_001, cellCount: 1 }, limits)).toHaveLength(1);
    expect(checkAutoQuoteLimits({ maxVoltage: 1, storedEnergy: 1, cellCount: 201 }, limits)).toHaveLength(1);
  });

  it("the default limits quote the 48 V, 20 kJ demo bank at once", () => {
    expect(checkAutoQuoteLimits({ maxVoltage: 48, storedEnergy: 182_000, cellCount: 19 }, DEFAULT_AUTO_QUOTE_LIMITS)).toEqual([]);
  });
});
