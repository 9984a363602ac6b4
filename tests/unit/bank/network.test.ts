import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { evaluateNetwork, type NetworkNode } from "@/lib/bank";

const cell = (id: string, capacitance: number, ratedVoltage = 100, esr?: number): NetworkNode =>
  esr === undefined ? { kind: "cell", id, capacitance, ratedVoltage } : { kind: "cell", id, capacitance, ratedVoltage, esr };
const series = (...children: NetworkNode[]): NetworkNode => ({ kind: "series", children });
const parallel = (...children: NetworkNode[]): NetworkNode => ({ kind: "parallel", children });
const µ = 1e-6;
const p = 1e-12;

describe("textbook worked examples", () => {
  // Source: OpenStax, University Physics Volume 2 (2016), section 8.2 "Capacitors in Series and in
  // Parallel", worked examples. Values from memory.
  it("series 1.000 µF, 5.000 µF, 8.000 µF → 0.755 µF", () => {
    const r = evaluateNetwork(series(cell("c1", 1 * µ), cell("c2", 5 * µ), cell("c3", 8 * µ)));
    expect(r.capacitance / µ).toBeCloseTo(0.755, 3);
  });

  it("parallel 1.000 pF, 5.000 pF, 8.000 pF → 14.0 pF", () => {
    const r = evaluateNetwork(parallel(cell("c1", 1 * p), cell("c2", 5 * p), cell("c3", 8 * p)));
    expect(r.capacitance / p).toBeCloseTo(14.0, 9);
  });

  it("1.000 µF and 5.000 µF in series, in parallel with 8.000 µF → 8.833 µF", () => {
    const r = evaluateNetwork(parallel(series(cell("c1", 1 * µ), cell("c2", 5 * µ)), cell("c3", 8 * µ)));
    expect(r.capacitance / µ).toBeCloseTo(8.833, 3);
  });

  it("12.0 µF in series with (2.0 µF ∥ 4.0 µF) at 12.0 V → 4.0 µF, V₁ = 4.0 V, V₂ = V₃ = 8.0 V, Q₂ = 16 µC, Q₃ = 32 µC", () => {
    const r = evaluateNetwork(series(cell("c1", 12 * µ), parallel(cell("c2", 2 * µ), cell("c3", 4 * µ))), 12);
    expect(r.capacitance / µ).toBeCloseTo(4.0, 9);
    expect(r.charge / µ).toBeCloseTo(48, 9);
    const byId = new Map(r.cells.map((c) => [c.id, c]));
    expect(byId.get("c1")!.voltage).toBeCloseTo(4.0, 9);
    expect(byId.get("c2")!.voltage).toBeCloseTo(8.0, 9);
    expect(byId.get("c3")!.voltage).toBeCloseTo(8.0, 9);
    expect(byId.get("c2")!.charge / µ).toBeCloseTo(16, 9);
    expect(byId.get("c3")!.charge / µ).toBeCloseTo(32, 9);
  });
});

describe("evaluateNetwork", () => {
  it("lists cells in document order and evaluates at maxVoltage when no voltage is given", () => {
    // 1 µF, 5 µF, 8 µF in series rated 10 V each: the 1 µF cell carries 0.755/1 of the voltage
    const r = evaluateNetwork(series(cell("a", 1 * µ, 10), cell("b", 5 * µ, 10), cell("c", 8 * µ, 10)));
    expect(r.cells.map((c) => c.id)).toEqual(["a", "b", "c"]);
    expect(r.maxVoltage).toBeCloseTo(10 * (1 + 1 / 5 + 1 / 8), 9); // V = Q/C, Q = 10 V · 1 µF
    expect(r.appliedVoltage).toBe(r.maxVoltage);
    expect(r.cells[0]!.voltage).toBeCloseTo(10, 9);
  });

  it("one weak cell limits the whole bank", () => {
    const r = evaluateNetwork(series(cell("a", 100, 2.7), cell("b", 100, 2.7), cell("weak", 100, 2.5)));
    expect(r.maxVoltage).toBeCloseTo(7.5, 9);
  });

  it("combines ESR: series adds, parallel combines reciprocally, only when every cell has one", () => {
    const r = evaluateNetwork(series(parallel(cell("a", 1, 3, 0.002), cell("b", 1, 3, 0.002)), cell("c", 2, 3, 0.004)));
    expect(r.esr).toBeCloseTo(0.001 + 0.004, 12);
    const partial = evaluateNetwork(series(cell("a", 1, 3, 0.002), cell("b", 1, 3)));
    expect(partial.esr).toBeUndefined();
  });

  it("½·C·V² energy is conserved across a nested tree (arithmetic identity)", () => {
    const tree = series(parallel(cell("a", 3), series(cell("b", 2), cell("c", 7))), cell("d", 1.5), parallel(cell("e", 0.5), cell("f", 0.25)));
    const r = evaluateNetwork(tree, 5);
    const sum = r.cells.reduce((s, c) => s + c.energy, 0);
    expect(sum / r.energy).toBeCloseTo(1, 12);
    expect(r.energy).toBeCloseTo(0.5 * r.capacitance * 25, 12);
  });

  it("handles depth 64 and 20,000 cells without recursion", () => {
    let deep: NetworkNode = cell("x", 1);
    for (let i = 0; i < 5000; i++) deep = { kind: i % 2 ? "series" : "parallel", children: [deep] };
    expect(evaluateNetwork(deep).capacitance).toBeCloseTo(1, 12);
    const strings = Array.from({ length: 200 }, (_, s) => series(...Array.from({ length: 100 }, (_, i) => cell(`s${s}-${i}`, 100, 2.7))));
    const big = evaluateNetwork(parallel(...strings));
    expect(big.cells).toHaveLength(20_000);
    expect(big.capacitance).toBeCloseTo(200, 9); // 200 strings × 100 F / 100
    expect(big.maxVoltage).toBeCloseTo(270, 9);
  });

  it("refuses an empty group", () => {
    expect(() => evaluateNetwork({ kind: "series", children: [] })).toThrow(RangeError);
  });
});

// ---- property tests (fast-check) ----

const arbCell = fc.record({
  capacitance: fc.double({ min: 1e-6, max: 1e3, noNaN: true }),
  ratedVoltage: fc.double({ min: 0.5, max: 1000, noNaN: true }),
});

let idCounter = 0;
const arbTree: fc.Arbitrary<NetworkNode> = fc.letrec<{ node: NetworkNode }>((tie) => ({
  node: fc.oneof(
    { depthSize: "small", withCrossShrink: true },
    arbCell.map((c) => ({ kind: "cell" as const, id: `c${idCounter++}`, ...c })),
    fc.record({
      kind: fc.constantFrom("series" as const, "parallel" as const),
      children: fc.array(tie("node"), { minLength: 1, maxLength: 4 }),
    }),
  ),
})).node;

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b));

describe("network properties", () => {
  it("series C is at most the smallest child; parallel C is at least the largest", () => {
    fc.assert(
      fc.property(fc.array(arbTree, { minLength: 1, maxLength: 5 }), (children) => {
        const childCs = children.map((c) => evaluateNetwork(c).capacitance);
        const s = evaluateNetwork({ kind: "series", children }).capacitance;
        const par = evaluateNetwork({ kind: "parallel", children }).capacitance;
        expect(s).toBeLessThanOrEqual(Math.min(...childCs) * (1 + 1e-12));
        expect(par).toBeGreaterThanOrEqual(Math.max(...childCs) * (1 - 1e-12));
      }),
    );
  });

  it("adding a cell in parallel never raises the maximum voltage", () => {
    fc.assert(
      fc.property(arbTree, arbCell, (tree, extra) => {
        const before = evaluateNetwork(tree).maxVoltage;
        const after = evaluateNetwork(parallel(tree, { kind: "cell", id: "extra", ...extra })).maxVoltage;
        expect(after).toBeLessThanOrEqual(before * (1 + 1e-12));
      }),
    );
  });

  it("cell energies sum to ½·C·V² and no cell exceeds its rating at maxVoltage", () => {
    fc.assert(
      fc.property(arbTree, fc.option(fc.double({ min: 0.1, max: 1000, noNaN: true }), { nil: undefined }), (tree, v) => {
        const r = evaluateNetwork(tree, v);
        const sum = r.cells.reduce((s, c) => s + c.energy, 0);
        expect(rel(sum, 0.5 * r.capacitance * r.appliedVoltage ** 2)).toBeLessThan(1e-9);
        if (v === undefined) {
          const ratings = new Map<string, number>();
          const stack: NetworkNode[] = [tree];
          while (stack.length) {
            const n = stack.pop()!;
            if (n.kind === "cell") ratings.set(n.id, n.ratedVoltage);
            else stack.push(...n.children);
          }
          for (const c of r.cells) expect(c.voltage).toBeLessThanOrEqual(ratings.get(c.id)! * (1 + 1e-9));
          expect(r.cells.some((c) => rel(c.voltage, ratings.get(c.id)!) < 1e-9)).toBe(true);
        }
      }),
    );
  });
});
