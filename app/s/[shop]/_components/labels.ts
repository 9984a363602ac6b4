import type { Technology, Topology } from "@/lib/bank";

export const TECH_LABELS: Record<Technology, string> = {
  edlc: "Supercapacitor (EDLC)",
  hybrid: "Hybrid lithium-ion capacitor",
  electrolytic: "Aluminium electrolytic",
  film: "Film",
};

/** Short names for table cells. */
export const TECH_SHORT: Record<Technology, string> = { edlc: "EDLC", hybrid: "Hybrid LIC", electrolytic: "Electrolytic", film: "Film" };

export const TOPOLOGY_LABELS: Record<Topology, string> = {
  "series-of-parallel-groups": "groups in series",
  "parallel-of-series-strings": "strings in parallel",
};

/** "18 S × 4 P" */
export function arrangementLabel(o: { seriesCount: number; parallelCount: number }): string {
  return `${o.seriesCount} S × ${o.parallelCount} P`;
}

/** The identity of an option: what the customer chooses and the server finds again. */
export function optionId(o: { cell: { sku: string }; topology: Topology; seriesCount: number; parallelCount: number }): string {
  return `${o.cell.sku}|${o.topology}|${o.seriesCount}|${o.parallelCount}`;
}
