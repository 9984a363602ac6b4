import { MAX_TOLERANCE_SAMPLES, MAX_TOLERANCE_WORK } from "@/lib/bank/tolerance";
import { defineRoute } from "@/lib/api/contract";
import { evaluateNetworkAnswerSchema, evaluateNetworkSchema, MAX_NETWORK_CELLS, MAX_NETWORK_DEPTH } from "@/lib/validation/bank";
import { failuresAnswerSchema, failuresRequestSchema, toleranceAnswerSchema, toleranceRequestSchema } from "@/lib/validation/network-analysis";
import { REFUSED } from "./shared";

const n = (x: number) => x.toLocaleString("en");
const cell = (id: string, extra: Record<string, number> = {}) => ({ kind: "cell", id, capacitance: 100, ratedVoltage: 2.7, ...extra });
const BOUNDS = `Bounded: at most ${MAX_NETWORK_DEPTH} levels deep, ${n(MAX_NETWORK_CELLS)} cells and a 1 MB body; every number has a physical upper bound.`;
const BAD_INPUT = "The body is not JSON, breaks a bound, or a field is wrong: `issues` names each field.";

export const evaluateNetwork = defineRoute({
  method: "POST",
  path: "/api/v1/networks/evaluate",
  operationId: "evaluateNetwork",
  tag: "Engine",
  summary: "Evaluate a series/parallel network",
  description: `Equivalent capacitance, ESR, the highest voltage the network may be charged to (the weakest cell limits it), and every cell's voltage, charge and energy when charged from zero to \`appliedVoltage\` (or to that highest voltage when none is given). Ideal capacitive division, no balancing. ${BOUNDS}`,
  access: "public",
  body: { json: evaluateNetworkSchema },
  ok: { status: 200, description: "The network's figures.", json: evaluateNetworkAnswerSchema },
  errors: { 400: BAD_INPUT },
  examples: [
    {
      title: "Two 100 F cells in series with one 50 F cell in parallel, at 4 V",
      json: {
        appliedVoltage: 4,
        network: { kind: "parallel", children: [{ kind: "series", children: [cell("a"), cell("b")] }, cell("c", { capacitance: 50 })] },
      },
    },
  ],
});

export const analyzeFailures = defineRoute({
  method: "POST",
  path: "/api/v1/networks/failures",
  operationId: "analyzeNetworkFailures",
  tag: "Engine",
  summary: "What one shorted or open cell does",
  description: `For every cell failed short and failed open: the capacitance after the fault (null when it shorts the whole network), the highest voltage on a remaining cell by ideal capacitive division, the cells pushed past their rated and surge voltages, and a verdict per kind of fault in plain words. Cells may carry \`surgeVoltage\`; ids must be unique. ${BOUNDS} Rate-limited per client.`,
  access: "public",
  body: { json: failuresRequestSchema },
  ok: { status: 200, description: "One case per cell and mode, the healthy figures and the verdicts.", json: failuresAnswerSchema },
  errors: { 400: BAD_INPUT, 429: REFUSED.rateLimited },
  examples: [
    {
      title: "A string of three 100 F cells at 7.5 V",
      json: { appliedVoltage: 7.5, network: { kind: "series", children: ["a", "b", "c"].map((id) => cell(id, { surgeVoltage: 2.85 })) } },
    },
  ],
});

export const toleranceYield = defineRoute({
  method: "POST",
  path: "/api/v1/networks/tolerance",
  operationId: "runToleranceYield",
  tag: "Engine",
  summary: "Tolerance yield by seeded Monte-Carlo",
  description: `Samples each cell's capacitance within its tolerance (uniform over the band, or normal with the band as ±3σ, truncated), narrowed by the shop's grading \`matchingTolerance\`. Answers the distributions of the equivalent capacitance and of the highest cell voltage, their histograms and the shares within surge, within rating and meeting the requirement. The same body and seed give the same numbers. At most ${n(MAX_TOLERANCE_SAMPLES)} samples and samples × (cells + groups) ≤ ${n(MAX_TOLERANCE_WORK)}. Rate-limited per client.`,
  access: "public",
  body: { json: toleranceRequestSchema },
  ok: { status: 200, description: "The yield figures.", json: toleranceAnswerSchema },
  errors: { 400: BAD_INPUT, 429: REFUSED.rateLimited },
  examples: [
    {
      title: "Three −10 %/+20 % cells graded to ±5 %, 10,000 normal samples",
      json: {
        appliedVoltage: 7.5,
        samples: 10000,
        seed: 42,
        distribution: "normal",
        matchingTolerance: 0.05,
        requirement: { capacitance: 32 },
        network: { kind: "series", children: ["a", "b", "c"].map((id) => cell(id, { surgeVoltage: 2.85, toleranceMinus: 0.1, tolerancePlus: 0.2 })) },
      },
    },
  ],
});
