import { describe, expect, it } from "vitest";
import { banksNotPassed, judgeTest, positionNames, testLimitsOf } from "@/lib/orders/test-limits";
import type { TestMeasurement } from "@/lib/orders/types";
import type { PricedOption } from "@/lib/quoting/types";

/** The fields of a frozen option the limits read; the rest of a PricedOption plays no part. */
function option(o: {
  topology: PricedOption["topology"];
  ns: number;
  np: number;
  cell: { capacitance: number; minus: number; plus: number; esr: number; leakage: number; rated: number; technology?: PricedOption["cell"]["technology"] };
  resistance: number | null;
  bleeder?: { resistance: number; switched: boolean };
  worstCellVoltage: number;
}): PricedOption {
  return {
    topology: o.topology,
    seriesCount: o.ns,
    parallelCount: o.np,
    capacitance: { nominal: (o.np * o.cell.capacitance) / o.ns, design: 0 },
    esr: { new: (o.cell.esr * o.ns) / o.np, endOfLife: 0 },
    cell: {
      technology: o.cell.technology ?? "edlc",
      capacitance: o.cell.capacitance,
      toleranceMinus: o.cell.minus,
      tolerancePlus: o.cell.plus,
      leakageCurrent: o.cell.leakage,
      ratedVoltage: o.cell.rated,
    },
    balancing: {
      resistance: o.resistance,
      count: o.resistance === null ? 0 : o.topology === "series-of-parallel-groups" ? o.ns : o.ns * o.np,
      activeBoard: null,
    },
    discharge: { bleeder: o.bleeder ?? null },
    worstCellVoltage: o.worstCellVoltage,
  } as unknown as PricedOption;
}

// Worked by hand (arithmetic below each figure). 18 groups of 4 × 100 F (−10/+20 %), 10 mΩ,
// 0.2 mA leakage, 2.7 V cells, 10 kΩ per group, at 48 V; cells graded to ±5 %, so the weakest
// cell charges to V_w = 48 / (1 + 17 × 0.95/1.05) = 2.9302 V (DESIGN.md §3.2), above the 2.7 V rating.
const groups = option({
  topology: "series-of-parallel-groups",
  ns: 18,
  np: 4,
  cell: { capacitance: 100, minus: 0.1, plus: 0.2, esr: 0.01, leakage: 0.0002, rated: 2.7 },
  resistance: 10_000,
  worstCellVoltage: 48 / (1 + (17 * 0.95) / 1.05),
});

describe("test limits from the frozen specification", () => {
  it("derives every limit of a bank of groups in series", () => {
    const l = testLimitsOf(groups, { maxVoltage: 48 });
    expect(l.testVoltage).toBe(48);
    // C = 4 × 100 / 18 = 22.222 F; −10 % = 20.000 F; +20 % = 26.667 F
    expect(l.capacitance.nominal).toBeCloseTo(22.2222, 4);
    expect(l.capacitance.min).toBeCloseTo(20.0, 4);
    expect(l.capacitance.max).toBeCloseTo(26.6667, 4);
    // ESR new = 10 mΩ × 18 / 4 = 45 mΩ; +20 % = 54 mΩ
    expect(l.esr.max).toBeCloseTo(0.054, 9);
    // 4 × 0.2 mA through each group + 2.6667 V / 10 kΩ = 0.8 mA + 0.26667 mA = 1.06667 mA
    expect(l.leakage.max).toBeCloseTo(0.00106667, 8);
    // V_w (2.93 V) is above the rating, so the top is the 2.7 V rating: 2.6667 ± 0.0333 V
    expect(l.positionVoltage.max).toBeCloseTo(2.7, 9);
    expect(l.positionVoltage.min).toBeCloseTo(2.63333, 5);
    expect(l.positions).toEqual(Array.from({ length: 18 }, (_, i) => `g${i + 1}`));
    expect(l.minHoldMinutes).toBe(60);
  });

  it("counts every cell of every string, each string's resistors and a continuous bleeder", () => {
    // 2 strings of 3 × 1 mA cells, 1 kΩ across each cell, a 100 Ω bleeder, at 7.5 V:
    // 2 × (1 mA + 2.5 V / 1 kΩ) + 7.5 V / 100 Ω = 7 mA + 75 mA = 82 mA
    const strings = option({
      topology: "parallel-of-series-strings",
      ns: 3,
      np: 2,
      cell: { capacitance: 10, minus: 0.1, plus: 0.1, esr: 0.1, leakage: 0.001, rated: 2.7 },
      resistance: 1000,
      bleeder: { resistance: 100, switched: false },
      worstCellVoltage: 2.6,
    });
    const l = testLimitsOf(strings, { maxVoltage: 7.5 });
    expect(l.leakage.max).toBeCloseTo(0.082, 9);
    expect(l.positions).toEqual(["s1-c1", "s1-c2", "s1-c3", "s2-c1", "s2-c2", "s2-c3"]);
    // 2.5 ± (2.6 − 2.5) V
    expect(l.positionVoltage.min).toBeCloseTo(2.4, 9);
    expect(l.positionVoltage.max).toBeCloseTo(2.6, 9);
    // a switched discharge circuit is off in service and draws nothing
    const switched = testLimitsOf({ ...strings, discharge: { ...strings.discharge, bleeder: { resistance: 100, switched: true } } } as PricedOption, {
      maxVoltage: 7.5,
    });
    expect(switched.leakage.max).toBeCloseTo(0.007, 9);
  });

  it("gives one series position a band of the meter's ±1 %, and waits minutes, not an hour, for film", () => {
    const one = option({
      topology: "series-of-parallel-groups",
      ns: 1,
      np: 10,
      cell: { capacitance: 1e-6, minus: 0.05, plus: 0.05, esr: 0.005, leakage: 1e-9, rated: 1100, technology: "film" },
      resistance: null,
      worstCellVoltage: 800,
    });
    const l = testLimitsOf(one, { maxVoltage: 800 });
    expect(l.positionVoltage.min).toBeCloseTo(792, 9);
    expect(l.positionVoltage.max).toBeCloseTo(808, 9);
    expect(l.minHoldMinutes).toBe(1);
    expect(positionNames(one)).toEqual(["g1"]);
  });
});

describe("judging a bank", () => {
  const limits = testLimitsOf(groups, { maxVoltage: 48 });
  const good = { capacitance: 22.5, esr: 0.05, leakageCurrent: 0.001, holdMinutes: 60, positionVoltages: Array.from({ length: 18 }, () => 2.6667) };

  it("passes a bank within every limit", () => {
    const v = judgeTest(good, limits);
    expect(v.passed).toBe(true);
    expect(v.checks.map((c) => [c.key, c.passed])).toEqual([
      ["capacitance", true],
      ["esr", true],
      ["hold", true],
      ["leakage", true],
      ["positions", true],
    ]);
  });

  it.each([
    ["capacitance", { capacitance: 19.9 }],
    ["capacitance", { capacitance: 26.7 }],
    ["esr", { esr: 0.0541 }],
    ["hold", { holdMinutes: 59 }],
    ["leakage", { leakageCurrent: 0.0011 }],
    ["positions", { positionVoltages: [2.71, ...Array.from({ length: 17 }, () => 2.66)] }],
    ["positions", { positionVoltages: Array.from({ length: 17 }, () => 2.66) }],
  ] as [string, Partial<TestMeasurement>][])("fails %s outside its limit", (key, change) => {
    const v = judgeTest({ ...good, ...change }, limits);
    expect(v.passed).toBe(false);
    expect(v.checks.filter((c) => !c.passed).map((c) => c.key)).toEqual([key]);
  });

  it("names the positions outside the band, a handful at most", () => {
    const voltages = Array.from({ length: 18 }, (_, i) => (i % 2 === 0 ? 2.5 : 2.66));
    const check = judgeTest({ ...good, positionVoltages: voltages }, limits).checks.find((c) => c.key === "positions");
    expect(check?.measured).toBe("outside: g1 2.5 V, g3 2.5 V, g5 2.5 V, g7 2.5 V, g9 2.5 V, g11 2.5 V and 3 more");
  });

  it("finds the banks with no test or a failed latest test", () => {
    expect(
      banksNotPassed(4, [
        { bank: 1, isPassed: true },
        { bank: 3, isPassed: false },
      ]),
    ).toEqual({ missing: [2, 4], failed: [3] });
    expect(banksNotPassed(1, [{ bank: 1, isPassed: true }])).toEqual({ missing: [], failed: [] });
  });
});
