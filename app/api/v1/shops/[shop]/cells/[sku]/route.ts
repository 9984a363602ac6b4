import { getCellBySku } from "@/db/queries/catalog-edit";
import { withShopApi } from "@/lib/auth/guards";
import { cellRecordOf, cellResponseFor, updateCell } from "@/lib/catalog/edit";
import { jsonError } from "@/lib/http/json-error";
import { readJsonAs } from "@/lib/http/read-json";
import { cellPatchSchema } from "@/lib/validation/catalog";
import { getCell as getContract, updateCell as updateContract } from "@/lib/api/contracts/catalog";
import { readApiCell, writeAnswer, type ApiCell } from "../cell-body";

/**
 * GET /api/v1/shops/{shop}/cells/{sku} — one cell. PATCH — the fields to change (SI units); with
 * `version` from a GET, a cell changed since is refused with 409 and nothing is written (without
 * it the change applies to the cell as stored: last write wins). Staff, or a key with the scope.
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string; sku: string }> }) {
  const { shop, sku } = await params;
  return withShopApi(
    request,
    shop,
    "catalog:read",
    async (ctx) => {
      const cell = await cellResponseFor(ctx, sku);
      return cell ? getContract.answer(cell) : jsonError(404, "No such cell.");
    },
    { outsiders: "not-found" },
  );
}

export async function PATCH(request: Request, { params }: { params: Promise<{ shop: string; sku: string }> }) {
  const { shop, sku } = await params;
  return withShopApi(
    request,
    shop,
    "catalog:write",
    async (ctx) => {
      const body = await readJsonAs(request, cellPatchSchema);
      if (!body.ok) return body.response;
      const row = await getCellBySku(ctx.shop.id, sku);
      if (!row) return jsonError(404, "No such cell.");
      const { version, ...fields } = body.value as ApiCell & { version?: number };
      const read = await readApiCell(ctx, fields, cellRecordOf(row));
      if (!read.ok) return read.response;
      return writeAnswer(ctx, await updateCell(ctx, sku, read.record, version ?? null), updateContract);
    },
    { outsiders: "not-found" },
  );
}
