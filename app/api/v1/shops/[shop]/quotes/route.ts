import { listQuotes } from "@/db/queries/quotes";
import { withShopApi } from "@/lib/auth/guards";
import { ownerScope, reads } from "@/lib/auth/ownership";
import { jsonError } from "@/lib/http/json-error";
import { quoteList } from "@/lib/validation/lists";
import { listQuotes as contract } from "@/lib/api/contracts/shops";

/**
 * GET /api/v1/shops/{shop}/quotes — { rows, total, page, size }: a customer's own quotes, or all of
 * the shop's for staff. Takes the same query as the lists (q, status, sort, dir, page, size); a value
 * the list does not take is a 400 naming it.
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(request, shop, reads("quote"), async (ctx) => {
    const { query, issues } = quoteList.parse(new URL(request.url).searchParams);
    if (issues.length > 0) return jsonError(400, "Invalid query.", issues);
    return contract.answer(await listQuotes(ctx.shop.id, ownerScope(ctx, "quote"), query));
  });
}
