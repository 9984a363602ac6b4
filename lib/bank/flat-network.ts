import type { NetworkCell, NetworkNode } from "./types";

export const FLAT_CELL = 0;
export const FLAT_SERIES = 1;
export const FLAT_PARALLEL = 2;

/**
 * A network tree laid out in pre-order (parents before children, children left to right) in
 * typed arrays, for the analyses that evaluate one tree many times (failures, tolerance yield).
 * The subtree of node i is the node range [i, i + subtreeSize[i]) and the cell range
 * [cellStart[i], cellStart[i] + cellCount[i]); cells are numbered in document order.
 */
export interface FlatNetwork {
  /** number of nodes (cells and groups) */
  size: number;
  kind: Uint8Array;
  /** parent node, −1 for the root */
  parent: Int32Array;
  /** 1 when the node's parent is a series group */
  parentSeries: Uint8Array;
  /** levels above the node (the root is 0) */
  depth: Int32Array;
  subtreeSize: Int32Array;
  cellStart: Int32Array;
  cellCount: Int32Array;
  /** node → its cell number, −1 for a group */
  cellOf: Int32Array;
  /** cell number → node */
  cellNode: Int32Array;
  /** the cells in document order */
  cells: NetworkCell[];
}

function isPositiveNumber(x: unknown): x is number {
  return typeof x === "number" && x > 0 && Number.isFinite(x);
}

/**
 * Lay a network tree out flat, without recursion. Throws RangeError on an empty group, a
 * capacitance or rated voltage that is not a positive number, or a surge voltage below the rated
 * voltage (validate input first with lib/validation).
 */
export function flattenNetwork(network: NetworkNode): FlatNetwork {
  const nodes: NetworkNode[] = [];
  const parents: number[] = [];
  const stackNode: NetworkNode[] = [network];
  const stackParent: number[] = [-1];
  while (stackNode.length > 0) {
    const node = stackNode.pop() as NetworkNode;
    const index = nodes.length;
    nodes.push(node);
    parents.push(stackParent.pop() as number);
    if (node.kind === "cell") continue;
    const children = node.children;
    if (!Array.isArray(children) || children.length === 0) {
      throw new RangeError(`a ${String(node.kind)} group must have at least one child`);
    }
    for (let c = children.length - 1; c >= 0; c--) {
      stackNode.push(children[c] as NetworkNode);
      stackParent.push(index);
    }
  }

  const n = nodes.length;
  const kind = new Uint8Array(n);
  const parent = Int32Array.from(parents);
  const depth = new Int32Array(n);
  const subtreeSize = new Int32Array(n).fill(1);
  const cellStart = new Int32Array(n);
  const cellCount = new Int32Array(n);
  const cellOf = new Int32Array(n).fill(-1);
  const cells: NetworkCell[] = [];
  const cellNodes: number[] = [];
  for (let i = 0; i < n; i++) {
    const node = nodes[i] as NetworkNode;
    const p = parent[i] as number;
    if (p >= 0) depth[i] = (depth[p] as number) + 1;
    cellStart[i] = cells.length;
    if (node.kind === "cell") {
      if (!isPositiveNumber(node.capacitance)) throw new RangeError(`cell ${node.id}: capacitance must be a positive number`);
      if (!isPositiveNumber(node.ratedVoltage)) throw new RangeError(`cell ${node.id}: rated voltage must be a positive number`);
      if (node.surgeVoltage !== undefined && !(isPositiveNumber(node.surgeVoltage) && node.surgeVoltage >= node.ratedVoltage)) {
        throw new RangeError(`cell ${node.id}: surge voltage must be a number at least the rated voltage`);
      }
      kind[i] = FLAT_CELL;
      cellOf[i] = cells.length;
      cells.push(node);
      cellNodes.push(i);
    } else {
      kind[i] = node.kind === "series" ? FLAT_SERIES : FLAT_PARALLEL;
    }
  }
  const parentSeries = new Uint8Array(n);
  for (let i = 1; i < n; i++) parentSeries[i] = kind[parent[i] as number] === FLAT_SERIES ? 1 : 0;
  // children after parents: one reverse sweep sums subtree sizes and cell counts
  for (let i = n - 1; i >= 0; i--) {
    if (kind[i] === FLAT_CELL) cellCount[i] = 1;
    const p = parent[i] as number;
    if (p >= 0) {
      subtreeSize[p] = (subtreeSize[p] as number) + (subtreeSize[i] as number);
      cellCount[p] = (cellCount[p] as number) + (cellCount[i] as number);
    }
  }
  return { size: n, kind, parent, parentSeries, depth, subtreeSize, cellStart, cellCount, cellOf, cellNode: Int32Array.from(cellNodes), cells };
}

/**
 * Equivalent capacitance of every subtree and each node's share of the applied voltage, for the
 * given cell capacitances (in document order). Writes into `cap`, `acc` and `fraction` (length
 * `size`): no allocation, so a sampler can call it many times.
 */
export function evaluateFlat(flat: FlatNetwork, cellCapacitance: Float64Array, cap: Float64Array, acc: Float64Array, fraction: Float64Array): void {
  const { size, kind, parent, parentSeries, cellOf } = flat;
  acc.fill(0);
  for (let i = size - 1; i > 0; i--) {
    const k = kind[i];
    const c = k === FLAT_CELL ? (cellCapacitance[cellOf[i] as number] as number) : k === FLAT_SERIES ? 1 / (acc[i] as number) : (acc[i] as number);
    cap[i] = c;
    const p = parent[i] as number;
    acc[p] = (acc[p] as number) + (parentSeries[i] ? 1 / c : c);
  }
  const k0 = kind[0];
  cap[0] = k0 === FLAT_CELL ? (cellCapacitance[0] as number) : k0 === FLAT_SERIES ? 1 / (acc[0] as number) : (acc[0] as number);
  fraction[0] = 1;
  for (let i = 1; i < size; i++) {
    const p = parent[i] as number;
    fraction[i] = parentSeries[i] ? ((fraction[p] as number) * (cap[p] as number)) / (cap[i] as number) : (fraction[p] as number);
  }
}
