import { listCustomerQuotes, listQuotes } from "@/db/queries/quotes";
import { withQuoteReader } from "@/lib/quoting/access";
import { quoteListQuerySchema } from "@/lib/validation/quote";

/** GET /api/v1/shops/{shop}/quotes — { rows, total }: a customer's own quotes, or all for staff. */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withQuoteReader(request, shop, async (ctx, scope) => {
    const q = quoteListQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
    const { rows, total } = scope.all ? await listQuotes(ctx.shop.id, q) : await listCustomerQuotes(ctx.shop.id, scope.userId, q);
    return Response.json({ rows, total });
  });
}
