import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  DEFAULT_DESIGN_FACTORS,
  DEFAULT_RELIABILITY_SETTINGS,
  searchArrangements,
  shippingNotes,
  standbyDrainSeconds,
  standingHeat,
  technologyCautions,
  transportEnergyWh,
  type DesignFactors,
  type Requirement,
} from "@/lib/bank";
import { edlc3000, hybridCell } from "./cells";

const hybrid = hybridCell;
const edlc = edlc3000;

const factors: DesignFactors = DEFAULT_DESIGN_FACTORS;

describe("hybrid cells stay above their minimum voltage", () => {
  it("48 V → 24 V is refused: the shortest safe string is 14 cells, 24/14 = 1.71 V per cell, below 2.2 V; the reason names the 30.8 V the bank would need", () => {
    const r = searchArrangements({ requirement: { maxVoltage: 48, minVoltage: 24, energy: 20_000 }, cells: [hybrid()], factors });
    expect(r.options).toEqual([]);
    const reason = r.reasons.find((x) => x.startsWith("hybrid:")) ?? "";
    // N_s: 48/3.8 → 13, V_w(13) = 48/(1 + 12·0.95/1.05) = 4.05 V > 4 V surge; V_w(14) = 3.76 V ≤ 3.8 V
    expect(reason).toContain("14 cells in series");
    expect(reason).toContain("1.71 V");
    expect(reason).toContain("2.2 V minimum");
    expect(reason).toContain("30.8 V");
  });

  it("48 V → 36 V is offered (36/16 ≥ 2.2 V), and every option keeps V_min per cell at or above the minimum", () => {
    const r = searchArrangements({ requirement: { maxVoltage: 48, minVoltage: 36, energy: 5000 }, cells: [hybrid()], factors });
    expect(r.options.length).toBeGreaterThan(0);
    for (const o of r.options) {
      expect(36 / o.seriesCount).toBeGreaterThanOrEqual(2.2);
      expect(o.handling.floorVoltage).toBeCloseTo(o.seriesCount * 2.2, 9);
      expect(o.cell.minVoltage).toBe(2.2);
    }
  });

  it("a request without a minimum voltage gets no hybrid option: a hybrid bank cannot be emptied to 0 V", () => {
    const r = searchArrangements({ requirement: { maxVoltage: 48, energy: 5000 }, cells: [hybrid(), edlc()], factors });
    expect(r.options.length).toBeGreaterThan(0);
    expect(r.options.every((o) => o.cell.technology !== "hybrid")).toBe(true);
  });

  it("a hybrid cell without its minimum voltage is incomplete data", () => {
    const r = searchArrangements({ requirement: { maxVoltage: 48, minVoltage: 36, energy: 5000 }, cells: [hybrid({ minVoltage: null })], factors });
    expect(r.options).toEqual([]);
    expect(r.reasons.join(" ")).toContain("a hybrid cell needs its minimum voltage");
  });

  it("property: no option's cells sit below their minimum at V_min", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 5, max: 900, noNaN: true }),
        fc.double({ min: 0.3, max: 0.95, noNaN: true }),
        fc.double({ min: 1.5, max: 3, noNaN: true }),
        (vMax, ratio, cellMin) => {
          const vMin = vMax * ratio;
          const r = searchArrangements({
            requirement: { maxVoltage: vMax, minVoltage: vMin, energy: 1000 },
            cells: [hybrid({ minVoltage: cellMin })],
            factors,
          });
          for (const o of r.options) expect(vMin / o.seriesCount).toBeGreaterThanOrEqual(cellMin * (1 - 1e-9));
        },
      ),
      { numRuns: 200 },
    );
  });

  it("no permanent bleeder is fitted across a hybrid bank: it would drain the cells below their minimum", () => {
    // 125 V → 100 V: 34 cells, floor 74.8 V, above the 60 V safe voltage
    const r = searchArrangements({ requirement: { maxVoltage: 125, minVoltage: 100, energy: 20_000 }, cells: [hybrid()], factors });
    const o = r.options[0]!;
    expect(o.discharge.bleeder).toBeNull();
    expect(o.handling.floorVoltage!).toBeGreaterThan(60);
    expect(o.cautions.join(" ")).toMatch(/cannot be brought below the 60 V safe voltage without harming its cells/);
  });
});

describe("standby drain through the balancing resistors", () => {
  // Outside check (DESIGN §7, closed forms checked by numerical integration): the closed form
  // t = R·n·C·ln((V₀ + I·R·n)/(V_min + I·R·n)) against an RK4 integration of
  // C·dV/dt = −V/(R·n) − I.
  it.each([
    { r: 39_000, n: 1, c: 1100, i: 8e-6, v0: 3.43, vMin: 2.2 },
    { r: 680, n: 1, c: 1100, i: 5e-4, v0: 3.43, vMin: 2.2 },
    { r: 1500, n: 4, c: 400, i: 4e-6, v0: 3.6, vMin: 2.5 },
  ])("closed form agrees with RK4 within 1e-6: R = $r Ω shared by $n, C = $c F, I = $i A", ({ r, n, c, i, v0, vMin }) => {
    const t = standbyDrainSeconds({ startVoltage: v0, minVoltage: vMin, capacitance: c, leakageCurrent: i, resistance: r, cellsPerResistor: n });
    const f = (v: number) => (-v / (r * n) - i) / c;
    const dt = t / 20_000;
    let v = v0;
    for (let k = 0; k < 20_000; k++) {
      const k1 = f(v);
      const k2 = f(v + (dt / 2) * k1);
      const k3 = f(v + (dt / 2) * k2);
      const k4 = f(v + dt * k3);
      v += (dt / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    }
    expect(Math.abs(v - vMin) / vMin).toBeLessThan(1e-6);
  });

  it("a hybrid bank with low-leakage cells outlasts the 90-day standby with its balancing resistors: no disconnect", () => {
    const r = searchArrangements({ requirement: { maxVoltage: 48, minVoltage: 36, energy: 5000 }, cells: [hybrid()], factors });
    for (const o of r.options) {
      expect(o.handling.standby!.needsDisconnect).toBe(false);
      expect(o.handling.standby!.seconds!).toBeGreaterThanOrEqual(90 * 86_400);
      expect(o.warnings.join(" ")).not.toMatch(/Standby drain/);
    }
  });

  it("leaky hybrid cells force small balancing resistors that drain a cell to 2.2 V within days: the option says the bank needs a disconnect", () => {
    // R ≤ (48/14)/(10 · 0.5 mA) = 686 Ω → 680 Ω; the cell at its lower tolerance, 1100·0.9 = 990 F:
    // R·C = 673,200 s; ln((3.4286 + 0.34)/(2.2 + 0.34)) = 0.3945 → 265,600 s, about 3.07 days
    const r = searchArrangements({
      requirement: { maxVoltage: 48, minVoltage: 36, energy: 5000 },
      cells: [hybrid({ leakageCurrent: 5e-4 })],
      factors,
    });
    const o = r.options.find((x) => x.seriesCount === 14 && x.parallelCount === 1)!;
    expect(o.balancing.resistance).toBe(680);
    expect(o.handling.standby!.seconds! / 86_400).toBeCloseTo(3.07, 2);
    expect(o.handling.standby!.needsDisconnect).toBe(true);
    expect(o.warnings.join(" ")).toMatch(/the bank needs a disconnect that opens the balancing circuit/);
  });

  it("a longer standby setting turns the same bank into one that needs a disconnect", () => {
    const requirement: Requirement = { maxVoltage: 48, minVoltage: 36, energy: 5000 };
    const o = searchArrangements({ requirement, cells: [hybrid()], factors, reliability: { ...DEFAULT_RELIABILITY_SETTINGS, standbyDays: 3000 } }).options[0]!;
    expect(o.handling.standby!.needsDisconnect).toBe(true);
  });

  it("EDLC, electrolytic and film cells have no minimum: no standby check", () => {
    const o = searchArrangements({ requirement: { maxVoltage: 48, minVoltage: 24, energy: 20_000 }, cells: [edlc()], factors }).options[0]!;
    expect(o.handling.standby).toBeNull();
    expect(o.handling.floorVoltage).toBeNull();
  });
});

describe("cautions per technology", () => {
  const base = { maxVoltage: 48, safeVoltage: 60, storedEnergy: 50_000, highEnergy: 10, floorVoltage: null, minCellVoltage: null };
  it.each(["edlc", "electrolytic", "film"] as const)(
    "%s: discharge and short the terminals before handling; ship discharged with a shorting link",
    (technology) => {
      const c = technologyCautions({ ...base, technology }).join(" ");
      expect(c).toContain("discharge it and short its terminals before handling");
      expect(c).toContain("Ship discharged, with a shorting link");
      expect(c).not.toMatch(/never short/i);
    },
  );

  it("hybrid: never shorted nor taken below its floor, handled as live, ships partly charged", () => {
    const c = technologyCautions({ ...base, technology: "hybrid", floorVoltage: 33, minCellVoltage: 2.2 }).join(" ");
    expect(c).toContain("never short the terminals and never discharge the bank below 33 V (2.2 V per cell)");
    expect(c).toContain("Ships partly charged");
    expect(c).not.toContain("short its terminals before handling");
    expect(c).not.toContain("shorting link");
    // 33 V floor is below the 60 V safe voltage: no disconnect caution
    expect(c).not.toContain("cannot be brought below");
  });

  it("every technology ends with the engineering-estimate line and shows shock and burn hazards where they apply", () => {
    for (const technology of ["edlc", "hybrid", "electrolytic", "film"] as const) {
      const c = technologyCautions({ ...base, technology, maxVoltage: 400, floorVoltage: technology === "hybrid" ? 220 : null });
      expect(c.at(-1)).toContain("engineering estimate");
      expect(c[0]).toContain("Shock hazard");
      expect(c[1]).toContain("Burn and arc hazard");
    }
  });

  it("the options carry them: an EDLC option says short before handling, a hybrid one never to short", () => {
    const requirement: Requirement = { maxVoltage: 48, minVoltage: 36, energy: 5000 };
    const e = searchArrangements({ requirement, cells: [edlc()], factors }).options[0]!;
    const h = searchArrangements({ requirement, cells: [hybrid()], factors }).options[0]!;
    expect(e.cautions.join(" ")).toContain("short its terminals before handling");
    expect(h.cautions.join(" ")).toContain("never short the terminals");
    expect(h.cautions.join(" ")).not.toContain("short its terminals before handling");
  });
});

describe("shipping notes per technology", () => {
  // UN Model Regulations special provision 361 (UN 3499): energy = ½·C_N·U_R²; SP 372 (UN 3508):
  // ½·C_N·(U_R² − U_L²); both 0.3 Wh per capacitor (text as in 49 CFR §172.102).
  it("a 3000 F 2.7 V EDLC stores ½·3000·2.7²/3600 = 3.04 Wh: UN 3499, class 9", () => {
    expect(transportEnergyWh(edlc())).toBeCloseTo(3.0375, 4);
    const n = shippingNotes(edlc()).join(" ");
    expect(n).toContain("UN 3499");
    expect(n).toContain("3.04 Wh");
  });

  it("a 10 F 2.7 V EDLC stores 0.0101 Wh: not dangerous goods", () => {
    const n = shippingNotes(edlc({ capacitance: 10 })).join(" ");
    expect(n).toContain("not dangerous goods");
    expect(n).not.toContain("class 9");
  });

  it("a 1100 F hybrid between 3.8 V and 2.2 V stores ½·1100·(3.8² − 2.2²)/3600 = 1.47 Wh: UN 3508, asymmetric", () => {
    expect(transportEnergyWh(hybrid())).toBeCloseTo((0.5 * 1100 * (3.8 ** 2 - 2.2 ** 2)) / 3600, 9);
    const n = shippingNotes(hybrid()).join(" ");
    expect(n).toContain("UN 3508");
    expect(n).toContain("partly charged");
  });

  it("electrolytic and film: not dangerous goods (recalled from memory), shipped discharged with a shorting link", () => {
    for (const technology of ["electrolytic", "film"] as const) {
      const n = shippingNotes({ technology, capacitance: 0.0047, ratedVoltage: 450 }).join(" ");
      expect(n).toContain("recalled from memory");
      expect(n).toContain("shorting link");
    }
  });
});

describe("standing heat of the balancing resistors in their enclosure (common-practice rule)", () => {
  it("60 W inside 8 L: a 0.2 m cube of 0.24 m² at 5.5 W/m²·K runs 45 K above ambient — significant", () => {
    const h = standingHeat(60, 0, 0.008);
    expect(h.surface).toBeCloseTo(0.24, 9);
    expect(h.temperatureRise).toBeCloseTo(60 / (5.5 * 0.24), 9);
    expect(h.significant).toBe(true);
  });

  it("2.6 W among 9.5 L of cells (a 19 L case): about 1 K — not significant", () => {
    const h = standingHeat(2.6, 0.0095);
    expect(h.enclosureVolume).toBeCloseTo(0.019, 12);
    expect(h.temperatureRise).toBeLessThan(SIGNIFICANT);
    expect(h.significant).toBe(false);
  });

  it("the rise is exactly at the threshold of 5 K when P = 5·h·A", () => {
    const a = 6 * 0.1 ** 2;
    expect(standingHeat(5 * 5.5 * a, 0, 0.001).significant).toBe(true);
    expect(standingHeat(5 * 5.5 * a * 0.99, 0, 0.001).significant).toBe(false);
  });

  it("an option whose balancing resistors heat their case warns with the figures; one that does not stays quiet", () => {
    const requirement: Requirement = { maxVoltage: 48, minVoltage: 24, energy: 2000 };
    // 50 mA leakage: R ≤ 2.5 V/(10 · 50 mA) = 5 Ω per cell, about 1.2 W each, in a small case
    const hot = searchArrangements({ requirement, cells: [edlc({ capacitance: 350, leakageCurrent: 0.05, volume: 5.3e-5, mass: 0.06 })], factors }).options[0]!;
    expect(hot.handling.standingHeat.significant).toBe(true);
    expect(hot.handling.standingHeat.watts).toBeCloseTo(hot.balancing.standbyLoss, 9);
    expect(hot.warnings.join(" ")).toMatch(/Standing heat: the balancing resistors dissipate .* K above ambient/);
    const cool = searchArrangements({ requirement, cells: [edlc()], factors }).options[0]!;
    expect(cool.handling.standingHeat.significant).toBe(false);
    expect(cool.warnings.join(" ")).not.toMatch(/Standing heat/);
  });
});

const SIGNIFICANT = 5;
