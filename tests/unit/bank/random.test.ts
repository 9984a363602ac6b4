import normalCdfReference from '@stdlib/stats-base-dists-normal-cdf';
import normalQuantileReference from '@stdlib/stats-base-dists-normal-quantile';
import kstest from '@stdlib/stats-kstest';
import { describe, expect, it } from 'vitest';
import { MersenneTwister, normalCdf, normalQuantile, sampleCellDeviations } from '@/lib/bank';

describe('MT19937 stream', () => {
  // Source: ISO/IEC 14882:2011 (C++), [rand.predef]: "The 10000th consecutive invocation of a
  // default-constructed object of type mt19937 shall produce the value 4123659995" (default seed 5489).
  it('gives 4123659995 as the 10,000th output for seed 5489, as the C++ standard requires', () => {
    const g = new MersenneTwister(5489);
    let v = 0;
    for (let i = 0; i < 10_000; i++) v = g.nextUint32();
    expect(v).toBe(4123659995);
  });

  it('fills (0, 1) from the same stream: (k + ½)/2³²', () => {
    const a = new MersenneTwister(42);
    const b = new MersenneTwister(42);
    const u = new Float64Array(1500); // crosses two refills of the 624-word state
    a.fillOpenUnit(u);
    for (let i = 0; i < u.length; i++) expect(u[i]).toBe((b.nextUint32() + 0.5) / 2 ** 32);
  });

  it('refuses a seed that is not a 32-bit whole number', () => {
    for (const s of [-1, 1.5, 2 ** 32, Number.NaN]) expect(() => new MersenneTwister(s)).toThrow(RangeError);
  });
});

describe('normal distribution functions against @stdlib (npm)', () => {
  // The reference itself loses accuracy below p ≈ 1e-9 (it answers −∞ at 1e-20), far outside what
  // the sampler uses: its draws stay within ±3σ (p ≥ 0.00135).
  it('Φ⁻¹ (Acklam) within its published 1.15e-9 relative error of @stdlib/stats-base-dists-normal-quantile', () => {
    const ps = [1e-9, 1e-6, 0.001, 0.01, 0.02425, 0.025, 0.1, 0.3, 0.4999, 0.5, 0.5001, 0.7, 0.9, 0.975, 0.97575, 0.99, 0.999999, 1 - 1e-9];
    for (let i = 1; i < 1000; i++) ps.push(i / 1000);
    for (const p of ps) {
      const ref = normalQuantileReference(p, 0, 1);
      expect(Math.abs(normalQuantile(p) - ref), `p = ${p}`).toBeLessThanOrEqual(1.15e-9 * Math.abs(ref) + 1e-15);
    }
  });

  it('Φ by Simpson integration within 1e-12 of @stdlib/stats-base-dists-normal-cdf on [−8, 8]', () => {
    for (let x = -8; x <= 8; x += 0.01) expect(Math.abs(normalCdf(x) - normalCdfReference(x, 0, 1)), `x = ${x}`).toBeLessThan(1e-12);
  });
});

// Source: the one-sample Kolmogorov–Smirnov test of @stdlib/stats-kstest (npm), on deviations drawn
// exactly as the Monte-Carlo draws them. Each sampler must pass (p > 0.01) against its own
// distribution and fail (p < 1e-6) against the other, so the check can tell them apart.
describe('the cell sampler against reference distributions (Kolmogorov–Smirnov)', () => {
  const n = 5000;
  const Phi = (x: number) => normalCdfReference(x, 0, 1);
  const truncatedNormalCdf = (mu: number, sigma: number, lo: number, hi: number) => (x: number) => {
    if (x <= lo) return 0;
    if (x >= hi) return 1;
    const a = Phi((lo - mu) / sigma);
    return (Phi((x - mu) / sigma) - a) / (Phi((hi - mu) / sigma) - a);
  };

  it('uniform over a −10 %/+20 % band', () => {
    const x = sampleCellDeviations({ minus: 0.1, plus: 0.2 }, { distribution: 'uniform', seed: 7 }, n);
    expect(kstest(x, 'uniform', -0.1, 0.2).pValue).toBeGreaterThan(0.01);
    expect(kstest(x, truncatedNormalCdf(0.05, 0.05, -0.1, 0.2)).pValue).toBeLessThan(1e-6);
  });

  it('uniform narrowed by grading to ±5 %', () => {
    const x = sampleCellDeviations({ minus: 0.1, plus: 0.2 }, { distribution: 'uniform', seed: 8, matchingTolerance: 0.05 }, n);
    expect(kstest(x, 'uniform', -0.05, 0.05).pValue).toBeGreaterThan(0.01);
    expect(kstest(x, 'uniform', -0.1, 0.2).pValue).toBeLessThan(1e-6);
  });

  it('normal with the −10 %/+20 % band as ±3σ (mean +5 %, σ 5 %), truncated at the band', () => {
    const x = sampleCellDeviations({ minus: 0.1, plus: 0.2 }, { distribution: 'normal', seed: 9 }, n);
    expect(kstest(x, truncatedNormalCdf(0.05, 0.05, -0.1, 0.2)).pValue).toBeGreaterThan(0.01);
    expect(kstest(x, 'uniform', -0.1, 0.2).pValue).toBeLessThan(1e-6);
  });

  it('normal truncated at a ±5 % grading window', () => {
    const x = sampleCellDeviations({ minus: 0.1, plus: 0.2 }, { distribution: 'normal', seed: 10, matchingTolerance: 0.05 }, n);
    expect(kstest(x, truncatedNormalCdf(0.05, 0.05, -0.05, 0.05)).pValue).toBeGreaterThan(0.01);
    expect(kstest(x, 'uniform', -0.05, 0.05).pValue).toBeLessThan(1e-6);
  });

  it('a symmetric ±10 % normal: mean 0, σ 3.33 %', () => {
    const x = sampleCellDeviations({ minus: 0.1, plus: 0.1 }, { distribution: 'normal', seed: 11 }, n);
    expect(kstest(x, truncatedNormalCdf(0, 0.1 / 3, -0.1, 0.1)).pValue).toBeGreaterThan(0.01);
    expect(kstest(x, 'normal', 0, 0.05).pValue).toBeLessThan(1e-6);
  });
});
