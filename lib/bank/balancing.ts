import { storedEnergy } from "./energy";
import { largestPreferredAtMost, smallestPowerRatingAtLeast } from "./preferred-values";
import type { ResistorSeries, Topology } from "./types";

/** Largest balancing resistor we propose (common practice: above ~10 MΩ board leakage and noise dominate). */
export const MAX_BALANCING_RESISTANCE = 10e6;

/** Continuous bleeder power above which a switched discharge circuit is needed (common practice). */
export const SWITCHED_BLEEDER_ABOVE_W = 100;

export interface BalancingResult {
  /** resistor value (Ω), null when the bank has a single series position */
  resistance: number | null;
  /** dissipation of one resistor (W) */
  power: number;
  /** standard rating ≥ 2 × power (W), null when above the largest standard rating */
  powerRating: number | null;
  count: number;
  /** total continuous loss of all balancing resistors (W) */
  standbyLoss: number;
  /** R·N_p·C_n (s); Infinity when there is no balancing resistor */
  timeConstant: number;
  /** resistance of the whole balancing chain seen across the bank terminals (Ω); Infinity when none */
  chainResistance: number;
}

/**
 * Passive balancing (DESIGN §3.4): R ≤ V_cell / (k·N_p·I_lk) per group of N_p paralleled cells,
 * V_cell = V_max/N_s, rounded down to the preferred series. In a parallel of series strings every
 * cell has its own resistor (N_p = 1 in the formula, N_s·N_p resistors); the time constant is the same.
 */
export function sizeBalancing(input: {
  topology: Topology;
  maxVoltage: number;
  seriesCount: number;
  parallelCount: number;
  cellCapacitance: number;
  leakageCurrent: number;
  balancingFactor: number;
  resistorSeries: ResistorSeries;
}): BalancingResult {
  const { topology, maxVoltage, seriesCount: ns, parallelCount: np, cellCapacitance: cn } = input;
  if (ns <= 1) {
    return {
      resistance: null,
      power: 0,
      powerRating: null,
      count: 0,
      standbyLoss: 0,
      timeConstant: Infinity,
      chainResistance: Infinity,
    };
  }
  const vCell = maxVoltage / ns;
  const perGroup = topology === "series-of-parallel-groups";
  const cellsPerResistor = perGroup ? np : 1;
  const leak = input.leakageCurrent > 0 ? input.leakageCurrent : 0;
  const rMax = leak > 0 ? Math.min(vCell / (input.balancingFactor * cellsPerResistor * leak), MAX_BALANCING_RESISTANCE) : MAX_BALANCING_RESISTANCE;
  const resistance = largestPreferredAtMost(rMax, input.resistorSeries);
  const power = (vCell * vCell) / resistance;
  const count = perGroup ? ns : ns * np;
  return {
    resistance,
    power,
    powerRating: smallestPowerRatingAtLeast(2 * power),
    count,
    standbyLoss: count * power,
    timeConstant: resistance * cellsPerResistor * cn,
    chainResistance: perGroup ? ns * resistance : (ns * resistance) / np,
  };
}

export interface BleederResult {
  /** time for the bank to fall from V_max to V_safe through balancing chain and bleeder (s) */
  secondsToSafe: number;
  bleeder: null | {
    resistance: number;
    /** continuous dissipation at V_max (W) */
    power: number;
    /** standard rating ≥ 2 × power, null above the largest standard rating */
    powerRating: number | null;
    /** energy it must absorb, ½·C·V_max² (J) */
    energy: number;
    /** continuous power is impractical: a switched discharge circuit is needed instead */
    switched: boolean;
  };
}

/**
 * Safe discharge (DESIGN §3.4). The balancing chain bleeds the bank; when it is too slow to bring
 * the bank from V_max to V_safe within t_safe, a bleeder across the terminals brings the total
 * time constant to at most t_safe / ln(V_max/V_safe).
 * `capacitance` is the bank capacitance the time is computed with (pass the upper-tolerance value
 * for a worst-case figure).
 */
export function sizeBleeder(input: {
  capacitance: number;
  maxVoltage: number;
  chainResistance: number;
  safeVoltage: number;
  safeTime: number;
  resistorSeries: ResistorSeries;
}): BleederResult {
  const { capacitance: c, maxVoltage: v, chainResistance: rChain, safeVoltage, safeTime } = input;
  if (v <= safeVoltage) return { secondsToSafe: 0, bleeder: null };
  const ln = Math.log(v / safeVoltage);
  const chainSeconds = c * rChain * ln;
  if (chainSeconds <= safeTime) return { secondsToSafe: chainSeconds, bleeder: null };
  const rTotalMax = safeTime / (ln * c);
  const conductance = 1 / rTotalMax - (Number.isFinite(rChain) ? 1 / rChain : 0);
  const resistance = largestPreferredAtMost(1 / conductance, input.resistorSeries);
  const rTotal = Number.isFinite(rChain) ? (rChain * resistance) / (rChain + resistance) : resistance;
  const power = (v * v) / resistance;
  return {
    secondsToSafe: c * rTotal * ln,
    bleeder: {
      resistance,
      power,
      powerRating: smallestPowerRatingAtLeast(2 * power),
      energy: storedEnergy(c, v),
      switched: power > SWITCHED_BLEEDER_ABOVE_W,
    },
  };
}
