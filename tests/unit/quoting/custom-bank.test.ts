import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DEFAULT_DESIGN_FACTORS, evaluateNetwork, searchArrangements, worstCaseCellVoltage, type NetworkNode } from "@/lib/bank";
import { priceBank } from "@/lib/pricing";
import { toEngineCell } from "@/lib/quoting/bill";
import { checkCustomTree, customBankBill, customBankOption, evaluateCustomBank, partsOf } from "@/lib/quoting/custom-bank";
import type { CatalogCell, CustomNode } from "@/lib/quoting/types";
import { demoCatalog } from "./demo-catalog";
import { SAMPLE_CELL } from "./sample-quote";

// Two invented 16 V cells of 100 F and 50 F.
const cell = (sku: string, capacitanceF: number): CatalogCell => ({ ...SAMPLE_CELL, id: sku, sku, capacitanceF, ratedVoltageV: 16, surgeVoltageV: 17 });
const C100 = cell("TST-100F-16", 100);
const C50 = cell("TST-050F-16", 50);
const leaf = (sku: string): CustomNode => ({ kind: "cell", sku });
const factors = { ...DEFAULT_DESIGN_FACTORS, matchingTolerance: 0 };

describe("a custom bank evaluated by the engine", () => {
  it("two mixed cells in series share the charge: the smaller takes the larger voltage (OpenStax University Physics Vol. 2 §8.2)", () => {
    // series: 1/C = 1/100 + 1/50 → C = 33.33 F; at 15 V, Q = 500 C, so V = Q/C_i = 5 V and 10 V
    const r = evaluateCustomBank({ kind: "series", children: [leaf(C100.sku), leaf(C50.sku)] }, [C100, C50], { maxVoltage: 15, capacitance: 30 }, factors);
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.figures.capacitance).toBeCloseTo(100 / 3, 9);
    expect(r.figures.cells.map((c) => [c.id, c.sku, Number(c.voltage.toFixed(9))])).toEqual([
      ["1", C100.sku, 5],
      ["2", C50.sku, 10],
    ]);
    expect(r.figures.weakest.sku).toBe(C50.sku);
    // the weakest cell limits the bank: 16 V on the 50 F cell is 24 V across both
    expect(r.figures.maxVoltage).toBeCloseTo(24, 9);
    // ½·C·V² = ½ × 33.33 × 15² = 3750 J
    expect(r.figures.energy).toBeCloseTo(3750, 6);
    expect(r.problems).toEqual([]);
  });

  it("a string of one part has the engine's own worst-case charging voltage (DESIGN §3.2)", () => {
    const m = 0.05;
    const tree: CustomNode = { kind: "series", children: Array.from({ length: 7 }, () => leaf(C100.sku)) };
    const r = evaluateCustomBank(tree, [C100], { maxVoltage: 100, capacitance: 1 }, { ...DEFAULT_DESIGN_FACTORS, matchingTolerance: m });
    if (!r.ok) throw new Error("not ok");
    for (const c of r.figures.cells) expect(c.worstVoltage).toBeCloseTo(worstCaseCellVoltage(100, 7, m), 9);
  });

  it("each cell's worst case equals evaluating the whole tree again with that cell low and every other high", () => {
    const parts = [C100, C50, cell("TST-220F-16", 220)];
    const node: fc.Arbitrary<CustomNode> = fc.letrec<{ node: CustomNode }>((tie) => ({
      node: fc.oneof(
        { depthSize: "small", withCrossShrink: true },
        fc.constantFrom(...parts.map((p) => leaf(p.sku))),
        fc.record({ kind: fc.constantFrom("series" as const, "parallel" as const), children: fc.array(tie("node"), { minLength: 1, maxLength: 4 }) }),
      ),
    })).node;
    fc.assert(
      fc.property(node, fc.double({ min: 0, max: 0.2, noNaN: true }), (tree, m) => {
        const f = { ...DEFAULT_DESIGN_FACTORS, matchingTolerance: m };
        const r = evaluateCustomBank(tree, parts, { maxVoltage: 10, capacitance: 1 }, f);
        if (!r.ok) return; // too deep for the editor
        r.figures.cells.forEach((c, x) => {
          let i = 0;
          const scale = (n: NetworkNode): NetworkNode =>
            n.kind === "cell" ? { ...n, capacitance: n.capacitance * (i++ === x ? 1 - m : 1 + m) } : { ...n, children: n.children.map(scale) };
          const brute = evaluateNetwork(scale(r.network), 10).cells[x]?.voltage ?? NaN;
          expect(c.worstVoltage).toBeCloseTo(brute, 9);
        });
      }),
      { numRuns: 200 },
    );
  });

  it("a bank built as the engine's option has the option's figures", () => {
    const catalog = demoCatalog("kestrel-bank-works");
    const requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000 };
    const o = searchArrangements({ requirement, cells: catalog.cells.map(toEngineCell), factors: DEFAULT_DESIGN_FACTORS }).options.find(
      (x) => x.topology === "series-of-parallel-groups" && x.balancing.activeBoard === null,
    );
    if (!o) throw new Error("no option");
    const group: CustomNode = { kind: "parallel", children: Array.from({ length: o.parallelCount }, () => leaf(o.cell.sku)) };
    const tree: CustomNode = { kind: "series", children: Array.from({ length: o.seriesCount }, () => group) };
    const r = evaluateCustomBank(tree, catalog.cells, requirement, DEFAULT_DESIGN_FACTORS);
    if (!r.ok) throw new Error("not ok");
    const summary = customBankOption(tree, r.figures, catalog.cells, requirement, DEFAULT_DESIGN_FACTORS, { warnings: r.warnings });
    expect(summary.capacitance.nominal).toBeCloseTo(o.capacitance.nominal, 9);
    expect(summary.capacitance.design).toBeCloseTo(o.capacitance.design, 9);
    expect(summary.esr.new).toBeCloseTo(o.esr.new, 12);
    expect(summary.mass).toBeCloseTo(o.mass, 9);
    expect(summary.volume).toBeCloseTo(o.volume, 12);
    expect(summary.usableEnergy).toBeCloseTo(o.usableEnergy, 6);
    expect([summary.seriesCount, summary.parallelCount, summary.cellCount]).toEqual([o.seriesCount, o.parallelCount, o.cellCount]);
  });

  it("refuses a cell past its surge voltage and warns of one past its rating", () => {
    // 40 V on two 16 V cells in series: 20 V each, past the 17 V surge
    const past = evaluateCustomBank({ kind: "series", children: [leaf(C100.sku), leaf(C100.sku)] }, [C100], { maxVoltage: 40, capacitance: 1 }, factors);
    expect(past.ok && past.problems).toEqual([expect.stringMatching(/^2 cells would pass the surge voltage/)]);
    // 33 V: 16.5 V each, past 16 V but within 17 V
    const rated = evaluateCustomBank({ kind: "series", children: [leaf(C100.sku), leaf(C100.sku)] }, [C100], { maxVoltage: 33, capacitance: 1 }, factors);
    expect(rated.ok && rated.problems).toEqual([]);
    expect(rated.ok && rated.warnings.join(" ")).toMatch(/pass the rated voltage/);
  });

  it("names what is wrong with an unfinished tree, by its place", () => {
    const tree: CustomNode = {
      kind: "series",
      children: [leaf(C100.sku), { kind: "parallel", children: [] }, { kind: "parallel", children: [leaf("NOPE"), leaf("")] }],
    };
    expect(checkCustomTree(tree, new Set([C100.sku]))).toEqual(
      expect.arrayContaining([
        { at: "2", message: expect.stringMatching(/empty/) },
        { at: "3.1", message: "NOPE is not in the catalog." },
        { at: "3.2", message: "Choose a cell." },
      ]),
    );
    let deep: CustomNode = leaf(C100.sku);
    for (let i = 0; i < 9; i++) deep = { kind: "series", children: [deep] };
    expect(checkCustomTree(deep, new Set([C100.sku])).map((i) => i.message)).toEqual([expect.stringMatching(/at most 8 levels/)]);
    expect(evaluateCustomBank(tree, [C100], { maxVoltage: 10, capacitance: 1 }, factors).ok).toBe(false);
  });

  it("bills each part by its count, and prices them on their own lines", () => {
    const tree: CustomNode = { kind: "series", children: [{ kind: "parallel", children: [leaf(C100.sku), leaf(C50.sku), leaf(C50.sku)] }, leaf(C100.sku)] };
    expect(partsOf(tree)).toEqual([
      { sku: C100.sku, count: 2 },
      { sku: C50.sku, count: 2 },
    ]);
    const requirement = { maxVoltage: 20, capacitance: 1 };
    const r = evaluateCustomBank(tree, [C100, C50], requirement, factors);
    if (!r.ok) throw new Error("not ok");
    const option = customBankOption(tree, r.figures, [C100, C50], requirement, factors, { warnings: r.warnings });
    const demo = demoCatalog("kestrel-bank-works");
    const made = customBankBill(tree, option, [C100, C50], demo.components, 3);
    if (!made.ok) throw new Error(made.message);
    expect(made.bill.mixedCells?.map((c) => [c.sku, c.count])).toEqual([
      [C100.sku, 2],
      [C50.sku, 2],
    ]);
    expect(made.bill.balancingResistors).toBeNull();
    const price = priceBank(made.bill, demo.rules);
    expect(price.lines.filter((l) => l.code === "cells").map((l) => l.quantity)).toEqual([2, 2]);
  });
});
