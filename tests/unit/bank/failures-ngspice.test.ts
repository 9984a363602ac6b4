/**
 * Source: ngspice (Debian package `ngspice`) transient simulation. Each bank below is netted from
 * the same tree the engine analyses, with one cell replaced by a 1 mΩ resistor (short) or left out
 * (open), and charged from a DC source through a resistor to steady state (30 time constants).
 * Every remaining cell's voltage, and the capacitance after the fault (charge delivered ÷ source
 * voltage), must agree with the engine within 0.1 %.
 */
import { spawnSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { analyzeFault, analyzeNetworkFailures, type NetworkNode } from "@/lib/bank";
import { cellVoltageFrom, networkToNetlist, runNgspice } from "./spice";

const cell = (id: string, microfarads: number): NetworkNode => ({ kind: "cell", id, capacitance: microfarads * 1e-6, ratedVoltage: 100 });
const series = (...children: NetworkNode[]): NetworkNode => ({ kind: "series", children });
const parallel = (...children: NetworkNode[]): NetworkNode => ({ kind: "parallel", children });

const banks: { name: string; tree: NetworkNode }[] = [
  { name: "a string of four mismatched cells", tree: series(cell("a", 1), cell("b", 4.7), cell("c", 10), cell("d", 2.2)) },
  {
    name: "three parallel groups of two in series",
    tree: series(parallel(cell("g1a", 10), cell("g1b", 12)), parallel(cell("g2a", 8.2), cell("g2b", 10)), parallel(cell("g3a", 9), cell("g3b", 11))),
  },
  {
    name: "two strings of three in parallel",
    tree: parallel(series(cell("s1a", 10), cell("s1b", 10), cell("s1c", 15)), series(cell("s2a", 4.7), cell("s2b", 6.8), cell("s2c", 5.6))),
  },
  { name: "12 µF in series with 2 µF ∥ 4 µF", tree: series(cell("c1", 12), parallel(cell("c2", 2), cell("c3", 4))) },
  {
    name: "three levels of nesting",
    tree: series(parallel(series(cell("x1", 10), cell("x2", 22)), cell("x3", 4.7)), cell("y1", 15)),
  },
];

function ngspiceAvailable(): void {
  const probe = spawnSync("ngspice", ["-v"], { encoding: "utf8" });
  if (probe.error) throw new Error('ngspice is not installed or not on PATH: install the Debian package "ngspice" to run these checks');
}

describe("one-cell failures against ngspice transient simulation", () => {
  const sourceVoltage = 10;
  for (const { name, tree } of banks) {
    const analysis = analyzeNetworkFailures(tree, sourceVoltage);
    for (const c of analysis.cases) {
      it(`${name}: cell ${c.cellId} ${c.mode}`, { timeout: 60_000 }, () => {
        ngspiceAvailable();
        const detail = analyzeFault(tree, sourceVoltage, c.cellId, c.mode);
        const tauCapacitance = Math.max(analysis.healthy.capacitance, c.capacitance ?? 0);
        const netlist = networkToNetlist(tree, {
          sourceVoltage,
          chargeResistance: 1000,
          equivalentCapacitance: tauCapacitance,
          faults: new Map([[c.cellId, c.mode]]),
        });
        const spice = runNgspice(netlist.text);
        for (const cellState of detail.cells) {
          const spiceVoltage = cellVoltageFrom(spice, netlist.cellNodes.get(cellState.id)!);
          expect(Math.abs(spiceVoltage - cellState.voltage), `cell ${cellState.id}`).toBeLessThan(
            1e-3 * Math.max(Math.abs(cellState.voltage), 1e-3 * sourceVoltage),
          );
        }
        if (!c.shortCircuit) {
          // ngspice reports the source current into its + terminal: delivered charge is negative
          const spiceCapacitance = -(spice.get("qsrc") as number) / sourceVoltage;
          if (c.capacitance === 0) expect(Math.abs(spiceCapacitance)).toBeLessThan(1e-6 * analysis.healthy.capacitance);
          else expect(Math.abs(spiceCapacitance / (c.capacitance as number) - 1)).toBeLessThan(1e-3);
        }
      });
    }
  }
});
