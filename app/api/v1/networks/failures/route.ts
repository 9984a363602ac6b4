import { analyzeNetworkFailures } from "@/lib/bank";
import { parseFailuresRequest } from "@/lib/validation/network-analysis";
import { analyzeFailures } from "@/lib/api/contracts/networks";
import { engineEndpoint } from "../engine-endpoint";

/**
 * POST /api/v1/networks/failures — public, rate-limited per client. Body `{ appliedVoltage, network }`
 * (the evaluate endpoint's network; cells may carry `surgeVoltage`, ids unique). Answers one case per
 * cell and mode, `{ cases: [{ cellId, mode, capacitance, maxCellVoltage, overstressed, overstressedCount,
 * pastSurge, pastSurgeCount, shortCircuit }], healthy, summary: { short, open }, listLimit }`
 * (DESIGN.md §3.5). Bad input: 400 `{ error, issues }`.
 */
export const POST = engineEndpoint(analyzeFailures, parseFailuresRequest, ({ network, appliedVoltage }) => {
  const r = analyzeNetworkFailures(network, appliedVoltage);
  return { appliedVoltage: r.appliedVoltage, healthy: r.healthy, cases: r.cases, summary: r.summary, listLimit: r.listLimit };
});
