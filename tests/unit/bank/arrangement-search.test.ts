import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  DEFAULT_DESIGN_FACTORS,
  searchArrangements,
  type ArrangementOption,
  type BalancingBoard,
  type DesignFactors,
  type EngineCell,
  type Requirement,
} from "@/lib/bank";
import { arbFactors } from "./arbitraries";
import { generateCatalog } from "./catalog-fixture";
import { rk4ConstantPower } from "./reference";

/** Invented cell (invented maker prefix and part number). */
function edlc(overrides: Partial<EngineCell> = {}): EngineCell {
  return {
    id: "cell-qz350",
    sku: "QZ-350-27",
    technology: "edlc",
    capacitance: 350,
    toleranceMinus: 0,
    tolerancePlus: 0.2,
    ratedVoltage: 2.7,
    surgeVoltage: 2.85,
    esr: 0.0032,
    leakageCurrent: 1e-3,
    continuousCurrent: 25,
    peakCurrent: 170,
    mass: 0.06,
    volume: 5.3e-5,
    unitCost: 9.5,
    stock: 500,
    leadTimeDays: 21,
    ...overrides,
  };
}

const board: BalancingBoard = { id: "b6", sku: "BAL-6CH-27", channels: 6, maxCellVoltage: 2.7, unitCost: 14, leadTimeDays: 10 };

describe("searchArrangements: hand-worked example (DESIGN §3.2)", () => {
  const factors: DesignFactors = { ...DEFAULT_DESIGN_FACTORS, matchingTolerance: 0.02 };
  const requirement: Requirement = { maxVoltage: 48, capacitance: 10 };

  it("N_s = ceil(48/2.7) = 18 needs active balancing (V_w = 2.769 V > 2.7 V); without a board the shortest safe string is 19, and 20 is the longer-life variant", () => {
    const { options, reasons } = searchArrangements({ requirement, cells: [edlc()], factors });
    expect(reasons).toEqual([]);
    expect(options.map((o) => [o.seriesCount, o.longerLife])).toEqual([
      [19, false],
      [20, true],
    ]);
    // an estimator may allow longer strings (0 keeps only the shortest safe one; the cap is MAX_LONGER_STRINGS)
    const series = (longerStrings: number) =>
      searchArrangements({ requirement, cells: [edlc()], factors, longerStrings, limit: 50 }).options.map((x) => x.seriesCount);
    expect(series(0)).toEqual([19]);
    expect(series(3)).toEqual([19, 20, 21, 22]);
    expect(series(1e9)).toEqual([19, 20, 21, 22, 23, 24, 25, 26, 27]);
    const o = options[0]!;
    expect(o.seriesCount).toBe(19);
    expect(o.parallelCount).toBe(1); // C_d = 350·1·0.8 = 280 F; 280/19 = 14.7 F ≥ 10 F
    expect(o.cellCount).toBe(19);
    expect(o.capacitance.nominal).toBeCloseTo(350 / 19, 9);
    expect(o.capacitance.design).toBeCloseTo(280 / 19, 9);
    // V_w = 48·(1/C_lo)/(1/C_lo + 18/C_hi), C_lo = 0.98·C_n, C_hi = 1.02·C_n
    expect(o.worstCellVoltage).toBeCloseTo(48 / (1 + (18 * 0.98) / 1.02), 9);
    expect(o.worstCellVoltage).toBeLessThan(2.7);
    expect(o.storedEnergy).toBeCloseTo(0.5 * (350 / 19) * 48 * 48, 6);
    expect(o.usableEnergy).toBeCloseTo(0.5 * (280 / 19) * 48 * 48, 6);
    expect(o.esr.new).toBeCloseTo(0.0032 * 19, 12);
    expect(o.esr.endOfLife).toBeCloseTo(0.0032 * 19 * 2, 12);
    expect(o.costEstimate).toBeCloseTo(19 * 9.5, 9);
    expect(o.mass).toBeCloseTo(19 * 0.06, 12);
    expect(o.leadTimeDays).toBe(0); // 19 cells in stock
    // balancing: R ≤ (48/19)/(10·1·1 mA) = 252.6 Ω → 240 Ω (E24)
    expect(o.balancing.resistance).toBe(240);
    expect(o.balancing.count).toBe(19);
    expect(o.balancing.activeBoard).toBeNull();
  });

  it("with a 6-channel board that clamps at 2.7 V, N_s = 18 is offered too, with ceil(18/6) = 3 boards", () => {
    const { options } = searchArrangements({ requirement, cells: [edlc()], factors, balancingBoards: [board] });
    const o18 = options.find((o) => o.seriesCount === 18)!;
    expect(o18).toBeDefined();
    expect(o18.balancing.activeBoard).toEqual({ sku: "BAL-6CH-27", count: 3 });
    expect(o18.costEstimate).toBeCloseTo(18 * 9.5 + 3 * 14, 9);
    expect(o18.warnings.some((w) => w.startsWith("Balancing needed"))).toBe(true);
    expect(o18.leadTimeDays).toBe(10); // the board's lead time
  });

  it("refuses a string whose worst-case cell voltage exceeds the surge rating, and takes the next one up", () => {
    // with the default 5 % matching, N_s = 18 gives V_w = 2.930 V > 2.85 V surge: refused even with a board;
    // 19 gives 2.777 V (above 2.7 V: 4 boards clamp it), 20 gives 2.637 V (passive balancing is enough)
    const { options } = searchArrangements({ requirement, cells: [edlc()], factors: DEFAULT_DESIGN_FACTORS, balancingBoards: [board] });
    expect(options.map((o) => o.seriesCount).sort()).toEqual([19, 20]);
    const o19 = options.find((o) => o.seriesCount === 19)!;
    const o20 = options.find((o) => o.seriesCount === 20)!;
    expect(o19.balancing.activeBoard).toEqual({ sku: "BAL-6CH-27", count: 4 });
    expect(o19.longerLife).toBe(false);
    expect(o20.balancing.activeBoard).toBeNull();
    expect(o20.longerLife).toBe(true);
  });

  it("offers both topologies when N_p > 1, with one balancing resistor per group or per cell", () => {
    const { options } = searchArrangements({ requirement: { maxVoltage: 48, capacitance: 30 }, cells: [edlc()], factors });
    // N_p ≥ 30·19/280 = 2.04 → 3
    const groups = options.find((o) => o.topology === "series-of-parallel-groups")!;
    const strings = options.find((o) => o.topology === "parallel-of-series-strings")!;
    expect(groups.parallelCount).toBe(3);
    expect(groups.balancing.count).toBe(19);
    expect(strings.balancing.count).toBe(57);
  });
});

describe("searchArrangements: warnings, cautions and reasons", () => {
  it("a 400 V electrolytic bank carries shock, burn/arc and handling cautions, and a switched discharge warning", () => {
    const cap: EngineCell = {
      ...edlc(),
      id: "el-1",
      sku: "EL-4700-450",
      technology: "electrolytic",
      capacitance: 4700e-6,
      toleranceMinus: 0.2,
      tolerancePlus: 0.2,
      ratedVoltage: 450,
      surgeVoltage: 500,
      esr: 0.03,
      leakageCurrent: 2e-3,
      mass: 0.5,
      volume: 6e-4,
      unitCost: 40,
      stock: 3,
      leadTimeDays: 45,
    };
    const { options } = searchArrangements({
      requirement: { maxVoltage: 400, energy: 1000, quantity: 2 },
      cells: [cap],
      factors: DEFAULT_DESIGN_FACTORS,
    });
    const o = options[0]!;
    expect(o.seriesCount).toBe(1);
    // C_d = 4.7 mF·0.8·0.8 = 3.008 mF; N_p ≥ 2·1000/(3.008 mF·400²) = 4.16 → 5
    expect(o.parallelCount).toBe(5);
    expect(o.cautions.some((c) => c.startsWith("Shock hazard"))).toBe(true);
    expect(o.cautions.some((c) => c.startsWith("Burn and arc hazard"))).toBe(true);
    expect(o.cautions.some((c) => c.includes("short its terminals"))).toBe(true);
    expect(o.cautions.some((c) => c.includes("shorting link"))).toBe(true);
    expect(o.cautions.some((c) => c.includes("engineering estimate"))).toBe(true);
    expect(o.discharge.bleeder?.switched).toBe(true);
    expect(o.discharge.secondsToSafe).toBeLessThanOrEqual(5);
    expect(o.warnings.some((w) => w.includes("switched discharge circuit"))).toBe(true);
    expect(o.warnings.some((w) => w.startsWith("Stock covers 3 of the 10 cells"))).toBe(true);
    expect(o.warnings.some((w) => w.startsWith("Long lead time"))).toBe(true);
    expect(o.leadTimeDays).toBe(45);
  });

  it("a low-voltage bank has no shock caution but keeps the handling cautions", () => {
    const { options } = searchArrangements({ requirement: { maxVoltage: 5, capacitance: 50 }, cells: [edlc()], factors: DEFAULT_DESIGN_FACTORS });
    const o = options[0]!;
    expect(o.cautions.some((c) => c.startsWith("Shock hazard"))).toBe(false);
    expect(o.cautions.some((c) => c.includes("engineering estimate"))).toBe(true);
    expect(o.discharge).toMatchObject({ secondsToSafe: 0, bleeder: null });
  });

  it("explains per technology what ruled every cell out", () => {
    const film: EngineCell = {
      ...edlc(),
      id: "fm-1",
      sku: "FM-470-800",
      technology: "film",
      capacitance: 470e-6,
      toleranceMinus: 0.05,
      tolerancePlus: 0.05,
      ratedVoltage: 800,
      surgeVoltage: 1200,
      esr: 0.003,
      leakageCurrent: 1e-7,
      mass: 1.2,
      volume: 1e-3,
    };
    const { options, reasons } = searchArrangements({
      requirement: { maxVoltage: 700, energy: 20_000, maxMass: 50 },
      cells: [film, edlc({ mass: 5 })],
      factors: DEFAULT_DESIGN_FACTORS,
    });
    expect(options).toEqual([]);
    expect(reasons).toContain("film: no cell reaches 20 kJ usable within 50 kg");
    // 260 EDLC cells would do for the voltage, but with 5 % matching the shortest passive string is
    // N_s = ceil(1 + (700/2.7 − 1)·1.05/0.95) = 287 cells, 1,435 kg at 5 kg each
    expect(reasons).toContain("edlc: even one string of 287 cells in series is beyond 50 kg");
    expect(reasons).toContain("electrolytic: no electrolytic cells in the catalog");
  });

  it("a technology filter keeps other families out", () => {
    const { options, reasons } = searchArrangements({
      requirement: { maxVoltage: 48, capacitance: 10, technology: "hybrid" },
      cells: [edlc()],
      factors: DEFAULT_DESIGN_FACTORS,
    });
    expect(options).toEqual([]);
    expect(reasons).toEqual(["hybrid: no hybrid cells in the catalog"]);
  });

  it("returns at most `limit` options, in the order of the cost estimate, from a generated catalog", () => {
    const cells = generateCatalog(2000, 7);
    const { options } = searchArrangements({
      requirement: { maxVoltage: 48, minVoltage: 24, backup: { power: 2000, seconds: 10 } },
      cells,
      factors: DEFAULT_DESIGN_FACTORS,
      limit: 12,
    });
    expect(options).toHaveLength(12);
    for (let i = 1; i < options.length; i++) expect(options[i]!.costEstimate).toBeGreaterThanOrEqual(options[i - 1]!.costEstimate);
  });
});

// ---- property: every option meets every stated requirement, with the smallest N_p ----

const arbCell: fc.Arbitrary<EngineCell> = fc
  .record({
    technology: fc.constantFrom("edlc" as const, "hybrid" as const, "electrolytic" as const, "film" as const),
    capacitance: fc.double({ min: 1e-4, max: 3000, noNaN: true }),
    toleranceMinus: fc.double({ min: 0, max: 0.2, noNaN: true }),
    tolerancePlus: fc.double({ min: 0, max: 0.3, noNaN: true }),
    ratedVoltage: fc.double({ min: 2, max: 500, noNaN: true }),
    surgeFactor: fc.double({ min: 1, max: 1.3, noNaN: true }),
    esr: fc.double({ min: 1e-4, max: 0.5, noNaN: true }),
    leakageCurrent: fc.double({ min: 0, max: 1e-2, noNaN: true }),
    peakCurrent: fc.double({ min: 1, max: 3000, noNaN: true }),
    mass: fc.double({ min: 0.001, max: 2, noNaN: true }),
    unitCost: fc.double({ min: 0.1, max: 100, noNaN: true }),
    stock: fc.integer({ min: 0, max: 1000 }),
  })
  .map((c) => ({
    id: `cell-${Math.round(c.capacitance * 1e6)}-${Math.round(c.ratedVoltage * 100)}`,
    sku: `TS-${Math.round(c.capacitance * 1e3)}-${Math.round(c.ratedVoltage * 10)}`,
    technology: c.technology,
    capacitance: c.capacitance,
    toleranceMinus: c.toleranceMinus,
    tolerancePlus: c.tolerancePlus,
    ratedVoltage: c.ratedVoltage,
    surgeVoltage: c.ratedVoltage * c.surgeFactor,
    esr: c.esr,
    leakageCurrent: c.leakageCurrent,
    continuousCurrent: c.peakCurrent / 5,
    peakCurrent: c.peakCurrent,
    mass: c.mass,
    volume: c.mass / 1500,
    unitCost: c.unitCost,
    stock: c.stock,
    leadTimeDays: 14,
  }));

const arbRequirement: fc.Arbitrary<Requirement> = fc
  .record({
    maxVoltage: fc.double({ min: 3, max: 800, noNaN: true }),
    // V_min ≥ 0.1·V_max keeps the RK4 reference away from the singular end at V → 0
    minFraction: fc.double({ min: 0.1, max: 0.8, noNaN: true }),
    capacitance: fc.option(fc.double({ min: 1e-4, max: 500, noNaN: true }), { nil: undefined }),
    energy: fc.option(fc.double({ min: 1, max: 1e5, noNaN: true }), { nil: undefined }),
    backup: fc.option(fc.record({ power: fc.double({ min: 1, max: 2e4, noNaN: true }), seconds: fc.double({ min: 0.1, max: 60, noNaN: true }) }), {
      nil: undefined,
    }),
    peakCurrent: fc.option(fc.record({ current: fc.double({ min: 1, max: 2000, noNaN: true }), maxDrop: fc.double({ min: 0.1, max: 50, noNaN: true }) }), {
      nil: undefined,
    }),
    maxMass: fc.option(fc.double({ min: 0.1, max: 500, noNaN: true }), { nil: undefined }),
    maxVolume: fc.option(fc.double({ min: 1e-4, max: 0.5, noNaN: true }), { nil: undefined }),
    technology: fc.option(fc.constantFrom("edlc" as const, "hybrid" as const, "electrolytic" as const, "film" as const), { nil: undefined }),
  })
  .filter((r) => r.capacitance !== undefined || r.energy !== undefined || r.backup !== undefined)
  .map(({ minFraction, ...r }) => {
    const out: Requirement = { maxVoltage: r.maxVoltage, minVoltage: r.maxVoltage * minFraction };
    for (const key of ["capacitance", "energy", "backup", "peakCurrent", "maxMass", "maxVolume", "technology"] as const) {
      if (r[key] !== undefined) (out as unknown as Record<string, unknown>)[key] = r[key];
    }
    return out;
  });

const arbBoards: fc.Arbitrary<BalancingBoard[]> = fc.array(
  fc.record({
    id: fc.constant("board"),
    sku: fc.constantFrom("BAL-A", "BAL-B"),
    channels: fc.integer({ min: 1, max: 16 }),
    maxCellVoltage: fc.double({ min: 2, max: 500, noNaN: true }),
    unitCost: fc.double({ min: 1, max: 50, noNaN: true }),
    leadTimeDays: fc.integer({ min: 1, max: 30 }),
  }),
  { maxLength: 2 },
);

/** Independent check of an option against the requirement, with np parallel cells. */
function meets(o: ArrangementOption, np: number, req: Requirement, f: DesignFactors, cell: EngineCell): boolean {
  const ns = o.seriesCount;
  const vMin = req.minVoltage ?? 0;
  const cDesign = (np * cell.capacitance * (1 - cell.toleranceMinus) * (1 - f.capacitanceFade)) / ns;
  const esrEol = (cell.esr * (1 + f.esrGrowth) * ns) / np;
  // the engine forgives 1e-9 relative when it rounds a count up; twice that keeps float noise out
  const slack = 1 + 2e-9;
  if (req.capacitance !== undefined && cDesign * slack < req.capacitance) return false;
  if (req.energy !== undefined && 0.5 * cDesign * (req.maxVoltage ** 2 - vMin ** 2) * slack < req.energy) return false;
  if (req.peakCurrent) {
    if (req.peakCurrent.current * esrEol > req.peakCurrent.maxDrop * slack) return false;
    if (req.peakCurrent.current / np > cell.peakCurrent * slack) return false;
  }
  return true;
}

describe("searchArrangements properties (fast-check)", () => {
  it("every option meets every stated requirement, with the smallest N_p, within the limits", () => {
    fc.assert(
      fc.property(fc.array(arbCell, { minLength: 1, maxLength: 5 }), arbRequirement, arbFactors, arbBoards, (cells, req, factors, boards) => {
        const { options, reasons } = searchArrangements({ requirement: req, cells, factors, balancingBoards: boards });
        if (options.length === 0) expect(reasons.length).toBeGreaterThan(0);
        else expect(reasons).toEqual([]);
        expect(options.length).toBeLessThanOrEqual(12);
        for (let i = 1; i < options.length; i++) expect(options[i]!.costEstimate).toBeGreaterThanOrEqual(options[i - 1]!.costEstimate);
        for (const o of options) {
          const cell = cells.find((c) => c.id === o.cellId)!;
          const ns = o.seriesCount;
          const np = o.parallelCount;
          expect(o.cellCount).toBe(ns * np);
          if (req.technology) expect(cell.technology).toBe(req.technology);
          // voltage: every cell within its derated rating at V_max
          expect(req.maxVoltage / ns).toBeLessThanOrEqual(factors.voltageDerating * cell.ratedVoltage * (1 + 1e-9));
          // worst-case transient, recomputed from DESIGN §3.2
          const cLo = cell.capacitance * (1 - factors.matchingTolerance);
          const cHi = cell.capacitance * (1 + factors.matchingTolerance);
          const vw = (req.maxVoltage * (1 / cLo)) / (1 / cLo + (ns - 1) / cHi);
          expect(Math.abs(vw - o.worstCellVoltage)).toBeLessThan(1e-9 * req.maxVoltage);
          expect(vw).toBeLessThanOrEqual(Math.max(cell.surgeVoltage, cell.ratedVoltage) * (1 + 1e-9));
          if (vw > cell.ratedVoltage * (1 + 1e-9)) {
            expect(o.balancing.activeBoard).not.toBeNull();
            const b = boards.find((x) => x.sku === o.balancing.activeBoard!.sku)!;
            expect(b.maxCellVoltage).toBeLessThanOrEqual(cell.ratedVoltage);
          }
          // the shortest safe string (DESIGN §3.2): one cell fewer is below what the voltage needs,
          // or its worst case is above the surge rating, or above the rating with no board to clamp it
          // (forgiving float noise just above a whole number relative to its size, as the engine does)
          const cellsForVoltage = req.maxVoltage / (factors.voltageDerating * cell.ratedVoltage);
          const nsVoltage = Math.max(1, Math.ceil(cellsForVoltage - 1e-9 * Math.max(1, cellsForVoltage)));
          const shorter = ns - 1;
          const vwShorter = (req.maxVoltage * (1 / cLo)) / (1 / cLo + (shorter - 1) / cHi);
          const surge = Math.max(cell.surgeVoltage, cell.ratedVoltage);
          const boardClamps = boards.some((b) => b.channels >= 1 && b.maxCellVoltage <= cell.ratedVoltage && b.maxCellVoltage >= req.maxVoltage / shorter);
          const shorterFits = vwShorter <= surge * (1 - 1e-9) && (vwShorter <= cell.ratedVoltage * (1 - 1e-9) || boardClamps);
          if (!o.longerLife) expect(shorter < nsVoltage || !shorterFits).toBe(true);
          expect(meets(o, np, req, factors, cell)).toBe(true);
          if (req.maxMass !== undefined) expect(o.mass).toBeLessThanOrEqual(req.maxMass * (1 + 1e-9));
          if (req.maxVolume !== undefined) expect(o.volume).toBeLessThanOrEqual(req.maxVolume * (1 + 1e-9));
          const vMin = req.minVoltage ?? 0;
          const cDesign = (n: number): number => (n * cell.capacitance * (1 - cell.toleranceMinus) * (1 - factors.capacitanceFade)) / ns;
          const esrEol = (n: number): number => (cell.esr * (1 + factors.esrGrowth) * ns) / n;
          let backupMet = (n: number, slack: number): boolean => n > 0 && slack > 0;
          if (req.backup) {
            const { power, seconds } = req.backup;
            // independent RK4 integration (see discharge.test.ts), 1e-3 tolerance either way
            backupMet = (n, slack) => {
              const t = rk4ConstantPower(cDesign(n), esrEol(n), req.maxVoltage, power, vMin, seconds / 4000, 2 * seconds);
              return t >= seconds * slack;
            };
            expect(backupMet(np, 1 - 1e-3)).toBe(true);
          }
          // the smallest N_p: one fewer fails some requirement (backup judged with the opposite tolerance)
          if (np > 1) expect(meets(o, np - 1, req, factors, cell) && backupMet(np - 1, 1 + 1e-3)).toBe(false);
        }
      }),
      { numRuns: 400 },
    );
  }, 120_000);
});
