import { getShopBySlug } from "@/db/queries/shops";
import { resolveShopContext } from "@/lib/auth/context";
import { refusedResponse, withShopApi } from "@/lib/auth/guards";
import { openAttachment } from "@/lib/attachments/storage";
import { contentDisposition } from "@/lib/attachments/content-type";
import { datasheetFor, removeDatasheet, uploadDatasheet } from "@/lib/catalog/datasheet";
import { jsonError } from "@/lib/http/json-error";
import { readUploadedFile } from "@/lib/http/upload";
import { uploadDatasheet as uploadContract } from "@/lib/api/contracts/catalog";
import { MAX_ATTACHMENT_BYTES, MAX_ATTACHMENT_SIZE_TEXT } from "@/lib/validation/limits";

/**
 * GET /api/v1/shops/{shop}/cells/{sku}/datasheet — the cell's datasheet (PDF) to whoever can see its
 * options: anyone while the cell is offered; once retired, staff and the customers it was quoted to.
 * Anyone else, or a cell without one: 404.
 * POST (multipart `file`, a PDF of at most 10 MB) — sets or replaces it; DELETE removes it. Staff.
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string; sku: string }> }) {
  const { shop: slug, sku } = await params;
  const shop = await getShopBySlug(slug);
  if (!shop) return refusedResponse("no-shop");
  const who = await resolveShopContext(request.headers, slug);
  const reader = who.status === "ok" ? { userId: who.ctx.user.id, role: who.ctx.role } : null;
  const sheet = await datasheetFor(shop.id, sku, reader);
  // a row whose file is gone answers 404 like no datasheet, never an empty reply
  const file = sheet ? await openAttachment(sheet.storageKey) : null;
  if (!sheet || !file) return jsonError(404, "No datasheet for this cell.");
  return new Response(file.stream, {
    headers: {
      "content-type": "application/pdf",
      "content-length": String(file.sizeBytes),
      "content-disposition": contentDisposition(sheet.fileName),
      "x-content-type-options": "nosniff",
      "cache-control": "private, no-store",
    },
  });
}

export async function POST(request: Request, { params }: { params: Promise<{ shop: string; sku: string }> }) {
  const { shop, sku } = await params;
  return withShopApi(
    request,
    shop,
    "catalog:write",
    async (ctx) => {
      const file = await readUploadedFile(request, MAX_ATTACHMENT_BYTES, MAX_ATTACHMENT_SIZE_TEXT);
      if (!file.ok) return file.response;
      const r = await uploadDatasheet(ctx, sku, file.bytes, file.name);
      if (!r.ok) return jsonError(r.code === "not-found" ? 404 : 400, r.message ?? "Refused.", [{ path: "file", message: r.message ?? "Refused." }]);
      return uploadContract.answer({ sku, fileName: r.data.fileName });
    },
    { outsiders: "not-found" },
  );
}

export async function DELETE(request: Request, { params }: { params: Promise<{ shop: string; sku: string }> }) {
  const { shop, sku } = await params;
  return withShopApi(
    request,
    shop,
    "catalog:write",
    async (ctx) => {
      const r = await removeDatasheet(ctx, sku);
      return r.ok ? new Response(null, { status: 204 }) : jsonError(404, r.message ?? "No such cell.");
    },
    { outsiders: "not-found" },
  );
}
