import type { NetworkNode } from './types';

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

const KIND_CELL = 0;
const KIND_SERIES = 1;
const KIND_PARALLEL = 2;

/**
 * Evaluate an ideal series/parallel network charged from zero (DESIGN §3.1).
 * Iterative (no recursion), so any depth is safe; linear in the number of nodes.
 * Throws RangeError on an empty group or a non-positive capacitance or rated voltage
 * (validate input first with lib/validation/bank.ts).
 */
export function evaluateNetwork(network: NetworkNode, appliedVoltage?: number): NetworkEvaluation {
  // Pass 1: pre-order flattening. Parents get smaller indices than their children.
  const nodes: NetworkNode[] = [];
  const parent: number[] = [];
  const stackNode: NetworkNode[] = [network];
  const stackParent: number[] = [-1];
  while (stackNode.length > 0) {
    const node = stackNode.pop() as NetworkNode;
    const p = stackParent.pop() as number;
    const index = nodes.length;
    nodes.push(node);
    parent.push(p);
    if (node.kind !== 'cell') {
      const children = node.children;
      if (!Array.isArray(children) || children.length === 0) {
        throw new RangeError(`a ${String(node.kind)} group must have at least one child`);
      }
      // push in reverse so the first child is visited first (document order)
      for (let c = children.length - 1; c >= 0; c--) {
        stackNode.push(children[c] as NetworkNode);
        stackParent.push(index);
      }
    }
  }

  const n = nodes.length;
  const kind = new Uint8Array(n);
  const cap = new Float64Array(n); // equivalent capacitance of the subtree
  const acc = new Float64Array(n); // series: Σ1/Cᵢ, parallel: ΣCᵢ
  const esr = new Float64Array(n); // equivalent ESR of the subtree
  const esrAcc = new Float64Array(n); // series: ΣRᵢ, parallel: Σ1/Rᵢ
  let everyCellHasEsr = true;
  let cellCount = 0;

  for (let i = 0; i < n; i++) {
    const node = nodes[i] as NetworkNode;
    kind[i] = node.kind === 'cell' ? KIND_CELL : node.kind === 'series' ? KIND_SERIES : KIND_PARALLEL;
  }

  // Pass 2: reverse pre-order = every child before its parent.
  for (let i = n - 1; i >= 0; i--) {
    const k = kind[i];
    if (k === KIND_CELL) {
      const cell = nodes[i] as Extract<NetworkNode, { kind: 'cell' }>;
      if (!(cell.capacitance > 0) || !Number.isFinite(cell.capacitance)) {
        throw new RangeError(`cell ${cell.id}: capacitance must be a positive number`);
      }
      if (!(cell.ratedVoltage > 0) || !Number.isFinite(cell.ratedVoltage)) {
        throw new RangeError(`cell ${cell.id}: rated voltage must be a positive number`);
      }
      cap[i] = cell.capacitance;
      if (cell.esr === undefined) everyCellHasEsr = false;
      else esr[i] = cell.esr;
      cellCount++;
    } else if (k === KIND_SERIES) {
      cap[i] = 1 / (acc[i] as number);
      esr[i] = esrAcc[i] as number;
    } else {
      cap[i] = acc[i] as number;
      esr[i] = 1 / (esrAcc[i] as number); // 1/∞ = 0 when a child has zero ESR
    }
    const p = parent[i] as number;
    if (p >= 0) {
      if (kind[p] === KIND_SERIES) {
        acc[p] = (acc[p] as number) + 1 / (cap[i] as number);
        esrAcc[p] = (esrAcc[p] as number) + (esr[i] as number);
      } else {
        acc[p] = (acc[p] as number) + (cap[i] as number);
        esrAcc[p] = (esrAcc[p] as number) + 1 / (esr[i] as number);
      }
    }
  }

  // Pass 3: pre-order. fraction = node voltage / applied voltage.
  // Series children share the parent's charge: V_child = V_parent · C_parent / C_child.
  const fraction = new Float64Array(n);
  fraction[0] = 1;
  let maxVoltage = Infinity;
  for (let i = 1; i < n; i++) {
    const p = parent[i] as number;
    fraction[i] =
      kind[p] === KIND_SERIES
        ? ((fraction[p] as number) * (cap[p] as number)) / (cap[i] as number)
        : (fraction[p] as number);
  }
  for (let i = 0; i < n; i++) {
    if (kind[i] === KIND_CELL) {
      const cell = nodes[i] as Extract<NetworkNode, { kind: 'cell' }>;
      const limit = cell.ratedVoltage / (fraction[i] as number);
      if (limit < maxVoltage) maxVoltage = limit;
    }
  }

  const v = appliedVoltage ?? maxVoltage;
  const cells: CellState[] = new Array<CellState>(cellCount);
  let c = 0;
  for (let i = 0; i < n; i++) {
    if (kind[i] !== KIND_CELL) continue;
    const cell = nodes[i] as Extract<NetworkNode, { kind: 'cell' }>;
    const vi = (fraction[i] as number) * v;
    const ci = cap[i] as number;
    cells[c++] = { id: cell.id, voltage: vi, charge: ci * vi, energy: 0.5 * ci * vi * vi };
  }

  const capacitance = cap[0] as number;
  const result: NetworkEvaluation = {
    capacitance,
    maxVoltage,
    appliedVoltage: v,
    energy: 0.5 * capacitance * v * v,
    charge: capacitance * v,
    cells,
  };
  if (everyCellHasEsr) result.esr = esr[0] as number;
  return result;
}
