/** Invented cells for the engine's tests (invented maker prefixes and part numbers), figures typical of their kind. */
import type { EngineCell } from "@/lib/bank";

/** A 1100 F, 3.8 V hybrid (lithium-ion) capacitor cell that must stay above 2.2 V. */
export function hybridCell(overrides: Partial<EngineCell> = {}): EngineCell {
  return {
    id: "cell-hx1100",
    sku: "HX-1100-38",
    technology: "hybrid",
    capacitance: 1100,
    toleranceMinus: 0.1,
    tolerancePlus: 0.2,
    ratedVoltage: 3.8,
    surgeVoltage: 4,
    esr: 1.6e-3,
    leakageCurrent: 8e-6,
    continuousCurrent: 60,
    peakCurrent: 180,
    mass: 0.121,
    volume: 7.6e-5,
    unitCost: 31.5,
    stock: 500,
    leadTimeDays: 6,
    minVoltage: 2.2,
    ...overrides,
  };
}

/** A 3000 F, 2.7 V EDLC cell. */
export function edlc3000(overrides: Partial<EngineCell> = {}): EngineCell {
  return {
    id: "cell-qz3000",
    sku: "QZ-3000-27",
    technology: "edlc",
    capacitance: 3000,
    toleranceMinus: 0.1,
    tolerancePlus: 0.2,
    ratedVoltage: 2.7,
    surgeVoltage: 2.85,
    esr: 0.29e-3,
    leakageCurrent: 5.2e-3,
    continuousCurrent: 130,
    peakCurrent: 2170,
    mass: 0.507,
    volume: 4.97e-4,
    unitCost: 44.9,
    stock: 5000,
    leadTimeDays: 2,
    ...overrides,
  };
}
