/**
 * Engine benchmark: network evaluation of 10,000 cells, an arrangement search over a generated
 * catalog of 10,000 invented cells with a constant-power backup requirement, the tolerance-yield
 * Monte-Carlo (100,000 samples of a 100-cell network) and the one-cell failures of 20,000 cells.
 * Run: npx tsx tests/bench/engine-bench.ts
 */
import { analyzeNetworkFailures, DEFAULT_DESIGN_FACTORS, evaluateNetwork, runToleranceYield, searchArrangements, type NetworkNode } from "../../lib/bank";
import { optionYield, optionYieldSamples } from "../../lib/bank/option-yield";
import { generateCatalog } from "../unit/bank/catalog-fixture";

const EVALUATION_TARGET_MS = 5;
const SEARCH_MEDIAN_TARGET_MS = 25;
const TOLERANCE_TARGET_MS = 250;
const FAILURES_TARGET_MS = 1000;

function stats(samples: number[]): { median: number; p95: number } {
  const s = [...samples].sort((a, b) => a - b);
  const at = (q: number): number => s[Math.min(s.length - 1, Math.floor(q * s.length))] as number;
  return { median: at(0.5), p95: at(0.95) };
}

function time(fn: () => unknown, runs: number, warmup: number): number[] {
  for (let i = 0; i < warmup; i++) fn();
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn();
    out.push(performance.now() - t0);
  }
  return out;
}

function stringsOfCells(strings: number, perString: number): NetworkNode {
  return {
    kind: "parallel",
    children: Array.from({ length: strings }, (_, s) => ({
      kind: "series" as const,
      children: Array.from({ length: perString }, (_, i) => ({
        kind: "cell" as const,
        id: `s${s}-c${i}`,
        capacitance: 350 * (1 + 0.01 * Math.sin(s * 131 + i)),
        ratedVoltage: 2.7,
        esr: 0.0032,
      })),
    })),
  };
}

function groupsInSeries(groups: number, perGroup: number): NetworkNode {
  return {
    kind: "series",
    children: Array.from({ length: groups }, (_, g) => ({
      kind: "parallel" as const,
      children: Array.from({ length: perGroup }, (_, i) => ({
        kind: "cell" as const,
        id: `g${g}-c${i}`,
        capacitance: 350 * (1 + 0.01 * Math.cos(g * 17 + i)),
        ratedVoltage: 2.7,
        esr: 0.0032,
      })),
    })),
  };
}

const ms = (x: number): string => x.toFixed(3);

export async function runEngineBench(): Promise<string[]> {
  const lines: string[] = [];
  const runs = 50;

  for (const [name, tree] of [
    ["100 strings of 100 cells in series, in parallel", stringsOfCells(100, 100)],
    ["100 groups of 100 parallel cells, in series", groupsInSeries(100, 100)],
  ] as const) {
    const s = stats(time(() => evaluateNetwork(tree), runs, 20));
    lines.push(
      `evaluateNetwork, 10,000 cells (${name}): median ${ms(s.median)} ms, p95 ${ms(s.p95)} ms — target < ${EVALUATION_TARGET_MS} ms: ${s.median < EVALUATION_TARGET_MS ? "holds" : "MISSED"}`,
    );
  }

  const cells = generateCatalog(10_000, 42);
  const requirement = { maxVoltage: 48, minVoltage: 24, backup: { power: 5000, seconds: 10 }, peakCurrent: { current: 400, maxDrop: 4 } };
  let optionCount = 0;
  const s = stats(
    time(
      () => {
        optionCount = searchArrangements({ requirement, cells, factors: DEFAULT_DESIGN_FACTORS, limit: 12 }).options.length;
      },
      runs,
      10,
    ),
  );
  lines.push(
    `searchArrangements, 10,000-cell catalog, 48 V → 24 V, 5 kW for 10 s backup (${optionCount} options): median ${ms(s.median)} ms, p95 ${ms(s.p95)} ms — target median < ${SEARCH_MEDIAN_TARGET_MS} ms: ${s.median < SEARCH_MEDIAN_TARGET_MS ? "holds" : "MISSED"}`,
  );

  // the same search with the customer's filters and ranking by life: every candidate's one-cell
  // failures and life are worked out before the cut
  const filtered = { ...requirement, ambientTemperature: 40, rmsCurrent: 100, survives: "both" as const, minLifeYears: 2, rankBy: "life" as const };
  let filteredCount = 0;
  const sf = stats(
    time(
      () => {
        filteredCount = searchArrangements({ requirement: filtered, cells, factors: DEFAULT_DESIGN_FACTORS, limit: 12 }).options.length;
      },
      runs,
      10,
    ),
  );
  lines.push(
    `searchArrangements, same catalog, surviving both kinds of fault, at least 2 years at 40 °C and 100 A rms, ranked by life (${filteredCount} options): median ${ms(sf.median)} ms, p95 ${ms(sf.p95)} ms — target median < ${SEARCH_MEDIAN_TARGET_MS} ms: ${sf.median < SEARCH_MEDIAN_TARGET_MS ? "holds" : "MISSED"}`,
  );

  // an option's tolerance yield as the storefront computes it on focus (the work budget caps it)
  const yieldOption = searchArrangements({
    requirement: { maxVoltage: 400, minVoltage: 200, energy: 500_000 },
    cells,
    factors: DEFAULT_DESIGN_FACTORS,
    limit: 1,
  }).options[0];
  if (yieldOption) {
    const y = stats(time(() => optionYield(yieldOption, { maxVoltage: 400, minVoltage: 200, energy: 500_000 }), 9, 2));
    lines.push(
      `optionYield, ${yieldOption.cellCount}-cell option (${optionYieldSamples(yieldOption)} samples, as on focus in the storefront): median ${ms(y.median)} ms, p95 ${ms(y.p95)} ms`,
    );
  }

  // tolerance yield: 25 groups of 4 graded cells in series (100 cells), 100,000 samples
  const graded: NetworkNode = {
    kind: "series",
    children: Array.from({ length: 25 }, (_, g) => ({
      kind: "parallel" as const,
      children: Array.from({ length: 4 }, (_, i) => ({
        kind: "cell" as const,
        id: `g${g}-c${i}`,
        capacitance: 3000,
        ratedVoltage: 2.7,
        surgeVoltage: 2.85,
        toleranceMinus: 0.1,
        tolerancePlus: 0.2,
      })),
    })),
  };
  for (const distribution of ["uniform", "normal"] as const) {
    const t = stats(
      time(
        () =>
          runToleranceYield({
            network: graded,
            appliedVoltage: 62.5,
            samples: 100_000,
            seed: 1,
            distribution,
            matchingTolerance: 0.05,
            requirement: { capacitance: 450 },
          }),
        7,
        2,
      ),
    );
    lines.push(
      `runToleranceYield, 100,000 samples × 100-cell network (25 groups of 4, ${distribution}): median ${ms(t.median)} ms, p95 ${ms(t.p95)} ms — target < ${TOLERANCE_TARGET_MS} ms: ${t.median < TOLERANCE_TARGET_MS ? "holds" : "MISSED"}`,
    );
  }

  // one-cell failures: every cell shorted and opened, 20,000 cells
  for (const [name, tree] of [
    ["200 strings of 100 cells", stringsOfCells(200, 100)],
    ["100 groups of 200 cells", groupsInSeries(100, 200)],
  ] as const) {
    const v = evaluateNetwork(tree).maxVoltage;
    const f = stats(time(() => analyzeNetworkFailures(tree, v), 5, 1));
    lines.push(
      `analyzeNetworkFailures, 20,000 cells × short and open (${name}): median ${ms(f.median)} ms, p95 ${ms(f.p95)} ms — target < ${FAILURES_TARGET_MS} ms: ${f.median < FAILURES_TARGET_MS ? "holds" : "MISSED"}`,
    );
  }
  return lines;
}

if (process.argv[1]?.replace(/\\/g, "/").endsWith("tests/bench/engine-bench.ts")) {
  void runEngineBench().then((lines) => {
    for (const line of lines) console.log(line);
  });
}
