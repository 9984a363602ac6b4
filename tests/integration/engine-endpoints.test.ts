import { beforeAll, describe, expect, it } from "vitest";
import { POST as evaluate } from "@/app/api/v1/networks/evaluate/route";
import { POST as failures } from "@/app/api/v1/networks/failures/route";
import { POST as tolerance } from "@/app/api/v1/networks/tolerance/route";
import { POST as arrangements } from "@/app/api/v1/shops/[shop]/arrangements/route";
import { exploreArrangements } from "@/app/s/[shop]/actions";
import { listActiveCells } from "@/db/queries/catalog";
import { EMPTY_REQUEST_FORM } from "@/lib/validation/request-form";
import { createShop, type TestShop } from "./fixtures";
import { actAs } from "./helpers";

const post = (path: string, body: unknown, raw = false) =>
  new Request(`http://127.0.0.1:3100${path}`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: raw ? (body as string) : JSON.stringify(body),
  });
const params = (shop: string) => ({ params: Promise.resolve({ shop }) });
const cell = (id: string, capacitance: number, ratedVoltage: number, esr?: number) => ({
  kind: "cell",
  id,
  capacitance,
  ratedVoltage,
  ...(esr ? { esr } : {}),
});

describe("POST /api/v1/networks/evaluate", () => {
  it("evaluates two mismatched cells in series at an applied voltage", async () => {
    // Series: 1/C = 1/100 + 1/50 → C = 33.33 F; Q = C·V; V₁ = Q/100, V₂ = Q/50 (DESIGN.md §3.1, charge sharing).
    const res = await evaluate(
      post("/api/v1/networks/evaluate", { appliedVoltage: 3, network: { kind: "series", children: [cell("a", 100, 2.7, 0.01), cell("b", 50, 2.7, 0.02)] } }),
    );
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.capacitance).toBeCloseTo(100 / 3, 9);
    expect(body.esr).toBeCloseTo(0.03, 12);
    expect(body.charge).toBeCloseTo(100, 9);
    expect(body.cells).toEqual([
      { id: "a", voltage: expect.closeTo(1, 9), charge: expect.closeTo(100, 9), energy: expect.closeTo(50, 9) },
      { id: "b", voltage: expect.closeTo(2, 9), charge: expect.closeTo(100, 9), energy: expect.closeTo(100, 9) },
    ]);
    // the 50 F cell reaches 2.7 V first: V_max = 2.7 · 3/2
    expect(body.maxVoltage).toBeCloseTo(4.05, 9);
    expect(Object.keys(body).sort()).toEqual(["capacitance", "cells", "charge", "energy", "esr", "maxVoltage"]);
  });

  it("evaluates at the maximum voltage when none is applied", async () => {
    const res = await evaluate(post("/api/v1/networks/evaluate", { network: { kind: "parallel", children: [cell("a", 1, 2.7), cell("b", 2, 3)] } }));
    const body = await res.json();
    expect(body.maxVoltage).toBeCloseTo(2.7, 12);
    expect(body.energy).toBeCloseTo(0.5 * 3 * 2.7 ** 2, 9);
    expect(body).not.toHaveProperty("esr");
  });

  const deep = (n: number) => {
    let node: unknown = cell("x", 1, 2.7);
    for (let i = 0; i < n; i++) node = { kind: "series", children: [node] };
    return node;
  };
  const bad: [string, string | object, RegExp][] = [
    ["negative capacitance", { network: cell("a", -1, 2.7) }, /network/],
    ["zero voltage", { network: cell("a", 1, 0) }, /network/],
    ["a string for a number", { network: cell("a", "1" as unknown as number, 2.7) }, /network/],
    ["NaN written as a string", '{"network":{"kind":"cell","id":"a","capacitance":"NaN","ratedVoltage":2.7}}', /network/],
    ["an unknown kind", { network: { kind: "ring", children: [cell("a", 1, 2.7)] } }, /network/],
    ["an empty group", { network: { kind: "series", children: [] } }, /network/],
    ["a negative applied voltage", { appliedVoltage: -5, network: cell("a", 1, 2.7) }, /appliedVoltage/],
    ["a missing network", { appliedVoltage: 5 }, /network/],
    ["an array body", [1, 2], /^$/],
    ["malformed JSON", '{"network": {', /^$/],
    ["an empty body", "", /^$/],
    ["depth 65", { network: deep(65) }, /network/],
  ];
  it.each(bad)("answers 400 with issues for %s", async (_name, body, pathPattern) => {
    const res = await evaluate(post("/api/v1/networks/evaluate", body, typeof body === "string"));
    expect(res.status).toBe(400);
    const json = await res.json();
    expect(typeof json.error).toBe("string");
    expect(json.issues.length).toBeGreaterThan(0);
    expect(json.issues[0].path).toMatch(pathPattern);
  });

  it("answers 400, not a crash, for a 100,000-deep network", async () => {
    const text =
      '{"network":' +
      '{"kind":"series","children":['.repeat(100_000) +
      '{"kind":"cell","id":"x","capacitance":1,"ratedVoltage":1}' +
      "]}".repeat(100_000) +
      "}";
    const res = await evaluate(post("/api/v1/networks/evaluate", text, true));
    expect(res.status).toBe(400);
  });

  it("answers 400 for more than 20,000 cells and for a body over 1 MB", async () => {
    const many = { network: { kind: "parallel", children: Array.from({ length: 20_001 }, (_, i) => cell(`c${i}`, 1, 2.7)) } };
    const res = await evaluate(post("/api/v1/networks/evaluate", many));
    expect(res.status).toBe(400);
    const big = await evaluate(post("/api/v1/networks/evaluate", JSON.stringify({ network: cell("a", 1, 2.7), pad: "x".repeat(1_100_000) }), true));
    expect(big.status).toBe(400);
    expect((await big.json()).error).toMatch(/larger than 1 MB/);
  });

  it("accepts 15,000 cells in a body under 1 MB (20,000 cells do not fit in 1 MB of JSON)", async () => {
    const ok = { appliedVoltage: 2, network: { kind: "parallel", children: Array.from({ length: 15_000 }, (_, i) => cell(`c${i}`, 1, 2.7)) } };
    const res = await evaluate(post("/api/v1/networks/evaluate", ok));
    expect(res.status).toBe(200);
    expect((await res.json()).capacitance).toBeCloseTo(15_000, 6);
  });
});

describe("POST /api/v1/networks/failures", () => {
  const rated = (id: string) => ({ kind: "cell", id, capacitance: 100, ratedVoltage: 2.7, surgeVoltage: 2.85 });
  // two strings of four 100 F cells at 10 V: 2.5 V per cell
  const strings = { kind: "parallel", children: [0, 1].map((s) => ({ kind: "series", children: [0, 1, 2, 3].map((i) => rated(`s${s}c${i}`)) })) };

  it("answers one case per cell and mode, and a verdict per mode", async () => {
    const res = await failures(post("/api/v1/networks/failures", { appliedVoltage: 10, network: strings }));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(Object.keys(body).sort()).toEqual(["appliedVoltage", "cases", "healthy", "listLimit", "summary"]);
    expect(body.cases).toHaveLength(16);
    // s0c0 shorted: its string's other three cells share 10 V → 3.33 V each, past the 2.85 V surge;
    // capacitance 100/3 F in parallel with 25 F
    expect(body.cases[0]).toEqual({
      cellId: "s0c0",
      mode: "short",
      capacitance: expect.closeTo(100 / 3 + 25, 9),
      maxCellVoltage: expect.closeTo(10 / 3, 9),
      overstressed: ["s0c1", "s0c2", "s0c3"],
      overstressedCount: 3,
      pastSurge: ["s0c1", "s0c2", "s0c3"],
      pastSurgeCount: 3,
      shortCircuit: false,
    });
    // s0c0 open: its string drops out, the other string keeps 2.5 V per cell
    expect(body.cases[1]).toMatchObject({
      cellId: "s0c0",
      mode: "open",
      capacitance: expect.closeTo(25, 9),
      maxCellVoltage: expect.closeTo(2.5, 9),
      overstressedCount: 0,
      shortCircuit: false,
    });
    expect(body.summary.short).toMatchObject({ mode: "short", survives: false, withinRating: false });
    expect(body.summary.short.text).toBe(
      "Survives one shorted cell: no — with cell s0c0 shorted, cell s0c1 reaches 3.33 V, surge 2.85 V (3 cells past surge).",
    );
    expect(body.summary.open).toMatchObject({ mode: "open", survives: true, withinRating: true });
  });

  it("reports a short across a parallel bank as a short circuit with no capacitance", async () => {
    const res = await failures(post("/api/v1/networks/failures", { appliedVoltage: 2, network: { kind: "parallel", children: [rated("a"), rated("b")] } }));
    const body = await res.json();
    expect(body.cases[0]).toMatchObject({ cellId: "a", mode: "short", capacitance: null, shortCircuit: true });
  });

  const bad: [string, unknown, RegExp][] = [
    ["no applied voltage", { network: strings }, /^appliedVoltage$/],
    ["a repeated cell id", { appliedVoltage: 5, network: { kind: "series", children: [rated("a"), rated("a")] } }, /^network\.children\[1\]\.id$/],
    ["a surge voltage below the rating", { appliedVoltage: 5, network: { ...rated("a"), surgeVoltage: 1 } }, /^network\.surgeVoltage$/],
    ["an empty group", { appliedVoltage: 5, network: { kind: "series", children: [] } }, /^network/],
    ["an array body", [strings], /^$/],
  ];
  it.each(bad)("answers 400 with the field for %s", async (_name, body, pathPattern) => {
    const res = await failures(post("/api/v1/networks/failures", body));
    expect(res.status).toBe(400);
    const json = await res.json();
    expect(typeof json.error).toBe("string");
    expect(json.issues[0].path).toMatch(pathPattern);
  });

  it("answers 400 for more than 20,000 cells and for a body over 1 MB", async () => {
    const many = {
      appliedVoltage: 1,
      network: { kind: "parallel", children: Array.from({ length: 20_001 }, (_, i) => ({ kind: "cell", id: `c${i}`, capacitance: 1, ratedVoltage: 1 })) },
    };
    expect((await failures(post("/api/v1/networks/failures", many))).status).toBe(400);
    const big = await failures(post("/api/v1/networks/failures", JSON.stringify({ appliedVoltage: 1, network: rated("a"), pad: "x".repeat(1_100_000) }), true));
    expect(big.status).toBe(400);
    expect((await big.json()).error).toMatch(/larger than 1 MB/);
  });
});

describe("POST /api/v1/networks/tolerance", () => {
  const graded = (id: string) => ({ kind: "cell", id, capacitance: 350, ratedVoltage: 2.7, surgeVoltage: 2.85, toleranceMinus: 0.1, tolerancePlus: 0.2 });
  const string = { kind: "series", children: Array.from({ length: 10 }, (_, i) => graded(`c${i}`)) };
  const run = {
    appliedVoltage: 26,
    network: string,
    samples: 20_000,
    seed: 12345,
    distribution: "normal",
    matchingTolerance: 0.05,
    requirement: { capacitance: 35 },
  };

  it("answers the distributions, histograms and shares, the same for the same body and seed", async () => {
    const res = await tolerance(post("/api/v1/networks/tolerance", run));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(Object.keys(body).sort()).toEqual([
      "capacitance",
      "distribution",
      "histogram",
      "maxCellVoltage",
      "nominal",
      "requiredCapacitance",
      "samples",
      "seed",
      "shares",
    ]);
    expect(body.samples).toBe(20_000);
    for (const d of [body.capacitance, body.maxCellVoltage]) {
      expect(Object.keys(d).sort()).toEqual(["max", "mean", "min", "p01", "p50", "p99", "std"]);
      expect(d.min).toBeLessThanOrEqual(d.p01);
      expect(d.p01).toBeLessThanOrEqual(d.p50);
      expect(d.p50).toBeLessThanOrEqual(d.p99);
      expect(d.p99).toBeLessThanOrEqual(d.max);
    }
    // graded to ±5 %: the string's capacitance stays within ±5 % of its nominal 35 F
    expect(body.capacitance.min).toBeGreaterThanOrEqual(35 * 0.95 - 1e-9);
    expect(body.capacitance.max).toBeLessThanOrEqual(35 * 1.05 + 1e-9);
    expect(body.histogram.capacitance.reduce((a: number, b: { count: number }) => a + b.count, 0)).toBe(20_000);
    expect(body.shares.meetingRequirement).toBeGreaterThan(0);
    expect(body.shares.meetingRequirement).toBeLessThan(1);
    const again = await tolerance(post("/api/v1/networks/tolerance", run));
    expect(await again.json()).toEqual(body);
  });

  const bad: [string, unknown, RegExp, RegExp?][] = [
    ["more than 100,000 samples", { ...run, samples: 100_001 }, /^samples$/],
    [
      "samples × network size past the bound",
      { ...run, network: { kind: "parallel", children: Array.from({ length: 400 }, (_, i) => graded(`p${i}`)) }, samples: 100_000 },
      /^samples$/,
      /at most 30,000,000; here 100,000 × 401: use at most 74,812 samples/,
    ],
    ["an unknown distribution", { ...run, distribution: "triangular" }, /^distribution$/],
    ["a seed past 32 bits", { ...run, seed: 2 ** 32 }, /^seed$/],
    ["a tolerance of −100 %", { ...run, network: { ...graded("a"), toleranceMinus: 1 } }, /^network\.toleranceMinus$/],
    ["no seed", { ...run, seed: undefined }, /^seed$/],
  ];
  it.each(bad)("answers 400 with the field for %s", async (_name, body, pathPattern, errorPattern) => {
    const res = await tolerance(post("/api/v1/networks/tolerance", body));
    expect(res.status).toBe(400);
    const json = await res.json();
    expect(json.issues[0].path).toMatch(pathPattern);
    if (errorPattern) expect(json.error).toMatch(errorPattern);
  });
});

describe("POST /api/v1/shops/{shop}/arrangements", () => {
  // shops of this file's own, with Kestrel's and Marlow's catalogs
  let kestrel: TestShop;
  let marlow: TestShop;
  beforeAll(async () => {
    [kestrel, marlow] = await Promise.all([createShop("kestrel"), createShop("marlow")]);
  });

  it("finds priced 48 V options with 20 kJ usable down to 24 V from Kestrel's catalog", async () => {
    const requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 2 };
    const res = await arrangements(post(`/api/v1/shops/${kestrel.slug}/arrangements`, requirement), params(kestrel.slug));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.designFactors).toMatchObject({ capacitanceFade: 0.2, resistorSeries: "E24", safeVoltage: 60 });
    expect(body.options.length).toBeGreaterThan(0);
    expect(body.options.length).toBeLessThanOrEqual(12);
    const skus = new Set((await listActiveCells(kestrel.id)).map((c) => c.sku));
    for (const o of body.options) {
      expect(skus.has(o.cell.sku)).toBe(true);
      expect(o.maxVoltage).toBeGreaterThanOrEqual(48);
      expect(o.usableEnergy).toBeGreaterThanOrEqual(20_000);
      // usable energy between 48 V and 24 V with the design capacitance: ½·C·(48² − 24²)
      expect(o.usableEnergy).toBeCloseTo(0.5 * o.capacitance.design * (48 ** 2 - 24 ** 2), 6);
      expect(o.topology).toMatch(/^(series-of-parallel-groups|parallel-of-series-strings)$/);
      expect(o.cellCount).toBe(o.seriesCount * o.parallelCount);
      expect(o.price.currency).toBe("EUR");
      expect(o.price.amount).toMatch(/^\d+\.\d{2}$/);
      expect(o.price.quantity).toBe(2);
      expect(typeof o.pareto).toBe("boolean");
      expect(o.cautions.length).toBeGreaterThan(0);
    }
    // ranked by price: never a dearer option before a cheaper one
    const prices = body.options.map((o: { price: { perBank: string } }) => Number(o.price.perBank));
    expect([...prices].sort((a, b) => a - b)).toEqual(prices);
    expect(body.options.some((o: { pareto: boolean }) => o.pareto)).toBe(true);
  });

  it("answers options: [] with reasons when nothing in the catalog can do it", async () => {
    const res = await arrangements(post(`/api/v1/shops/${marlow.slug}/arrangements`, { maxVoltage: 800, energy: 5e8, maxMass: 10 }), params(marlow.slug));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.options).toEqual([]);
    expect(body.reasons.length).toBeGreaterThan(0);
  });

  it("answers 400 at the field for 1e17 V (beyond the 2 MV bound), where the search once never returned", async () => {
    const res = await arrangements(post(`/api/v1/shops/${kestrel.slug}/arrangements`, { maxVoltage: 1e17, energy: 1 }), params(kestrel.slug));
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.issues).toContainEqual({ path: "maxVoltage", message: "Maximum voltage must be at most 2 MV" });
  });

  it("answers 400 for a requirement with nothing to size for, and 404 for an unknown shop", async () => {
    const res = await arrangements(post(`/api/v1/shops/${kestrel.slug}/arrangements`, { maxVoltage: 48 }), params(kestrel.slug));
    expect(res.status).toBe(400);
    expect((await res.json()).issues.length).toBeGreaterThan(0);
    const missing = await arrangements(post("/api/v1/shops/nowhere/arrangements", { maxVoltage: 48, energy: 1 }), params("nowhere"));
    expect(missing.status).toBe(404);
  });
});

describe("the storefront's search action", () => {
  let kestrel: TestShop;
  beforeAll(async () => {
    kestrel = await createShop("kestrel");
  });

  it('refuses "1e17 V" typed into the form at the maximum-voltage field, before any search', async () => {
    await actAs(null);
    const r = await exploreArrangements(kestrel.slug, { ...EMPTY_REQUEST_FORM, maxVoltage: "1e17 V", sizeFor: "energy", energy: "1 kJ" });
    expect(r).toMatchObject({ ok: false, code: "invalid" });
    if (!r.ok) expect(r.fieldErrors?.maxVoltage?.join(" ")).toMatch(/at most 2 MV/);
  });
});
