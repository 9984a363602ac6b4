import { analyzeNetworkFailures } from "@/lib/bank";
import { env } from "@/lib/env";
import { jsonError } from "@/lib/http/json-error";
import { readJsonBody } from "@/lib/http/read-json";
import { clientKey, createRateLimiter } from "@/lib/http/rate-limit";
import { parseFailuresRequest } from "@/lib/validation/network-analysis";

const limiter = createRateLimiter({ limit: env.API_RATE_LIMIT_PER_MINUTE, windowMs: 60_000 });

/**
 * POST /api/v1/networks/failures — public, rate-limited per client. Body `{ appliedVoltage, network }`
 * (the evaluate endpoint's network; cells may carry `surgeVoltage`, ids unique). Answers one case per
 * cell and mode, `{ cases: [{ cellId, mode, capacitance, maxCellVoltage, overstressed, overstressedCount,
 * pastSurge, pastSurgeCount, shortCircuit }], healthy, summary: { short, open }, listLimit }`
 * (DESIGN.md §3.5). Bad input: 400 `{ error, issues }`.
 */
export async function POST(request: Request) {
  const gate = limiter.hit(clientKey(request.headers));
  if (!gate.allowed) {
    return jsonError(429, `Too many requests; try again in ${gate.retryAfterSeconds} s.`, undefined, { headers: { "retry-after": String(gate.retryAfterSeconds) } });
  }
  const body = await readJsonBody(request);
  if (!body.ok) return body.response;
  const parsed = parseFailuresRequest(body.value);
  if (!parsed.ok) return jsonError(400, parsed.error, parsed.issues);
  try {
    const r = analyzeNetworkFailures(parsed.data.network, parsed.data.appliedVoltage);
    return Response.json({ appliedVoltage: r.appliedVoltage, healthy: r.healthy, cases: r.cases, summary: r.summary, listLimit: r.listLimit });
  } catch (error) {
    if (error instanceof RangeError) return jsonError(400, error.message, [{ path: "network", message: error.message }]);
    throw error;
  }
}
