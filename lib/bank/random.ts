/**
 * Seeded random numbers for the engine's Monte-Carlo work. Same seed, same numbers, on every
 * platform: only 32-bit integer arithmetic decides the stream.
 */

const N = 624;
const M = 397;
const UPPER = 0x80000000;
const LOWER = 0x7fffffff;
const MATRIX_A = 0x9908b0df;

/**
 * MT19937, the 32-bit Mersenne Twister (M. Matsumoto and T. Nishimura, ACM TOMACS 8(1), 1998),
 * seeded as their reference `init_genrand`. Its stream is the one ISO C++ specifies for
 * `std::mt19937` (checked in tests/unit/bank/random.test.ts).
 */
export class MersenneTwister {
  private readonly state = new Int32Array(N);
  private index = N;

  constructor(seed: number) {
    if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new RangeError('seed must be a whole number from 0 to 4294967295');
    const mt = this.state;
    mt[0] = seed >>> 0;
    for (let i = 1; i < N; i++) {
      const prev = (mt[i - 1] as number) ^ ((mt[i - 1] as number) >>> 30);
      // 1812433253 · prev + i, modulo 2³²
      mt[i] = Math.imul(prev, 1812433253) + i;
    }
  }

  private twist(): void {
    const mt = this.state;
    let k = 0;
    for (; k < N - M; k++) {
      const y = ((mt[k] as number) & UPPER) | ((mt[k + 1] as number) & LOWER);
      mt[k] = (mt[k + M] as number) ^ (y >>> 1) ^ (y & 1 ? MATRIX_A : 0);
    }
    for (; k < N - 1; k++) {
      const y = ((mt[k] as number) & UPPER) | ((mt[k + 1] as number) & LOWER);
      mt[k] = (mt[k + M - N] as number) ^ (y >>> 1) ^ (y & 1 ? MATRIX_A : 0);
    }
    const y = ((mt[N - 1] as number) & UPPER) | ((mt[0] as number) & LOWER);
    mt[N - 1] = (mt[M - 1] as number) ^ (y >>> 1) ^ (y & 1 ? MATRIX_A : 0);
    this.index = 0;
  }

  /** the next 32-bit output (genrand_int32) */
  nextUint32(): number {
    if (this.index >= N) this.twist();
    let y = this.state[this.index++] as number;
    y ^= y >>> 11;
    y ^= (y << 7) & 0x9d2c5680;
    y ^= (y << 15) & 0xefc60000;
    y ^= y >>> 18;
    return y >>> 0;
  }

  /** fill `out` with uniform numbers strictly inside (0, 1): (k + ½)/2³² */
  fillOpenUnit(out: Float64Array): void {
    const mt = this.state;
    const n = out.length;
    let i = 0;
    while (i < n) {
      if (this.index >= N) this.twist();
      const start = this.index;
      const end = Math.min(N, start + n - i);
      for (let j = start; j < end; j++) {
        let y = mt[j] as number;
        y ^= y >>> 11;
        y ^= (y << 7) & 0x9d2c5680;
        y ^= (y << 15) & 0xefc60000;
        y ^= y >>> 18;
        out[i++] = ((y >>> 0) + 0.5) * 2.3283064365386963e-10;
      }
      this.index = end;
    }
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
