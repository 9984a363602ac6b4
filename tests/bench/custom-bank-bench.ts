/**
 * What one edit in the network editor costs in the browser: evaluating, summarising and pricing a
 * custom bank at the editor's largest size (1,000 cells: 40 groups in series of 25 cells each, two
 * invented parts mixed), as the workbench does on every keystroke. `npx tsx tests/bench/custom-bank-bench.ts`.
 * Figures only — nothing here fails a build. Target: a median under 50 ms, so typing stays fluid.
 */
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank";
import { DEFAULT_PRICING_RULES } from "@/lib/pricing";
import { composeRevision, resolveCustomBank } from "@/lib/quoting/compose-revision";
import { NO_OVERRIDES } from "@/lib/quoting/review-search";
import type { CustomNode } from "@/lib/quoting/types";
import { SAMPLE_CELL } from "../unit/quoting/sample-quote";

const RUNS = 30;
const TARGET_MEDIAN_MS = 50;
const other = { ...SAMPLE_CELL, id: "bench-2", sku: "BWC-2400-27", capacitanceF: 2400, unitCost: "31.2000" };
const tree: CustomNode = {
  kind: "series",
  children: Array.from({ length: 40 }, (_, g) => ({
    kind: "parallel" as const,
    children: Array.from({ length: 25 }, (_, i) => ({ kind: "cell" as const, sku: (g + i) % 5 === 0 ? other.sku : SAMPLE_CELL.sku })),
  })),
};
const requirement = { maxVoltage: 96, minVoltage: 48, energy: 500_000, quantity: 2 };

function edit() {
  const r = resolveCustomBank(tree, {
    cells: [SAMPLE_CELL, other],
    retiredSkus: new Set(),
    components: [],
    rules: DEFAULT_PRICING_RULES,
    factors: DEFAULT_DESIGN_FACTORS,
    shopFactors: DEFAULT_DESIGN_FACTORS,
    overrides: NO_OVERRIDES,
    requirement,
  });
  if (!r.ok) throw new Error(r.message);
  return composeRevision(r.bank, { bankPrice: null, lines: [], discount: { kind: "percent", value: "3", reason: "bench" } }, DEFAULT_PRICING_RULES, 2);
}

edit();
const times: number[] = [];
for (let i = 0; i < RUNS; i++) {
  const t0 = performance.now();
  edit();
  times.push(performance.now() - t0);
}
times.sort((a, b) => a - b);
const median = times[Math.floor(RUNS / 2)] ?? NaN;
const p95 = times[Math.min(RUNS - 1, Math.ceil(0.95 * RUNS) - 1)] ?? NaN;
console.log(
  `custom bank of 1,000 cells, evaluated, summarised and priced: median ${median.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms (target median < ${TARGET_MEDIAN_MS} ms)`,
);
