import { describe, expect, it } from "vitest";
import { parseArrangementRequest, parseEvaluateRequest } from "@/lib/validation/bank";

const goodCell = { kind: "cell", id: "a", capacitance: 100, ratedVoltage: 2.7 };

/** Build a deeply nested body as JSON text (JSON.stringify itself would overflow the stack). */
function deepBody(depth: number): unknown {
  const text = `{"network":${'{"kind":"series","children":['.repeat(depth)}${JSON.stringify(goodCell)}${"]}".repeat(depth)}}`;
  return JSON.parse(text);
}

describe("parseEvaluateRequest", () => {
  it("accepts a valid body", () => {
    const r = parseEvaluateRequest({ appliedVoltage: 5, network: { kind: "series", children: [goodCell, { ...goodCell, id: "b", esr: 0.003 }] } });
    expect(r.ok).toBe(true);
  });

  const bad: [string, unknown, string][] = [
    ["negative capacitance", { network: { ...goodCell, capacitance: -1 } }, "network.capacitance"],
    ["zero rated voltage", { network: { ...goodCell, ratedVoltage: 0 } }, "network.ratedVoltage"],
    ["NaN capacitance", { network: { ...goodCell, capacitance: Number.NaN } }, "network.capacitance"],
    ["capacitance as a string", { network: { kind: "parallel", children: [{ ...goodCell, capacitance: "100" }] } }, "network.children[0].capacitance"],
    ["an unknown kind", { network: { kind: "bridge", children: [goodCell] } }, "network.kind"],
    ["an empty group", { network: { kind: "series", children: [goodCell, { kind: "parallel", children: [] }] } }, "network.children[1].children"],
    ["an empty id", { network: { ...goodCell, id: "" } }, "network.id"],
    ["an unknown field", { network: { ...goodCell, colour: "blue" } }, "network"],
    ["a negative applied voltage", { appliedVoltage: -5, network: goodCell }, "appliedVoltage"],
    ["a missing network", {}, "network"],
  ];
  for (const [name, body, path] of bad) {
    it(`refuses ${name} with the path ${path}`, () => {
      const r = parseEvaluateRequest(body);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.issues.map((i) => i.path)).toContain(path);
    });
  }

  it("refuses a body that is not an object", () => {
    expect(parseEvaluateRequest("network").ok).toBe(false);
    expect(parseEvaluateRequest(null).ok).toBe(false);
    expect(parseEvaluateRequest([goodCell]).ok).toBe(false);
  });

  it("accepts 64 levels and refuses 65", () => {
    expect(parseEvaluateRequest(deepBody(63)).ok).toBe(true); // 63 groups + the cell = 64 levels
    const r = parseEvaluateRequest(deepBody(64));
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error).toMatch(/64 levels/);
      expect(r.issues[0]!.path).toBe(`network${".children[0]".repeat(63)}`);
    }
  });

  it("refuses a 100,000-deep body cleanly, without a stack overflow", () => {
    const r = parseEvaluateRequest(deepBody(100_000));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(/nested/);
  });

  it("accepts 20,000 cells and refuses 20,001", () => {
    const cells = (n: number) => Array.from({ length: n }, (_, i) => ({ ...goodCell, id: `c${i}` }));
    expect(parseEvaluateRequest({ network: { kind: "parallel", children: cells(20_000) } }).ok).toBe(true);
    const r = parseEvaluateRequest({ network: { kind: "parallel", children: cells(20_001) } });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error).toMatch(/20000 cells/);
      expect(r.issues[0]!.path).toBe("network.children[20000]");
    }
  });
});

describe("parseArrangementRequest", () => {
  it("accepts a valid request and defaults the quantity to 1", () => {
    const r = parseArrangementRequest({ maxVoltage: 48, minVoltage: 24, backup: { power: 2000, seconds: 10 } });
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.data.quantity).toBe(1);
  });

  const bad: [string, unknown, string][] = [
    ["no capacitance, energy or backup", { maxVoltage: 48 }, "capacitance"],
    ["minVoltage not below maxVoltage", { maxVoltage: 48, minVoltage: 48, capacitance: 10 }, "minVoltage"],
    ["a negative max voltage", { maxVoltage: -48, capacitance: 10 }, "maxVoltage"],
    ["a fractional quantity", { maxVoltage: 48, capacitance: 10, quantity: 1.5 }, "quantity"],
    ["a zero quantity", { maxVoltage: 48, capacitance: 10, quantity: 0 }, "quantity"],
    ["an unknown technology", { maxVoltage: 48, capacitance: 10, technology: "plasma" }, "technology"],
    ["backup power as a string", { maxVoltage: 48, backup: { power: "2 kW", seconds: 10 } }, "backup.power"],
    ["a zero peak-current drop", { maxVoltage: 48, capacitance: 10, peakCurrent: { current: 100, maxDrop: 0 } }, "peakCurrent.maxDrop"],
    ["an unknown field", { maxVoltage: 48, capacitance: 10, colour: "red" }, ""],
  ];
  for (const [name, body, path] of bad) {
    it(`refuses ${name} (path "${path}")`, () => {
      const r = parseArrangementRequest(body);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.issues.map((i) => i.path)).toContain(path);
    });
  }
});

describe("every number has a physical upper bound (lib/bank/bounds.ts)", () => {
  const base = { maxVoltage: 48, capacitance: 10 };
  // [what, body at the bound (accepted), body just above it (refused), path, message]
  const cases: [string, object, object, string, RegExp][] = [
    ["1e17 V", { ...base, maxVoltage: 2e6 }, { ...base, maxVoltage: 1e17 }, "maxVoltage", /at most 2 MV/],
    [
      "a minimum voltage",
      { maxVoltage: 2e6, minVoltage: 1e6, capacitance: 1 },
      { maxVoltage: 2e6, minVoltage: 3e6, capacitance: 1 },
      "minVoltage",
      /at most 2 MV/,
    ],
    ["capacitance", { ...base, capacitance: 1e8 }, { ...base, capacitance: 1.0000001e8 }, "capacitance", /at most 100 MF/],
    ["energy", { maxVoltage: 48, energy: 1e9 }, { maxVoltage: 48, energy: 1e308 }, "energy", /at most 1 GJ/],
    [
      "backup power",
      { maxVoltage: 48, backup: { power: 1e9, seconds: 1 } },
      { maxVoltage: 48, backup: { power: 2e9, seconds: 1 } },
      "backup.power",
      /at most 1 GW/,
    ],
    [
      "backup time",
      { maxVoltage: 48, backup: { power: 1, seconds: 86_400 } },
      { maxVoltage: 48, backup: { power: 1, seconds: 86_401 } },
      "backup.seconds",
      /at most 86,400 s/,
    ],
    [
      "peak current",
      { ...base, peakCurrent: { current: 1e7, maxDrop: 1 } },
      { ...base, peakCurrent: { current: 1e8, maxDrop: 1 } },
      "peakCurrent.current",
      /at most 10 MA/,
    ],
    ["mass", { ...base, maxMass: 1e6 }, { ...base, maxMass: 1e7 }, "maxMass", /at most 1,000,000 kg/],
    ["volume", { ...base, maxVolume: 1e3 }, { ...base, maxVolume: 1e4 }, "maxVolume", /at most 1,000 m³/],
    ["quantity", { ...base, quantity: 100_000 }, { ...base, quantity: 100_001 }, "quantity", /at most 100,000/],
  ];
  for (const [what, atBound, above, path, message] of cases) {
    it(`${what}: accepted at the bound, refused above it at "${path}"`, () => {
      expect(parseArrangementRequest(atBound).ok).toBe(true);
      const r = parseArrangementRequest(above);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.issues.find((i) => i.path === path)?.message).toMatch(message);
    });
  }

  it("a network cell and the applied voltage are bounded too", () => {
    for (const [body, path] of [
      [{ appliedVoltage: 1e17, network: goodCell }, "appliedVoltage"],
      [{ network: { ...goodCell, capacitance: 1e300 } }, "network.capacitance"],
      [{ network: { ...goodCell, ratedVoltage: 1e17 } }, "network.ratedVoltage"],
      [{ network: { ...goodCell, esr: 1e6 } }, "network.esr"],
    ] as const) {
      const r = parseEvaluateRequest(body);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.issues.map((i) => i.path)).toContain(path);
    }
  });
});
