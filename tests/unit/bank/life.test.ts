import { describe, expect, it } from "vitest";
import { DEFAULT_LIFE_SETTINGS, estimateCellLife, estimateOptionLife, HOURS_PER_YEAR, type LifeCell } from "@/lib/bank";

// An invented 105 °C electrolytic and an invented 65 °C EDLC, with made-up but typical figures.
const electrolytic: LifeCell = {
  technology: "electrolytic",
  ratedVoltage: 450,
  esr: 0.05,
  capacitance: 0.0047,
  ratedLifeHours: 2000,
  maxTemperature: 105,
  minTemperature: -40,
  thermalResistance: 8,
};
const edlc: LifeCell = {
  technology: "edlc",
  ratedVoltage: 2.7,
  esr: 0.00029,
  capacitance: 3000,
  ratedLifeHours: 1500,
  maxTemperature: 65,
  minTemperature: -40,
  thermalResistance: 3.2,
  coldFactors: { capacitance: 0.9, esr: 2.5 },
};

describe("expected life", () => {
  // Common practice (the "10 °C rule" for capacitor life, no single source): life doubles for each
  // 10 °C below the rated temperature. Worked case: 2000 h at 105 °C, run at 65 °C and its rated
  // voltage with no ripple: 2000 · 2^((105 − 65)/10) = 32,000 h ≈ 3.65 years.
  it("doubles for each 10 °C below the rated temperature: 2000 h at 105 °C → 32,000 h at 65 °C", () => {
    const r = estimateCellLife({ cell: electrolytic, ambientTemperature: 65, cellVoltage: 450 });
    expect(r.ok).toBe(true);
    expect(r.temperatureFactor).toBeCloseTo(16, 12);
    expect(r.voltageFactor).toBe(1);
    expect(r.lifeHours).toBeCloseTo(32_000, 6);
    expect(r.lifeYears).toBeCloseTo(32_000 / 8766, 9);
    expect(r.assumptions.join(" ")).toMatch(/10 °C below the rated 105 °C \(common practice\)/);
  });

  it("halves for each 10 °C above it", () => {
    const r = estimateCellLife({ cell: { ...electrolytic, ratedTemperature: 85 }, ambientTemperature: 95, cellVoltage: 450 });
    expect(r.lifeHours).toBeCloseTo(1000, 6);
  });

  // Common practice for EDLCs, recalled from memory: life about doubles for each 0.1 V below 2.7 V.
  it("an EDLC at 2.6 V instead of 2.7 V lives about twice as long (the default voltage step)", () => {
    const at = (v: number) => estimateCellLife({ cell: edlc, ambientTemperature: 65, cellVoltage: v }).lifeHours!;
    expect(at(2.6) / at(2.7)).toBeCloseTo(2, 1);
    expect(at(2.5) / at(2.7)).toBeCloseTo(4, 0);
  });

  it("heats itself by I²·ESR·R_th: 10 A through 50 mΩ and 8 K/W → 5 W, 40 K", () => {
    const r = estimateCellLife({ cell: { ...electrolytic, esr: 0.05 }, ambientTemperature: 40, cellVoltage: 400, cellRmsCurrent: 10 });
    expect(r.dissipation).toBeCloseTo(5, 12);
    expect(r.selfHeating).toBeCloseTo(40, 12);
    expect(r.cellTemperature).toBeCloseTo(80, 12);
    expect(r.temperatureFactor).toBeCloseTo(2 ** 2.5, 12);
  });

  it("refuses a cell that would run above its maximum temperature, or an ambient below its minimum", () => {
    const hot = estimateCellLife({ cell: electrolytic, ambientTemperature: 90, cellVoltage: 400, cellRmsCurrent: 10 });
    expect(hot).toMatchObject({ ok: false, lifeHours: null, lifeYears: null });
    expect(hot.refusal).toBe("The cell would run at 130 °C (90 °C ambient + 40 K self-heating), above its 105 °C maximum.");
    const cold = estimateCellLife({ cell: electrolytic, ambientTemperature: -45, cellVoltage: 400 });
    expect(cold.ok).toBe(false);
    expect(cold.refusal).toMatch(/below the cell's -40 °C minimum/);
  });

  it("stops at the ceiling of the settings", () => {
    const r = estimateCellLife({ cell: electrolytic, ambientTemperature: 0, cellVoltage: 100 });
    expect(r.capped).toBe(true);
    expect(r.lifeYears).toBe(DEFAULT_LIFE_SETTINGS.maxLifeYears);
    const own = estimateCellLife({ cell: electrolytic, ambientTemperature: 0, cellVoltage: 100, settings: { ...DEFAULT_LIFE_SETTINGS, maxLifeYears: 5 } });
    expect(own.lifeHours).toBe(5 * HOURS_PER_YEAR);
  });

  it("gives capacitance and ESR at cold from the catalog factors", () => {
    const r = estimateCellLife({ cell: edlc, ambientTemperature: 25, cellVoltage: 2.5 });
    expect(r.cold).toEqual({ temperature: -40, capacitance: 2700, esr: 0.00029 * 2.5 });
    expect(estimateCellLife({ cell: electrolytic, ambientTemperature: 25, cellVoltage: 400 }).cold).toBeNull();
  });

  it("refuses malformed figures", () => {
    expect(() => estimateCellLife({ cell: { ...edlc, ratedLifeHours: 0 }, ambientTemperature: 25, cellVoltage: 2 })).toThrow(RangeError);
    expect(() => estimateCellLife({ cell: edlc, ambientTemperature: Number.NaN, cellVoltage: 2 })).toThrow(RangeError);
    expect(() => estimateCellLife({ cell: edlc, ambientTemperature: 25, cellVoltage: 2, cellRmsCurrent: -1 })).toThrow(RangeError);
  });
});

describe("expected life of an arrangement option", () => {
  it("splits the voltage over the series count and the current over the parallel count", () => {
    const r = estimateOptionLife({
      cell: edlc,
      topology: "series-of-parallel-groups",
      seriesCount: 18,
      parallelCount: 4,
      workingVoltage: 48,
      ambientTemperature: 35,
      rmsCurrent: 200,
    });
    expect(r.cellVoltage).toBeCloseTo(48 / 18, 12);
    expect(r.cellRmsCurrent).toBe(50);
    // 50² A² × 0.29 mΩ × 3.2 K/W = 2.32 K
    expect(r.selfHeating).toBeCloseTo(2.32, 12);
    // bank at −40 °C: 4 × 2700 F / 18, ESR 18 × 0.725 mΩ / 4
    expect(r.bankCold!.capacitance).toBeCloseTo(600, 9);
    expect(r.bankCold!.esr).toBeCloseTo((18 * 0.000725) / 4, 12);
    expect(r.assumptions[0]).toMatch(/^Each cell works at 2\.67 V and carries 50 A rms/);
  });

  it("refuses counts below one", () => {
    expect(() =>
      estimateOptionLife({ cell: edlc, topology: "parallel-of-series-strings", seriesCount: 0, parallelCount: 1, workingVoltage: 1, ambientTemperature: 25 }),
    ).toThrow(RangeError);
  });
});
