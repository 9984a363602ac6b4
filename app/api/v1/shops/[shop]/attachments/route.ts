import { withShopApi } from "@/lib/auth/guards";
import { jsonError } from "@/lib/http/json-error";
import { readBodyLimited } from "@/lib/http/read-json";
import { cleanFileName, detectAttachmentType } from "@/lib/attachments/content-type";
import { acceptUpload } from "@/lib/attachments/upload";
import { MAX_ATTACHMENT_BYTES, MAX_ATTACHMENT_SIZE_TEXT } from "@/lib/validation/limits";
import { uploadAttachment as contract } from "@/lib/api/contracts/shops";

/** Room for the multipart boundaries and part headers around one file. */
const MULTIPART_OVERHEAD = 64 * 1024;

const tooLarge = () =>
  jsonError(400, `A file may be at most ${MAX_ATTACHMENT_SIZE_TEXT}.`, [{ path: "file", message: `The file is larger than ${MAX_ATTACHMENT_SIZE_TEXT}.` }]);

/**
 * POST /api/v1/shops/{shop}/attachments — multipart `file`: a drawing or specification (PDF, PNG,
 * JPEG, DXF; at most 10 MB; judged by content) → 201 { id, fileName, sizeBytes, contentType }. The
 * name is stored without control or bidirectional characters and with the extension of its content.
 * 429 past the upload rates, 413 past a quota (lib/attachments/upload.ts).
 */
export async function POST(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(request, shop, "request:create", async (ctx) => {
    const contentType = request.headers.get("content-type") ?? "";
    if (!contentType.toLowerCase().startsWith("multipart/form-data")) {
      return jsonError(400, "Send the file as multipart/form-data in a field named file.", [{ path: "file", message: "Expected multipart/form-data" }]);
    }
    const body = await readBodyLimited(request, MAX_ATTACHMENT_BYTES + MULTIPART_OVERHEAD);
    if (body === null) return tooLarge();
    let form: FormData;
    try {
      form = await new Response(body, { headers: { "content-type": contentType } }).formData();
    } catch {
      return jsonError(400, "The upload could not be read.", [{ path: "file", message: "Malformed multipart body" }]);
    }
    const file = form.get("file");
    if (!(file instanceof File)) return jsonError(400, "Choose a file to attach.", [{ path: "file", message: "No file" }]);
    if (file.size > MAX_ATTACHMENT_BYTES) return tooLarge();
    const bytes = new Uint8Array(await file.arrayBuffer());
    const type = await detectAttachmentType(bytes);
    if (!type.ok) return jsonError(400, type.reason, [{ path: "file", message: type.reason }]);
    const outcome = await acceptUpload(ctx.shop.id, ctx.user.id, {
      fileName: cleanFileName(file.name, type.contentType),
      contentType: type.contentType,
      bytes,
    });
    if (!outcome.ok) {
      const headers = outcome.retryAfterSeconds ? { "retry-after": String(outcome.retryAfterSeconds) } : undefined;
      return jsonError(outcome.status, outcome.message, [{ path: "file", message: outcome.message }], { headers });
    }
    return contract.answer(outcome.attachment);
  });
}
