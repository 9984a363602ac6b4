/**
 * Pricing-rule versions compared field by field (the history and the audit log), the rules form
 * read into a rule set, and the settings list the design-factors form renders from.
 */
import { describe, expect, it } from "vitest";
import { demoPricingRules } from "@/db/seed/pricing-rules";
import { API_KEY_SCOPE_FOR, keyAllows } from "@/lib/auth/api-key-scopes";
import { ROLE_PERMISSIONS } from "@/lib/auth/permissions";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { DEFAULT_RELIABILITY_SETTINGS } from "@/lib/bank/reliability-settings";
import { DEFAULT_PRICING_RULES, readPricingRules, validatePricingRules } from "@/lib/pricing";
import { diffRules } from "@/lib/pricing/rule-versions";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import { readSetting, readSettingsForm, SETTINGS_GROUPS, settingsFormText } from "@/lib/validation/design-settings";
import { formFromRules, readRulesForm } from "@/lib/validation/pricing";

const kestrel = demoPricingRules["kestrel-bank-works"];
const marlow = demoPricingRules["marlow-pulse"];

describe("diffRules", () => {
  it("names each changed rule with both values as people read them, in the form's order", () => {
    // the demo shop asks a 30 % deposit (db/seed/pricing-rules.ts); dropping it is a change people read as "none"
    expect(kestrel.depositPercent).toBe(30);
    const after = { ...kestrel, labourRatePerHour: "66.50", depositPercent: 0, quantityBreaks: [{ minQuantity: 10, discountPct: "5" }] };
    expect(diffRules(kestrel, after)).toEqual([
      { key: "labourRatePerHour", label: "Labour rate per hour", from: "64", to: "66.5" },
      { key: "quantityBreaks", label: "Quantity breaks", from: "from 5: 3 %; from 10: 6 %; from 25: 9 %; from 50: 12 %", to: "from 10: 5 %" },
      { key: "depositPercent", label: "Deposit on acceptance", from: "30 %", to: "none: the full total on acceptance" },
    ]);
  });

  it("sees no change in the same amounts written differently, or breaks listed in another order", () => {
    const same = { ...kestrel, labourRatePerHour: "64", quantityBreaks: [...kestrel.quantityBreaks].reverse() };
    expect(diffRules(kestrel, same)).toEqual([]);
  });

  it("reads a rule set saved before the deposit existed as no deposit", () => {
    const { depositPercent: _d, ...old } = kestrel;
    expect(readPricingRules(old).depositPercent).toBe(0);
    // against the demo shop's 30 % the deposit is then the one difference, and nothing else moved
    expect(diffRules(readPricingRules(old), kestrel)).toEqual([
      { key: "depositPercent", label: "Deposit on acceptance", from: "none: the full total on acceptance", to: "30 %" },
    ]);
  });
});

describe("the demo shops' own rules", () => {
  it("are valid, in EUR and GBP, and differ in their figures", () => {
    expect(validatePricingRules(kestrel)).toEqual([]);
    expect(validatePricingRules(marlow)).toEqual([]);
    expect([kestrel.currency, marlow.currency]).toEqual(["EUR", "GBP"]);
    const differing = diffRules(kestrel, marlow).map((c) => c.key);
    for (const key of ["labourRatePerHour", "marginPct", "overheadPct", "taxRatePct", "quantityBreaks", "depositPercent"] as const)
      expect(differing).toContain(key);
    expect(diffRules(DEFAULT_PRICING_RULES, kestrel).length).toBeGreaterThan(5);
  });
});

describe("the rules form", () => {
  it("reads its own text back as the same rules", () => {
    const r = readRulesForm({ ...formFromRules(marlow), reason: "Check" }, { requireReason: true });
    expect(r).toEqual({ ok: true, rules: marlow, reason: "Check" });
  });

  it("puts each problem on its field, enclosure volumes in litres", () => {
    const form = formFromRules(kestrel);
    form.enclosures[1]!.volumeLitres = "-2";
    const r = readRulesForm({ ...form, marginPct: "100", depositPercent: "101", setupMinutes: "ten", reason: "" }, { requireReason: true });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(Object.keys(r.fieldErrors).sort()).toEqual(["depositPercent", "enclosures.1.volumeLitres", "marginPct", "reason", "setupMinutes"]);
    if (!r.ok) expect(r.fieldErrors.marginPct).toMatch(/below 100/);
  });
});

describe("the design settings list", () => {
  it("reads its own text back, group by group", () => {
    // the reliability group reaches into a nested object per technology ("voltageDoublingStep.edlc")
    const groups = { designFactors: DEFAULT_DESIGN_FACTORS, autoQuoteLimits: DEFAULT_AUTO_QUOTE_LIMITS, reliabilitySettings: DEFAULT_RELIABILITY_SETTINGS };
    expect(readSettingsForm(settingsFormText(groups))).toEqual({ ok: true, groups });
  });

  it("refuses a value beyond a field's bounds with the bound in the message, and reads units", () => {
    const field = (key: string) => SETTINGS_GROUPS.flatMap((g) => g.fields).find((f) => f.key === key)!;
    expect(readSetting(field("capacitanceFade"), "95 %")).toEqual({ ok: false, message: "The end-of-life capacitance fade must be at most 90 %" });
    expect(readSetting(field("capacitanceFade"), "25 %")).toEqual({ ok: true, value: 0.25 });
    expect(readSetting(field("safeVoltage"), "0 V")).toMatchObject({ ok: false, message: expect.stringMatching(/greater than zero/) });
    expect(readSetting(field("maxStoredEnergy"), "2 MJ")).toEqual({ ok: true, value: 2e6 });
    expect(readSetting(field("safeTime"), "2 min")).toEqual({ ok: true, value: 120 });
    expect(readSetting(field("resistorSeries"), "E6")).toMatchObject({ ok: false });
    expect(readSetting(field("maxCellCount"), "12.5")).toMatchObject({ ok: false, message: expect.stringMatching(/whole number/) });
  });

  it("gives every field a sentence of help and bounds a number can be checked against", () => {
    for (const f of SETTINGS_GROUPS.flatMap((g) => g.fields)) {
      expect(f.help.length, f.key).toBeGreaterThan(20);
      if (f.kind !== "choice") expect(f.max, f.key).toBeGreaterThan(f.min ?? 0);
    }
  });
});

describe("API key scopes", () => {
  it("stand in only for permissions staff have, and catalog:read never writes", () => {
    for (const permission of Object.keys(API_KEY_SCOPE_FOR)) expect(ROLE_PERMISSIONS.estimator, permission).toContain(permission);
    expect(keyAllows(["catalog:read"], "catalog:read")).toBe(true);
    expect(keyAllows(["catalog:read"], "catalog:write")).toBe(false);
    expect(keyAllows(["catalog:read"], "pricing:write")).toBe(false);
    expect(keyAllows(["catalog:write"], "pricing:write")).toBe(true);
    expect(keyAllows(["quotes:read", "catalog:write"], "team:update-role")).toBe(false);
    expect(keyAllows(["orders:read"], ["quote:read-all", "order:read-all"])).toBe(true);
  });
});
