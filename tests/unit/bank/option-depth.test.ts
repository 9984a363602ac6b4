import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DEFAULT_DESIGN_FACTORS, HOURS_PER_YEAR, searchArrangements, type CellThermal, type EngineCell, type Requirement } from "@/lib/bank";
import { endOfLifeCapacitanceNeed, optionYield, optionYieldSamples } from "@/lib/bank/option-yield";
import { edlc3000 } from "./cells";

// Invented EDLC cells (invented part numbers) with made-up but typical life data: 1500 h at 65 °C
// and 2.7 V, −40 to 65 °C, 3.2 K/W to ambient.
const thermal: CellThermal = {
  ratedLifeHours: 1500,
  ratedTemperature: 65,
  minTemperature: -40,
  maxTemperature: 65,
  thermalResistance: 3.2,
  coldCapacitanceFactor: 0.9,
  coldEsrFactor: 2.5,
};

function edlc(sku: string, overrides: Partial<EngineCell> = {}): EngineCell {
  return edlc3000({ id: `cell-${sku}`, sku, thermal, ...overrides });
}

const factors = DEFAULT_DESIGN_FACTORS;
const requirement: Requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000, ambientTemperature: 40 };

describe("temperature and life on every option", () => {
  it("carries the life estimate: the 10 °C rule and the voltage step (common practice), with its assumptions", () => {
    const o = searchArrangements({ requirement, cells: [edlc("QZ-3000")], factors }).options[0]!;
    const life = o.life!;
    expect(life.ambientTemperature).toBe(40);
    expect(life.ambientAssumed).toBe(false);
    expect(life.cellVoltage).toBeCloseTo(48 / o.seriesCount, 12);
    // worked by hand: 2^((65 − 40)/10) = 5.66; voltage: 2^((2.7 − V_cell)/(0.037·2.7))
    expect(life.temperatureFactor).toBeCloseTo(2 ** 2.5, 9);
    expect(life.voltageFactor).toBeCloseTo(2 ** ((2.7 - 48 / o.seriesCount) / (0.037 * 2.7)), 9);
    expect(life.lifeHours).toBeCloseTo(Math.min(1500 * life.temperatureFactor * life.voltageFactor, 20 * HOURS_PER_YEAR), 6);
    expect(life.assumptions.join(" ")).toMatch(/10 °C below the rated 65 °C \(common practice\)/);
    expect(life.assumptions.join(" ")).toMatch(/No rms current was stated/);
    // the bank at −40 °C: 0.9 × C and 2.5 × ESR
    expect(life.cold!.capacitance).toBeCloseTo(o.capacitance.nominal * 0.9, 9);
    expect(life.cold!.esr).toBeCloseTo(o.esr.new * 2.5, 12);
  });

  it("assumes 25 °C when no ambient is stated, and says so", () => {
    const o = searchArrangements({ requirement: { maxVoltage: 48, minVoltage: 24, energy: 20_000 }, cells: [edlc("QZ-3000")], factors }).options[0]!;
    expect(o.life!.ambientAssumed).toBe(true);
    expect(o.life!.ambientTemperature).toBe(25);
    expect(o.life!.assumptions[0]).toMatch(/25 °C is assumed/);
  });

  it("is null when the catalog gives no life data", () => {
    const o = searchArrangements({ requirement, cells: [edlc("QZ-3000", { thermal: null })], factors }).options[0]!;
    expect(o.life).toBeNull();
  });

  it("refuses a cell whose range excludes the stated ambient, and says why", () => {
    const hot = searchArrangements({ requirement: { ...requirement, ambientTemperature: 70 }, cells: [edlc("QZ-3000")], factors });
    expect(hot.options).toEqual([]);
    expect(hot.reasons.join(" ")).toContain("the 70 °C ambient is outside every cell's temperature range");
    const cold = searchArrangements({ requirement: { ...requirement, ambientTemperature: -50 }, cells: [edlc("QZ-3000")], factors });
    expect(cold.options).toEqual([]);
  });

  it("adds cells in parallel until self-heating keeps them within range: (I/N_p)²·ESR·R_th ≤ T_max − ambient", () => {
    // 400 A rms at 55 °C: N_p ≥ 400·√(0.29 mΩ · 3.2 K/W / 10 K) = 3.85 → 4; and within 130 A: N_p ≥ 3.08
    const r = searchArrangements({ requirement: { ...requirement, ambientTemperature: 55, rmsCurrent: 400 }, cells: [edlc("QZ-3000")], factors });
    expect(r.options.length).toBeGreaterThan(0);
    for (const o of r.options) {
      expect(o.parallelCount).toBeGreaterThanOrEqual(4);
      expect(o.life!.cellTemperature).toBeLessThanOrEqual(65 + 1e-9);
      expect(o.life!.selfHeating).toBeCloseTo((400 / o.parallelCount) ** 2 * 0.29e-3 * 3.2, 9);
    }
    // at 60 °C: N_p ≥ 400·√(0.29 mΩ · 3.2 K/W / 5 K) = 5.45 → 6, but 40 kg holds only 4 strings of 19 cells
    const none = searchArrangements({
      requirement: { ...requirement, ambientTemperature: 60, rmsCurrent: 400, maxMass: 40 },
      cells: [edlc("QZ-3000")],
      factors,
    });
    expect(none.options).toEqual([]);
    expect(none.reasons.join(" ")).toMatch(/400 A rms without heating its cells past their maximum temperature at 60 °C within 40 kg/);
  });

  it("the longer-life variant lives longer than the shortest safe string of the same cell", () => {
    const r = searchArrangements({ requirement, cells: [edlc("QZ-3000")], factors });
    const short = r.options.find((o) => !o.longerLife && o.topology === "series-of-parallel-groups")!;
    const long = r.options.find((o) => o.longerLife && o.topology === "series-of-parallel-groups")!;
    expect(long.seriesCount).toBe(short.seriesCount + 1);
    expect(long.life!.lifeHours!).toBeGreaterThan(short.life!.lifeHours!);
  });
});

describe("ranking and filtering by life", () => {
  // three invented cells: cheap and short-lived, dear and long-lived, and one without life data
  const cells = [
    edlc("QZ-A-CHEAP", { unitCost: 30, thermal: { ...thermal, ratedLifeHours: 500 } }),
    edlc("QZ-B-DEAR", { unitCost: 60, thermal: { ...thermal, ratedLifeHours: 4000 } }),
    edlc("QZ-C-NODATA", { unitCost: 20, thermal: null }),
  ];

  it("by price (the default) the cheapest comes first; by life the longest-lived, options without life data last", () => {
    const byPrice = searchArrangements({ requirement, cells, factors, limit: 12 }).options;
    expect(byPrice[0]!.cell.sku).toBe("QZ-C-NODATA");
    const byLife = searchArrangements({ requirement: { ...requirement, rankBy: "life" }, cells, factors, limit: 12 }).options;
    const years = byLife.map((o) => o.life?.lifeYears ?? -1);
    expect(years).toEqual([...years].sort((a, b) => b - a));
    expect(byLife[0]!.cell.sku).toBe("QZ-B-DEAR");
    expect(byLife.at(-1)!.life).toBeNull();
  });

  it("a minimum life keeps only the options expected to reach it; none reaching it is explained", () => {
    const all = searchArrangements({ requirement, cells, factors, limit: 12 }).options;
    const cut = (all.find((o) => o.cell.sku === "QZ-A-CHEAP")!.life!.lifeYears! + all.find((o) => o.cell.sku === "QZ-B-DEAR")!.life!.lifeYears!) / 2;
    const kept = searchArrangements({ requirement: { ...requirement, minLifeYears: cut }, cells, factors, limit: 12 }).options;
    expect(kept.length).toBeGreaterThan(0);
    for (const o of kept) expect(o.life!.lifeYears!).toBeGreaterThanOrEqual(cut);
    expect(kept.some((o) => o.cell.sku === "QZ-C-NODATA")).toBe(false);
    const none = searchArrangements({ requirement: { ...requirement, minLifeYears: 19.99, ambientTemperature: 60 }, cells, factors });
    expect(none.options).toEqual([]);
    expect(none.reasons.join(" ")).toMatch(/none is expected to last 19.99 years \(the longest: \d+\.\d years\)/);
  });
});

describe("the customer's filter for options that survive one failed cell", () => {
  const cells = [edlc("QZ-3000"), edlc("QZ-0650", { capacitance: 650, esr: 0.8e-3, unitCost: 16.5, thermal: null })];

  it("every option carries both verdicts, in words", () => {
    const o = searchArrangements({ requirement, cells, factors }).options[0]!;
    expect(o.failures.short.text).toMatch(/^Survives one shorted cell: (yes|no)/);
    expect(o.failures.open.text).toMatch(/^Survives one open cell: (yes|no)/);
  });

  it.each(["short", "open", "both"] as const)("survives %s: only options that survive it are shown", (survives) => {
    const all = searchArrangements({ requirement, cells, factors, limit: 40 }).options;
    const kept = searchArrangements({ requirement: { ...requirement, survives }, cells, factors, limit: 40 }).options;
    for (const o of kept) {
      if (survives !== "open") expect(o.failures.short.survives).toBe(true);
      if (survives !== "short") expect(o.failures.open.survives).toBe(true);
    }
    // the filter removes exactly the ones that do not survive
    const expected = all.filter((o) => (survives === "open" || o.failures.short.survives) && (survives === "short" || o.failures.open.survives));
    expect(kept.map((o) => `${o.cell.sku}|${o.topology}|${o.seriesCount}|${o.parallelCount}`)).toEqual(
      expected.map((o) => `${o.cell.sku}|${o.topology}|${o.seriesCount}|${o.parallelCount}`),
    );
  });

  it("a single string never survives an open cell: asking for it with one cell in parallel is explained", () => {
    const r = searchArrangements({
      requirement: { maxVoltage: 48, minVoltage: 24, capacitance: 1, survives: "open", maxMass: 11 },
      cells: [edlc("QZ-3000")],
      factors,
    });
    expect(r.options).toEqual([]);
    expect(r.reasons.join(" ")).toContain("none survives one open cell");
  });
});

describe("tolerance yield of an option", () => {
  const o = searchArrangements({ requirement, cells: [edlc("QZ-3000")], factors }).options[0]!;

  it("is reproducible: the same option gives the same numbers", () => {
    const a = optionYield(o, requirement);
    const b = optionYield(structuredClone(o), structuredClone(requirement));
    expect(b).toEqual(a);
    expect(a.samples).toBe(optionYieldSamples(o));
  });

  it("checks the requirement at end of life: the needed capacitance is 2E/(V_max² − V_min²)/(1 − f_C)", () => {
    expect(endOfLifeCapacitanceNeed(requirement, 0.2)).toBeCloseTo((2 * 20_000) / (48 * 48 - 24 * 24) / 0.8, 9);
    expect(optionYield(o, requirement).requiredCapacitance).toBeCloseTo((2 * 20_000) / (48 * 48 - 24 * 24) / 0.8, 9);
  });

  it("property: with no spread (grading m = 0) the share meeting the requirement is 0 % or 100 %", () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 200, noNaN: true }), (capacitance) => {
        const flat = { ...o, yieldBasis: { ...o.yieldBasis, matchingTolerance: 0 } };
        const y = optionYield(flat, { maxVoltage: 48, capacitance });
        expect([0, 1]).toContain(y.shares.meetingRequirement);
        expect(y.capacitance.std).toBe(0);
      }),
      { numRuns: 30 },
    );
  });

  it("takes fewer samples for a larger bank, within its bounds", () => {
    expect(optionYieldSamples({ seriesCount: 18, parallelCount: 1, topology: "series-of-parallel-groups" })).toBe(10_000);
    expect(optionYieldSamples({ seriesCount: 100, parallelCount: 100, topology: "parallel-of-series-strings" })).toBe(Math.floor(2_000_000 / 10_101));
    expect(optionYieldSamples({ seriesCount: 200, parallelCount: 100, topology: "parallel-of-series-strings" })).toBe(100);
  });
});
