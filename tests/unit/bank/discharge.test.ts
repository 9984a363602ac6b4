import { describe, expect, it } from "vitest";
import { constantCurrentDischarge, constantPowerDischarge, constantPowerSeconds, resistiveDischarge } from "@/lib/bank";
import { rk4ConstantPower } from "./reference";

describe("constant-power discharge", () => {
  it("without ESR matches V(t) = √(V₀² − 2·P·t/C) (closed form, DESIGN §3.3)", () => {
    const c = 58;
    const v0 = 16;
    const power = 200;
    const r = constantPowerDischarge({ capacitance: c, esr: 0, v0, power, vEnd: 8 });
    expect(r.seconds).toBeCloseTo((c * (v0 ** 2 - 8 ** 2)) / (2 * power), 9);
    expect(r.limitedBy).toBe("min-voltage");
    expect(r.points).toHaveLength(100);
    for (const pt of r.points) expect(pt.v).toBeCloseTo(Math.sqrt(v0 ** 2 - (2 * power * pt.t) / c), 6);
  });

  it("with ESR agrees with RK4 numerical integration within 1e-4", () => {
    const cases = [
      { c: 58, r: 0.019, v0: 16, p: 300, vEnd: 8 },
      { c: 3.2, r: 0.28, v0: 48, p: 900, vEnd: 24 },
      { c: 500, r: 0.002, v0: 2.7, p: 50, vEnd: 1.35 },
    ];
    for (const k of cases) {
      const closed = constantPowerSeconds(k.c, k.r, k.v0, k.p, k.vEnd);
      const numeric = rk4ConstantPower(k.c, k.r, k.v0, k.p, k.vEnd, closed / 20000);
      expect(Math.abs(closed / numeric - 1)).toBeLessThan(1e-4);
      const full = constantPowerDischarge({ capacitance: k.c, esr: k.r, v0: k.v0, power: k.p, vEnd: k.vEnd });
      expect(full.seconds).toBe(closed);
      expect(full.points.at(-1)!.v).toBeCloseTo(k.vEnd, 6);
      // the terminal voltage only falls
      for (let i = 1; i < full.points.length; i++) expect(full.points[i]!.v).toBeLessThanOrEqual(full.points[i - 1]!.v + 1e-12);
    }
  });

  it("stops at the most power the bank can deliver, V_C²/(4·ESR), when V_min is below it", () => {
    // P·ESR = 100 W · 1 Ω: the terminal voltage cannot go below √100 = 10 V
    const r = constantPowerDischarge({ capacitance: 1, esr: 1, v0: 40, power: 100, vEnd: 5 });
    expect(r.limitedBy).toBe("max-power");
    const numeric = rk4ConstantPower(1, 1, 40, 100, 5, r.seconds / 50000);
    expect(Math.abs(r.seconds / numeric - 1)).toBeLessThan(1e-3);
    expect(r.points.at(-1)!.v).toBeCloseTo(10, 6);
  });

  it("a bank that cannot deliver the power at all lasts 0 s", () => {
    expect(constantPowerSeconds(1, 1, 10, 100, 0)).toBe(0); // needs V_C ≥ 2·√(P·ESR) = 20 V
  });

  it("75 % of the stored energy is usable between V and V/2 (arithmetic: 1 − (1/2)²)", () => {
    const c = 100;
    const v = 48;
    const power = 1000;
    const seconds = constantPowerSeconds(c, 0, v, power, v / 2);
    expect((seconds * power) / (0.5 * c * v * v)).toBeCloseTo(0.75, 12);
  });
});

describe("constant-current discharge", () => {
  it("follows V(t) = V₀ − I·ESR − I·t/C (DESIGN §3.3) and matches Euler integration of dV/dt = −I/C", () => {
    const r = constantCurrentDischarge({ capacitance: 10, esr: 0.05, v0: 12, current: 20, vEnd: 6 });
    expect(r.seconds).toBeCloseTo(((12 - 1 - 6) * 10) / 20, 12);
    expect(r.points[0]!.v).toBeCloseTo(11, 12);
    let vc = 12;
    let t = 0;
    const dt = 1e-4;
    while (vc - 20 * 0.05 > 6) {
      vc -= (20 / 10) * dt;
      t += dt;
    }
    expect(Math.abs(t - r.seconds)).toBeLessThan(2 * dt);
  });

  it("never reaches vEnd without current; starts below vEnd → 0 s", () => {
    expect(constantCurrentDischarge({ capacitance: 1, esr: 0, v0: 5, current: 0, vEnd: 1 }).seconds).toBe(Infinity);
    expect(constantCurrentDischarge({ capacitance: 1, esr: 1, v0: 5, current: 10, vEnd: 1 }).seconds).toBe(0);
  });
});

describe("resistive discharge", () => {
  it("follows V(t) = V₀·e^(−t/RC): one time constant leaves 1/e", () => {
    const r = resistiveDischarge({ capacitance: 2, resistance: 5, v0: 100, vEnd: 100 / Math.E });
    expect(r.seconds).toBeCloseTo(10, 9);
    // forward-Euler integration of dV/dt = −V/(RC) reaches the same time
    let v = 100;
    let t = 0;
    const dt = 1e-4;
    while (v > 100 / Math.E) {
      v -= (v / 10) * dt;
      t += dt;
    }
    expect(Math.abs(t - r.seconds)).toBeLessThan(1e-3);
    expect(r.points.at(-1)!.v).toBeCloseTo(100 / Math.E, 9);
  });
});
