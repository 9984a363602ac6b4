import { describe, expect, it } from "vitest";
import { parseFailuresRequest, parseToleranceRequest } from "@/lib/validation/network-analysis";

const good = { kind: "cell", id: "a", capacitance: 100, ratedVoltage: 2.7, surgeVoltage: 2.85, toleranceMinus: 0.1, tolerancePlus: 0.2 };
const pair = { kind: "series", children: [good, { ...good, id: "b" }] };
const tolerance = { appliedVoltage: 5, network: pair, samples: 1000, seed: 1, distribution: "uniform" };

describe("parseFailuresRequest", () => {
  it("accepts the evaluate network with surge voltages", () => {
    expect(parseFailuresRequest({ appliedVoltage: 5, network: pair }).ok).toBe(true);
  });

  const bad: [string, unknown, string][] = [
    ["a missing applied voltage", { network: pair }, "appliedVoltage"],
    ["a zero applied voltage", { appliedVoltage: 0, network: pair }, "appliedVoltage"],
    ["an absurd applied voltage", { appliedVoltage: 1e9, network: pair }, "appliedVoltage"],
    [
      "a surge voltage below the rating",
      { appliedVoltage: 5, network: { kind: "series", children: [good, { ...good, id: "b", surgeVoltage: 2 }] } },
      "network.children[1].surgeVoltage",
    ],
    ["a repeated cell id", { appliedVoltage: 5, network: { kind: "series", children: [good, good] } }, "network.children[1].id"],
    ["a tolerance above 100 %", { appliedVoltage: 5, network: { ...good, tolerancePlus: 1.5 } }, "network.tolerancePlus"],
    ["an unknown field", { appliedVoltage: 5, network: pair, samples: 3 }, ""],
  ];
  for (const [name, body, path] of bad) {
    it(`refuses ${name} at ${path || "the body"}`, () => {
      const r = parseFailuresRequest(body);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.issues.map((i) => i.path)).toContain(path);
    });
  }
});

describe("parseToleranceRequest", () => {
  it("accepts a run with grading and a requirement, and repeated ids", () => {
    const r = parseToleranceRequest({
      ...tolerance,
      network: { kind: "parallel", children: [good, good] },
      matchingTolerance: 0.05,
      requirement: { energy: 10, minVoltage: 2 },
      bins: 20,
    });
    expect(r.ok).toBe(true);
  });

  const bad: [string, unknown, string][] = [
    ["more than 100,000 samples", { ...tolerance, samples: 100_001 }, "samples"],
    ["fractional samples", { ...tolerance, samples: 10.5 }, "samples"],
    ["a negative seed", { ...tolerance, seed: -1 }, "seed"],
    ["a seed past 32 bits", { ...tolerance, seed: 2 ** 32 }, "seed"],
    ["an unknown distribution", { ...tolerance, distribution: "lognormal" }, "distribution"],
    ["a grading above 100 %", { ...tolerance, matchingTolerance: 2 }, "matchingTolerance"],
    ["a minimum voltage at the applied voltage", { ...tolerance, requirement: { energy: 1, minVoltage: 5 } }, "requirement.minVoltage"],
    ["too many bins", { ...tolerance, bins: 500 }, "bins"],
    ["a body that is not an object", [tolerance], ""],
  ];
  for (const [name, body, path] of bad) {
    it(`refuses ${name} at ${path || "the body"}`, () => {
      const r = parseToleranceRequest(body);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.issues.map((i) => i.path)).toContain(path);
    });
  }

  it("refuses samples × network size past the bound, saying the bound and the largest sample count that fits", () => {
    const network = { kind: "parallel", children: Array.from({ length: 999 }, (_, i) => ({ ...good, id: `c${i}` })) };
    const r = parseToleranceRequest({ ...tolerance, network, samples: 100_000 });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.issues[0]!.path).toBe("samples");
      expect(r.error).toBe("samples: samples × network size (cells and groups) may be at most 30,000,000; here 100,000 × 1,000: use at most 30,000 samples");
    }
    expect(parseToleranceRequest({ ...tolerance, network, samples: 30_000 }).ok).toBe(true);
  });
});
