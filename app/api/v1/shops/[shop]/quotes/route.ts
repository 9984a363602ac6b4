import { listQuotes } from "@/db/queries/quotes";
import { withShopApi } from "@/lib/auth/guards";
import { ownerScope, reads } from "@/lib/auth/ownership";
import { quoteListQuerySchema } from "@/lib/validation/quote";

/** GET /api/v1/shops/{shop}/quotes — { rows, total }: a customer's own quotes, or all for staff. */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(request, shop, reads("quote"), async (ctx) => {
    const q = quoteListQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
    const { rows, total } = await listQuotes(ctx.shop.id, ownerScope(ctx, "quote"), q);
    return Response.json({ rows, total });
  });
}
