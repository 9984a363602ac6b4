/**
 * Quote PDF rendering speed: `npx tsx tests/bench/pdf-bench.ts`. Renders one worded quote (built
 * in memory, no database) 20 times after a warm-up and prints the median and p95; the target is a
 * median under 400 ms. Figures only — nothing here fails a build.
 */
import { renderQuotePdfLayout } from "@/lib/quoting/quote-pdf-layout";
import { sampleQuoteDocument } from "../unit/quoting/sample-quote";

const RUNS = 20;
const TARGET_MEDIAN_MS = 400;

function percentile(sorted: number[], p: number): number {
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[i] ?? Number.NaN;
}

async function main() {
  const doc = sampleQuoteDocument();
  const first = performance.now();
  const warm = await renderQuotePdfLayout(doc);
  const firstMs = performance.now() - first;
  const times: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    await renderQuotePdfLayout(doc);
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const median = percentile(times, 50);
  const p95 = percentile(times, 95);
  console.log(
    `quote PDF (${warm.byteLength} bytes): first render ${firstMs.toFixed(0)} ms; over ${RUNS} renders median ${median.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms`,
  );
  console.log(`median under ${TARGET_MEDIAN_MS} ms: ${median < TARGET_MEDIAN_MS ? "yes" : "NO"}`);
}

void main();
