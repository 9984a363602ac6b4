// Minor units per ISO 4217 list one (JPY 0, EUR 2, KWD 3 digits).
import { describe, expect, it } from "vitest";
import { formatMinor, isSupportedCurrency, minorToDecimal } from "@/dev/stripe-standin/money";

describe("minorToDecimal", () => {
  it.each([
    [1234, "eur", "12.34"],
    [5, "eur", "0.05"],
    [0, "gbp", "0.00"],
    [1500, "jpy", "1500"],
    [12345, "kwd", "12.345"],
    [99999999, "eur", "999999.99"],
  ])("%i %s → %s", (amount, currency, decimal) => {
    expect(minorToDecimal(amount, currency)).toBe(decimal);
  });
});

describe("formatMinor and currencies", () => {
  it("formats for people with the currency's digits", () => {
    expect(formatMinor(25190, "eur")).toBe("€251.90");
    expect(formatMinor(3000, "gbp")).toBe("£30.00");
  });

  it("takes lower-case ISO 4217 codes only", () => {
    expect(isSupportedCurrency("eur")).toBe(true);
    expect(isSupportedCurrency("EUR")).toBe(false);
    expect(isSupportedCurrency("xyz")).toBe(false);
  });
});
