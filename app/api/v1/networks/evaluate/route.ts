import { jsonError } from "@/lib/http/json-error";
import { evaluateNetwork } from "@/lib/bank";
import { readJsonAs } from "@/lib/http/read-json";
import { parseEvaluateRequest } from "@/lib/validation/bank";
import { evaluateNetwork as contract } from "@/lib/api/contracts/networks";

/**
 * POST /api/v1/networks/evaluate — public (contract: lib/api/contracts/networks.ts). Body `{ appliedVoltage?, network }` (DESIGN.md §3.1);
 * answer `{ capacitance, esr?, maxVoltage, energy, charge, cells }`. Any bad input is a 400 with
 * `{ error, issues: [{ path, message }] }`; depth, cell count and body size are bounded.
 */
export async function POST(request: Request) {
  const parsed = await readJsonAs(request, parseEvaluateRequest);
  if (!parsed.ok) return parsed.response;
  try {
    const r = evaluateNetwork(parsed.value.network, parsed.value.appliedVoltage);
    return contract.answer({
      capacitance: r.capacitance,
      ...(r.esr !== undefined ? { esr: r.esr } : {}),
      maxVoltage: r.maxVoltage,
      energy: r.energy,
      charge: r.charge,
      cells: r.cells,
    });
  } catch (error) {
    if (error instanceof RangeError) return jsonError(400, error.message, [{ path: "network", message: error.message }]);
    throw error;
  }
}
