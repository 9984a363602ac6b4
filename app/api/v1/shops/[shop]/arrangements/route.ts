import { loadShopCatalog } from "@/db/queries/catalog";
import { getShopBySlug } from "@/db/queries/shops";
import { refusedResponse } from "@/lib/auth/guards";
import { limits, requestClient, tooManyRequests } from "@/lib/http/limits";
import { readJsonAs } from "@/lib/http/read-json";
import { memoizedSearch } from "@/lib/quoting/search-memo";
import { parseArrangementRequest } from "@/lib/validation/bank";
import { searchArrangements as contract } from "@/lib/api/contracts/shops";

/**
 * POST /api/v1/shops/{shop}/arrangements — open to visitors (DESIGN.md §3.2): a requirement in
 * SI units in, `{ designFactors, options, reasons? }` out, from the shop's active catalog and
 * priced by its rules. Rate-limited per client.
 */
export async function POST(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const gate = await limits.publicApi.hit(requestClient(request.headers));
  if (!gate.allowed) return tooManyRequests(gate);
  const { shop: slug } = await params;
  const shop = await getShopBySlug(slug);
  if (!shop) return refusedResponse("no-shop");
  const parsed = await readJsonAs(request, parseArrangementRequest);
  if (!parsed.ok) return parsed.response;
  // the catalog and a search repeated lately are kept while the shop's catalog version is current
  const result = memoizedSearch(shop.id, shop.catalogVersion, await loadShopCatalog(shop.id, shop.catalogVersion), parsed.value);
  return contract.answer({
    designFactors: result.designFactors,
    options: result.options,
    ...(result.options.length === 0 ? { reasons: result.reasons } : {}),
  });
}
