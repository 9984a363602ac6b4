import { jsonError } from "@/lib/http/json-error";
import { limits, requestClient, tooManyRequests } from "@/lib/http/limits";
import { readJsonAs } from "@/lib/http/read-json";
import type { z } from "zod";
import type { DefinedRoute, Sendable } from "@/lib/api/contract";
import type { ParseResult } from "@/lib/validation/bank";

/**
 * A public engine endpoint's POST handler: rate-limited per client (429 with retry-after), the
 * bounded JSON body reader, a parser that names the field of any bad input (400 `{ error, issues }`),
 * then the pure engine call; an engine RangeError is a 400 on `network`, never a 500.
 */
export function engineEndpoint<T, S extends z.ZodType>(
  contract: DefinedRoute<S>,
  parse: (json: unknown) => ParseResult<T>,
  compute: (input: T) => Sendable<z.input<S>>,
) {
  return async function POST(request: Request): Promise<Response> {
    const gate = await limits.engine.hit(requestClient(request.headers));
    if (!gate.allowed) return tooManyRequests(gate);
    const parsed = await readJsonAs(request, parse);
    if (!parsed.ok) return parsed.response;
    try {
      return contract.answer(compute(parsed.value));
    } catch (error) {
      if (error instanceof RangeError) return jsonError(400, error.message, [{ path: "network", message: error.message }]);
      throw error;
    }
  };
}
