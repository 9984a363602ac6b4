import { getOrderDetail } from "@/db/queries/orders";
import { withShopApi } from "@/lib/auth/guards";
import { jsonError } from "@/lib/http/json-error";
import { pdfResponse } from "@/lib/http/pdf-response";
import { isOrderNumber } from "@/lib/orders/order-number";
import { loadTravelerPdf } from "@/lib/orders/order-pdf-loader";

/** GET /api/v1/shops/{shop}/orders/{number}/traveler — the build traveler PDF, for the shop's staff. */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string; number: string }> }) {
  const { shop, number } = await params;
  return withShopApi(request, shop, "order:read-all", async (ctx) => {
    const detail = isOrderNumber(number) ? await getOrderDetail(ctx.shop.id, number) : null;
    if (!detail) return jsonError(404, "No such order.");
    const { buffer, fileName } = await loadTravelerPdf(detail);
    return pdfResponse(buffer, fileName);
  });
}
