import { getQuote } from "@/lib/api/contracts/quotes";
import { withShopApi } from "@/lib/auth/guards";
import { reads } from "@/lib/auth/ownership";
import { quoteRevisionForApi } from "@/lib/quoting/quote-api";
import type { QuoteRevisionResponse } from "@/lib/validation/quote-api";

/**
 * GET /api/v1/shops/{shop}/quotes/{number} — the quote's latest revision as JSON
 * (lib/validation/quote-api.ts quoteRevisionResponseSchema): arrangement, sell lines, totals, its
 * state, validity and the list of revisions. The quote's own customer and the shop's staff; any
 * other member of the shop gets 404.
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string; number: string }> }) {
  const { shop, number } = await params;
  return withShopApi(request, shop, reads("quote"), async (ctx) => {
    const answer = await quoteRevisionForApi(ctx, number);
    if (answer.status === 200) return getQuote.answer(answer.body as QuoteRevisionResponse);
    return Response.json(answer.body, { status: answer.status });
  });
}
