import { evaluateFlat, flattenNetwork, FLAT_SERIES } from "./flat-network";
import type { NetworkCell, NetworkNode } from "./types";

// a module-local copy for the per-node loop: bundlers read imported bindings through accessors
const SERIES = FLAT_SERIES;

export interface CellState {
  id: string;
  voltage: number;
  charge: number;
  energy: number;
}

export interface NetworkEvaluation {
  /** equivalent capacitance (F) */
  capacitance: number;
  /** equivalent ESR (Ω), only when every cell has one */
  esr?: number;
  /** largest applied voltage at which no cell exceeds its rated voltage */
  maxVoltage: number;
  /** the voltage the cells were evaluated at (appliedVoltage, or maxVoltage) */
  appliedVoltage: number;
  /** ½·C·V² at appliedVoltage (J) */
  energy: number;
  /** C·V at appliedVoltage (C) */
  charge: number;
  /** cells in document order (depth-first, children left to right) */
  cells: CellState[];
}

/**
 * Evaluate an ideal series/parallel network charged from zero (DESIGN §3.1).
 * Iterative (no recursion), so any depth is safe; linear in the number of nodes.
 * Throws RangeError on an empty group, a non-positive capacitance or rated voltage, or a surge
 * voltage below the rated voltage (validate input first with lib/validation/bank.ts).
 */
export function evaluateNetwork(network: NetworkNode, appliedVoltage?: number): NetworkEvaluation {
  // Parents before children in typed arrays; capacitances and each node's share of V from them.
  const flat = flattenNetwork(network);
  const { size: n, parent, parentSeries, cellOf, cells, cellNode } = flat;
  const cellCapacitance = new Float64Array(cells.length);
  for (let x = 0; x < cells.length; x++) cellCapacitance[x] = (cells[x] as NetworkCell).capacitance;
  const cap = new Float64Array(n);
  const fraction = new Float64Array(n);
  evaluateFlat(flat, cellCapacitance, cap, new Float64Array(n), fraction);

  // ESR: series adds, parallel combines reciprocally; children before parents.
  const esr = new Float64Array(n); // equivalent ESR of the subtree
  const esrAcc = new Float64Array(n); // series: ΣRᵢ, parallel: Σ1/Rᵢ
  let everyCellHasEsr = true;
  for (let i = n - 1; i >= 0; i--) {
    const x = cellOf[i] as number;
    if (x >= 0) {
      const cellEsr = (cells[x] as NetworkCell).esr;
      if (cellEsr === undefined) everyCellHasEsr = false;
      else esr[i] = cellEsr;
    } else {
      esr[i] = flat.kind[i] === SERIES ? (esrAcc[i] as number) : 1 / (esrAcc[i] as number); // 1/∞ = 0 when a child has zero ESR
    }
    const p = parent[i] as number;
    if (p >= 0) esrAcc[p] = (esrAcc[p] as number) + (parentSeries[i] ? (esr[i] as number) : 1 / (esr[i] as number));
  }

  // The largest V at which no cell passes its rated voltage.
  let maxVoltage = Infinity;
  for (let x = 0; x < cells.length; x++) {
    const limit = (cells[x] as NetworkCell).ratedVoltage / (fraction[cellNode[x] as number] as number);
    if (limit < maxVoltage) maxVoltage = limit;
  }

  const v = appliedVoltage ?? maxVoltage;
  const states: CellState[] = new Array<CellState>(cells.length);
  for (let x = 0; x < cells.length; x++) {
    const i = cellNode[x] as number;
    const vi = (fraction[i] as number) * v;
    const ci = cap[i] as number;
    states[x] = { id: (cells[x] as NetworkCell).id, voltage: vi, charge: ci * vi, energy: 0.5 * ci * vi * vi };
  }

  const capacitance = cap[0] as number;
  const result: NetworkEvaluation = {
    capacitance,
    maxVoltage,
    appliedVoltage: v,
    energy: 0.5 * capacitance * v * v,
    charge: capacitance * v,
    cells: states,
  };
  if (everyCellHasEsr) result.esr = esr[0] as number;
  return result;
}
