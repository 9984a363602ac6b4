import { getQuoteRevision } from "@/lib/api/contracts/quotes";
import { withShopApi } from "@/lib/auth/guards";
import { reads } from "@/lib/auth/ownership";
import { jsonError } from "@/lib/http/json-error";
import { quoteRevisionForApi } from "@/lib/quoting/quote-api";
import type { QuoteRevisionResponse } from "@/lib/validation/quote-api";

/** GET /api/v1/shops/{shop}/quotes/{number}/revisions/{n} — one revision of the quote, as GET …/quotes/{number} answers the latest. */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string; number: string; n: string }> }) {
  const { shop, number, n } = await params;
  return withShopApi(request, shop, reads("quote"), async (ctx) => {
    if (!/^[1-9]\d{0,5}$/.test(n)) return jsonError(404, `Quote ${number} has no revision ${n}.`);
    const answer = await quoteRevisionForApi(ctx, number, Number(n));
    if (answer.status === 200) return getQuoteRevision.answer(answer.body as QuoteRevisionResponse);
    return Response.json(answer.body, { status: answer.status });
  });
}
