import { listCatalogCells } from "@/db/queries/catalog";
import { listDatasheetSkus } from "@/db/queries/catalog-edit";
import { withShopApi } from "@/lib/auth/guards";
import { toCellResponse } from "@/lib/catalog/cell-api";
import { createCell, shopCurrency } from "@/lib/catalog/edit";
import { jsonError } from "@/lib/http/json-error";
import { readJsonAs } from "@/lib/http/read-json";
import { cellCreateSchema } from "@/lib/validation/catalog";
import { catalogList } from "@/lib/validation/lists";
import { createCell as createContract, listCells as listContract } from "@/lib/api/contracts/catalog";
import { readApiCell, writeAnswer, type ApiCell } from "./cell-body";

/**
 * GET /api/v1/shops/{shop}/cells — { rows, total, page, size }: the shop's cells, active or not, with
 * the catalog list's query (q, technology, sort, dir, page, size). Staff (or a key with catalog:read).
 * POST — a whole cell (fields as the arrangements answer's `cell`, SI units, `unitCost: { amount,
 * currency }`) → 201 with the cell; 409 when the SKU is taken.
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(
    request,
    shop,
    "catalog:read",
    async (ctx) => {
      const { query, issues } = catalogList.parse(new URL(request.url).searchParams);
      if (issues.length > 0) return jsonError(400, "Invalid query.", issues);
      const [page, currency, datasheets] = await Promise.all([listCatalogCells(ctx.shop.id, query), shopCurrency(ctx.shop.id), listDatasheetSkus(ctx.shop.id)]);
      const has = new Set(datasheets);
      return listContract.answer({
        ...page,
        rows: page.rows.map((r) => toCellResponse(r, { currency, shopSlug: ctx.shop.slug, hasDatasheet: has.has(r.sku) })),
      });
    },
    { outsiders: "not-found" },
  );
}

export async function POST(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(
    request,
    shop,
    "catalog:write",
    async (ctx) => {
      const body = await readJsonAs(request, cellCreateSchema);
      if (!body.ok) return body.response;
      const read = await readApiCell(ctx, body.value as ApiCell, null);
      if (!read.ok) return read.response;
      return writeAnswer(ctx, await createCell(ctx, read.record), createContract);
    },
    { outsiders: "not-found" },
  );
}
