import { evaluateFlat, flattenNetwork, FLAT_CELL, FLAT_SERIES, type FlatNetwork } from "./flat-network";
import { normalCdf, normalQuantile, Xoshiro128 } from "./random";

// Module-local copies for the per-sample loops: bundlers read imported bindings through accessors.
const CELL = FLAT_CELL;
const SERIES = FLAT_SERIES;
const quantile = normalQuantile;
import type { NetworkNode } from "./types";

/**
 * Tolerance yield (DESIGN §3.5): a seeded Monte-Carlo over the bank. Each sample draws every
 * cell's capacitance within its tolerance, evaluates the network (ideal capacitive division from
 * zero charge) and records the equivalent capacitance and the highest cell voltage at the applied
 * voltage. Same input and seed, same numbers.
 *
 * Cell spread: a cell with tolerance −a/+b lies in [C_n(1 − a), C_n(1 + b)].
 * - uniform: evenly over that band;
 * - normal: the band is ±3σ around its centre (mean C_n(1 + (b − a)/2), σ = C_n(a + b)/6),
 *   truncated at the band — a supplier does not ship cells outside their tolerance.
 * The shop's grading m (incoming inspection keeps only cells within ±m of nominal) clips the band
 * to [C_n(1 − min(a, m)), C_n(1 + min(b, m))]: the uniform stays uniform on the narrower band, the
 * normal keeps its centre and σ and is truncated there too.
 */

export type ToleranceDistribution = "uniform" | "normal";

/** Most samples in one run. */
export const MAX_TOLERANCE_SAMPLES = 100_000;
/**
 * Most samples × nodes (cells and groups) in one run: about a second of one core here (the bench
 * prints the rate), so no single request can hold the server longer.
 */
export const MAX_TOLERANCE_WORK = 30_000_000;
/** Most histogram bins. */
export const MAX_HISTOGRAM_BINS = 200;
export const DEFAULT_HISTOGRAM_BINS = 40;

const EPS = 1e-9;

export interface ToleranceInput {
  network: NetworkNode;
  appliedVoltage: number;
  samples: number;
  /** 0 … 4294967295 */
  seed: number;
  distribution: ToleranceDistribution;
  /** tolerance for cells that carry none (fractions); default none: such cells stay at nominal */
  defaultTolerance?: { minus: number; plus: number };
  /** the shop's grading m (fraction): each cell's band clipped to ±m of nominal */
  matchingTolerance?: number;
  /** a sample meets the requirement when C ≥ capacitance and ½·C·(V² − minVoltage²) ≥ energy */
  requirement?: { capacitance?: number; energy?: number; minVoltage?: number };
  /** histogram bins (default 40) */
  bins?: number;
}

export interface DistributionSummary {
  mean: number;
  /** sample standard deviation (n − 1) */
  std: number;
  /** percentiles by linear interpolation between order statistics */
  p01: number;
  p50: number;
  p99: number;
  min: number;
  max: number;
}

export interface HistogramBin {
  from: number;
  to: number;
  count: number;
}

export interface ToleranceResult {
  samples: number;
  seed: number;
  distribution: ToleranceDistribution;
  /** the same figures with every cell at nominal */
  nominal: { capacitance: number; maxCellVoltage: number };
  capacitance: DistributionSummary;
  maxCellVoltage: DistributionSummary;
  histogram: { capacitance: HistogramBin[]; maxCellVoltage: HistogramBin[] };
  shares: {
    /** every cell within its surge voltage (its rated voltage where none is given) */
    withinSurge: number;
    /** every cell within its rated voltage */
    withinRating: number;
    /** the requirement met; null without a requirement */
    meetingRequirement: number | null;
  };
  /** the capacitance a sample must reach to meet the requirement (F), null without one */
  requiredCapacitance: number | null;
}

/** Per-cell sampling parameters, relative deviations from nominal. */
interface CellSpread {
  lo: Float64Array;
  hi: Float64Array;
  mu: Float64Array;
  sigma: Float64Array;
  /** normal: Φ at the truncation points, as lower bound and span */
  pLo: Float64Array;
  pSpan: Float64Array;
}

function checkFraction(x: number, what: string, max: number): void {
  if (!(x >= 0 && x <= max)) throw new RangeError(`${what} must be a fraction from 0 to ${max}`);
}

function prepareSpread(tolerances: readonly { minus: number; plus: number }[], distribution: ToleranceDistribution, matching: number | undefined): CellSpread {
  const k = tolerances.length;
  const spread: CellSpread = {
    lo: new Float64Array(k),
    hi: new Float64Array(k),
    mu: new Float64Array(k),
    sigma: new Float64Array(k),
    pLo: new Float64Array(k),
    pSpan: new Float64Array(k),
  };
  if (matching !== undefined) checkFraction(matching, "matching tolerance", 1);
  // Φ is integrated numerically: once per distinct band, not once per cell
  const cache = new Map<string, [number, number]>();
  for (let x = 0; x < k; x++) {
    const t = tolerances[x] as { minus: number; plus: number };
    checkFraction(t.minus, "toleranceMinus", 0.99);
    checkFraction(t.plus, "tolerancePlus", 1);
    const lo = -Math.min(t.minus, matching ?? Infinity);
    const hi = Math.min(t.plus, matching ?? Infinity);
    spread.lo[x] = lo;
    spread.hi[x] = hi;
    if (distribution === "normal" && hi > lo) {
      const mu = (t.plus - t.minus) / 2;
      const sigma = (t.plus + t.minus) / 6;
      spread.mu[x] = mu;
      spread.sigma[x] = sigma;
      const key = `${lo}/${hi}/${mu}/${sigma}`;
      let p = cache.get(key);
      if (!p) {
        const a = normalCdf((lo - mu) / sigma);
        p = [a, normalCdf((hi - mu) / sigma) - a];
        cache.set(key, p);
      }
      spread.pLo[x] = p[0];
      spread.pSpan[x] = p[1];
    }
  }
  return spread;
}

/** Uniform numbers in (0, 1) → relative deviations, one per cell, uniform over each band; no allocation. */
function drawUniform(spread: CellSpread, u: Float64Array, out: Float64Array): void {
  const { lo, hi } = spread;
  for (let x = 0; x < out.length; x++) {
    const l = lo[x] as number;
    out[x] = l + (u[x] as number) * ((hi[x] as number) - l);
  }
}

/** Uniform numbers in (0, 1) → relative deviations, truncated normal by inversion; no allocation. */
function drawNormal(spread: CellSpread, u: Float64Array, out: Float64Array): void {
  const { lo, hi, mu, sigma, pLo, pSpan } = spread;
  for (let x = 0; x < out.length; x++) {
    const l = lo[x] as number;
    const h = hi[x] as number;
    if (!(h > l)) {
      out[x] = l;
      continue;
    }
    const d = (mu[x] as number) + (sigma[x] as number) * quantile((pLo[x] as number) + (u[x] as number) * (pSpan[x] as number));
    out[x] = d < l ? l : d > h ? h : d;
  }
}

/**
 * `count` relative deviations of one cell drawn exactly as the Monte-Carlo draws them (for checking
 * the sampler against reference distributions).
 */
export function sampleCellDeviations(
  tolerance: { minus: number; plus: number },
  opts: { distribution: ToleranceDistribution; seed: number; matchingTolerance?: number },
  count: number,
): Float64Array {
  const spread = prepareSpread([tolerance], opts.distribution, opts.matchingTolerance);
  const rng = Xoshiro128.fromSeed(opts.seed);
  const u = new Float64Array(1);
  const d = new Float64Array(1);
  const out = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    rng.fillOpenUnit(u);
    if (opts.distribution === "uniform") drawUniform(spread, u, d);
    else drawNormal(spread, u, d);
    out[i] = d[0] as number;
  }
  return out;
}

/** Mean, sample standard deviation and percentiles; sorts `values` in place. */
export function summarizeSamples(values: Float64Array): DistributionSummary {
  const n = values.length;
  if (n === 0) throw new RangeError("no samples to summarize");
  let sum = 0;
  for (let i = 0; i < n; i++) sum += values[i] as number;
  const mean = sum / n;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const d = (values[i] as number) - mean;
    ss += d * d;
  }
  values.sort();
  const at = (q: number): number => {
    const h = (n - 1) * q;
    const i = Math.floor(h);
    const lo = values[i] as number;
    return i + 1 < n ? lo + (h - i) * ((values[i + 1] as number) - lo) : lo;
  };
  return {
    mean,
    std: n > 1 ? Math.sqrt(ss / (n - 1)) : 0,
    p01: at(0.01),
    p50: at(0.5),
    p99: at(0.99),
    min: values[0] as number,
    max: values[n - 1] as number,
  };
}

/** Equal-width bins from the smallest to the largest value; one bin when they are equal. */
export function histogram(values: Float64Array, bins: number, min: number, max: number): HistogramBin[] {
  const width = (max - min) / bins;
  if (!(width > Math.abs(max) * 1e-12)) return [{ from: min, to: max, count: values.length }];
  const counts = new Array<number>(bins).fill(0);
  for (let i = 0; i < values.length; i++) {
    const b = Math.min(bins - 1, Math.max(0, Math.floor(((values[i] as number) - min) / width)));
    counts[b] = (counts[b] as number) + 1;
  }
  return counts.map((count, b) => ({ from: min + b * width, to: b === bins - 1 ? max : min + (b + 1) * width, count }));
}

interface SampleScratch {
  cap: Float64Array;
  acc: Float64Array;
  fraction: Float64Array;
  elastance: Float64Array;
  nominalCap: Float64Array;
  dev: Float64Array;
  ratedLimit: Float64Array;
  surgeLimit: Float64Array;
  /** out: [every cell within rating, every cell within surge] as 0/1 */
  flags: Uint8Array;
}

/**
 * One sample: the network with each cell at nominal·(1 + deviation), as evaluateFlat does, fused
 * with the cell checks. Answers the highest cell share of V. Kept small so the engine optimizes it.
 */
function evaluateSample(flat: FlatNetwork, w: SampleScratch): number {
  const { size, kind, parent, parentSeries, cellOf } = flat;
  const { cap, acc, fraction, elastance, nominalCap, dev, ratedLimit, surgeLimit } = w;
  acc.fill(0);
  // children before parents: each subtree's capacitance
  for (let i = size - 1; i > 0; i--) {
    const kd = kind[i];
    const x = cellOf[i] as number;
    const c = kd === CELL ? (nominalCap[x] as number) * (1 + (dev[x] as number)) : kd === SERIES ? 1 / (acc[i] as number) : (acc[i] as number);
    cap[i] = c;
    const p = parent[i] as number;
    if (parentSeries[i]) {
      const e = 1 / c;
      elastance[i] = e;
      acc[p] = (acc[p] as number) + e;
    } else {
      acc[p] = (acc[p] as number) + c;
    }
  }
  const k0 = kind[0];
  cap[0] = k0 === CELL ? (nominalCap[0] as number) * (1 + (dev[0] as number)) : k0 === SERIES ? 1 / (acc[0] as number) : (acc[0] as number);
  // parents before children: each node's share of V, each cell against its limits
  let f = k0 === CELL ? 1 : 0;
  let ratedOk = k0 === CELL ? 1 <= (ratedLimit[0] as number) : true;
  let surgeOk = k0 === CELL ? 1 <= (surgeLimit[0] as number) : true;
  fraction[0] = 1;
  for (let i = 1; i < size; i++) {
    const p = parent[i] as number;
    const v = parentSeries[i] ? (fraction[p] as number) * (cap[p] as number) * (elastance[i] as number) : (fraction[p] as number);
    fraction[i] = v;
    if (kind[i] === CELL) {
      if (v > f) f = v;
      if (v > (ratedLimit[i] as number)) {
        ratedOk = false;
        if (v > (surgeLimit[i] as number)) surgeOk = false;
      }
    }
  }
  w.flags[0] = ratedOk ? 1 : 0;
  w.flags[1] = surgeOk ? 1 : 0;
  return f;
}

/** The sample loop, apart from the set-up so that it is optimized on its own. */
function sampleAll(
  flat: FlatNetwork,
  scratch: SampleScratch,
  rng: Xoshiro128,
  spread: CellSpread,
  distribution: ToleranceDistribution,
  u: Float64Array,
  V: number,
  threshold: number,
  capSamples: Float64Array,
  voltSamples: Float64Array,
): { withinRating: number; withinSurge: number; meeting: number } {
  let withinRating = 0;
  let withinSurge = 0;
  let meeting = 0;
  const { cap, dev, flags } = scratch;
  for (let s = 0; s < capSamples.length; s++) {
    rng.fillOpenUnit(u);
    if (distribution === "uniform") drawUniform(spread, u, dev);
    else drawNormal(spread, u, dev);
    const f = evaluateSample(flat, scratch);
    const c = cap[0] as number;
    capSamples[s] = c;
    voltSamples[s] = f * V;
    withinRating += flags[0] as number;
    withinSurge += flags[1] as number;
    if (c >= threshold) meeting++;
  }
  return { withinRating, withinSurge, meeting };
}

/**
 * Run the Monte-Carlo. Bounded by construction: samples ≤ MAX_TOLERANCE_SAMPLES and
 * samples × nodes ≤ MAX_TOLERANCE_WORK, else RangeError (as for a malformed network, a
 * non-positive voltage or a tolerance out of range). No allocation per sample.
 */
export function runToleranceYield(input: ToleranceInput): ToleranceResult {
  const { appliedVoltage: V, samples: S, seed, distribution } = input;
  if (!(V > 0) || !Number.isFinite(V)) throw new RangeError("applied voltage must be a positive number");
  if (!Number.isInteger(S) || S < 1 || S > MAX_TOLERANCE_SAMPLES) throw new RangeError(`samples must be a whole number from 1 to ${MAX_TOLERANCE_SAMPLES}`);
  const bins = input.bins ?? DEFAULT_HISTOGRAM_BINS;
  if (!Number.isInteger(bins) || bins < 1 || bins > MAX_HISTOGRAM_BINS) throw new RangeError(`bins must be a whole number from 1 to ${MAX_HISTOGRAM_BINS}`);
  const flat: FlatNetwork = flattenNetwork(input.network);
  if (S * flat.size > MAX_TOLERANCE_WORK) {
    throw new RangeError(
      `samples × network size (cells and groups) must be at most ${MAX_TOLERANCE_WORK.toLocaleString("en")}; here ${S.toLocaleString("en")} × ${flat.size.toLocaleString("en")}`,
    );
  }
  const rng = Xoshiro128.fromSeed(seed);
  const requiredCapacitance = requiredCapacitanceOf(input.requirement, V);

  const { cells, cellNode, size } = flat;
  const k = cells.length;
  const fallback = input.defaultTolerance ?? { minus: 0, plus: 0 };
  const spread = prepareSpread(
    cells.map((c) => ({ minus: c.toleranceMinus ?? fallback.minus, plus: c.tolerancePlus ?? fallback.plus })),
    distribution,
    input.matchingTolerance,
  );
  const nominalCap = new Float64Array(k);
  // per node, the limits of a cell as shares of V (with a margin for rounding); infinite for a group
  const ratedLimit = new Float64Array(size).fill(Infinity);
  const surgeLimit = new Float64Array(size).fill(Infinity);
  for (let x = 0; x < k; x++) {
    const c = cells[x] as (typeof cells)[number];
    nominalCap[x] = c.capacitance;
    const i = cellNode[x] as number;
    ratedLimit[i] = (c.ratedVoltage / V) * (1 + EPS);
    surgeLimit[i] = (Math.max(c.ratedVoltage, c.surgeVoltage ?? c.ratedVoltage) / V) * (1 + EPS);
  }
  const cap = new Float64Array(size);
  const acc = new Float64Array(size);
  const fraction = new Float64Array(size);
  evaluateFlat(flat, nominalCap, cap, acc, fraction);
  let nominalShare = 0;
  for (let x = 0; x < k; x++) nominalShare = Math.max(nominalShare, fraction[cellNode[x] as number] as number);
  const nominal = { capacitance: cap[0] as number, maxCellVoltage: nominalShare * V };

  const u = new Float64Array(k);
  const dev = new Float64Array(k);
  const elastance = new Float64Array(size);
  const capSamples = new Float64Array(S);
  const voltSamples = new Float64Array(S);
  const threshold = requiredCapacitance === null ? 0 : requiredCapacitance * (1 - EPS);
  const scratch: SampleScratch = { cap, acc, fraction, elastance, nominalCap, dev, ratedLimit, surgeLimit, flags: new Uint8Array(2) };
  const tally = sampleAll(flat, scratch, rng, spread, distribution, u, V, threshold, capSamples, voltSamples);

  const capacitance = summarizeSamples(capSamples);
  const maxCellVoltage = summarizeSamples(voltSamples);
  return {
    samples: S,
    seed,
    distribution,
    nominal,
    capacitance,
    maxCellVoltage,
    histogram: {
      capacitance: histogram(capSamples, bins, capacitance.min, capacitance.max),
      maxCellVoltage: histogram(voltSamples, bins, maxCellVoltage.min, maxCellVoltage.max),
    },
    shares: {
      withinSurge: tally.withinSurge / S,
      withinRating: tally.withinRating / S,
      meetingRequirement: requiredCapacitance === null ? null : tally.meeting / S,
    },
    requiredCapacitance,
  };
}

/** The capacitance that meets a capacitance and/or usable-energy requirement at voltage V. */
function requiredCapacitanceOf(req: ToleranceInput["requirement"], V: number): number | null {
  if (!req || (req.capacitance === undefined && req.energy === undefined)) return null;
  let need = 0;
  if (req.capacitance !== undefined) {
    if (!(req.capacitance > 0)) throw new RangeError("required capacitance must be positive");
    need = req.capacitance;
  }
  if (req.energy !== undefined) {
    const vMin = req.minVoltage ?? 0;
    if (!(req.energy > 0)) throw new RangeError("required energy must be positive");
    if (!(vMin >= 0 && vMin < V)) throw new RangeError("minimum voltage must be at least 0 and below the applied voltage");
    need = Math.max(need, (2 * req.energy) / (V * V - vMin * vMin));
  }
  return need;
}
