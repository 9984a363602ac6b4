import { loadShopCatalog } from "@/db/queries/catalog";
import { getShopBySlug } from "@/db/queries/shops";
import { refusedResponse } from "@/lib/auth/guards";
import { env } from "@/lib/env";
import { jsonError } from "@/lib/http/json-error";
import { readJsonBody } from "@/lib/http/read-json";
import { clientKey, createRateLimiter } from "@/lib/http/rate-limit";
import { searchPricedOptions } from "@/lib/quoting/priced-search";
import { parseArrangementRequest } from "@/lib/validation/bank";

const limiter = createRateLimiter({ limit: env.API_RATE_LIMIT_PER_MINUTE, windowMs: 60_000 });

/**
 * POST /api/v1/shops/{shop}/arrangements — open to visitors (DESIGN.md §3.2): a requirement in
 * SI units in, `{ designFactors, options, reasons? }` out, from the shop's active catalog and
 * priced by its rules. Rate-limited per client.
 */
export async function POST(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const gate = limiter.hit(clientKey(request.headers));
  if (!gate.allowed) {
    return jsonError(429, `Too many requests; try again in ${gate.retryAfterSeconds} s.`, undefined, { headers: { "retry-after": String(gate.retryAfterSeconds) } });
  }
  const { shop: slug } = await params;
  const shop = await getShopBySlug(slug);
  if (!shop) return refusedResponse("no-shop");
  const body = await readJsonBody(request);
  if (!body.ok) return body.response;
  const parsed = parseArrangementRequest(body.value);
  if (!parsed.ok) return jsonError(400, parsed.error, parsed.issues);
  const result = searchPricedOptions(await loadShopCatalog(shop.id), parsed.data);
  return Response.json({
    designFactors: result.designFactors,
    options: result.options,
    ...(result.options.length === 0 ? { reasons: result.reasons } : {}),
  });
}
