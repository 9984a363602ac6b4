import normalCdfReference from "@stdlib/stats-base-dists-normal-cdf";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  evaluateNetwork,
  histogram,
  MAX_TOLERANCE_SAMPLES,
  runToleranceYield,
  summarizeSamples,
  type NetworkNode,
  type ToleranceDistribution,
} from "@/lib/bank";

type Cell = Extract<NetworkNode, { kind: "cell" }>;
const cell = (id: string, capacitance: number, minus: number, plus: number, ratedVoltage = 2.7, surgeVoltage?: number): Cell => ({
  kind: "cell",
  id,
  capacitance,
  ratedVoltage,
  toleranceMinus: minus,
  tolerancePlus: plus,
  ...(surgeVoltage === undefined ? {} : { surgeVoltage }),
});
const N = 100_000;

/** Mean and variance of one cell's capacitance under the engine's spread (closed forms). */
function cellMoments(c: Cell, distribution: ToleranceDistribution): { mean: number; variance: number } {
  const a = c.toleranceMinus ?? 0;
  const b = c.tolerancePlus ?? 0;
  if (distribution === "uniform") {
    // uniform on [C(1 − a), C(1 + b)]: mean at the centre, variance width²/12
    return { mean: c.capacitance * (1 + (b - a) / 2), variance: (c.capacitance * (a + b)) ** 2 / 12 };
  }
  // normal (μ = (b − a)/2, σ = (a + b)/6) truncated at ±3σ: mean μ, variance σ²·(1 − 2·3·φ(3)/Z)
  // (the truncated-normal moments, e.g. Johnson, Kotz and Balakrishnan, Continuous Univariate
  // Distributions, vol. 1, §13.10.1), Z = Φ(3) − Φ(−3) from @stdlib.
  const sigma = (a + b) / 6;
  const phi3 = Math.exp(-4.5) / Math.sqrt(2 * Math.PI);
  const Z = normalCdfReference(3, 0, 1) - normalCdfReference(-3, 0, 1);
  return { mean: c.capacitance * (1 + (b - a) / 2), variance: (c.capacitance * sigma) ** 2 * (1 - (6 * phi3) / Z) };
}

describe("tolerance yield against closed forms", { timeout: 60_000 }, () => {
  const cells = [cell("a", 100, 0.1, 0.1), cell("b", 100, 0.1, 0.3), cell("c", 47, 0.2, 0.2), cell("d", 220, 0.05, 0.1), cell("e", 3.3, 0.2, 0.8)];

  for (const distribution of ["uniform", "normal"] as const) {
    // Source: the sum of independent variables has the sum of their means and of their variances.
    it(`${distribution}: a parallel group's capacitance has the sum of the means and of the variances`, () => {
      const r = runToleranceYield({ network: { kind: "parallel", children: cells }, appliedVoltage: 1, samples: N, seed: 2024, distribution });
      const mean = cells.reduce((s, c) => s + cellMoments(c, distribution).mean, 0);
      const variance = cells.reduce((s, c) => s + cellMoments(c, distribution).variance, 0);
      expect(Math.abs(r.capacitance.mean - mean)).toBeLessThan(5 * Math.sqrt(variance / N));
      expect(Math.abs(r.capacitance.std ** 2 - variance)).toBeLessThan(5 * variance * Math.sqrt(2 / (N - 1)));
    });
  }

  // Source: the delta method (Taylor expansion of g(X) about the means; e.g. Casella and Berger,
  // Statistical Inference, §5.5.4): E[g] ≈ g(μ) + ½·Σ g_ii·σ_i², Var[g] ≈ Σ g_i²·σ_i², for the
  // series capacitance g = 1/Σ(1/C_i): g_i = g²/C_i², g_ii = 2g³/C_i⁴ − 2g²/C_i³.
  it("a series string: mean within sampling error of the second-order delta-method estimate, variance of the first-order one", () => {
    const string = [
      cell("s1", 100, 0.1, 0.1),
      cell("s2", 120, 0.1, 0.1),
      cell("s3", 90, 0.1, 0.1),
      cell("s4", 100, 0.1, 0.1),
      cell("s5", 150, 0.1, 0.1),
      cell("s6", 80, 0.1, 0.1),
    ];
    const r = runToleranceYield({ network: { kind: "series", children: string }, appliedVoltage: 1, samples: N, seed: 77, distribution: "uniform" });
    const mu = string.map((c) => cellMoments(c, "uniform").mean);
    const v = string.map((c) => cellMoments(c, "uniform").variance);
    const g = 1 / mu.reduce((s, m) => s + 1 / m, 0);
    const gi = mu.map((m) => (g * g) / (m * m));
    const gii = mu.map((m) => (2 * g ** 3) / m ** 4 - (2 * g * g) / m ** 3);
    const second = g + 0.5 * gii.reduce((s, x, i) => s + x * v[i]!, 0);
    const variance = gi.reduce((s, x, i) => s + x * x * v[i]!, 0);
    const se = Math.sqrt(variance / N);
    expect(Math.abs(r.capacitance.mean - second)).toBeLessThan(4 * se);
    // the second-order term is what makes it agree: the first-order estimate g(μ) is far off
    expect(Math.abs(r.capacitance.mean - g)).toBeGreaterThan(10 * se);
    expect(Math.abs(r.capacitance.std ** 2 / variance - 1)).toBeLessThan(0.02);
  });

  // Closed form: two cells of capacitance uniform on [L, H] in series at V; the higher cell voltage
  // is V·max/(C₁ + C₂), within a rating r when max/min ≤ k = r/(V − r). Integrating the joint
  // density, P(C₂ > k·C₁) = (H − kL)²/(2k(H − L)²), so P(within) = 1 − (H − kL)²/(k(H − L)²).
  it("two cells in series: the share within rating matches the integral of the joint density", () => {
    const [L, H, V, rating] = [0.8, 1.2, 2, 1.05];
    const k = rating / (V - rating);
    const p = 1 - (H - k * L) ** 2 / (k * (H - L) ** 2);
    const tree: NetworkNode = { kind: "series", children: [cell("a", 1, 0.2, 0.2, rating), cell("b", 1, 0.2, 0.2, rating)] };
    const r = runToleranceYield({ network: tree, appliedVoltage: V, samples: N, seed: 5, distribution: "uniform" });
    expect(Math.abs(r.shares.withinRating - p)).toBeLessThan(5 * Math.sqrt((p * (1 - p)) / N));
    expect(r.shares.withinSurge).toBe(r.shares.withinRating); // no surge voltage: the rating is the limit
    // the highest cell voltage lies between V/2 and V·H/(L + H)
    expect(r.maxCellVoltage.min).toBeGreaterThanOrEqual(V / 2);
    expect(r.maxCellVoltage.max).toBeLessThanOrEqual((V * H) / (L + H) + 1e-12);
  });

  it("grading narrows the spread: every sample within ±m of nominal, so the capacitance within ±m too", () => {
    const tree: NetworkNode = { kind: "parallel", children: cells };
    const nominal = evaluateNetwork(tree).capacitance;
    const r = runToleranceYield({ network: tree, appliedVoltage: 1, samples: 20_000, seed: 1, distribution: "normal", matchingTolerance: 0.02 });
    expect(r.capacitance.min).toBeGreaterThanOrEqual(nominal * 0.98 - 1e-9);
    expect(r.capacitance.max).toBeLessThanOrEqual(nominal * 1.02 + 1e-9);
    const wide = runToleranceYield({ network: tree, appliedVoltage: 1, samples: 20_000, seed: 1, distribution: "normal" });
    expect(wide.capacitance.std).toBeGreaterThan(2 * r.capacitance.std);
  });
});

describe("tolerance yield behaviour", () => {
  const string: NetworkNode = { kind: "series", children: Array.from({ length: 10 }, (_, i) => cell(`c${i}`, 350, 0.1, 0.2, 2.7, 2.85)) };

  it("same input and seed, same numbers; another seed, other numbers", () => {
    const input = { network: string, appliedVoltage: 26, samples: 5000, seed: 99, distribution: "normal" as const, requirement: { capacitance: 36 } };
    const a = runToleranceYield(input);
    expect(runToleranceYield(input)).toEqual(a);
    expect(runToleranceYield({ ...input, seed: 100 }).capacitance.mean).not.toBe(a.capacitance.mean);
  });

  it("meets a capacitance or energy requirement in the share of samples at or above it", () => {
    const r = runToleranceYield({ network: string, appliedVoltage: 26, samples: 20_000, seed: 3, distribution: "uniform", requirement: { capacitance: 36 } });
    // nominal 35 F, uniform −10 %/+20 % per cell: the median string lies near 35·1.05
    expect(r.requiredCapacitance).toBe(36);
    expect(r.shares.meetingRequirement!).toBeGreaterThan(0.5);
    expect(r.shares.meetingRequirement!).toBeLessThan(1);
    // ½·C·(26² − 13²) ≥ E ⇔ C ≥ 2E/(26² − 13²): the same threshold expressed as energy
    const e = runToleranceYield({
      network: string,
      appliedVoltage: 26,
      samples: 20_000,
      seed: 3,
      distribution: "uniform",
      requirement: { energy: 0.5 * 36 * (26 ** 2 - 13 ** 2), minVoltage: 13 },
    });
    expect(e.requiredCapacitance).toBeCloseTo(36, 9);
    expect(e.shares.meetingRequirement).toBe(r.shares.meetingRequirement);
  });

  it("histograms cover every sample between the smallest and the largest", () => {
    const r = runToleranceYield({ network: string, appliedVoltage: 26, samples: 12_345, seed: 4, distribution: "normal", bins: 25 });
    for (const [h, s] of [
      [r.histogram.capacitance, r.capacitance],
      [r.histogram.maxCellVoltage, r.maxCellVoltage],
    ] as const) {
      expect(h.length).toBe(25);
      expect(h.reduce((a, b) => a + b.count, 0)).toBe(12_345);
      expect(h[0]!.from).toBe(s.min);
      expect(h.at(-1)!.to).toBe(s.max);
      for (let i = 1; i < h.length; i++) expect(h[i]!.from).toBeCloseTo(h[i - 1]!.to, 12);
    }
    expect(r.capacitance.p01).toBeLessThan(r.capacitance.p50);
    expect(r.capacitance.p50).toBeLessThan(r.capacitance.p99);
  });

  it("refuses more than 100,000 samples and more than the work bound, saying the bound", () => {
    expect(() => runToleranceYield({ network: string, appliedVoltage: 1, samples: MAX_TOLERANCE_SAMPLES + 1, seed: 1, distribution: "uniform" })).toThrow(
      /100000/,
    );
    const big: NetworkNode = { kind: "parallel", children: Array.from({ length: 1000 }, (_, i) => cell(`b${i}`, 1, 0.1, 0.1)) };
    expect(() => runToleranceYield({ network: big, appliedVoltage: 1, samples: 100_000, seed: 1, distribution: "uniform" })).toThrow(
      /at most 30,000,000; here 100,000 × 1,001/,
    );
    expect(() =>
      runToleranceYield({ network: string, appliedVoltage: 1, samples: 10, seed: 1, distribution: "uniform", requirement: { energy: 1, minVoltage: 2 } }),
    ).toThrow(RangeError);
  });

  // Percentiles by linear interpolation between order statistics (Hyndman and Fan 1996, definition 7,
  // the default of R's quantile()): for 1, 2, …, 101, p01 = 2, p50 = 51, p99 = 100.
  it("summarizes with sample standard deviation and type-7 percentiles", () => {
    const s = summarizeSamples(Float64Array.from({ length: 101 }, (_, i) => 101 - i));
    expect(s).toMatchObject({ mean: 51, p01: 2, p50: 51, p99: 100, min: 1, max: 101 });
    expect(s.std).toBeCloseTo(Math.sqrt((101 * 102) / 12), 12); // n(n+1)/12 for 1…n with n − 1 in the denominator
    expect(summarizeSamples(Float64Array.of(1, 2)).p50).toBe(1.5);
    expect(histogram(Float64Array.of(3, 3, 3), 10, 3, 3)).toEqual([{ from: 3, to: 3, count: 3 }]);
  });
});

// ---- properties (fast-check) ----

const arbTree: fc.Arbitrary<NetworkNode> = fc.letrec<{ node: NetworkNode }>((tie) => ({
  node: fc.oneof(
    { depthSize: "small", withCrossShrink: true },
    fc
      .record({ capacitance: fc.double({ min: 0.01, max: 100, noNaN: true }), ratedVoltage: fc.constantFrom(1, 2.7, 5) })
      .map((c) => ({ kind: "cell" as const, id: "c", ...c })),
    fc.record({ kind: fc.constantFrom("series" as const, "parallel" as const), children: fc.array(tie("node"), { minLength: 1, maxLength: 4 }) }),
  ),
})).node;

describe("tolerance properties", () => {
  it("with zero tolerance every sample is the nominal bank: the yield is 0 % or 100 %", { timeout: 60_000 }, () => {
    fc.assert(
      fc.property(
        arbTree,
        fc.double({ min: 0.2, max: 2, noNaN: true }),
        fc.constantFrom<ToleranceDistribution>("uniform", "normal"),
        (tree, load, distribution) => {
          const healthy = evaluateNetwork(tree);
          const V = healthy.maxVoltage * load;
          const r = runToleranceYield({
            network: tree,
            appliedVoltage: V,
            samples: 50,
            seed: 1,
            distribution,
            requirement: { capacitance: healthy.capacitance * load },
          });
          for (const share of [r.shares.withinRating, r.shares.withinSurge, r.shares.meetingRequirement]) expect([0, 1]).toContain(share);
          expect(r.shares.withinRating).toBe(load <= 1 - 1e-6 ? 1 : load >= 1 + 1e-6 ? 0 : r.shares.withinRating);
          expect(r.capacitance.min).toBe(r.nominal.capacitance);
          expect(r.capacitance.max).toBe(r.nominal.capacitance);
          expect(r.capacitance.std).toBeLessThanOrEqual(1e-12 * r.nominal.capacitance);
        },
      ),
      { numRuns: 200 },
    );
  });
});
