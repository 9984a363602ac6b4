import { z } from "zod";
import { defineRoute } from "@/lib/api/contract";
import { cellCsvTemplate, MAX_IMPORT_BYTES } from "@/lib/catalog/cell-csv";
import {
  cellCreateSchema,
  cellImportResponseSchema,
  cellListResponseSchema,
  cellPatchSchema,
  cellResponseSchema,
  datasheetUploadResponseSchema,
} from "@/lib/validation/catalog";
import { catalogList } from "@/lib/validation/lists";
import { MAX_ATTACHMENT_SIZE_TEXT } from "@/lib/validation/limits";
import { EXAMPLE_SHOP, REFUSED, shopParams } from "./shared";

/** A demo cell of the example shop (db/seed/catalog-kestrel.ts). */
const EXAMPLE_SKU = "QFS-1200R27";

const cellParams = shopParams.extend({ sku: z.string().min(1).meta({ description: "the cell's SKU (part number)", example: EXAMPLE_SKU }) });

const flag = z.enum(["1", "true", "0", "false"]);

export const listCells = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/cells",
  operationId: "listCells",
  tag: "Catalog",
  summary: "The shop's cells",
  description:
    "A page of the shop's cells, offered or retired, with the fields named as in the arrangements answer's `cell` (SI units, tolerances as fractions) and what only the shop sees: `unitCost` as a decimal string in the shop's currency, `stock`, `leadTimeDays`, `active`, the `version` a change may name, and the datasheet's address. Searches SKU, maker and series; filters by technology; sorts by any column. For the shop's staff.",
  access: "member",
  apiKey: "catalog:read",
  params: shopParams,
  query: catalogList.querySchema,
  ok: { status: 200, description: "A page of cells.", json: cellListResponseSchema },
  errors: { 400: "A query value the list does not take: `issues` names it.", 401: REFUSED.signedOut, 403: REFUSED.notStaff, 404: REFUSED.noShopForOutsiders },
  examples: [{ title: "Supercapacitor (EDLC) cells, cheapest first", params: { shop: EXAMPLE_SHOP }, query: { technology: "edlc", sort: "cost" } }],
});

export const createCell = defineRoute({
  method: "POST",
  path: "/api/v1/shops/{shop}/cells",
  operationId: "createCell",
  tag: "Catalog",
  summary: "Add a cell",
  description:
    "A whole cell: its figures in SI units (a cylinder's `diameter`, a box's `length` and `width`), `unitCost` in the shop's currency, and optionally `stock`, `leadTimeDays` and `active` (offered unless it says otherwise). Every field is read by the same rules as the desk's form and the CSV import. For the shop's staff who keep the catalog.",
  access: "member",
  apiKey: "catalog:write",
  params: shopParams,
  body: { json: cellCreateSchema },
  ok: { status: 201, description: "The cell as stored.", json: cellResponseSchema },
  errors: {
    400: "A field is wrong, out of its bounds or missing, or `unitCost` is not in the shop's currency: `issues` names it.",
    401: REFUSED.signedOut,
    403: `${REFUSED.notStaff} ${REFUSED.crossSite}`,
    404: REFUSED.noShopForOutsiders,
    409: "The shop already has a cell with this SKU.",
  },
});

export const getCell = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/cells/{sku}",
  operationId: "getCell",
  tag: "Catalog",
  summary: "One cell",
  description: "One cell of the shop, offered or retired, with the `version` to name in a change. For the shop's staff.",
  access: "member",
  apiKey: "catalog:read",
  params: cellParams,
  ok: { status: 200, description: "The cell.", json: cellResponseSchema },
  errors: { 401: REFUSED.signedOut, 403: REFUSED.notStaff, 404: `${REFUSED.noShopForOutsiders} Or no cell has this SKU.` },
  examples: [{ title: "One cell", params: { shop: EXAMPLE_SHOP, sku: EXAMPLE_SKU } }],
});

export const updateCell = defineRoute({
  method: "PATCH",
  path: "/api/v1/shops/{shop}/cells/{sku}",
  operationId: "updateCell",
  tag: "Catalog",
  summary: "Change a cell",
  description:
    "Only the fields to change, in SI units. With `version` (from a GET), a cell someone changed since is refused with 409 and nothing is written; without it the change applies to the cell as stored (the last write wins). A new unit cost goes into the cell's cost history; issued quotes keep their prices. Retire a cell with `active: false`. For the shop's staff who keep the catalog.",
  access: "member",
  apiKey: "catalog:write",
  params: cellParams,
  body: { json: cellPatchSchema },
  ok: { status: 200, description: "The cell as stored now.", json: cellResponseSchema },
  errors: {
    400: "A field is wrong or out of its bounds, or `unitCost` is not in the shop's currency: `issues` names it.",
    401: REFUSED.signedOut,
    403: `${REFUSED.notStaff} ${REFUSED.crossSite}`,
    404: `${REFUSED.noShopForOutsiders} Or no cell has this SKU.`,
    409: "The cell changed since the `version` sent: fetch it again and reapply the change.",
  },
  // a cell no browser journey edits, given the figures it has (the examples run against the demo data)
  examples: [{ title: "Stock and lead time after a stock count", params: { shop: EXAMPLE_SHOP, sku: "QFS-2000R27" }, json: { stock: 520, leadTimeDays: 2 } }],
});

export const getDatasheet = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/cells/{sku}/datasheet",
  operationId: "getCellDatasheet",
  tag: "Catalog",
  summary: "A cell's datasheet (PDF)",
  description:
    "The datasheet of a cell the shop offers, to anyone (it is linked from every option built from the cell). Once the cell is retired, only to the shop's staff and to the customers it was quoted to; anyone else gets 404, as for a cell without one.",
  access: "open",
  params: cellParams,
  ok: { status: 200, description: "The PDF (Content-Disposition names the file).", file: ["application/pdf"] },
  errors: { 404: "No such shop, no such cell, no datasheet for it, or a retired cell's sheet this caller may not see." },
});

export const uploadDatasheet = defineRoute({
  method: "POST",
  path: "/api/v1/shops/{shop}/cells/{sku}/datasheet",
  operationId: "uploadCellDatasheet",
  tag: "Catalog",
  summary: "Set a cell's datasheet",
  description: `One PDF in a multipart field named \`file\`, judged by its content (not its name), at most ${MAX_ATTACHMENT_SIZE_TEXT}. It replaces the one the cell had. For the shop's staff who keep the catalog.`,
  access: "member",
  apiKey: "catalog:write",
  params: cellParams,
  body: { multipart: z.object({ file: z.file().meta({ description: `a PDF, judged by content; at most ${MAX_ATTACHMENT_SIZE_TEXT}` }) }) },
  ok: { status: 201, description: "The stored datasheet.", json: datasheetUploadResponseSchema },
  errors: {
    400: "Not multipart, no file, too large, or not a PDF: `issues` names `file`.",
    401: REFUSED.signedOut,
    403: `${REFUSED.notStaff} ${REFUSED.crossSite}`,
    404: `${REFUSED.noShopForOutsiders} Or no cell has this SKU.`,
  },
});

export const removeDatasheet = defineRoute({
  method: "DELETE",
  path: "/api/v1/shops/{shop}/cells/{sku}/datasheet",
  operationId: "removeCellDatasheet",
  tag: "Catalog",
  summary: "Remove a cell's datasheet",
  description: "The cell keeps no datasheet; options and quotes built from it stop linking one. For the shop's staff who keep the catalog.",
  access: "member",
  apiKey: "catalog:write",
  params: cellParams,
  ok: { status: 204, description: "Removed (or there was none)." },
  errors: { 401: REFUSED.signedOut, 403: `${REFUSED.notStaff} ${REFUSED.crossSite}`, 404: `${REFUSED.noShopForOutsiders} Or no cell has this SKU.` },
});

export const exportCellsCsv = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/cells.csv",
  operationId: "exportCellsCsv",
  tag: "Catalog",
  summary: "The catalog as CSV, or the import template",
  description:
    "Every cell as CSV: one column per field of the cells API (the same names), quantities as SI numbers, `unitCost` as a decimal in the shop's currency, `active` as true or false. `template=1` gives the header and one example row instead. Importing the file unchanged reports no changes. For the shop's staff.",
  access: "member",
  apiKey: "catalog:read",
  params: shopParams,
  query: z.object({ template: flag.optional().meta({ description: "`1`: the header and one example row, not the catalog" }) }),
  ok: { status: 200, description: "The CSV (Content-Disposition names the file).", file: ["text/csv"] },
  errors: { 401: REFUSED.signedOut, 403: REFUSED.notStaff, 404: REFUSED.noShopForOutsiders },
  examples: [{ title: "The import template", params: { shop: EXAMPLE_SHOP }, query: { template: "1" }, output: "cells-template.csv" }],
});

export const importCellsCsv = defineRoute({
  method: "POST",
  path: "/api/v1/shops/{shop}/cells.csv",
  operationId: "importCellsCsv",
  tag: "Catalog",
  summary: "Import cells from CSV",
  description: `The CSV as the body (\`content-type: text/csv\`, at most ${MAX_IMPORT_BYTES / 1024 / 1024} MB), in the columns of the export; quantities as SI numbers or engineering strings (\`3000 F\`, \`0.29 mΩ\`). A row with a known SKU changes that cell, one with a new SKU adds it. \`dryRun=1\` only says what the import would do. Without it, the import is applied in one transaction, and when any row has an error nothing at all is applied (422) unless \`applyValid=1\` asks for the valid rows alone. The answer counts the cells created, updated and unchanged and lists each error by row (the header is row 1), column and reason. For the shop's staff who keep the catalog.`,
  access: "member",
  apiKey: "catalog:write",
  params: shopParams,
  query: z.object({
    dryRun: flag.optional().meta({ description: "`1`: say what the import would do, write nothing" }),
    applyValid: flag.optional().meta({ description: "`1`: apply the valid rows even when others have errors" }),
  }),
  body: { text: ["text/csv", "text/plain"] },
  ok: { status: 200, description: "What the import did, or would do with `dryRun=1`.", json: cellImportResponseSchema },
  errors: {
    400: "The CSV contains a NUL character.",
    401: REFUSED.signedOut,
    403: `${REFUSED.notStaff} ${REFUSED.crossSite}`,
    404: REFUSED.noShopForOutsiders,
    413: `The body is larger than ${MAX_IMPORT_BYTES / 1024 / 1024} MB.`,
    415: "The body is not sent as text/csv.",
    422: {
      description: "Rows have errors and `applyValid` was not given: nothing was applied; `errors` lists each row's problem.",
      json: cellImportResponseSchema,
    },
  },
  examples: [
    {
      title: "What importing the template's example row would do",
      params: { shop: EXAMPLE_SHOP },
      query: { dryRun: "1" },
      text: `${cellCsvTemplate().replace(/\r\n/g, "\n")}\n`,
    },
  ],
});
