import { runToleranceYield } from "@/lib/bank";
import { parseToleranceRequest } from "@/lib/validation/network-analysis";
import { toleranceYield } from "@/lib/api/contracts/networks";
import { engineEndpoint } from "../engine-endpoint";

/**
 * POST /api/v1/networks/tolerance — public, rate-limited per client. Body `{ appliedVoltage, network,
 * samples (≤ 100,000), seed, distribution: "uniform" | "normal", matchingTolerance?, defaultTolerance?,
 * requirement?, bins? }`; cells may carry `toleranceMinus`/`tolerancePlus` (fractions) and
 * `surgeVoltage`. Answers `{ samples, seed, distribution, nominal, capacitance, maxCellVoltage,
 * histogram: { capacitance, maxCellVoltage }, shares, requiredCapacitance }` (DESIGN.md §3.5); same
 * body and seed, same numbers. samples × network size is bounded so one request stays near a second
 * of CPU. Bad input: 400 `{ error, issues }`.
 */
export const POST = engineEndpoint(toleranceYield, parseToleranceRequest, runToleranceYield);
