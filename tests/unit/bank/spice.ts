/**
 * Test helper: write a network tree as an ngspice netlist and run it.
 * The bank is charged from a DC source through a resistor; every capacitor starts at 0 V.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { NetworkNode } from "@/lib/bank";

export interface SpiceNetlist {
  text: string;
  /** for every cell id: its top and bottom node names */
  cellNodes: Map<string, { top: string; bottom: string }>;
  /** every node name besides ground and the source node */
  nodes: string[];
  stopTime: number;
}

/**
 * Net the tree between node `top` and ground (0). Series children are chained through new nodes;
 * parallel children share the group's two nodes. Every internal node gets 1e15 Ω to ground so the
 * matrix is never singular (floating nodes between series capacitors).
 */
export function networkToNetlist(
  tree: NetworkNode,
  opts: {
    sourceVoltage: number;
    chargeResistance: number;
    equivalentCapacitance: number;
    /** failed cells: a short becomes a 1 mΩ resistor, an open is left out */
    faults?: ReadonlyMap<string, "short" | "open">;
  },
): SpiceNetlist {
  const lines: string[] = ["* network charged through a resistor", `V1 src 0 DC ${opts.sourceVoltage}`, `R1 src top ${opts.chargeResistance}`];
  const cellNodes = new Map<string, { top: string; bottom: string }>();
  const nodes = new Set<string>(["top"]);
  let nodeCounter = 0;
  let capCounter = 0;
  const work: { node: NetworkNode; top: string; bottom: string }[] = [{ node: tree, top: "top", bottom: "0" }];
  while (work.length > 0) {
    const { node, top, bottom } = work.pop()!;
    if (node.kind === "cell") {
      capCounter++;
      const fault = opts.faults?.get(node.id);
      if (fault === "short") lines.push(`Rshort${capCounter} ${top} ${bottom} 1e-3`);
      else if (fault !== "open") lines.push(`C${capCounter} ${top} ${bottom} ${node.capacitance} IC=0`);
      cellNodes.set(node.id, { top, bottom });
    } else if (node.kind === "parallel") {
      for (const child of node.children) work.push({ node: child, top, bottom });
    } else {
      let upper = top;
      node.children.forEach((child, i) => {
        const lower = i === node.children.length - 1 ? bottom : `n${++nodeCounter}`;
        if (lower !== "0") nodes.add(lower);
        work.push({ node: child, top: upper, bottom: lower });
        upper = lower;
      });
    }
  }
  for (const n of nodes) lines.push(`Rleak_${n} ${n} 0 1e15`);
  const tau = opts.chargeResistance * opts.equivalentCapacitance;
  const stopTime = 30 * tau;
  // read values a little before the end: the last time point may fall just short of stopTime
  const readAt = (0.99 * stopTime).toPrecision(12);
  lines.push(`.tran ${(tau / 100).toPrecision(12)} ${stopTime.toPrecision(12)} 0 ${(tau / 200).toPrecision(12)} uic`);
  lines.push(`.meas tran qsrc INTEG i(V1) FROM=0 TO=${readAt}`);
  for (const n of nodes) lines.push(`.meas tran v_${n} FIND v(${n}) AT=${readAt}`);
  lines.push(".end");
  return { text: lines.join("\n") + "\n", cellNodes, nodes: [...nodes], stopTime };
}

/** Run ngspice in batch mode and return its `.meas` results by lower-case name. */
export function runNgspice(netlist: string): Map<string, number> {
  const dir = mkdtempSync(join(tmpdir(), "faradsmith-spice-"));
  try {
    const file = join(dir, "bank.cir");
    writeFileSync(file, netlist);
    const run = spawnSync("ngspice", ["-b", file], { encoding: "utf8", timeout: 60_000 });
    if (run.error) {
      throw new Error(`ngspice could not be run (${run.error.message}); install the Debian package "ngspice"`);
    }
    const out = `${run.stdout}\n${run.stderr}`;
    const values = new Map<string, number>();
    for (const match of out.matchAll(/^\s*([a-z0-9_]+)\s*=\s*([-+]?\d[\d.]*(?:e[-+]?\d+)?)/gim)) {
      values.set((match[1] as string).toLowerCase(), Number(match[2]));
    }
    return values;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** A cell's voltage, v(top) − v(bottom), from a run's `.meas` results (node "0" is ground). */
export function cellVoltageFrom(spice: Map<string, number>, nodes: { top: string; bottom: string }): number {
  const at = (node: string): number => {
    if (node === "0") return 0;
    const v = spice.get(`v_${node}`);
    if (v === undefined) throw new Error(`ngspice did not report v(${node})`);
    return v;
  };
  return at(nodes.top) - at(nodes.bottom);
}
