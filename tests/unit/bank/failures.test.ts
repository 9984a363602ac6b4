import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  analyzeFault,
  analyzeNetworkFailures,
  analyzeOptionFailures,
  evaluateNetwork,
  optionNetwork,
  type FailureMode,
  type NetworkNode,
  type Topology,
} from "@/lib/bank";

type Cell = Extract<NetworkNode, { kind: "cell" }>;
const cell = (id: string, capacitance: number, ratedVoltage = 2.7, surgeVoltage?: number): Cell =>
  surgeVoltage === undefined ? { kind: "cell", id, capacitance, ratedVoltage } : { kind: "cell", id, capacitance, ratedVoltage, surgeVoltage };
const series = (...children: NetworkNode[]): NetworkNode => ({ kind: "series", children });
const parallel = (...children: NetworkNode[]): NetworkNode => ({ kind: "parallel", children });
const µ = 1e-6;

function bank(topology: Topology, ns: number, np: number, make: (s: number, p: number) => Cell): NetworkNode {
  if (topology === "series-of-parallel-groups") {
    return {
      kind: "series",
      children: Array.from({ length: ns }, (_, s) => ({ kind: "parallel" as const, children: Array.from({ length: np }, (_, p) => make(s, p)) })),
    };
  }
  return {
    kind: "parallel",
    children: Array.from({ length: np }, (_, p) => ({ kind: "series" as const, children: Array.from({ length: ns }, (_, s) => make(s, p)) })),
  };
}

/**
 * Reference for the checks below: the faulted network re-evaluated from scratch, by plain
 * recursion over the tree (a short is an infinite capacitance, an open a zero one), written
 * independently of the engine's incremental method.
 */
function reference(tree: NetworkNode, faultId: string, mode: FailureMode, V: number): { capacitance: number; voltages: Map<string, number> } {
  const capOf = (n: NetworkNode): number => {
    if (n.kind === "cell") return n.id === faultId ? (mode === "short" ? Infinity : 0) : n.capacitance;
    const cs = n.children.map(capOf);
    if (n.kind === "parallel") return cs.some((c) => c === Infinity) ? Infinity : cs.reduce((a, b) => a + b, 0);
    const elastance = cs.reduce((a, c) => a + (c === Infinity ? 0 : c === 0 ? Infinity : 1 / c), 0);
    return elastance === Infinity ? 0 : elastance === 0 ? Infinity : 1 / elastance;
  };
  const voltages = new Map<string, number>();
  const assign = (n: NetworkNode, v: number): void => {
    if (n.kind === "cell") {
      if (n.id !== faultId) voltages.set(n.id, v);
      return;
    }
    if (n.kind === "parallel") {
      for (const c of n.children) assign(c, v);
      return;
    }
    const c = capOf(n);
    for (const child of n.children) {
      const cc = capOf(child);
      // no charge (an open inside): the open part holds the whole voltage, the rest none
      assign(child, cc === Infinity ? 0 : c === 0 ? (cc === 0 ? v : 0) : (c * v) / cc);
    }
  };
  const root = capOf(tree);
  assign(tree, root === Infinity ? 0 : V);
  return { capacitance: root, voltages };
}

function cellsOf(tree: NetworkNode): Cell[] {
  const out: Cell[] = [];
  const stack = [tree];
  while (stack.length) {
    const n = stack.pop()!;
    if (n.kind === "cell") out.push(n);
    else for (let i = n.children.length - 1; i >= 0; i--) stack.push(n.children[i]!);
  }
  return out;
}

const close = (a: number, b: number, tol = 1e-9) => Math.abs(a - b) <= tol * Math.max(Math.abs(a), Math.abs(b), 1e-300);

describe("hand-worked one-cell faults", () => {
  it("a string of four 100 F cells at 10 V: a short puts 10/3 V on the others, an open disconnects the string", () => {
    const r = analyzeNetworkFailures(series(cell("a", 100, 2.7, 2.85), cell("b", 100, 2.7, 2.85), cell("c", 100, 2.7, 2.85), cell("d", 100, 2.7, 2.85)), 10);
    expect(r.healthy).toEqual({ capacitance: 25, maxCellVoltage: 2.5, withinRating: true, withinSurge: true });
    const [short, open] = r.cases;
    expect(short).toMatchObject({
      cellId: "a",
      mode: "short",
      shortCircuit: false,
      overstressed: ["b", "c", "d"],
      overstressedCount: 3,
      pastSurge: ["b", "c", "d"],
      pastSurgeCount: 3,
    });
    expect(short!.capacitance).toBeCloseTo(100 / 3, 12);
    expect(short!.maxCellVoltage).toBeCloseTo(10 / 3, 12);
    expect(open).toMatchObject({ cellId: "a", mode: "open", capacitance: 0, maxCellVoltage: 0, overstressedCount: 0, shortCircuit: false });
    expect(r.summary.short.survives).toBe(false);
    expect(r.summary.short.text).toBe("Survives one shorted cell: no — with cell a shorted, cell b reaches 3.33 V, surge 2.85 V (3 cells past surge).");
    expect(r.summary.open.survives).toBe(false);
    expect(r.summary.open.text).toBe("Survives one open cell: no — an open in cell a disconnects the whole network: no capacitance is left.");
  });

  it("three cells in parallel: a short shorts the whole network, an open leaves two", () => {
    const r = analyzeNetworkFailures(parallel(cell("a", 1), cell("b", 1), cell("c", 1)), 2);
    expect(r.cases[0]).toMatchObject({ mode: "short", capacitance: null, shortCircuit: true, maxCellVoltage: 0, overstressedCount: 0 });
    expect(r.cases[1]).toMatchObject({ mode: "open", capacitance: 2, maxCellVoltage: 2, shortCircuit: false });
    expect(r.summary.short.text).toBe("Survives one shorted cell: no — a short in cell a shorts the whole network.");
    expect(r.summary.open).toMatchObject({ survives: true, withinRating: true });
  });

  // OpenStax, University Physics Volume 2, §8.2 worked example (12.0 µF in series with 2.0 µF ∥ 4.0 µF
  // at 12.0 V; values from memory), with one cell failed; the faulted figures worked by hand.
  it("the textbook 12 µF + (2 µF ∥ 4 µF) network at 12 V with each cell failed", () => {
    const tree = series(cell("c1", 12 * µ, 100), parallel(cell("c2", 2 * µ, 10), cell("c3", 4 * µ, 10)));
    const r = analyzeNetworkFailures(tree, 12);
    const byCase = new Map(r.cases.map((c) => [`${c.cellId}/${c.mode}`, c]));
    // c1 shorted: the group takes all 12 V, C = 6 µF
    expect(byCase.get("c1/short")!.capacitance! / µ).toBeCloseTo(6, 12);
    expect(byCase.get("c1/short")!.maxCellVoltage).toBeCloseTo(12, 12);
    expect(byCase.get("c1/short")!.overstressed).toEqual(["c2", "c3"]);
    // c1 open: no charge flows
    expect(byCase.get("c1/open")).toMatchObject({ capacitance: 0, maxCellVoltage: 0 });
    // c2 shorted: the group is shorted, c1 takes 12 V, C = 12 µF
    expect(byCase.get("c2/short")!.capacitance! / µ).toBeCloseTo(12, 12);
    expect(byCase.get("c2/short")!.maxCellVoltage).toBeCloseTo(12, 12);
    // c2 open: 12 µF in series with 4 µF = 3 µF, Q = 36 µC: c1 3 V, c3 9 V
    expect(byCase.get("c2/open")!.capacitance! / µ).toBeCloseTo(3, 12);
    expect(byCase.get("c2/open")!.maxCellVoltage).toBeCloseTo(9, 12);
    expect(byCase.get("c2/open")!.overstressedCount).toBe(0);
    const detail = analyzeFault(tree, 12, "c2", "open");
    expect(detail.cells.map((c) => [c.id, Number(c.voltage.toFixed(9))])).toEqual([
      ["c1", 3],
      ["c3", 9],
    ]);
  });

  it("in a nested network a short can lower a neighbour: series(parallel(series(a, b), c), d) at 1 V, all 1 F", () => {
    // healthy: series(a, b) = 0.5 F, group 1.5 F, total 0.6 F: the group holds 0.4 V, so c 0.4 V.
    // a shorted: group 2 F, total 2/3 F, the group holds 1/3 V: c falls to 0.333 V while b rises to it.
    const tree = series(parallel(series(cell("a", 1), cell("b", 1)), cell("c", 1)), cell("d", 1));
    const before = new Map(evaluateNetwork(tree, 1).cells.map((c) => [c.id, c.voltage]));
    const after = new Map(analyzeFault(tree, 1, "a", "short").cells.map((c) => [c.id, c.voltage]));
    expect(before.get("c")).toBeCloseTo(0.4, 12);
    expect(after.get("c")).toBeCloseTo(1 / 3, 12);
    expect(after.get("b")).toBeCloseTo(1 / 3, 12);
    expect(after.get("d")).toBeCloseTo(2 / 3, 12);
  });

  it("lists at most listLimit cells in document order but counts all of them", () => {
    const tree = series(...Array.from({ length: 30 }, (_, i) => cell(`k${String(i).padStart(2, "0")}`, 10, 1)));
    const r = analyzeNetworkFailures(tree, 30, { listLimit: 5 });
    const c = r.cases.find((x) => x.cellId === "k03" && x.mode === "short")!;
    expect(c.overstressedCount).toBe(29);
    expect(c.overstressed).toEqual(["k00", "k01", "k02", "k04", "k05"]);
    expect(r.listLimit).toBe(5);
  });

  it("refuses a network whose cells sit deeper in all than the bound", () => {
    // 20,001 cells, each 65 levels down: 1,300,065 path steps, past 20,000 × 64
    let deep: NetworkNode = parallel(...Array.from({ length: 20_001 }, (_, i) => cell(`d${i}`, 1)));
    for (let i = 0; i < 64; i++) deep = series(deep);
    expect(() => analyzeNetworkFailures(deep, 1)).toThrow(/too large to analyse/);
  });

  it("refuses a non-positive applied voltage and an unknown cell id", () => {
    expect(() => analyzeNetworkFailures(cell("a", 1), 0)).toThrow(RangeError);
    expect(() => analyzeFault(cell("a", 1), 1, "zz", "short")).toThrow(RangeError);
  });
});

// ---- against the plain re-evaluation, on generated networks (fast-check) ----

const arbTree: fc.Arbitrary<NetworkNode> = fc
  .letrec<{ node: NetworkNode }>((tie) => ({
    node: fc.oneof(
      { depthSize: "small", withCrossShrink: true },
      fc
        .record({
          // a few repeated values so that ties and identical siblings occur
          capacitance: fc.oneof(fc.constantFrom(1, 2, 4.7, 10), fc.double({ min: 0.01, max: 100, noNaN: true })),
          ratedVoltage: fc.constantFrom(1, 2.5, 2.7, 5),
          surge: fc.option(fc.constantFrom(1.05, 1.1), { nil: undefined }),
        })
        .map(({ capacitance, ratedVoltage, surge }) => ({
          kind: "cell" as const,
          id: "",
          capacitance,
          ratedVoltage,
          ...(surge ? { surgeVoltage: ratedVoltage * surge } : {}),
        })),
      fc.record({ kind: fc.constantFrom("series" as const, "parallel" as const), children: fc.array(tie("node"), { minLength: 1, maxLength: 4 }) }),
    ),
  }))
  .node.map((tree) => {
    // fresh unique ids in document order
    const copy = structuredClone(tree);
    cellsOf(copy).forEach((c, i) => (c.id = `x${i}`));
    return copy;
  });

describe("failures agree with a plain re-evaluation of each faulted network", () => {
  it("capacitance, highest voltage, cells past rated and surge, short circuit", { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(arbTree, fc.double({ min: 0.3, max: 1.3, noNaN: true }), (tree, load) => {
        const V = evaluateNetwork(tree).maxVoltage * load;
        const cells = cellsOf(tree);
        const r = analyzeNetworkFailures(tree, V, { listLimit: cells.length });
        expect(r.cases.length).toBe(2 * cells.length);
        for (const c of r.cases) {
          const ref = reference(tree, c.cellId, c.mode, V);
          expect(c.shortCircuit).toBe(ref.capacitance === Infinity);
          if (ref.capacitance === Infinity) expect(c.capacitance).toBeNull();
          else expect(close(c.capacitance!, ref.capacitance, 1e-9) || (c.capacitance === 0 && ref.capacitance === 0)).toBe(true);
          const volts = [...ref.voltages.entries()];
          const max = Math.max(0, ...volts.map(([, v]) => v));
          expect(Math.abs(c.maxCellVoltage - max)).toBeLessThanOrEqual(1e-9 * Math.max(max, V));
          // cells clearly past (or clearly within) their limits; a margin skips rounding ties
          const byId = new Map(cells.map((x) => [x.id, x]));
          const past = (limit: (x: Cell) => number) => volts.filter(([id, v]) => v > limit(byId.get(id)!) * (1 + 1e-6)).map(([id]) => id);
          const within = (limit: (x: Cell) => number) => volts.filter(([id, v]) => v < limit(byId.get(id)!) * (1 - 1e-6)).map(([id]) => id);
          const surge = (x: Cell) => x.surgeVoltage ?? x.ratedVoltage;
          for (const id of past((x) => x.ratedVoltage)) expect(c.overstressed).toContain(id);
          for (const id of within((x) => x.ratedVoltage)) expect(c.overstressed).not.toContain(id);
          for (const id of past(surge)) expect(c.pastSurge).toContain(id);
          for (const id of within(surge)) expect(c.pastSurge).not.toContain(id);
          expect(c.overstressedCount).toBe(c.overstressed.length);
          expect(c.pastSurgeCount).toBe(c.pastSurge.length);
          expect(c.overstressed.indexOf(c.cellId)).toBe(-1);
        }
      }),
      { numRuns: 300 },
    );
  });

  it("every remaining cell voltage of one fault (analyzeFault)", { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(arbTree, fc.nat(), fc.constantFrom<FailureMode>("short", "open"), (tree, pick, mode) => {
        const cells = cellsOf(tree);
        const target = cells[pick % cells.length]!.id;
        const d = analyzeFault(tree, 7, target, mode);
        const ref = reference(tree, target, mode, 7);
        expect(d.cells.length).toBe(cells.length - 1);
        for (const c of d.cells) expect(Math.abs(c.voltage - ref.voltages.get(c.id)!)).toBeLessThanOrEqual(1e-9 * 7);
      }),
      { numRuns: 300 },
    );
  });
});

describe("failure properties", () => {
  it("an open never raises the capacitance; a short never lowers it", { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(arbTree, (tree) => {
        const r = analyzeNetworkFailures(tree, 1);
        for (const c of r.cases) {
          if (c.mode === "open") expect(c.capacitance!).toBeLessThanOrEqual(r.healthy.capacitance * (1 + 1e-12));
          else if (c.capacitance !== null) expect(c.capacitance).toBeGreaterThanOrEqual(r.healthy.capacitance * (1 - 1e-12));
        }
      }),
      { numRuns: 300 },
    );
  });

  // For the two topologies a shop builds (and so for a lone string or group); the nested
  // counter-example above shows why the property is stated for these shapes only.
  it("in either topology a short never lowers the voltage of any cell it does not short with it", { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(
        fc.constantFrom<Topology>("series-of-parallel-groups", "parallel-of-series-strings"),
        fc.integer({ min: 1, max: 5 }),
        fc.integer({ min: 1, max: 4 }),
        fc.array(fc.double({ min: 0.5, max: 2, noNaN: true }), { minLength: 20, maxLength: 20 }),
        fc.nat(),
        (topology, ns, np, caps, pick) => {
          const tree = bank(topology, ns, np, (s, p) => cell(`s${s}p${p}`, caps[(s * np + p) % caps.length]!));
          const before = new Map(evaluateNetwork(tree, 10).cells.map((c) => [c.id, c.voltage]));
          const s0 = pick % ns;
          const p0 = Math.floor(pick / ns) % np;
          const d = analyzeFault(tree, 10, `s${s0}p${p0}`, "short");
          for (const c of d.cells) {
            // cells shorted with it: the rest of its parallel group (or, with one series position, everything)
            const shortedWith = topology === "series-of-parallel-groups" ? c.id.startsWith(`s${s0}p`) : ns === 1;
            if (!shortedWith) expect(c.voltage).toBeGreaterThanOrEqual(before.get(c.id)! * (1 - 1e-12));
          }
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe("arrangement option failures in closed form", () => {
  const topologies: Topology[] = ["series-of-parallel-groups", "parallel-of-series-strings"];
  const sizes: [number, number][] = [
    [1, 1],
    [1, 3],
    [4, 1],
    [2, 2],
    [5, 3],
    [16, 2],
  ];
  for (const topology of topologies) {
    for (const [ns, np] of sizes) {
      for (const V of [2.5 * ns, 2.7 * ns, 2.8 * ns]) {
        it(`${topology}, ${ns}s${np}p at ${V.toFixed(1)} V: the same as the built tree`, () => {
          const surge = 2.85;
          const o = analyzeOptionFailures({
            cell: { capacitance: 350, ratedVoltage: 2.7, surgeVoltage: surge },
            topology,
            seriesCount: ns,
            parallelCount: np,
            appliedVoltage: V,
          });
          const tree = bank(topology, ns, np, (s, p) => cell(`s${s}p${p}`, 350, 2.7, surge));
          const n = analyzeNetworkFailures(tree, V);
          expect(o.healthy.capacitance).toBeCloseTo(n.healthy.capacitance, 9);
          expect(o.healthy.maxCellVoltage).toBeCloseTo(n.healthy.maxCellVoltage, 9);
          for (const mode of ["short", "open"] as const) {
            const oc = o.cases[mode];
            // identical cells: every case of the network is the same
            for (const nc of n.cases.filter((c) => c.mode === mode)) {
              expect(oc.shortCircuit).toBe(nc.shortCircuit);
              if (nc.capacitance === null) expect(oc.capacitance).toBeNull();
              else expect(oc.capacitance!).toBeCloseTo(nc.capacitance, 9);
              expect(oc.maxCellVoltage).toBeCloseTo(nc.maxCellVoltage, 9);
              expect(oc.overstressedCount).toBe(nc.overstressedCount);
              expect(oc.pastSurgeCount).toBe(nc.pastSurgeCount);
            }
            expect(o.summary[mode].survives).toBe(n.summary[mode].survives);
            expect(o.summary[mode].withinRating).toBe(n.summary[mode].withinRating);
            expect(oc.classes.reduce((a, c) => a + c.count, 0)).toBe(ns * np - 1);
          }
        });
      }
    }
  }

  it("with a matching tolerance, the worst class voltage equals the built tree with that position low and the rest high", () => {
    const m = 0.05;
    const lo = 350 * (1 - m);
    const hi = 350 * (1 + m);
    const V = 48;
    const ns = 18;
    const np = 4;
    // groups, short in group 0: group 1 low, others high → group 1's cells are the worst
    const g = analyzeOptionFailures({
      cell: { capacitance: 350, ratedVoltage: 2.7 },
      topology: "series-of-parallel-groups",
      seriesCount: ns,
      parallelCount: np,
      appliedVoltage: V,
      matchingTolerance: m,
    });
    const gTree = bank("series-of-parallel-groups", ns, np, (s, p) => cell(`s${s}p${p}`, s === 1 ? lo : hi));
    const gFault = analyzeFault(gTree, V, "s0p0", "short");
    expect(g.cases.short.maxCellVoltage).toBeCloseTo(Math.max(...gFault.cells.map((c) => c.voltage)), 9);
    // groups, open in group 0: that group low (its 3 remaining cells), the others high
    const gTree2 = bank("series-of-parallel-groups", ns, np, (s, p) => cell(`s${s}p${p}`, s === 0 ? lo : hi));
    const gOpen = analyzeFault(gTree2, V, "s0p0", "open");
    expect(g.cases.open.maxCellVoltage).toBeCloseTo(Math.max(...gOpen.cells.map((c) => c.voltage)), 9);
    // strings, short in string 0: the next cell of that string low, the rest high
    const st = analyzeOptionFailures({
      cell: { capacitance: 350, ratedVoltage: 2.7 },
      topology: "parallel-of-series-strings",
      seriesCount: ns,
      parallelCount: np,
      appliedVoltage: V,
      matchingTolerance: m,
    });
    const sTree = bank("parallel-of-series-strings", ns, np, (s, p) => cell(`s${s}p${p}`, s === 1 && p === 0 ? lo : hi));
    const sFault = analyzeFault(sTree, V, "s0p0", "short");
    expect(st.cases.short.maxCellVoltage).toBeCloseTo(sFault.cells.find((c) => c.id === "s1p0")!.voltage, 9);
  });

  it('says it in plain words: "the other cells of that string reach 3.1 V, surge 2.85 V"', () => {
    // 7 cells per string at 18.6 V: 2.66 V each; after a short, 18.6 V over 6 cells = 3.1 V
    const o = analyzeOptionFailures({
      cell: { capacitance: 350, ratedVoltage: 2.7, surgeVoltage: 2.85 },
      topology: "parallel-of-series-strings",
      seriesCount: 7,
      parallelCount: 3,
      appliedVoltage: 18.6,
    });
    expect(o.summary.short.text).toBe("Survives one shorted cell: no — the other cells of that string reach 3.1 V, surge 2.85 V (6 cells past surge).");
    expect(o.summary.open.text).toBe(
      "Survives one open cell: yes — the cells of the other strings reach at most 2.66 V, rated 2.7 V; capacitance falls from 150 F to 100 F at worst.",
    );
    const g = analyzeOptionFailures({
      cell: { capacitance: 350, ratedVoltage: 2.7, surgeVoltage: 2.85 },
      topology: "series-of-parallel-groups",
      seriesCount: 7,
      parallelCount: 3,
      appliedVoltage: 18.6,
    });
    expect(g.summary.open.text).toBe("Survives one open cell: no — the other cells of that group reach 3.72 V, surge 2.85 V (2 cells past surge).");
  });

  it("refuses counts below one and a surge voltage below the rating", () => {
    expect(() =>
      analyzeOptionFailures({
        cell: { capacitance: 1, ratedVoltage: 2.7 },
        topology: "series-of-parallel-groups",
        seriesCount: 0,
        parallelCount: 1,
        appliedVoltage: 1,
      }),
    ).toThrow(RangeError);
    expect(() =>
      analyzeOptionFailures({
        cell: { capacitance: 1, ratedVoltage: 2.7, surgeVoltage: 2 },
        topology: "series-of-parallel-groups",
        seriesCount: 1,
        parallelCount: 1,
        appliedVoltage: 1,
      }),
    ).toThrow(RangeError);
  });
});

describe("optionNetwork", () => {
  it("builds either topology with ids that name each place, and the same figures as the closed forms", () => {
    const figures = { capacitance: 350, ratedVoltage: 2.7, surgeVoltage: 2.85, toleranceMinus: 0.1, tolerancePlus: 0.2 };
    for (const topology of ["series-of-parallel-groups", "parallel-of-series-strings"] as const) {
      const tree = optionNetwork({ cell: figures, topology, seriesCount: 5, parallelCount: 3 });
      const cells = cellsOf(tree);
      expect(cells).toHaveLength(15);
      expect(new Set(cells.map((c) => c.id)).size).toBe(15);
      expect(cells[0]).toEqual({ kind: "cell", id: topology === "series-of-parallel-groups" ? "g1-c1" : "s1-c1", ...figures });
      expect(evaluateNetwork(tree).capacitance).toBeCloseTo((3 * 350) / 5, 9);
      const o = analyzeOptionFailures({ cell: figures, topology, seriesCount: 5, parallelCount: 3, appliedVoltage: 13 });
      expect(analyzeNetworkFailures(tree, 13).summary.short.survives).toBe(o.summary.short.survives);
    }
    expect(() => optionNetwork({ cell: figures, topology: "parallel-of-series-strings", seriesCount: 200, parallelCount: 101 })).toThrow(RangeError);
  });
});
