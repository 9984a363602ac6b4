import { describe, expect, it } from "vitest";
import { validatePricingRules } from "@/lib/pricing";
import { searchPricedOptions } from "@/lib/quoting/priced-search";
import { memoizedSearch } from "@/lib/quoting/search-memo";
import { demoCatalog } from "./demo-catalog";

const requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 1 };

describe("recent searches kept per shop and catalog version", () => {
  it("answer a repeated search from memory with exactly what searching again gives", () => {
    const catalog = demoCatalog("kestrel-bank-works");
    const first = memoizedSearch("shop-a", 7, catalog, requirement);
    expect(memoizedSearch("shop-a", 7, catalog, { ...requirement })).toBe(first);
    expect(JSON.parse(JSON.stringify(first))).toEqual(JSON.parse(JSON.stringify(searchPricedOptions(catalog, requirement))));
  });

  it("never answer a newer catalog version, another shop or another requirement from an older search", () => {
    const catalog = demoCatalog("kestrel-bank-works");
    const first = memoizedSearch("shop-b", 1, catalog, requirement);
    const dearer = { ...catalog, rules: { ...catalog.rules, marginPct: "60" } };
    const newer = memoizedSearch("shop-b", 2, dearer, requirement);
    expect(newer).not.toBe(first);
    expect(Number(newer.options[0]!.price!.amount)).toBeGreaterThan(Number(first.options[0]!.price!.amount));
    expect(memoizedSearch("shop-c", 1, catalog, requirement)).not.toBe(first);
    expect(memoizedSearch("shop-b", 1, catalog, { ...requirement, quantity: 2 })).not.toBe(first);
  });

  it("keep the few hundred most recently used", () => {
    const catalog = demoCatalog("kestrel-bank-works");
    const first = memoizedSearch("shop-d", 1, catalog, requirement);
    for (let v = 0; v < 300; v++) memoizedSearch("shop-d", 1, catalog, { ...requirement, maxVoltage: 40 + v / 100 });
    expect(memoizedSearch("shop-d", 1, catalog, requirement)).not.toBe(first);
  });
});

describe("pricing rules frozen all the way down", () => {
  it("are checked once, and still report what is wrong with them", () => {
    const bad = Object.freeze({ ...demoCatalog("marlow-pulse").rules, currency: "XYZ", quantityBreaks: Object.freeze([]), enclosures: Object.freeze([]) });
    expect(validatePricingRules(bad as never).map((i) => i.path)).toContain("currency");
    expect(validatePricingRules(bad as never).map((i) => i.path)).toContain("currency");
  });
});
