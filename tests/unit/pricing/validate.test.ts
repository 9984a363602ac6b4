import { describe, expect, it } from "vitest";
import { DEFAULT_PRICING_RULES, validateBankBill, validatePricingRules, type BankBill, type PricingRules } from "@/lib/pricing";

const rules = (over: Partial<PricingRules> = {}): PricingRules => ({
  ...DEFAULT_PRICING_RULES,
  ...over,
});
const paths = (r: PricingRules): string[] => validatePricingRules(r).map((i) => i.path);

describe("validatePricingRules", () => {
  it("accepts the default rules", () => {
    expect(validatePricingRules(rules())).toEqual([]);
  });

  // Margin on price: price = cost / (1 − m) — m = 100 % divides by zero, above it the price
  // turns negative (arithmetic).
  it.each(["100", "100.0", "150", "-1"])("refuses a margin of %s %%", (marginPct) => {
    expect(paths(rules({ marginPct }))).toEqual(["marginPct"]);
  });

  it("accepts a margin just below 100 % and a zero margin", () => {
    expect(paths(rules({ marginPct: "99.99" }))).toEqual([]);
    expect(paths(rules({ marginPct: "0" }))).toEqual([]);
  });

  it("refuses negative rates and money that is not a decimal string", () => {
    expect(paths(rules({ labourRatePerHour: "-5.00" }))).toEqual(["labourRatePerHour"]);
    expect(paths(rules({ labourRatePerHour: "68,00" }))).toEqual(["labourRatePerHour"]);
    expect(paths(rules({ terminalSetCost: "1e2" }))).toEqual(["terminalSetCost"]);
    expect(paths(rules({ balancingBoardCost: "-1" }))).toEqual(["balancingBoardCost"]);
    expect(paths(rules({ overheadPct: "-3" }))).toEqual(["overheadPct"]);
    expect(paths(rules({ taxRatePct: "-0.5" }))).toEqual(["taxRatePct"]);
    expect(paths(rules({ taxRatePct: "120" }))).toEqual(["taxRatePct"]);
    expect(paths(rules({ setupMinutes: -1, testMinutes: Number.NaN }))).toEqual(["setupMinutes", "testMinutes"]);
  });

  it("refuses money finer than the currency minor unit (ISO 4217: EUR 2, JPY 0, KWD 3)", () => {
    expect(paths(rules({ labourRatePerHour: "68.001" }))).toEqual(["labourRatePerHour"]);
    const yen = rules({
      currency: "JPY",
      labourRatePerHour: "6000",
      interconnectCostPerCell: "250",
      balancingBoardCost: "2500",
      terminalSetCost: "3000",
      enclosures: [{ name: "Box", maxVolumeM3: 0.01, cost: "9000" }],
    });
    expect(paths(yen)).toEqual([]);
    expect(paths({ ...yen, labourRatePerHour: "6000.5" })).toEqual(["labourRatePerHour"]);
    expect(paths(rules({ currency: "KWD", labourRatePerHour: "12.500" }))).toEqual([]);
  });

  it.each([
    [0, []],
    [100, []],
    [30.5, []],
    [-1, ["depositPercent"]],
    [100.5, ["depositPercent"]],
    [Number.NaN, ["depositPercent"]],
  ])("reads a deposit of %s %% (0 = full payment only, 100 = all up front)", (depositPercent, expected) => {
    expect(paths(rules({ depositPercent }))).toEqual(expected);
  });

  it("still reads rules saved with the retired flat resistor costs, and checks them as money", () => {
    expect(paths(rules({ balancingResistorCost: "0.35", bleederCostPerWatt: "0.90" }))).toEqual([]);
    expect(paths(rules({ bleederCostPerWatt: "0.9x" }))).toEqual(["bleederCostPerWatt"]);
  });

  it("refuses an unknown currency", () => {
    expect(paths(rules({ currency: "XYZ" }))).toEqual(["currency"]);
    expect(paths(rules({ currency: "eur" }))).toEqual(["currency"]);
  });

  it("checks enclosures, packing factor, breaks and validity with their paths", () => {
    const issues = validatePricingRules(
      rules({
        enclosures: [
          { name: "A", maxVolumeM3: 0.01, cost: "10.00" },
          { name: "", maxVolumeM3: 0, cost: "-1.00" },
          { name: "A", maxVolumeM3: 0.02, cost: "20.00" },
        ],
        enclosurePackingFactor: 0.9,
        quantityBreaks: [
          { minQuantity: 5, discountPct: "4" },
          { minQuantity: 5, discountPct: "100" },
          { minQuantity: 2.5, discountPct: "1" },
        ],
        quoteValidityDays: 0,
      }),
    );
    expect(issues.map((i) => i.path)).toEqual([
      "enclosures[1].name",
      "enclosures[1].maxVolumeM3",
      "enclosures[1].cost",
      "enclosures[2].name",
      "enclosurePackingFactor",
      "quantityBreaks[1].minQuantity",
      "quantityBreaks[1].discountPct",
      "quantityBreaks[2].minQuantity",
      "quoteValidityDays",
    ]);
    expect(issues.find((i) => i.path === "enclosures[2].name")?.message).toMatch(/duplicates/);
    expect(issues.find((i) => i.path === "quantityBreaks[1].discountPct")?.message).toMatch(/below 100/);
  });
});

describe("validateBankBill", () => {
  const bill: BankBill = {
    cell: { sku: "QX-350F-2V7", description: "EDLC cell 350 F 2.7 V", unitCost: "6.40" },
    cellCount: 6,
    balancingResistors: { count: 6, resistance: 1000, powerRating: 0.25, unitCost: "0.35" },
    bleeder: { resistance: 330, power: 2, unitCost: "1.80" },
    activeBoards: { sku: "AB-6S", count: 1, unitCost: "" },
    volumeM3: 0.000528,
    quantity: 1,
  };

  it('accepts a sound bill (an empty board unit cost means "use the rules fallback")', () => {
    expect(validateBankBill(bill)).toEqual([]);
  });

  it("lists every problem with its path", () => {
    const issues = validateBankBill({
      cell: { sku: " ", description: "x", unitCost: "1e3" },
      cellCount: 0,
      balancingResistors: { count: -1, resistance: 0, powerRating: 0.25, unitCost: "0.35" },
      bleeder: { resistance: 330, power: Number.POSITIVE_INFINITY, unitCost: "1.80" },
      activeBoards: { sku: "AB-6S", count: 1.5, unitCost: "-3" },
      volumeM3: 0,
      quantity: 2.5,
    });
    expect(issues.map((i) => i.path)).toEqual([
      "cell.sku",
      "cell.unitCost",
      "cellCount",
      "quantity",
      "volumeM3",
      "balancingResistors.count",
      "balancingResistors.resistance",
      "bleeder.power",
      "activeBoards.count",
      "activeBoards.unitCost",
    ]);
  });
});
