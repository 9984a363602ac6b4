import { MAX_CELLS_PER_BANK } from "./bounds";
import type { NetworkCell, NetworkNode, Topology } from "./types";

export interface OptionNetworkInput {
  /** the cell's figures; every cell of the bank gets them */
  cell: Omit<NetworkCell, "kind" | "id">;
  topology: Topology;
  seriesCount: number;
  parallelCount: number;
}

/**
 * The network tree of an arrangement option, for the analyses that take a tree (tolerance yield,
 * one fault in full). Cell ids name their place, counted from 1: "g3-c2" is the second cell of the
 * third group in series; "s2-c5" the fifth cell of the second string. At most MAX_CELLS_PER_BANK
 * cells, else RangeError.
 */
export function optionNetwork(input: OptionNetworkInput): NetworkNode {
  const { cell, topology, seriesCount: ns, parallelCount: np } = input;
  if (!Number.isInteger(ns) || !Number.isInteger(np) || ns < 1 || np < 1)
    throw new RangeError("series and parallel counts must be whole numbers of at least 1");
  if (ns * np > MAX_CELLS_PER_BANK) throw new RangeError(`a bank may hold at most ${MAX_CELLS_PER_BANK} cells`);
  if (topology === "series-of-parallel-groups") {
    return {
      kind: "series",
      children: Array.from({ length: ns }, (_, s) => ({
        kind: "parallel" as const,
        children: Array.from({ length: np }, (_, p): NetworkNode => ({ ...cell, kind: "cell", id: `g${s + 1}-c${p + 1}` })),
      })),
    };
  }
  return {
    kind: "parallel",
    children: Array.from({ length: np }, (_, p) => ({
      kind: "series" as const,
      children: Array.from({ length: ns }, (_, s): NetworkNode => ({ ...cell, kind: "cell", id: `s${p + 1}-c${s + 1}` })),
    })),
  };
}
