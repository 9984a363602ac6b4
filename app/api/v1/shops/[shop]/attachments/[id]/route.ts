import { getAttachment } from "@/db/queries/attachments";
import { withShopApi } from "@/lib/auth/guards";
import { maySee, reads } from "@/lib/auth/ownership";
import { jsonError } from "@/lib/http/json-error";
import { openAttachment } from "@/lib/attachments/storage";
import { ALLOWED_ATTACHMENT_TYPES, cleanFileName, contentDisposition, type AttachmentContentType } from "@/lib/attachments/content-type";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Files a browser may show in place (`?view=inline`): their content was sniffed at upload; a DXF drawing is always downloaded. */
const INLINE_TYPES = new Set(["application/pdf", "image/png", "image/jpeg"]);

/**
 * GET /api/v1/shops/{shop}/attachments/{id}[?view=inline] — the file, to the customer who uploaded
 * it and to the shop's staff; 404 to anyone else in the shop (ids cannot be probed), and 404 when
 * the file itself is gone. The download's name ends in the extension of its content type. PDF, PNG
 * and JPEG files are shown in the browser with `?view=inline`; anything else is always a download.
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string; id: string }> }) {
  const { shop, id } = await params;
  return withShopApi(request, shop, reads("attachment"), async (ctx) => {
    const row = UUID.test(id) ? await getAttachment(ctx.shop.id, id) : null;
    if (!row || !maySee(ctx, "attachment", row.uploadedByUserId)) return jsonError(404, "No such attachment.");
    const type = (ALLOWED_ATTACHMENT_TYPES as readonly string[]).includes(row.contentType) ? (row.contentType as AttachmentContentType) : null;
    const file = type ? await openAttachment(row.storageKey) : null;
    if (!type || !file) {
      console.error(`[attachments] ${row.id} of shop ${ctx.shop.id}: ${type ? "its file is missing" : `unexpected type ${row.contentType}`}`);
      return jsonError(404, "This attachment's file is no longer available.");
    }
    return new Response(file.stream, {
      headers: {
        "content-type": type,
        "content-length": String(file.sizeBytes),
        "content-disposition":
          new URL(request.url).searchParams.get("view") === "inline" && INLINE_TYPES.has(type)
            ? contentDisposition(cleanFileName(row.fileName, type)).replace(/^attachment;/, "inline;")
            : contentDisposition(cleanFileName(row.fileName, type)),
        "x-content-type-options": "nosniff",
        "cache-control": "private, no-store",
      },
    });
  });
}
