import { describe, expect, it } from "vitest";
import { sizeBalancing, sizeBleeder } from "@/lib/bank";

// Hand-worked from DESIGN §3.4 with IEC 60063:2015 E24 rounding.
describe("passive balancing", () => {
  it("series of parallel groups: R ≤ V_cell/(k·N_p·I_lk), one resistor per group", () => {
    // 16 V over 6 groups of 2 cells (350 F, 10 µA): R ≤ 2.667/(10·2·10 µA) = 13.33 kΩ → 13 kΩ (E24)
    const b = sizeBalancing({
      topology: "series-of-parallel-groups",
      maxVoltage: 16,
      seriesCount: 6,
      parallelCount: 2,
      cellCapacitance: 350,
      leakageCurrent: 10e-6,
      balancingFactor: 10,
      resistorSeries: "E24",
    });
    const vCell = 16 / 6;
    expect(b.resistance).toBe(13_000);
    expect(b.count).toBe(6);
    expect(b.power).toBeCloseTo((vCell * vCell) / 13_000, 12);
    expect(b.powerRating).toBe(0.125); // ≥ 2 × 0.55 mW
    expect(b.standbyLoss).toBeCloseTo((6 * vCell * vCell) / 13_000, 12);
    expect(b.timeConstant).toBeCloseTo(13_000 * 2 * 350, 6);
    expect(b.chainResistance).toBe(6 * 13_000);
  });

  it("parallel of series strings: one resistor per cell, same time constant", () => {
    // R ≤ 2.667/(10·10 µA) = 26.7 kΩ → 24 kΩ (E24); 12 resistors
    const b = sizeBalancing({
      topology: "parallel-of-series-strings",
      maxVoltage: 16,
      seriesCount: 6,
      parallelCount: 2,
      cellCapacitance: 350,
      leakageCurrent: 10e-6,
      balancingFactor: 10,
      resistorSeries: "E24",
    });
    expect(b.resistance).toBe(24_000);
    expect(b.count).toBe(12);
    expect(b.timeConstant).toBeCloseTo(24_000 * 350, 6);
    expect(b.chainResistance).toBe((6 * 24_000) / 2);
  });

  it("a single series position needs no balancing resistor", () => {
    const b = sizeBalancing({
      topology: "series-of-parallel-groups",
      maxVoltage: 2.5,
      seriesCount: 1,
      parallelCount: 4,
      cellCapacitance: 100,
      leakageCurrent: 1e-4,
      balancingFactor: 10,
      resistorSeries: "E24",
    });
    expect(b.count).toBe(0);
    expect(b.resistance).toBeNull();
  });
});

describe("safe discharge", () => {
  it("no bleeder when the bank never exceeds V_safe", () => {
    expect(sizeBleeder({ capacitance: 10, maxVoltage: 48, chainResistance: 1e5, safeVoltage: 60, safeTime: 5, resistorSeries: "E24" })).toEqual({
      secondsToSafe: 0,
      bleeder: null,
    });
  });

  it("the balancing chain alone is enough when C·R·ln(V/V_safe) ≤ t_safe", () => {
    const r = sizeBleeder({ capacitance: 1e-4, maxVoltage: 400, chainResistance: 10_000, safeVoltage: 60, safeTime: 5, resistorSeries: "E24" });
    expect(r.bleeder).toBeNull();
    expect(r.secondsToSafe).toBeCloseTo(1e-4 * 10_000 * Math.log(400 / 60), 12);
  });

  it("sizes a bleeder so the total time constant is ≤ t_safe/ln(V_max/V_safe), and flags > 100 W as switched", () => {
    // 2 mF at 400 V, chain 94 kΩ: τ ≤ 5/ln(400/60) = 2.636 s → R_total ≤ 1317.8 Ω → bleeder ≤ 1336.5 Ω → 1.3 kΩ (E24)
    const r = sizeBleeder({ capacitance: 2e-3, maxVoltage: 400, chainResistance: 94_000, safeVoltage: 60, safeTime: 5, resistorSeries: "E24" });
    expect(r.bleeder).not.toBeNull();
    expect(r.bleeder!.resistance).toBe(1300);
    expect(r.bleeder!.power).toBeCloseTo(400 ** 2 / 1300, 9);
    expect(r.bleeder!.energy).toBeCloseTo(0.5 * 2e-3 * 400 ** 2, 9);
    expect(r.bleeder!.switched).toBe(true); // 123 W continuous
    expect(r.bleeder!.powerRating).toBeNull();
    expect(r.secondsToSafe).toBeLessThanOrEqual(5);
    const rTotal = (1300 * 94_000) / (1300 + 94_000);
    expect(r.secondsToSafe).toBeCloseTo(2e-3 * rTotal * Math.log(400 / 60), 9);
  });

  it("a small bank gets a continuous bleeder", () => {
    const r = sizeBleeder({ capacitance: 1e-3, maxVoltage: 100, chainResistance: Infinity, safeVoltage: 60, safeTime: 5, resistorSeries: "E12" });
    // τ ≤ 5/ln(100/60) = 9.788 s → R ≤ 9788 Ω → 8.2 kΩ (E12); 100²/8200 = 1.22 W → 3 W rating
    expect(r.bleeder!.resistance).toBe(8200);
    expect(r.bleeder!.switched).toBe(false);
    expect(r.bleeder!.powerRating).toBe(3);
  });
});
