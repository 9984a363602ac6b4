import Decimal from "decimal.js";
import { describe, expect, it } from "vitest";
import { ISO_4217_MINOR_UNITS, formatMoney, fromMinorUnits, minorUnits, moneyString, roundMoney, toMinorUnits } from "@/lib/pricing";

describe("minorUnits", () => {
  // Source: ISO 4217 list one (current currency & funds codes), column "Minor unit".
  it.each([
    ["JPY", 0],
    ["KRW", 0],
    ["ISK", 0],
    ["CLP", 0],
    ["VND", 0],
    ["XOF", 0],
    ["USD", 2],
    ["EUR", 2],
    ["GBP", 2],
    ["CHF", 2],
    ["CAD", 2],
    ["AUD", 2],
    ["SEK", 2],
    ["NOK", 2],
    ["DKK", 2],
    ["PLN", 2],
    ["CZK", 2],
    ["INR", 2],
    ["CNY", 2],
    ["HUF", 2],
    ["KWD", 3],
    ["BHD", 3],
    ["OMR", 3],
    ["JOD", 3],
    ["TND", 3],
    ["LYD", 3],
    ["IQD", 3],
    ["CLF", 4],
    ["UYW", 4],
  ] as const)("%s has %i minor digits (ISO 4217 list one)", (code, digits) => {
    expect(minorUnits(code)).toBe(digits);
  });

  it("holds only three-letter upper-case codes with 0, 2, 3 or 4 digits", () => {
    const entries = Object.entries(ISO_4217_MINOR_UNITS);
    expect(entries.length).toBeGreaterThan(150);
    for (const [code, digits] of entries) {
      expect(code).toMatch(/^[A-Z]{3}$/);
      expect([0, 2, 3, 4]).toContain(digits);
    }
  });

  it("throws a clear Error for an unknown code", () => {
    expect(() => minorUnits("XYZ")).toThrow(/Unknown currency code "XYZ".*ISO 4217/);
    expect(() => minorUnits("")).toThrow(/Unknown currency code/);
  });

  it("does not guess lower-case codes but says how to fix them", () => {
    expect(() => minorUnits("eur")).toThrow(/upper case: "EUR"/);
  });
});

describe("roundMoney — half-up to the ISO 4217 minor unit", () => {
  // Digits per ISO 4217 list one; half-up (half away from zero) is common practice for prices.
  it.each([
    // USD, 2 digits
    ["0.005", "USD", "0.01"],
    ["0.004", "USD", "0.00"],
    ["0.025", "USD", "0.03"], // bankers' rounding would give 0.02
    ["1.005", "USD", "1.01"], // the binary float 1.005 is 1.00499…: Math.round(1.005 * 100) gives 1.00
    ["19.999", "USD", "20.00"],
    ["-0.005", "USD", "-0.01"], // away from zero
    ["-0.004", "USD", "0.00"], // never "-0.00"
    ["12", "USD", "12.00"],
    // JPY, 0 digits
    ["2.5", "JPY", "3"], // bankers' rounding would give 2
    ["0.5", "JPY", "1"],
    ["1234.49", "JPY", "1234"],
    ["1200.00", "JPY", "1200"],
    // KWD, 3 digits
    ["1.0005", "KWD", "1.001"],
    ["0.0004999", "KWD", "0.000"],
    ["12.3456", "KWD", "12.346"],
    ["7", "KWD", "7.000"],
  ] as const)("%s %s → %s", (value, code, expected) => {
    expect(moneyString(value, code)).toBe(expected);
    expect(roundMoney(value, code).toFixed(minorUnits(code))).toBe(expected);
  });

  it("accepts a Decimal as well as a string", () => {
    expect(roundMoney(new Decimal("2.675"), "EUR").toString()).toBe("2.68");
  });

  it("rejects non-decimal strings and unknown codes", () => {
    expect(() => roundMoney("1e3", "EUR")).toThrow(/decimal string/);
    expect(() => roundMoney("12,50", "EUR")).toThrow(/decimal string/);
    expect(() => roundMoney("NaN", "EUR")).toThrow(/decimal string/);
    expect(() => roundMoney("1.00", "ABC")).toThrow(/Unknown currency code/);
  });
});

describe("formatMoney", () => {
  // Expected texts: CLDR locale data (Unicode Common Locale Data Repository) as shipped with
  // Node 20's ICU; the number of decimals is forced to the ISO 4217 minor unit.
  it("formats EUR in en-GB and de-DE", () => {
    expect(formatMoney("1234.5", "EUR")).toBe("€1,234.50");
    expect(formatMoney("1234.5", "EUR", "de-DE")).toBe("1.234,50\u00a0€");
  });

  it("shows no decimals for JPY and three for KWD", () => {
    expect(formatMoney("1200", "JPY")).toBe("JP¥1,200");
    expect(formatMoney("12.345", "KWD")).toMatch(/^KWD\s12\.345$/);
  });

  it("uses ISO 4217 digits where the locale data show fewer (IQD: 3 in ISO 4217 list one)", () => {
    expect(formatMoney("1.5", "IQD")).toMatch(/1\.500$/);
  });

  it("rounds half-up before formatting and keeps every digit of large amounts", () => {
    expect(formatMoney("0.005", "USD", "en-US")).toBe("$0.01");
    expect(formatMoney("12345678901234567.89", "EUR")).toBe("€12,345,678,901,234,567.89");
  });

  it("throws for an unknown currency", () => {
    expect(() => formatMoney("1", "XYZ")).toThrow(/Unknown currency code/);
  });
});

describe("toMinorUnits", () => {
  // Minor-unit digits per ISO 4217 list one.
  it.each([
    ["12.34", "USD", 1234],
    ["19.99", "EUR", 1999], // 19.99 * 100 in binary floats is 1998.9999999999998
    ["0.01", "GBP", 1],
    ["1200", "JPY", 1200],
    ["1200.00", "JPY", 1200],
    ["12.345", "KWD", 12345],
    ["0", "EUR", 0],
  ] as const)("%s %s → %i", (amount, code, expected) => {
    expect(toMinorUnits(amount, code)).toBe(expected);
  });

  it("refuses amounts finer than the currency allows instead of rounding them silently", () => {
    expect(() => toMinorUnits("12.345", "USD")).toThrow(/more decimals than USD allows/);
    expect(() => toMinorUnits("1200.5", "JPY")).toThrow(/more decimals than JPY allows/);
  });

  it("refuses amounts beyond the safe integer range", () => {
    expect(() => toMinorUnits("90071992547409.93", "EUR")).toThrow(/too large/);
    expect(toMinorUnits("90071992547409.91", "EUR")).toBe(Number.MAX_SAFE_INTEGER);
  });

  it("throws for an unknown currency", () => {
    expect(() => toMinorUnits("1", "XYZ")).toThrow(/Unknown currency code/);
  });
});

describe("fromMinorUnits (what a payment service reports, back to a decimal)", () => {
  // ISO 4217 list one: JPY 0, EUR 2, KWD 3 minor-unit digits
  it.each([
    [1234, "EUR", "12.34"],
    [5, "EUR", "0.05"],
    [0, "EUR", "0.00"],
    [1200, "JPY", "1200"],
    [12345, "KWD", "12.345"],
    [-250, "GBP", "-2.50"],
  ] as const)("%i %s → %s, and back", (minor, code, decimal) => {
    expect(fromMinorUnits(minor, code)).toBe(decimal);
    expect(toMinorUnits(decimal, code)).toBe(minor === 0 ? 0 : minor);
  });

  it("refuses a fraction of a minor unit", () => {
    expect(() => fromMinorUnits(1.5, "EUR")).toThrow(/safe integer/);
  });
});
