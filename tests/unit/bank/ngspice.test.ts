/**
 * Source: ngspice (Debian package `ngspice`) transient simulation. Each network below is netted
 * from the same tree the engine evaluates, charged from a DC source through a resistor to steady
 * state (30 time constants); cell voltages and the equivalent capacitance (charge delivered by
 * the source ÷ source voltage) must agree with the engine within 0.1 %.
 */
import { spawnSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { evaluateNetwork, type NetworkNode } from "@/lib/bank";
import { cellVoltageFrom, networkToNetlist, runNgspice } from "./spice";

const cell = (id: string, microfarads: number, ratedVoltage = 100): NetworkNode => ({
  kind: "cell",
  id,
  capacitance: microfarads * 1e-6,
  ratedVoltage,
});
const series = (...children: NetworkNode[]): NetworkNode => ({ kind: "series", children });
const parallel = (...children: NetworkNode[]): NetworkNode => ({ kind: "parallel", children });

const networks: { name: string; tree: NetworkNode }[] = [
  { name: "mismatched cells in series", tree: series(cell("a", 1), cell("b", 4.7), cell("c", 10), cell("d", 2.2)) },
  {
    name: "parallel groups in series",
    tree: series(parallel(cell("a1", 10), cell("a2", 12)), parallel(cell("b1", 8.2), cell("b2", 10), cell("b3", 9)), parallel(cell("c1", 22))),
  },
  {
    name: "series strings in parallel",
    tree: parallel(
      series(cell("s1a", 10), cell("s1b", 10), cell("s1c", 15)),
      series(cell("s2a", 4.7), cell("s2b", 6.8)),
      series(cell("s3a", 33), cell("s3b", 1)),
    ),
  },
  {
    name: "three levels of nesting",
    tree: series(
      parallel(series(cell("x1", 10), cell("x2", 22)), cell("x3", 4.7)),
      parallel(cell("y1", 15), series(cell("y2", 3.3), parallel(cell("y3", 1), cell("y4", 2.2)))),
    ),
  },
  {
    name: "four levels with single-child groups",
    tree: parallel(series(parallel(series(cell("z1", 2), cell("z2", 3))), cell("z3", 5)), series(cell("z4", 7))),
  },
  {
    name: "a single weak cell in a long string",
    tree: series(cell("w1", 100), cell("w2", 100), cell("w3", 68), cell("w4", 100), cell("w5", 100), cell("w6", 100)),
  },
  {
    name: "two-by-two cross-connected bank",
    tree: parallel(series(parallel(cell("p1", 47), cell("p2", 39)), parallel(cell("p3", 56), cell("p4", 47))), cell("p5", 5.6)),
  },
];

function ngspiceAvailable(): void {
  const probe = spawnSync("ngspice", ["-v"], { encoding: "utf8" });
  if (probe.error) {
    throw new Error('ngspice is not installed or not on PATH: install the Debian package "ngspice" to run these checks');
  }
}

describe("network evaluation against ngspice transient simulation", () => {
  it("has ngspice available (fails, never skips, when it is missing)", () => {
    expect(ngspiceAvailable).not.toThrow();
  });

  for (const { name, tree } of networks) {
    it(`agrees with ngspice: ${name}`, { timeout: 60_000 }, () => {
      ngspiceAvailable();
      const sourceVoltage = 10;
      const engine = evaluateNetwork(tree, sourceVoltage);
      const netlist = networkToNetlist(tree, { sourceVoltage, chargeResistance: 1000, equivalentCapacitance: engine.capacitance });
      const spice = runNgspice(netlist.text);
      const charge = spice.get("qsrc");
      expect(charge, "ngspice reported the delivered charge").toBeDefined();
      // ngspice reports the source current into its + terminal: delivered charge is negative
      const spiceCapacitance = -(charge as number) / sourceVoltage;
      expect(Math.abs(spiceCapacitance / engine.capacitance - 1)).toBeLessThan(1e-3);
      expect(engine.cells.length).toBe(netlist.cellNodes.size);
      for (const c of engine.cells) {
        const spiceVoltage = cellVoltageFrom(spice, netlist.cellNodes.get(c.id)!);
        expect(Math.abs(spiceVoltage - c.voltage), `cell ${c.id}`).toBeLessThan(1e-3 * Math.max(Math.abs(c.voltage), 1e-3 * sourceVoltage));
      }
    });
  }
});
