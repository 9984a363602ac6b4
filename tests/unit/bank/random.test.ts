import normalCdfReference from "@stdlib/stats-base-dists-normal-cdf";
import normalQuantileReference from "@stdlib/stats-base-dists-normal-quantile";
import kstest from "@stdlib/stats-kstest";
import { describe, expect, it } from "vitest";
import { normalCdf, normalQuantile, sampleCellDeviations, splitMix64, Xoshiro128 } from "@/lib/bank";

describe("seeded stream", () => {
  // Source: the reference test of the rand_xoshiro crate (the Rust rand project), whose expected
  // values "were produced with the reference implementation (v1.1)" of xoshiro128** by Blackman and
  // Vigna: from the state {1, 2, 3, 4}.
  it("xoshiro128** from the state {1, 2, 3, 4} gives the reference outputs", () => {
    const g = new Xoshiro128([1, 2, 3, 4]);
    const expected = [11520, 0, 5927040, 70819200, 2031721883, 1637235492, 1287239034, 3734860849, 3729100597, 4258142804];
    expect(expected.map(() => g.nextUint32())).toEqual(expected);
  });

  // Source: SplitMix64 (Steele, Lea and Flood 2014) as in Vigna's splitmix64.c; its first outputs
  // for seed 0 are published widely as 0xE220A8397B1DCDAF, 0x6E789E6AA1B965F4, 0x06C45D188009454F.
  it("SplitMix64 from seed 0 gives its published first outputs, and fills the state from them", () => {
    expect(splitMix64(0n, 3)).toEqual([0xe220a8397b1dcdafn, 0x6e789e6aa1b965f4n, 0x06c45d188009454fn]);
    const fromSeed = Xoshiro128.fromSeed(0);
    const fromWords = new Xoshiro128([0x7b1dcdaf, 0xe220a839, 0xa1b965f4, 0x6e789e6a]);
    for (let i = 0; i < 100; i++) expect(fromSeed.nextUint32()).toBe(fromWords.nextUint32());
  });

  it("fills (0, 1) from the same stream: (k + ½)/2³²", () => {
    const a = Xoshiro128.fromSeed(42);
    const b = Xoshiro128.fromSeed(42);
    const u = new Float64Array(1500);
    a.fillOpenUnit(u);
    for (let i = 0; i < u.length; i++) expect(u[i]).toBe((b.nextUint32() + 0.5) / 2 ** 32);
    expect(a.nextUint32()).toBe(b.nextUint32());
  });

  it("refuses a seed that is not a 32-bit whole number, and an all-zero state", () => {
    for (const s of [-1, 1.5, 2 ** 32, Number.NaN]) expect(() => Xoshiro128.fromSeed(s)).toThrow(RangeError);
    expect(() => new Xoshiro128([0, 0, 0, 0])).toThrow(RangeError);
  });
});

describe("normal distribution functions against @stdlib (npm)", () => {
  // The reference itself loses accuracy below p ≈ 1e-9 (it answers −∞ at 1e-20), far outside what
  // the sampler uses: its draws stay within ±3σ (p ≥ 0.00135).
  it("Φ⁻¹ (Acklam) within its published 1.15e-9 relative error of @stdlib/stats-base-dists-normal-quantile", () => {
    const ps = [1e-9, 1e-6, 0.001, 0.01, 0.02425, 0.025, 0.1, 0.3, 0.4999, 0.5, 0.5001, 0.7, 0.9, 0.975, 0.97575, 0.99, 0.999999, 1 - 1e-9];
    for (let i = 1; i < 1000; i++) ps.push(i / 1000);
    for (const p of ps) {
      const ref = normalQuantileReference(p, 0, 1);
      expect(Math.abs(normalQuantile(p) - ref), `p = ${p}`).toBeLessThanOrEqual(1.15e-9 * Math.abs(ref) + 1e-15);
    }
  });

  it("Φ by Simpson integration within 1e-12 of @stdlib/stats-base-dists-normal-cdf on [−8, 8]", () => {
    for (let x = -8; x <= 8; x += 0.01) expect(Math.abs(normalCdf(x) - normalCdfReference(x, 0, 1)), `x = ${x}`).toBeLessThan(1e-12);
  });
});

// Source: the one-sample Kolmogorov–Smirnov test of @stdlib/stats-kstest (npm), on deviations drawn
// exactly as the Monte-Carlo draws them. Each sampler must pass (p > 0.01) against its own
// distribution and fail (p < 1e-6) against the other, so the check can tell them apart.
describe("the cell sampler against reference distributions (Kolmogorov–Smirnov)", () => {
  const n = 5000;
  const Phi = (x: number) => normalCdfReference(x, 0, 1);
  const truncatedNormalCdf = (mu: number, sigma: number, lo: number, hi: number) => (x: number) => {
    if (x <= lo) return 0;
    if (x >= hi) return 1;
    const a = Phi((lo - mu) / sigma);
    return (Phi((x - mu) / sigma) - a) / (Phi((hi - mu) / sigma) - a);
  };

  it("uniform over a −10 %/+20 % band", () => {
    const x = sampleCellDeviations({ minus: 0.1, plus: 0.2 }, { distribution: "uniform", seed: 7 }, n);
    expect(kstest(x, "uniform", -0.1, 0.2).pValue).toBeGreaterThan(0.01);
    expect(kstest(x, truncatedNormalCdf(0.05, 0.05, -0.1, 0.2)).pValue).toBeLessThan(1e-6);
  });

  it("uniform narrowed by grading to ±5 %", () => {
    const x = sampleCellDeviations({ minus: 0.1, plus: 0.2 }, { distribution: "uniform", seed: 8, matchingTolerance: 0.05 }, n);
    expect(kstest(x, "uniform", -0.05, 0.05).pValue).toBeGreaterThan(0.01);
    expect(kstest(x, "uniform", -0.1, 0.2).pValue).toBeLessThan(1e-6);
  });

  it("normal with the −10 %/+20 % band as ±3σ (mean +5 %, σ 5 %), truncated at the band", () => {
    const x = sampleCellDeviations({ minus: 0.1, plus: 0.2 }, { distribution: "normal", seed: 9 }, n);
    expect(kstest(x, truncatedNormalCdf(0.05, 0.05, -0.1, 0.2)).pValue).toBeGreaterThan(0.01);
    expect(kstest(x, "uniform", -0.1, 0.2).pValue).toBeLessThan(1e-6);
  });

  it("normal truncated at a ±5 % grading window", () => {
    const x = sampleCellDeviations({ minus: 0.1, plus: 0.2 }, { distribution: "normal", seed: 10, matchingTolerance: 0.05 }, n);
    expect(kstest(x, truncatedNormalCdf(0.05, 0.05, -0.05, 0.05)).pValue).toBeGreaterThan(0.01);
    expect(kstest(x, "uniform", -0.05, 0.05).pValue).toBeLessThan(1e-6);
  });

  it("a symmetric ±10 % normal: mean 0, σ 3.33 %", () => {
    const x = sampleCellDeviations({ minus: 0.1, plus: 0.1 }, { distribution: "normal", seed: 11 }, n);
    expect(kstest(x, truncatedNormalCdf(0, 0.1 / 3, -0.1, 0.1)).pValue).toBeGreaterThan(0.01);
    expect(kstest(x, "normal", 0, 0.05).pValue).toBeLessThan(1e-6);
  });
});
