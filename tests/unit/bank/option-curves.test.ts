import { describe, expect, it } from "vitest";
import { chargingVoltages, DEFAULT_DESIGN_FACTORS, dischargeCurve, searchArrangements, type EngineCell, type Requirement } from "@/lib/bank";

/** Invented cells (invented part numbers). */
const EDLC: EngineCell = {
  id: "q1",
  sku: "QZ-3000-27",
  technology: "edlc",
  capacitance: 3000,
  toleranceMinus: 0.1,
  tolerancePlus: 0.2,
  ratedVoltage: 2.7,
  surgeVoltage: 2.85,
  esr: 0.0003,
  leakageCurrent: 0.005,
  continuousCurrent: 130,
  peakCurrent: 2000,
  mass: 0.5,
  volume: 5e-4,
  unitCost: 40,
  stock: 1000,
  leadTimeDays: 3,
};
const FILM: EngineCell = {
  ...EDLC,
  id: "f1",
  sku: "FM-100-1100",
  technology: "film",
  capacitance: 100e-6,
  toleranceMinus: 0.05,
  tolerancePlus: 0.05,
  ratedVoltage: 1100,
  surgeVoltage: 1650,
  esr: 0.002,
  leakageCurrent: 1e-7,
  mass: 1,
  volume: 1e-3,
};

const first = (requirement: Requirement, cell: EngineCell) => {
  const o = searchArrangements({ requirement, cells: [cell], factors: DEFAULT_DESIGN_FACTORS }).options[0];
  if (!o) throw new Error("no option");
  return o;
};

/** The time a falling curve crosses v, interpolating ln v linearly between points (exact for V₀·e^(−t/τ)). */
function crossing(points: { t: number; v: number }[], v: number): number {
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1]!;
    const b = points[i]!;
    if (a.v >= v && b.v <= v) return a.t + ((Math.log(a.v) - Math.log(v)) / (Math.log(a.v) - Math.log(b.v))) * (b.t - a.t);
  }
  return Number.NaN;
}

describe("the discharge chart and the time-to-safe figure agree", () => {
  it.each([
    ["a 125 V supercapacitor module (balancing chain and bleeder)", { maxVoltage: 125, minVoltage: 60, capacitance: 20 }, EDLC],
    ["an 800 V film bank (bleeder only, one cell in series)", { maxVoltage: 800, capacitance: 300e-6 }, FILM],
  ] as const)("%s: the self-discharge curve crosses V_safe at secondsToSafe", (_name, requirement, cell) => {
    const o = first(requirement, cell);
    expect(o.discharge.secondsToSafe).toBeGreaterThan(0);
    // the worst case is the upper capacitance tolerance: N_p·C_n·(1 + b)/N_s
    expect(o.discharge.capacitance).toBeCloseTo(o.capacitance.nominal * (1 + cell.tolerancePlus), 12);
    const curve = dischargeCurve(o, requirement, DEFAULT_DESIGN_FACTORS.safeVoltage)!;
    expect(curve.kind).toBe("resistive");
    const t = crossing(curve.points, DEFAULT_DESIGN_FACTORS.safeVoltage);
    expect(Math.abs(t - o.discharge.secondsToSafe) / o.discharge.secondsToSafe).toBeLessThan(1e-9);
  });

  it("the resistance it discharges through is the balancing chain and the bleeder in parallel", () => {
    const o = first({ maxVoltage: 125, minVoltage: 60, capacitance: 20 }, EDLC);
    const chain = o.discharge.chainResistance!;
    const bleeder = o.discharge.bleeder!.resistance;
    // groups in series: N_s balancing resistors R in series across the terminals
    expect(chain).toBeCloseTo(o.seriesCount * o.balancing.resistance!, 6);
    expect(o.discharge.resistance).toBeCloseTo(1 / (1 / chain + 1 / bleeder), 6);
  });

  it("a backup curve lasts as long as the backup figure (design capacitance, end-of-life ESR)", () => {
    const requirement: Requirement = { maxVoltage: 48, minVoltage: 24, backup: { power: 2000, seconds: 10 } };
    const o = first(requirement, EDLC);
    const curve = dischargeCurve(o, requirement, 60)!;
    expect(curve.kind).toBe("constant-power");
    expect(curve.seconds).toBeCloseTo(o.backupSeconds!, 9);
    expect(curve.requiredSeconds).toBe(10);
  });
});

describe("charging voltages of each series position", () => {
  it("the weakest and the others add up to V_max and hold the same charge (C_lo·V_w = C_hi·V_other)", () => {
    const o = first({ maxVoltage: 48, capacitance: 10 }, EDLC);
    const v = chargingVoltages(o, 48);
    const m = DEFAULT_DESIGN_FACTORS.matchingTolerance;
    expect(v.weakest + (o.seriesCount - 1) * v.others!).toBeCloseTo(48, 9);
    expect((1 - m) * v.weakest).toBeCloseTo((1 + m) * v.others!, 9);
    expect(v.balanced).toBeCloseTo(48 / o.seriesCount, 12);
  });

  it("a single cell takes the whole voltage", () => {
    expect(chargingVoltages({ seriesCount: 1, worstCellVoltage: 400 } as never, 400)).toEqual({ weakest: 400, others: null, balanced: 400 });
  });
});
