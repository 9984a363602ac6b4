import "server-only";
import { recordAudit } from "@/db/queries/audit";
import { customerQuotedCell, deleteDatasheet, getDatasheetBySku, lockCellBySku, putDatasheet } from "@/db/queries/catalog-edit";
import { withShop } from "@/db/tx";
import { detectAttachmentType, cleanFileName } from "@/lib/attachments/content-type";
import { removeStoredBytes, storeAttachmentBytes } from "@/lib/attachments/storage";
import { actorOf, type ShopContext } from "@/lib/auth/context";
import type { ActionResult } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { CELL_SUBJECT } from "./edit";

/**
 * A cell's datasheet: a PDF (judged by its content, as attachments are), stored outside public/,
 * one per cell. Whoever can see the cell's options may download it: anyone while the cell is
 * offered (the storefront shows its options to visitors), and once it is retired the shop's staff
 * and the customers whose quotes froze it.
 */
export async function uploadDatasheet(ctx: ShopContext, sku: string, bytes: Uint8Array, name: string): Promise<ActionResult<{ fileName: string }>> {
  const type = await detectAttachmentType(bytes);
  if (!type.ok || type.contentType !== "application/pdf")
    return {
      ok: false,
      code: "invalid",
      message: type.ok ? "A datasheet must be a PDF." : type.reason,
      fieldErrors: { file: ["A datasheet must be a PDF file"] },
    };
  const stored = await storeAttachmentBytes(ctx.shop.id, bytes);
  const fileName = cleanFileName(name, "application/pdf");
  const result = await withShop(ctx.shop.id, async (tx) => {
    const cell = await lockCellBySku(tx, ctx.shop.id, sku);
    if (!cell) return null;
    const replaced = await putDatasheet(tx, ctx.shop.id, {
      cellId: cell.id,
      fileName,
      sizeBytes: bytes.byteLength,
      sha256: stored.sha256,
      storageKey: stored.storageKey,
      uploadedByUserId: actorOf(ctx).actorUserId,
    });
    await recordAudit(tx, ctx.shop.id, {
      ...actorOf(ctx),
      action: `${CELL_SUBJECT}.datasheet`,
      subjectType: CELL_SUBJECT,
      subjectId: cell.id,
      summary: `${sku}: datasheet ${replaced ? "replaced by" : "set to"} ${fileName}`,
    });
    return { replaced };
  });
  if (result === null) {
    await removeStoredBytes(stored.storageKey);
    return { ok: false, code: "not-found", message: `No cell ${sku} in this catalog.` };
  }
  if (result.replaced) await removeStoredBytes(result.replaced);
  return { ok: true, data: { fileName } };
}

export async function removeDatasheet(ctx: ShopContext, sku: string): Promise<ActionResult<null>> {
  const removed = await withShop(ctx.shop.id, async (tx) => {
    const cell = await lockCellBySku(tx, ctx.shop.id, sku);
    if (!cell) return undefined;
    const key = await deleteDatasheet(tx, ctx.shop.id, cell.id);
    if (key)
      await recordAudit(tx, ctx.shop.id, {
        ...actorOf(ctx),
        action: `${CELL_SUBJECT}.datasheet`,
        subjectType: CELL_SUBJECT,
        subjectId: cell.id,
        summary: `${sku}: datasheet removed`,
      });
    return key;
  });
  if (removed === undefined) return { ok: false, code: "not-found", message: `No cell ${sku} in this catalog.` };
  if (removed) await removeStoredBytes(removed);
  return { ok: true, data: null };
}

/**
 * The datasheet for a reader (null: not signed in, or not a member): its file, or null when the
 * reader may not see it or the cell has none (both answer "not found").
 */
export async function datasheetFor(shopId: string, sku: string, reader: { userId: string; role: ShopContext["role"] } | null) {
  const sheet = await getDatasheetBySku(shopId, sku);
  if (!sheet) return null;
  if (sheet.cellActive) return sheet;
  if (!reader) return null;
  if (can(reader.role, "catalog:read")) return sheet;
  return (await customerQuotedCell(shopId, reader.userId, sku)) ? sheet : null;
}
