import { formatQuantity } from "../quantities";
import { evaluateFlat, flattenNetwork, type FlatNetwork } from "./flat-network";
import type { NetworkNode, Topology } from "./types";

/**
 * One-cell failures (DESIGN §3.5): what a bank does when one cell fails short or open.
 * A short takes no voltage (in a parallel group it shorts the group); an open carries no charge.
 * Voltages are the ideal capacitive division of the bank charged from zero with the fault
 * already present, with no balancing.
 */

export type FailureMode = "short" | "open";
export const FAILURE_MODES: readonly FailureMode[] = ["short", "open"];

export interface FailureCase {
  /** the failed cell */
  cellId: string;
  mode: FailureMode;
  /** equivalent capacitance after the fault (F); null when the fault shorts the whole network */
  capacitance: number | null;
  /** the highest voltage on any remaining cell at the applied voltage (V) */
  maxCellVoltage: number;
  /** remaining cells past their rated voltage, in document order (the first `listLimit`) */
  overstressed: string[];
  overstressedCount: number;
  /**
   * remaining cells past their surge voltage (past the rated voltage for a cell with no surge
   * voltage given), in document order (the first `listLimit`)
   */
  pastSurge: string[];
  pastSurgeCount: number;
  /** the fault shorts the whole network */
  shortCircuit: boolean;
}

export interface FailureWorstCase {
  /** the failed cell; null for an arrangement option, where every cell is alike */
  cellId: string | null;
  shortCircuit: boolean;
  /** capacitance after the fault (F), null on a short circuit */
  capacitance: number | null;
  /**
   * the most stressed remaining cells (closest to or furthest past their surge voltage when a
   * cell passes it, else to their rated voltage): a cell id for a network, a description for an
   * option; null when no remaining cell carries voltage
   */
  stressed: null | { cells: string; count: number; voltage: number; ratedVoltage: number; surgeVoltage: number | null };
  overstressedCount: number;
  pastSurgeCount: number;
}

export interface FailureModeSummary {
  mode: FailureMode;
  /**
   * every single fault of this kind leaves the bank working: no short circuit, some capacitance
   * left, every remaining cell within its surge voltage (its rated voltage where none is given)
   */
  survives: boolean;
  /** … and every remaining cell within its rated voltage */
  withinRating: boolean;
  /** capacitance after a fault of this kind: the lowest and the highest over all cells (F), null on a short circuit */
  capacitanceRange: { min: number | null; max: number | null };
  /** the worst single fault of this kind, null for a network with no cell */
  worst: FailureWorstCase | null;
  /** the verdict in plain words, e.g. "Survives one shorted cell: no — the other cells of that string reach 3.1 V, surge 2.85 V." */
  text: string;
}

export interface NetworkFailureAnalysis {
  appliedVoltage: number;
  healthy: { capacitance: number; maxCellVoltage: number; withinRating: boolean; withinSurge: boolean };
  /** one case per cell and mode: each cell's short, then its open, cells in document order */
  cases: FailureCase[];
  summary: { short: FailureModeSummary; open: FailureModeSummary };
  /** how many cell ids each list of a case holds at most */
  listLimit: number;
}

/** Most listed cell ids over a whole analysis; each list keeps at least MIN_LIST_LIMIT. */
export const FAILURE_LIST_BUDGET = 100_000;
export const MIN_LIST_LIMIT = 4;
/**
 * Most path steps (cells × their depth) in one analysis: 20,000 cells at the validator's depth of
 * 64. Each step costs O(log² cells) at worst, so an analysis stays near a second here.
 */
export const MAX_FAILURE_PATH_STEPS = 20_000 * 64;
/** relative margin so that a cell exactly at its limit is not "past" it through rounding */
const EPS = 1e-9;

function fmt(value: number, unit: string): string {
  return formatQuantity(value, unit);
}

/**
 * Range-minimum tree over cell values in document order, to list the cells of a range whose
 * value is below a threshold in O((found + 1)·log n).
 */
class MinTree {
  private readonly width: number;
  private readonly min: Float64Array;
  constructor(values: Float64Array) {
    let w = 1;
    while (w < values.length) w *= 2;
    this.width = w;
    this.min = new Float64Array(2 * w).fill(Infinity);
    this.min.set(values, w);
    for (let i = w - 1; i >= 1; i--) this.min[i] = Math.min(this.min[2 * i] as number, this.min[2 * i + 1] as number);
  }
  /** push onto `out` the positions in [lo, hi) whose value is below `threshold`, in order, until `out` holds `limit` */
  collectBelow(lo: number, hi: number, threshold: number, limit: number, out: number[]): void {
    this.visit(1, 0, this.width, lo, hi, threshold, limit, out);
  }
  private visit(node: number, nodeLo: number, nodeHi: number, lo: number, hi: number, t: number, limit: number, out: number[]): void {
    if (out.length >= limit || nodeHi <= lo || hi <= nodeLo || !((this.min[node] as number) < t)) return;
    if (nodeHi - nodeLo === 1) {
      out.push(nodeLo);
      return;
    }
    const mid = (nodeLo + nodeHi) >>> 1;
    this.visit(2 * node, nodeLo, mid, lo, hi, t, limit, out);
    this.visit(2 * node + 1, mid, nodeHi, lo, hi, t, limit, out);
  }
}

/**
 * Merge-sort tree over cell values in document order: how many values of a range lie below a
 * threshold, in O(log² n).
 */
class CountTree {
  private readonly levels: Float64Array[] = [];
  private readonly n: number;
  constructor(values: Float64Array) {
    this.n = values.length;
    let level = Float64Array.from(values);
    this.levels.push(level);
    for (let block = 1; block < this.n; block *= 2) {
      const next = new Float64Array(this.n);
      for (let start = 0; start < this.n; start += 2 * block) {
        let a = start;
        const aEnd = Math.min(start + block, this.n);
        let b = aEnd;
        const bEnd = Math.min(start + 2 * block, this.n);
        let o = start;
        while (a < aEnd && b < bEnd) next[o++] = (level[a] as number) <= (level[b] as number) ? (level[a++] as number) : (level[b++] as number);
        while (a < aEnd) next[o++] = level[a++] as number;
        while (b < bEnd) next[o++] = level[b++] as number;
      }
      this.levels.push(next);
      level = next;
    }
  }
  countBelow(lo: number, hi: number, threshold: number): number {
    let count = 0;
    let a = lo;
    let b = hi;
    for (let l = 0; a < b; l++) {
      const level = this.levels[l] as Float64Array;
      if (a & 1) {
        count += this.blockBelow(level, a << l, (a + 1) << l, threshold);
        a++;
      }
      if (b & 1) {
        b--;
        count += this.blockBelow(level, b << l, (b + 1) << l, threshold);
      }
      a >>= 1;
      b >>= 1;
    }
    return count;
  }
  private blockBelow(level: Float64Array, start: number, end: number, t: number): number {
    let lo = start;
    let hi = Math.min(end, this.n);
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if ((level[mid] as number) < t) lo = mid + 1;
      else hi = mid;
    }
    return lo - start;
  }
}

/** What a fault does to one cell's headroom: the structures built once per analysis. */
interface Headroom {
  values: Float64Array;
  list: MinTree | null;
  count: CountTree | null;
}

function lazyList(h: Headroom): MinTree {
  return (h.list ??= new MinTree(h.values));
}
function lazyCount(h: Headroom): CountTree {
  return (h.count ??= new CountTree(h.values));
}

/**
 * The healthy network and, for one fault at a time, the path from the failed cell to the root:
 * each path node's capacitance after the fault, and the factor by which the voltage of every cell
 * hanging off the path at each level changes (a fault only rescales those subtrees as wholes).
 */
class FaultPaths {
  readonly cap: Float64Array;
  readonly acc: Float64Array;
  readonly fraction: Float64Array;
  /** each child's term in its parent's sum (1/C under a series group, C under a parallel one) */
  private readonly contrib: Float64Array;
  /** each group's largest term, kept apart so that removing it never subtracts two nearly equal numbers */
  private readonly dominant: Int32Array;
  private readonly accRest: Float64Array;
  /** path of the last traced fault: pathNode[0] is the cell, pathNode[len − 1] the root */
  readonly pathNode: Int32Array;
  readonly pathCap: Float64Array;
  private readonly pathFraction: Float64Array;
  /** scale[k]: factor on the voltages of the cells under pathNode[k + 1] but not under pathNode[k] */
  readonly scale: Float64Array;
  len = 0;

  constructor(private readonly flat: FlatNetwork) {
    const { size: n, parent, parentSeries, cells } = flat;
    const cellCap = new Float64Array(cells.length);
    for (let x = 0; x < cells.length; x++) cellCap[x] = (cells[x] as { capacitance: number }).capacitance;
    this.cap = new Float64Array(n);
    this.acc = new Float64Array(n);
    this.fraction = new Float64Array(n);
    evaluateFlat(flat, cellCap, this.cap, this.acc, this.fraction);
    this.contrib = new Float64Array(n);
    this.dominant = new Int32Array(n).fill(-1);
    this.accRest = new Float64Array(n);
    for (let i = 1; i < n; i++) {
      const p = parent[i] as number;
      this.contrib[i] = parentSeries[i] ? 1 / (this.cap[i] as number) : (this.cap[i] as number);
      const d = this.dominant[p] as number;
      if (d < 0 || (this.contrib[i] as number) > (this.contrib[d] as number)) this.dominant[p] = i;
    }
    for (let i = 1; i < n; i++) {
      const p = parent[i] as number;
      if (this.dominant[p] !== i) this.accRest[p] = (this.accRest[p] as number) + (this.contrib[i] as number);
    }
    const levels = flat.depth.reduce((a, b) => Math.max(a, b), 0) + 1;
    this.pathNode = new Int32Array(levels);
    this.pathCap = new Float64Array(levels);
    this.pathFraction = new Float64Array(levels);
    this.scale = new Float64Array(levels);
  }

  /** Trace one fault of cell x (document order); answers the capacitance after it, Infinity on a short circuit. */
  trace(x: number, mode: FailureMode): number {
    const { parent, parentSeries, cellNode } = this.flat;
    const { pathNode, pathCap, pathFraction, scale, fraction, cap, acc, contrib, dominant, accRest } = this;
    // bottom-up: a short takes no voltage (infinite capacitance), an open carries no charge (zero)
    let len = 0;
    let node = cellNode[x] as number;
    let newCap = mode === "short" ? Infinity : 0;
    pathNode[len] = node;
    pathCap[len++] = newCap;
    while ((parent[node] as number) >= 0) {
      const a = parent[node] as number;
      const base = dominant[a] === node ? (accRest[a] as number) : Math.max(0, (acc[a] as number) - (contrib[node] as number));
      if (parentSeries[node]) {
        const sum = base + (newCap === Infinity ? 0 : newCap === 0 ? Infinity : 1 / newCap);
        newCap = sum === Infinity ? 0 : sum === 0 ? Infinity : 1 / sum;
      } else {
        newCap = newCap === Infinity ? Infinity : base + newCap;
      }
      node = a;
      pathNode[len] = node;
      pathCap[len++] = newCap;
    }
    this.len = len;
    const rootCap = pathCap[len - 1] as number;
    if (rootCap === Infinity) {
      scale.fill(0);
      return rootCap;
    }
    // top-down: each path node's new share of V, and one factor for the cells hanging off it
    pathFraction[len - 1] = 1;
    for (let k = len - 2; k >= 0; k--) {
      const a = pathNode[k + 1] as number;
      const fa = pathFraction[k + 1] as number;
      const capA = pathCap[k + 1] as number;
      const capC = pathCap[k] as number;
      if (!parentSeries[pathNode[k] as number]) {
        pathFraction[k] = fa;
        scale[k] = fa / (fraction[a] as number);
      } else {
        if (capC === Infinity) pathFraction[k] = 0;
        else if (capA === 0)
          pathFraction[k] = capC === 0 ? fa : 0; // no charge: the open part takes it all
        else pathFraction[k] = (fa * capA) / capC;
        // series siblings share the group's charge fa·capA (a group of infinite capacitance has no other child)
        scale[k] = capA === Infinity ? 0 : (fa * capA) / ((fraction[a] as number) * (cap[a] as number));
      }
    }
    return rootCap;
  }
}

export interface FaultDetail {
  cellId: string;
  mode: FailureMode;
  /** equivalent capacitance after the fault (F), null on a short circuit */
  capacitance: number | null;
  shortCircuit: boolean;
  /** every other cell at the applied voltage after the fault, in document order */
  cells: { id: string; voltage: number; ratedVoltage: number; surgeVoltage: number | null }[];
}

/**
 * Every remaining cell's voltage after one fault (the first cell with that id), in O(nodes): for
 * showing one case in full. Throws RangeError when no cell has the id.
 */
export function analyzeFault(network: NetworkNode, appliedVoltage: number, cellId: string, mode: FailureMode): FaultDetail {
  if (!(appliedVoltage > 0) || !Number.isFinite(appliedVoltage)) throw new RangeError("applied voltage must be a positive number");
  const flat = flattenNetwork(network);
  const { cells, cellNode, cellStart, cellCount } = flat;
  const x = cells.findIndex((c) => c.id === cellId);
  if (x < 0) throw new RangeError(`no cell has the id ${cellId}`);
  const paths = new FaultPaths(flat);
  const rootCap = paths.trace(x, mode);
  const voltage = new Float64Array(cells.length);
  for (let y = 0; y < cells.length; y++) voltage[y] = (paths.fraction[cellNode[y] as number] as number) * appliedVoltage;
  for (let k = 0; k < paths.len - 1; k++) {
    const a = paths.pathNode[k + 1] as number;
    const c = paths.pathNode[k] as number;
    const s = paths.scale[k] as number;
    const aHi = (cellStart[a] as number) + (cellCount[a] as number);
    const cHi = (cellStart[c] as number) + (cellCount[c] as number);
    for (let y = cellStart[a] as number; y < aHi; y++) {
      if (y === cellStart[c]) y = cHi;
      if (y < aHi) voltage[y] = (voltage[y] as number) * s;
    }
  }
  const out: FaultDetail["cells"] = [];
  for (let y = 0; y < cells.length; y++) {
    if (y === x) continue;
    const c = cells[y] as (typeof cells)[number];
    out.push({ id: c.id, voltage: rootCap === Infinity ? 0 : (voltage[y] as number), ratedVoltage: c.ratedVoltage, surgeVoltage: c.surgeVoltage ?? null });
  }
  return { cellId, mode, capacitance: rootCap === Infinity ? null : rootCap, shortCircuit: rootCap === Infinity, cells: out };
}

/**
 * Every one-cell fault of a series/parallel network at an applied voltage: one case per cell and
 * mode, and a verdict per mode. Work is O(cells × depth × log² cells) plus the listed ids: a
 * fault only rescales whole subtrees hanging off the path from the failed cell to the root, so
 * each case walks that path (at most the network's depth) instead of re-evaluating the tree.
 * Throws RangeError on a malformed network or a non-positive applied voltage.
 */
export function analyzeNetworkFailures(network: NetworkNode, appliedVoltage: number, opts: { listLimit?: number } = {}): NetworkFailureAnalysis {
  if (!(appliedVoltage > 0) || !Number.isFinite(appliedVoltage)) throw new RangeError("applied voltage must be a positive number");
  const flat = flattenNetwork(network);
  const { cellStart, cellCount, cellNode, cells } = flat;
  const cellTotal = cells.length;
  let steps = 0;
  for (let x = 0; x < cellTotal; x++) steps += flat.depth[cellNode[x] as number] as number;
  if (steps > MAX_FAILURE_PATH_STEPS) {
    throw new RangeError(`the network is too large to analyse: its cells sit ${steps} levels deep in all, at most ${MAX_FAILURE_PATH_STEPS} are analysed`);
  }
  const V = appliedVoltage;
  const listLimit = Math.max(1, Math.floor(opts.listLimit ?? Math.min(cellTotal, Math.max(MIN_LIST_LIMIT, Math.floor(FAILURE_LIST_BUDGET / (4 * cellTotal))))));

  const paths = new FaultPaths(flat);
  const { fraction, cap } = paths;

  // per cell (document order): share of V, and headroom factors to rated and surge
  const cellFraction = new Float64Array(cellTotal);
  const rated: Headroom = { values: new Float64Array(cellTotal), list: null, count: null };
  const surge: Headroom = { values: new Float64Array(cellTotal), list: null, count: null };
  let healthyMaxF = 0;
  let healthyWithinRating = true;
  let healthyWithinSurge = true;
  for (let x = 0; x < cellTotal; x++) {
    const c = cells[x] as (typeof cells)[number];
    const f = fraction[cellNode[x] as number] as number;
    cellFraction[x] = f;
    rated.values[x] = c.ratedVoltage / (f * V);
    surge.values[x] = surgeLimit(c) / (f * V);
    if (f > healthyMaxF) healthyMaxF = f;
    if ((rated.values[x] as number) * (1 + EPS) < 1) healthyWithinRating = false;
    if ((surge.values[x] as number) * (1 + EPS) < 1) healthyWithinSurge = false;
  }

  // aggregates over each node's siblings' subtrees (the cells a fault below it rescales together)
  const sibRated = siblingAggregates(flat, cellFraction, rated.values);
  const sibSurge = siblingAggregates(flat, cellFraction, surge.values);

  const cases: FailureCase[] = [];
  // per case: the largest voltage/limit ratio over the remaining cells and that cell, to rated and to surge
  const caseRated: Stress[] = [];
  const caseSurge: Stress[] = [];
  const listedRated: number[] = [];
  const listedSurge: number[] = [];

  for (let x = 0; x < cellTotal; x++) {
    for (const mode of FAILURE_MODES) {
      const rootCap = paths.trace(x, mode);
      const shortCircuit = rootCap === Infinity;
      let maxF = 0;
      const worstRated: Stress = { ratio: 0, cell: -1 };
      const worstSurge: Stress = { ratio: 0, cell: -1 };
      let ratedCount = 0;
      let surgeCount = 0;
      listedRated.length = 0;
      listedSurge.length = 0;

      for (let k = paths.len - 2; k >= 0; k--) {
        const a = paths.pathNode[k + 1] as number;
        const c = paths.pathNode[k] as number;
        const scale = paths.scale[k] as number;
        if (!(scale > 0) || (cellCount[a] as number) === (cellCount[c] as number)) continue;
        const fMax = scale * (sibRated.maxFraction[c] as number);
        if (fMax > maxF) maxF = fMax;
        // the two cell ranges of a's subtree outside c's subtree
        const aLo = cellStart[a] as number;
        const cLo = cellStart[c] as number;
        const cHi = cLo + (cellCount[c] as number);
        const aHi = aLo + (cellCount[a] as number);
        const threshold = scale / (1 + EPS);
        ratedCount += stressLevel(rated, sibRated, c, scale, threshold, aLo, cLo, cHi, aHi, listLimit, listedRated, worstRated);
        surgeCount += stressLevel(surge, sibSurge, c, scale, threshold, aLo, cLo, cHi, aHi, listLimit, listedSurge, worstSurge);
      }
      cases.push({
        cellId: (cells[x] as { id: string }).id,
        mode,
        capacitance: shortCircuit ? null : rootCap,
        maxCellVoltage: maxF * V,
        overstressed: firstIds(listedRated, listLimit, cells),
        overstressedCount: ratedCount,
        pastSurge: firstIds(listedSurge, listLimit, cells),
        pastSurgeCount: surgeCount,
        shortCircuit,
      });
      caseRated.push(worstRated);
      caseSurge.push(worstSurge);
    }
  }

  const healthyCapacitance = cap[0] as number;
  const summarize = (mode: FailureMode): FailureModeSummary => {
    let worst = -1;
    const rank = (i: number): number[] => {
      const c = cases[i] as FailureCase;
      const pastSurge = c.pastSurgeCount > 0;
      const ratio = pastSurge ? (caseSurge[i] as Stress).ratio : (caseRated[i] as Stress).ratio;
      return [Number(c.shortCircuit), Number(c.capacitance === 0), Number(pastSurge), Number(c.overstressedCount > 0), ratio, -(c.capacitance ?? 0)];
    };
    const picked: number[] = [];
    for (let i = mode === "short" ? 0 : 1; i < cases.length; i += 2) picked.push(i);
    for (const i of picked) if (worst < 0 || rankAbove(rank(i), rank(worst))) worst = i;
    const summary = summarizeCases(
      mode,
      picked.map((i) => cases[i] as FailureCase),
    );
    if (worst >= 0) {
      const c = cases[worst] as FailureCase;
      const stress = (c.pastSurgeCount > 0 ? caseSurge[worst] : caseRated[worst]) as Stress;
      const sc = stress.cell >= 0 ? (cells[stress.cell] as (typeof cells)[number]) : null;
      const limit = sc ? (c.pastSurgeCount > 0 ? surgeLimit(sc) : sc.ratedVoltage) : 0;
      const stressed =
        sc && stress.ratio > 0
          ? { cells: `cell ${sc.id}`, count: 1, voltage: stress.ratio * limit, ratedVoltage: sc.ratedVoltage, surgeVoltage: sc.surgeVoltage ?? null }
          : null;
      return completeSummary(summary, c, c.cellId, stressed, healthyCapacitance, "network");
    }
    summary.text = describeFailureMode(summary, healthyCapacitance, "network");
    return summary;
  };

  return {
    appliedVoltage: V,
    healthy: { capacitance: healthyCapacitance, maxCellVoltage: healthyMaxF * V, withinRating: healthyWithinRating, withinSurge: healthyWithinSurge },
    cases,
    summary: { short: summarize("short"), open: summarize("open") },
    listLimit,
  };
}

interface Stress {
  /** remaining cell voltage ÷ its limit */
  ratio: number;
  /** cell number, −1 for none */
  cell: number;
}

/**
 * One level of the path: the sibling cells of `c` all scale by `scale`. Updates the case's worst
 * ratio, lists the first cells past their limit and answers how many are past it.
 */
function stressLevel(
  room: Headroom,
  sib: SiblingAggregates,
  c: number,
  scale: number,
  threshold: number,
  aLo: number,
  cLo: number,
  cHi: number,
  aHi: number,
  listLimit: number,
  listed: number[],
  worst: Stress,
): number {
  const ratio = scale / (sib.minRoom[c] as number);
  if (ratio > worst.ratio) {
    worst.ratio = ratio;
    worst.cell = sib.minRoomCell[c] as number;
  }
  if (!((sib.minRoom[c] as number) < threshold)) return 0;
  collect(lazyList(room), aLo, cLo, cHi, aHi, threshold, listLimit, listed);
  const counter = lazyCount(room);
  return counter.countBelow(aLo, cLo, threshold) + counter.countBelow(cHi, aHi, threshold);
}

function rankAbove(a: number[], b: number[]): boolean {
  for (let i = 0; i < a.length; i++) {
    if ((a[i] as number) !== (b[i] as number)) return (a[i] as number) > (b[i] as number);
  }
  return false;
}

/** survives / withinRating / capacitance range over the cases of one mode (worst and text filled by the caller) */
function summarizeCases(mode: FailureMode, cases: readonly CaseFigures[]): FailureModeSummary {
  let minCap: number | null = null;
  let maxCap: number | null = null;
  let survives = true;
  let withinRating = true;
  for (const c of cases) {
    if (c.capacitance !== null) {
      minCap = minCap === null ? c.capacitance : Math.min(minCap, c.capacitance);
      maxCap = maxCap === null ? c.capacitance : Math.max(maxCap, c.capacitance);
    }
    const dead = !survivesFault(c);
    if (dead) survives = false;
    if (dead || c.overstressedCount > 0) withinRating = false;
  }
  return { mode, survives, withinRating, capacitanceRange: { min: minCap, max: maxCap }, worst: null, text: "" };
}

function surgeLimit(c: { ratedVoltage: number; surgeVoltage?: number }): number {
  return Math.max(c.ratedVoltage, c.surgeVoltage ?? c.ratedVoltage);
}

/** the first `limit` cells (document order) of the two ranges whose value is below the threshold */
function collect(tree: MinTree, aLo: number, cLo: number, cHi: number, aHi: number, threshold: number, limit: number, out: number[]): void {
  const local: number[] = [];
  tree.collectBelow(aLo, cLo, threshold, limit, local);
  tree.collectBelow(cHi, aHi, threshold, limit, local);
  for (const i of local) out.push(i);
}

function firstIds(listed: number[], limit: number, cells: readonly { id: string }[]): string[] {
  listed.sort((a, b) => a - b);
  const out: string[] = [];
  for (let i = 0; i < listed.length && i < limit; i++) out.push((cells[listed[i] as number] as { id: string }).id);
  return out;
}

interface SiblingAggregates {
  /** largest share of V among the cells outside the node's subtree but inside its parent's */
  maxFraction: Float64Array;
  /** smallest headroom there, and the cell (number) that has it */
  minRoom: Float64Array;
  minRoomCell: Int32Array;
}

/**
 * For each non-root node, over the cells of its siblings' subtrees (its parent's subtree less its
 * own): the largest share of V and the smallest headroom with its cell. O(nodes), with prefix and
 * suffix sweeps over each group's children; ties keep the earlier cell.
 */
function siblingAggregates(flat: FlatNetwork, cellFraction: Float64Array, room: Float64Array): SiblingAggregates {
  const { size: n, parent, subtreeSize, cellOf } = flat;
  const subMaxF = new Float64Array(n);
  const subMin = new Float64Array(n).fill(Infinity);
  const subMinCell = new Int32Array(n).fill(-1);
  for (let i = n - 1; i >= 0; i--) {
    const x = cellOf[i] as number;
    if (x >= 0) {
      subMaxF[i] = cellFraction[x] as number;
      subMin[i] = room[x] as number;
      subMinCell[i] = x;
    }
    const p = parent[i] as number;
    if (p < 0) continue;
    if ((subMaxF[i] as number) > (subMaxF[p] as number)) subMaxF[p] = subMaxF[i] as number;
    // children are met right to left: replacing on ties keeps the earlier cell
    if ((subMin[i] as number) <= (subMin[p] as number)) {
      subMin[p] = subMin[i] as number;
      subMinCell[p] = subMinCell[i] as number;
    }
  }
  const maxFraction = new Float64Array(n);
  const minRoom = new Float64Array(n).fill(Infinity);
  const minRoomCell = new Int32Array(n).fill(-1);
  const children: number[] = [];
  for (let g = 0; g < n; g++) {
    if ((cellOf[g] as number) >= 0) continue;
    children.length = 0;
    for (let c = g + 1; c < g + (subtreeSize[g] as number); c += subtreeSize[c] as number) children.push(c);
    let f = 0;
    let r = Infinity;
    let rc = -1;
    for (const c of children) {
      // prefix: the children before c
      maxFraction[c] = f;
      minRoom[c] = r;
      minRoomCell[c] = rc;
      if ((subMaxF[c] as number) > f) f = subMaxF[c] as number;
      if ((subMin[c] as number) < r) {
        r = subMin[c] as number;
        rc = subMinCell[c] as number;
      }
    }
    f = 0;
    r = Infinity;
    rc = -1;
    for (let k = children.length - 1; k >= 0; k--) {
      // suffix: the children after c (an earlier cell wins a tie, so only a strictly smaller one replaces)
      const c = children[k] as number;
      if (f > (maxFraction[c] as number)) maxFraction[c] = f;
      if (r < (minRoom[c] as number)) {
        minRoom[c] = r;
        minRoomCell[c] = rc;
      }
      if ((subMaxF[c] as number) > f) f = subMaxF[c] as number;
      if ((subMin[c] as number) <= r) {
        r = subMin[c] as number;
        rc = subMinCell[c] as number;
      }
    }
  }
  return { maxFraction, minRoom, minRoomCell };
}

type CaseFigures = Pick<FailureCase, "capacitance" | "shortCircuit" | "pastSurgeCount" | "overstressedCount">;

/** Fill in a mode's worst case and its verdict in words. */
function completeSummary(
  summary: FailureModeSummary,
  c: CaseFigures,
  cellId: string | null,
  stressed: FailureWorstCase["stressed"],
  healthyCapacitance: number,
  scope: "network" | "bank",
): FailureModeSummary {
  summary.worst = {
    cellId,
    shortCircuit: c.shortCircuit,
    capacitance: c.capacitance,
    stressed,
    overstressedCount: c.overstressedCount,
    pastSurgeCount: c.pastSurgeCount,
  };
  summary.text = describeFailureMode(summary, healthyCapacitance, scope);
  return summary;
}

/** The verdict for one failure mode in plain words, from its summary and worst case. */
function describeFailureMode(summary: FailureModeSummary, healthyCapacitance: number, scope: "network" | "bank"): string {
  const lead = summary.mode === "short" ? "Survives one shorted cell" : "Survives one open cell";
  const w = summary.worst;
  if (!w) return `${lead}: yes — there is no cell to fail.`;
  const fault =
    w.cellId === null
      ? summary.mode === "short"
        ? "a shorted cell"
        : "an open cell"
      : `${summary.mode === "short" ? "a short in" : "an open in"} cell ${w.cellId}`;
  if (w.shortCircuit) return `${lead}: no — ${fault} shorts the whole ${scope}.`;
  if (w.capacitance === 0) return `${lead}: no — ${fault} disconnects the whole ${scope}: no capacitance is left.`;
  const context = w.cellId === null ? "" : `with cell ${w.cellId} ${summary.mode === "short" ? "shorted" : "open"}, `;
  const capacitanceText =
    summary.mode === "open" && summary.capacitanceRange.min !== null
      ? `; capacitance falls from ${fmt(healthyCapacitance, "F")} to ${fmt(summary.capacitanceRange.min, "F")} at worst`
      : "";
  const st = w.stressed;
  if (!st) return `${lead}: ${summary.survives ? "yes" : "no"} — no remaining cell carries voltage${capacitanceText}.`;
  const reach = `${st.cells} ${st.count === 1 ? "reaches" : "reach"}`;
  const surgeText = st.surgeVoltage !== null ? `surge ${fmt(st.surgeVoltage, "V")}` : `rated ${fmt(st.ratedVoltage, "V")} and no surge voltage given`;
  if (!summary.survives) {
    const count = w.pastSurgeCount > 1 ? ` (${w.pastSurgeCount} cells past ${st.surgeVoltage !== null ? "surge" : "rating"})` : "";
    return `${lead}: no — ${context}${reach} ${fmt(st.voltage, "V")}, ${surgeText}${count}.`;
  }
  if (!summary.withinRating) {
    const limits = st.surgeVoltage !== null ? `rated ${fmt(st.ratedVoltage, "V")}, surge ${fmt(st.surgeVoltage, "V")}` : `rated ${fmt(st.ratedVoltage, "V")}`;
    return `${lead}: yes, above rating — ${context}${reach} ${fmt(st.voltage, "V")}, ${limits}${capacitanceText}.`;
  }
  return `${lead}: yes — ${context}${reach} at most ${fmt(st.voltage, "V")}, rated ${fmt(st.ratedVoltage, "V")}${capacitanceText}.`;
}

export interface OptionFailureInput {
  cell: { capacitance: number; ratedVoltage: number; surgeVoltage?: number | null };
  topology: Topology;
  seriesCount: number;
  parallelCount: number;
  /** the working voltage the bank is charged to (V) */
  appliedVoltage: number;
  /**
   * cell matching tolerance m after grading (fraction, default 0): each group of cells is then
   * taken at its worst, the series position under study at C(1 − m) and every other at C(1 + m),
   * as for the option's worst-case charging voltage. Capacitances stay nominal.
   */
  matchingTolerance?: number;
}

/** Cells of an option that a fault treats alike, with their voltage after the fault. */
export interface OptionCellClass {
  /** e.g. "the other cells of that string" */
  cells: string;
  count: number;
  voltage: number;
}

export interface OptionFailureCase {
  mode: FailureMode;
  /** equivalent capacitance after the fault (F), null on a short circuit */
  capacitance: number | null;
  maxCellVoltage: number;
  overstressedCount: number;
  pastSurgeCount: number;
  shortCircuit: boolean;
  /** the remaining cells, grouped by what the fault does to them (cells left at 0 V included) */
  classes: OptionCellClass[];
}

export interface OptionFailureAnalysis {
  appliedVoltage: number;
  healthy: { capacitance: number; maxCellVoltage: number };
  /** every cell of an option is alike: one case per mode answers for all of them */
  cases: { short: OptionFailureCase; open: OptionFailureCase };
  summary: { short: FailureModeSummary; open: FailureModeSummary };
}

function classesOf(cells: (OptionCellClass | null)[]): OptionCellClass[] {
  return cells.filter((c): c is OptionCellClass => c !== null && c.count > 0);
}

function cellWord(count: number, what: string): string {
  return `${count === 1 ? what.replace("cells", "cell") : what}`;
}

/**
 * One-cell failures of an arrangement option in closed form (N_s·N_p identical cells in either
 * topology): the same answer as analyzeNetworkFailures on the built tree, in O(1), for banks of
 * any size. Throws RangeError on counts below 1 or non-positive figures.
 */
export function analyzeOptionFailures(input: OptionFailureInput): OptionFailureAnalysis {
  const { cases, healthy } = optionFailureCases(input);
  const { cell } = input;
  const surgeVoltage = cell.surgeVoltage ?? null;
  const summarize = (c: OptionFailureCase): FailureModeSummary => {
    const summary = summarizeCases(c.mode, [c]);
    let top: OptionCellClass | null = null;
    for (const k of c.classes) if (k.voltage > 0 && (!top || k.voltage > top.voltage)) top = k;
    const stressed = top ? { cells: top.cells, count: top.count, voltage: top.voltage, ratedVoltage: cell.ratedVoltage, surgeVoltage } : null;
    return completeSummary(summary, c, null, stressed, healthy.capacitance, "bank");
  };
  return {
    appliedVoltage: input.appliedVoltage,
    healthy,
    cases,
    summary: { short: summarize(cases.short), open: summarize(cases.open) },
  };
}

/**
 * The two cases of analyzeOptionFailures without their verdicts in words: cheap enough to run on
 * every candidate of a search (the customer's filter for banks that survive).
 */
export function optionFailureCases(input: OptionFailureInput): {
  cases: { short: OptionFailureCase; open: OptionFailureCase };
  healthy: { capacitance: number; maxCellVoltage: number };
} {
  const { cell, topology, appliedVoltage: V } = input;
  const ns = input.seriesCount;
  const np = input.parallelCount;
  const m = input.matchingTolerance ?? 0;
  if (!Number.isInteger(ns) || !Number.isInteger(np) || ns < 1 || np < 1)
    throw new RangeError("series and parallel counts must be whole numbers of at least 1");
  if (!(cell.capacitance > 0) || !(cell.ratedVoltage > 0) || !(V > 0) || !Number.isFinite(V))
    throw new RangeError("capacitance, rated voltage and applied voltage must be positive");
  if (!(m >= 0 && m < 1)) throw new RangeError("matching tolerance must be at least 0 and below 1");
  const surgeVoltage = cell.surgeVoltage ?? null;
  if (surgeVoltage !== null && !(surgeVoltage >= cell.ratedVoltage)) throw new RangeError("surge voltage must be at least the rated voltage");
  const C = cell.capacitance;
  const r = (1 - m) / (1 + m);
  // one position low among `others` high, plus `extra` (in units of the low position's capacitance)
  const lowAmong = (others: number, extra = 0): number => V / (1 + others * r + extra);
  const strings = topology === "parallel-of-series-strings";
  const unit = strings ? "string" : "group";

  const make = (mode: FailureMode): OptionFailureCase => {
    let capacitance: number | null;
    let classes: OptionCellClass[];
    if (mode === "short") {
      if (ns === 1) {
        capacitance = null;
        classes = classesOf([{ cells: cellWord(np * ns - 1, "the other cells"), count: np * ns - 1, voltage: 0 }]);
      } else if (strings) {
        capacitance = ((np - 1) * C) / ns + C / (ns - 1);
        classes = classesOf([
          { cells: cellWord(ns - 1, `the other cells of that ${unit}`), count: ns - 1, voltage: lowAmong(ns - 2) },
          { cells: cellWord((np - 1) * ns, `the cells of the other ${unit}s`), count: (np - 1) * ns, voltage: lowAmong(ns - 1) },
        ]);
      } else {
        capacitance = (np * C) / (ns - 1);
        classes = classesOf([
          { cells: cellWord(np - 1, `the other cells of that ${unit}`), count: np - 1, voltage: 0 },
          { cells: cellWord((ns - 1) * np, `the cells of the other ${unit}s`), count: (ns - 1) * np, voltage: lowAmong(ns - 2) },
        ]);
      }
    } else if (np === 1) {
      capacitance = 0;
      classes = classesOf([{ cells: cellWord(ns - 1, "the other cells"), count: ns - 1, voltage: 0 }]);
    } else if (strings) {
      capacitance = ((np - 1) * C) / ns;
      classes = classesOf([
        { cells: cellWord(ns - 1, `the other cells of that ${unit}`), count: ns - 1, voltage: 0 },
        { cells: cellWord((np - 1) * ns, `the cells of the other ${unit}s`), count: (np - 1) * ns, voltage: lowAmong(ns - 1) },
      ]);
    } else {
      capacitance = 1 / ((ns - 1) / (np * C) + 1 / ((np - 1) * C));
      classes = classesOf([
        // the weakened group low, the full groups high
        { cells: cellWord(np - 1, `the other cells of that ${unit}`), count: np - 1, voltage: V / (1 + ((ns - 1) * (np - 1) * r) / np) },
        // a full group low, the other full groups and the weakened one high
        { cells: cellWord((ns - 1) * np, `the cells of the other ${unit}s`), count: (ns - 1) * np, voltage: lowAmong(ns - 2, (np * r) / (np - 1)) },
      ]);
    }
    const limit = Math.max(cell.ratedVoltage, surgeVoltage ?? cell.ratedVoltage);
    let maxCellVoltage = 0;
    let overstressedCount = 0;
    let pastSurgeCount = 0;
    for (const c of classes) {
      maxCellVoltage = Math.max(maxCellVoltage, c.voltage);
      if (c.voltage > cell.ratedVoltage * (1 + EPS)) overstressedCount += c.count;
      if (c.voltage > limit * (1 + EPS)) pastSurgeCount += c.count;
    }
    return { mode, capacitance, maxCellVoltage, overstressedCount, pastSurgeCount, shortCircuit: capacitance === null, classes };
  };

  return {
    cases: { short: make("short"), open: make("open") },
    healthy: { capacitance: (np * C) / ns, maxCellVoltage: lowAmong(ns - 1) },
  };
}

/** A fault case leaves the bank working: no short circuit, some capacitance, every remaining cell within surge (as the summaries judge). */
export function survivesFault(c: Pick<OptionFailureCase, "shortCircuit" | "capacitance" | "pastSurgeCount">): boolean {
  return !(c.shortCircuit || c.capacitance === 0 || c.pastSurgeCount > 0);
}
