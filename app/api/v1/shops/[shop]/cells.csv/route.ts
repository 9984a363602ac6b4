import { withShopApi } from "@/lib/auth/guards";
import { cellCsvTemplate, MAX_IMPORT_BYTES } from "@/lib/catalog/cell-csv";
import { exportCellsCsv, importCells, previewCellImport } from "@/lib/catalog/edit";
import { contentDisposition } from "@/lib/attachments/content-type";
import { jsonError } from "@/lib/http/json-error";
import { readBodyLimited } from "@/lib/http/read-json";
import { importCellsCsv as contract } from "@/lib/api/contracts/catalog";
import type { CellImportResponse } from "@/lib/validation/catalog";
import { hasNul } from "@/lib/validation/text";

const csvHeaders = (name: string) => ({
  "content-type": "text/csv; charset=utf-8",
  "content-disposition": contentDisposition(name),
  "cache-control": "private, no-store",
});

/**
 * GET /api/v1/shops/{shop}/cells.csv — every cell as CSV (the columns are the cells API's field
 * names; SI numbers; money as decimals in the shop's currency); `?template=1` gives the header and
 * one example row instead.
 * POST (body text/csv) — imports: `?dryRun=1` only says what it would do; without it the import is
 * applied in one transaction, and nothing at all is applied when `errors` is non-empty unless
 * `applyValid=1`. Answers { created, updated, unchanged, errors: [{ row, column, message }], applied,
 * dryRun }: 200, or 422 when errors kept the import from being applied.
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(
    request,
    shop,
    "catalog:read",
    async (ctx) => {
      if (new URL(request.url).searchParams.get("template") === "1")
        return new Response(`${cellCsvTemplate()}\r\n`, { headers: csvHeaders("cells-template.csv") });
      return new Response(`${await exportCellsCsv(ctx.shop.id)}\r\n`, { headers: csvHeaders(`${ctx.shop.slug}-cells.csv`) });
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
      const type = (request.headers.get("content-type") ?? "").toLowerCase();
      if (!type.startsWith("text/csv") && !type.startsWith("text/plain"))
        return jsonError(415, "Send the CSV as the body with content-type text/csv.", [{ path: "", message: "Expected text/csv" }]);
      const search = new URL(request.url).searchParams;
      const dryRun = search.get("dryRun") === "1" || search.get("dryRun") === "true";
      const applyValid = search.get("applyValid") === "1" || search.get("applyValid") === "true";
      const bytes = await readBodyLimited(request, MAX_IMPORT_BYTES);
      if (bytes === null) return jsonError(413, `A CSV import may be at most ${MAX_IMPORT_BYTES / 1024 / 1024} MB.`, [{ path: "", message: "Body too large" }]);
      const text = new TextDecoder("utf-8", { fatal: false }).decode(bytes);
      if (hasNul(text)) return jsonError(400, "The CSV contains a NUL character.", [{ path: "", message: "NUL character" }]);
      const outcome = dryRun ? { plan: await previewCellImport(ctx.shop.id, text), applied: false } : await importCells(ctx, text, { applyValid });
      const { plan } = outcome;
      const answer: CellImportResponse = {
        created: plan.created,
        updated: plan.updated,
        unchanged: plan.unchanged,
        errors: plan.errors,
        applied: outcome.applied,
        dryRun,
      };
      // errors kept the import from being applied: the same answer, as the contract's 422
      const refused = !dryRun && !outcome.applied && plan.errors.length > 0;
      return refused ? Response.json(answer, { status: 422 }) : contract.answer(answer);
    },
    { outsiders: "not-found" },
  );
}
