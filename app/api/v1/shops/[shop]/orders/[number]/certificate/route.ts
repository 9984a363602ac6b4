import { getOrderDetail } from "@/db/queries/orders";
import { withShopApi } from "@/lib/auth/guards";
import { maySee, reads } from "@/lib/auth/ownership";
import { jsonError } from "@/lib/http/json-error";
import { pdfResponse } from "@/lib/http/pdf-response";
import { isOrderNumber } from "@/lib/orders/order-number";
import { loadCertificatePdf } from "@/lib/orders/order-pdf-loader";

/**
 * GET /api/v1/shops/{shop}/orders/{number}/certificate — the test certificate PDF, for the order's
 * customer and the shop's staff (others 404), once every bank has passed (409 until then).
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string; number: string }> }) {
  const { shop, number } = await params;
  return withShopApi(request, shop, reads("order"), async (ctx) => {
    const detail = isOrderNumber(number) ? await getOrderDetail(ctx.shop.id, number) : null;
    if (!detail || !maySee(ctx, "order", detail.order.customerUserId)) return jsonError(404, "No such order.");
    const pdf = await loadCertificatePdf(detail);
    if (!pdf.ok) return jsonError(409, pdf.reason);
    return pdfResponse(pdf.buffer, pdf.fileName);
  });
}
