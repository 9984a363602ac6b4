/**
 * Seeded random numbers for the engine's Monte-Carlo work. Same seed, same numbers, on every
 * platform: only integer arithmetic decides the stream.
 */

const MASK64 = (1n << 64n) - 1n;

/**
 * SplitMix64 (G. L. Steele, D. Lea and C. H. Flood, OOPSLA 2014; S. Vigna's splitmix64.c): the
 * generator the xoshiro authors recommend for filling a state from a seed. BigInt, seeding only.
 */
export function splitMix64(seed: bigint, count: number): bigint[] {
  let x = seed & MASK64;
  const out: bigint[] = [];
  for (let i = 0; i < count; i++) {
    x = (x + 0x9e3779b97f4a7c15n) & MASK64;
    let z = x;
    z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
    z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
    out.push(z ^ (z >> 31n));
  }
  return out;
}

/**
 * xoshiro128** 1.1 (D. Blackman and S. Vigna, "Scrambled linear pseudorandom number generators",
 * ACM TOMS 47(4), 2021): 128 bits of state, 32-bit outputs, period 2¹²⁸ − 1. Checked against
 * published reference outputs in tests/unit/bank/random.test.ts.
 */
export class Xoshiro128 {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;

  /** from four 32-bit state words, not all zero */
  constructor(state: readonly [number, number, number, number]) {
    if (state.every((w) => (w | 0) === 0)) throw new RangeError("the state must not be all zero");
    [this.s0, this.s1, this.s2, this.s3] = state.map((w) => w | 0) as [number, number, number, number];
  }

  /**
   * From a 32-bit seed: two SplitMix64 outputs of the seed fill the state, each as its low then
   * its high 32 bits. Any seed gives a valid (non-zero) state.
   */
  static fromSeed(seed: number): Xoshiro128 {
    if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new RangeError("seed must be a whole number from 0 to 4294967295");
    const [a, b] = splitMix64(BigInt(seed), 2) as [bigint, bigint];
    const word = (x: bigint, shift: bigint) => Number((x >> shift) & 0xffffffffn);
    return new Xoshiro128([word(a, 0n), word(a, 32n), word(b, 0n), word(b, 32n)]);
  }

  /** the next 32-bit output */
  nextUint32(): number {
    const s1 = this.s1;
    const m = Math.imul(s1, 5);
    const result = Math.imul((m << 7) | (m >>> 25), 9) >>> 0;
    const t = s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = (this.s3 << 11) | (this.s3 >>> 21);
    return result;
  }

  /** fill `out` with uniform numbers strictly inside (0, 1): (k + ½)/2³² for each output k */
  fillOpenUnit(out: Float64Array): void {
    let s0 = this.s0;
    let s1 = this.s1;
    let s2 = this.s2;
    let s3 = this.s3;
    for (let i = 0; i < out.length; i++) {
      const m = Math.imul(s1, 5);
      const r = Math.imul((m << 7) | (m >>> 25), 9) >>> 0;
      const t = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= t;
      s3 = (s3 << 11) | (s3 >>> 21);
      out[i] = (r + 0.5) * 2.3283064365386963e-10;
    }
    this.s0 = s0;
    this.s1 = s1;
    this.s2 = s2;
    this.s3 = s3;
  }
}

// P. J. Acklam's rational approximation of the standard normal quantile (relative error below
// 1.15e-9 over (0, 1)); coefficients as he published them. Checked against an npm statistics
// library in tests/unit/bank/random.test.ts.
const A0 = -3.969683028665376e1;
const A1 = 2.209460984245205e2;
const A2 = -2.759285104469687e2;
const A3 = 1.38357751867269e2;
const A4 = -3.066479806614716e1;
const A5 = 2.506628277459239;
const B0 = -5.447609879822406e1;
const B1 = 1.615858368580409e2;
const B2 = -1.556989798598866e2;
const B3 = 6.680131188771972e1;
const B4 = -1.328068155288572e1;
const C0 = -7.784894002430293e-3;
const C1 = -3.223964580411365e-1;
const C2 = -2.400758277161838;
const C3 = -2.549732539343734;
const C4 = 4.374664141464968;
const C5 = 2.938163982698783;
const D0 = 7.784695709041462e-3;
const D1 = 3.224671290700398e-1;
const D2 = 2.445134137142996;
const D3 = 3.754408661907416;
const P_LOW = 0.02425;

function normalTail(q: number): number {
  return (((((C0 * q + C1) * q + C2) * q + C3) * q + C4) * q + C5) / ((((D0 * q + D1) * q + D2) * q + D3) * q + 1);
}

/** Standard normal quantile Φ⁻¹(p) for 0 < p < 1 (Acklam's algorithm). */
export function normalQuantile(p: number): number {
  if (p < P_LOW) return normalTail(Math.sqrt(-2 * Math.log(p)));
  if (p > 1 - P_LOW) return -normalTail(Math.sqrt(-2 * Math.log(1 - p)));
  const q = p - 0.5;
  const r = q * q;
  return ((((((A0 * r + A1) * r + A2) * r + A3) * r + A4) * r + A5) * q) / (((((B0 * r + B1) * r + B2) * r + B3) * r + B4) * r + 1);
}

/**
 * Standard normal distribution Φ(x), for |x| ≤ 8, by composite Simpson integration of the density
 * from 0 (error below 1e-12 there). Used once per cell to bound a truncated normal, never per sample.
 */
export function normalCdf(x: number): number {
  if (x > 8) return 1;
  if (x < -8) return 0;
  const steps = 2 * Math.max(8, Math.ceil(Math.abs(x) * 400));
  const h = x / steps;
  let sum = 1 + Math.exp(-0.5 * x * x);
  for (let i = 1; i < steps; i++) {
    const t = i * h;
    sum += (i % 2 === 1 ? 4 : 2) * Math.exp(-0.5 * t * t);
  }
  return 0.5 + ((h / 3) * sum) / Math.sqrt(2 * Math.PI);
}
