import { runToleranceYield } from "@/lib/bank";
import { env } from "@/lib/env";
import { jsonError } from "@/lib/http/json-error";
import { readJsonBody } from "@/lib/http/read-json";
import { clientKey, createRateLimiter } from "@/lib/http/rate-limit";
import { parseToleranceRequest } from "@/lib/validation/network-analysis";

const limiter = createRateLimiter({ limit: env.API_RATE_LIMIT_PER_MINUTE, windowMs: 60_000 });

/**
 * POST /api/v1/networks/tolerance — public, rate-limited per client. Body `{ appliedVoltage, network,
 * samples (≤ 100,000), seed, distribution: "uniform" | "normal", matchingTolerance?, defaultTolerance?,
 * requirement?, bins? }`; cells may carry `toleranceMinus`/`tolerancePlus` (fractions) and
 * `surgeVoltage`. Answers `{ samples, seed, distribution, nominal, capacitance, maxCellVoltage,
 * histogram: { capacitance, maxCellVoltage }, shares, requiredCapacitance }` (DESIGN.md §3.5); same
 * body and seed, same numbers. samples × network size is bounded so one request stays near a second
 * of CPU. Bad input: 400 `{ error, issues }`.
 */
export async function POST(request: Request) {
  const gate = limiter.hit(clientKey(request.headers));
  if (!gate.allowed) {
    return jsonError(429, `Too many requests; try again in ${gate.retryAfterSeconds} s.`, undefined, { headers: { "retry-after": String(gate.retryAfterSeconds) } });
  }
  const body = await readJsonBody(request);
  if (!body.ok) return body.response;
  const parsed = parseToleranceRequest(body.value);
  if (!parsed.ok) return jsonError(400, parsed.error, parsed.issues);
  try {
    return Response.json(runToleranceYield(parsed.data));
  } catch (error) {
    if (error instanceof RangeError) return jsonError(400, error.message, [{ path: "network", message: error.message }]);
    throw error;
  }
}
