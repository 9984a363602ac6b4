import { getRevisionIdByNumber } from "@/db/queries/quote-life";
import { getQuoteByNumber } from "@/db/queries/quotes";
import { withShopApi } from "@/lib/auth/guards";
import { maySee, reads } from "@/lib/auth/ownership";
import { jsonError } from "@/lib/http/json-error";
import { pdfResponse } from "@/lib/http/pdf-response";
import { isQuoteNumber } from "@/lib/quoting/quote-number";
import { loadQuotePdf } from "@/lib/quoting/quote-pdf-loader";

/** GET /api/v1/shops/{shop}/quotes/{number}/pdf[?revision=n] — the current revision (or revision n) as a PDF (same access as the page). */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string; number: string }> }) {
  const { shop, number } = await params;
  return withShopApi(request, shop, reads("quote"), async (ctx) => {
    const quote = isQuoteNumber(number) ? await getQuoteByNumber(ctx.shop.id, number) : null;
    if (!quote || !maySee(ctx, "quote", quote.customerUserId)) return jsonError(404, "No such quote.");
    const asked = new URL(request.url).searchParams.get("revision");
    const revisionId =
      asked === null ? quote.revisionId : /^[1-9]\d{0,5}$/.test(asked) ? await getRevisionIdByNumber(ctx.shop.id, number, Number(asked)) : null;
    if (!revisionId) return jsonError(404, `Quote ${number} has no revision ${asked ?? ""}.`);
    const { buffer, fileName } = await loadQuotePdf(ctx.shop.id, revisionId);
    return pdfResponse(buffer, fileName);
  });
}
