/** Engine types. Physics in SI units as plain numbers (F, V, Ω, A, J, W, s, kg, m³). */

export const TECHNOLOGIES = ["edlc", "hybrid", "electrolytic", "film"] as const;
export type Technology = (typeof TECHNOLOGIES)[number];

export type NetworkNode =
  | {
      kind: "cell";
      id: string;
      capacitance: number;
      ratedVoltage: number;
      esr?: number;
      leakage?: number;
      /** surge voltage (V), at least the rated voltage: one-cell failures and tolerance yield */
      surgeVoltage?: number;
      /** capacitance tolerance as fractions (0.1 = 10 %): tolerance yield */
      toleranceMinus?: number;
      tolerancePlus?: number;
    }
  | { kind: "series" | "parallel"; children: NetworkNode[] };

/** A cell of a network tree. */
export type NetworkCell = Extract<NetworkNode, { kind: "cell" }>;

/** A catalog cell as the engine sees it. */
export interface EngineCell {
  id: string;
  sku: string;
  technology: Technology;
  capacitance: number;
  /** fractions (0.1 = 10 %) */
  toleranceMinus: number;
  tolerancePlus: number;
  ratedVoltage: number;
  surgeVoltage: number;
  esr: number;
  leakageCurrent: number;
  continuousCurrent: number;
  peakCurrent: number;
  /** kg */
  mass: number;
  /** m³ */
  volume: number;
  /** float, ONLY for ranking and estimates; exact money is priced by the caller */
  unitCost: number;
  stock: number;
  leadTimeDays: number;
  /**
   * lowest voltage the cell may be taken to (V): hybrid (lithium-ion) cells must carry one
   * (commonly about 2.2 V); none (or 0) means the cell may be discharged to 0 V
   */
  minVoltage?: number | null;
  /** temperature and life data, where the catalog gives it */
  thermal?: CellThermal | null;
}

/** A cell's temperature and life data as the catalog gives it; any figure may be missing. */
export interface CellThermal {
  /** life at the rated temperature and rated voltage (h) */
  ratedLifeHours: number | null;
  /** temperature the rated life is given at (°C); missing: the top of the range */
  ratedTemperature: number | null;
  /** operating range (°C) */
  minTemperature: number | null;
  maxTemperature: number | null;
  /** thermal resistance cell to ambient (K/W) */
  thermalResistance: number | null;
  /** capacitance and ESR at the bottom of the range, as factors of their values at 25 °C */
  coldCapacitanceFactor: number | null;
  coldEsrFactor: number | null;
}

/** Active balancing board: clamps each channel (one series position) at or below maxCellVoltage. */
export interface BalancingBoard {
  id: string;
  sku: string;
  channels: number;
  maxCellVoltage: number;
  unitCost: number;
  leadTimeDays: number;
}

export type ResistorSeries = "E12" | "E24" | "E48" | "E96";

export interface DesignFactors {
  /** end-of-life capacitance fade f_C (fraction) */
  capacitanceFade: number;
  /** end-of-life ESR growth g (fraction: 1.0 = +100 %) */
  esrGrowth: number;
  /** cell voltage derating d (≤ 1) */
  voltageDerating: number;
  /** cell matching tolerance m after incoming grading (fraction) */
  matchingTolerance: number;
  /** balancing factor k: balancing current ≥ k × leakage */
  balancingFactor: number;
  resistorSeries: ResistorSeries;
  /** V_safe */
  safeVoltage: number;
  /** t_safe (s) */
  safeTime: number;
}

export const DEFAULT_DESIGN_FACTORS: DesignFactors = {
  capacitanceFade: 0.2,
  esrGrowth: 1.0,
  voltageDerating: 1.0,
  matchingTolerance: 0.05,
  balancingFactor: 10,
  resistorSeries: "E24",
  safeVoltage: 60,
  safeTime: 5,
};

export interface Requirement {
  maxVoltage: number;
  minVoltage?: number;
  capacitance?: number;
  /** usable energy between maxVoltage and minVoltage (J) */
  energy?: number;
  /** constant-power backup: power (W) for seconds down to minVoltage */
  backup?: { power: number; seconds: number };
  /** peak current (A) with the allowed voltage drop (V) */
  peakCurrent?: { current: number; maxDrop: number };
  maxMass?: number;
  maxVolume?: number;
  quantity?: number;
  technology?: Technology;
  /** ambient temperature around the bank in service (°C); the life estimate assumes 25 °C without it */
  ambientTemperature?: number;
  /** rms current the bank carries in service (A): sizes self-heating */
  rmsCurrent?: number;
  /** show only banks that survive one failed cell of this kind */
  survives?: FaultFilter;
  /** show only banks expected to last at least this many years */
  minLifeYears?: number;
  /** which options come first: the cheapest (default) or the longest-lived */
  rankBy?: RankBy;
}

export const FAULT_FILTERS = ["short", "open", "both"] as const;
export type FaultFilter = (typeof FAULT_FILTERS)[number];
export const RANK_BY = ["price", "life"] as const;
export type RankBy = (typeof RANK_BY)[number];

export const TOPOLOGIES = ["series-of-parallel-groups", "parallel-of-series-strings"] as const;
export type Topology = (typeof TOPOLOGIES)[number];

/**
 * Bounding-box volume of a cell in m³. Cylinders pack on a square grid, so each takes d²·h
 * (common practice for bank layout estimates).
 */
export function cellVolume(input: { shape: "cylinder" | "box"; diameterMm?: number; lengthMm?: number; widthMm?: number; heightMm: number }): number {
  const mm3ToM3 = 1e-9;
  if (input.shape === "cylinder") {
    const d = input.diameterMm;
    if (d === undefined || !(d > 0) || !(input.heightMm > 0)) {
      throw new RangeError("a cylinder needs a positive diameter and height");
    }
    return d * d * input.heightMm * mm3ToM3;
  }
  const { lengthMm: l, widthMm: w, heightMm: h } = input;
  if (l === undefined || w === undefined || !(l > 0) || !(w > 0) || !(h > 0)) {
    throw new RangeError("a box needs a positive length, width and height");
  }
  return l * w * h * mm3ToM3;
}
