import { getAttachment } from "@/db/queries/attachments";
import { withShopApi } from "@/lib/auth/guards";
import { maySee, reads } from "@/lib/auth/ownership";
import { jsonError } from "@/lib/http/json-error";
import { attachmentStream } from "@/lib/attachments/storage";
import { contentDisposition } from "@/lib/attachments/content-type";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * GET /api/v1/shops/{shop}/attachments/{id} — the file, to the customer who uploaded it and to the
 * shop's staff; 404 to anyone else in the shop (ids cannot be probed).
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string; id: string }> }) {
  const { shop, id } = await params;
  return withShopApi(request, shop, reads("attachment"), async (ctx) => {
    const row = UUID.test(id) ? await getAttachment(ctx.shop.id, id) : null;
    if (!row || !maySee(ctx, "attachment", row.uploadedByUserId)) return jsonError(404, "No such attachment.");
    return new Response(attachmentStream(row.storageKey), {
      headers: {
        "content-type": row.contentType,
        "content-length": String(row.sizeBytes),
        "content-disposition": contentDisposition(row.fileName),
        "x-content-type-options": "nosniff",
        "cache-control": "private, no-store",
      },
    });
  });
}
