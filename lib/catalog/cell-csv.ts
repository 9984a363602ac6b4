/**
 * The catalog's cells as CSV, written and read with papaparse: export, the template, and the import
 * plan (each row new, changed field by field, unchanged, or an error with its row, column and
 * reason). Applying a plan is db/queries/catalog-edit.ts's `applyCellImport`, in one transaction.
 * Pure: no database, no framework (the import page previews with the same code the server applies).
 */
import Papa from "papaparse";
import { CELL_FIELDS, CELL_FIELD_NAMES, diffCells, moneyText, readCell, type CellFieldName, type CellRecord, type FieldChange } from "./cell-fields";

/** Most data rows one import takes (a shop's catalog holds hundreds of cells). */
export const MAX_IMPORT_ROWS = 5000;
/** Largest CSV file one import takes: 2 MB (binary megabytes). */
export const MAX_IMPORT_BYTES = 2 * 1024 * 1024;

/** The CSV's columns, in order: the cell's field names (as the cells API names them). */
export const CSV_COLUMNS: readonly CellFieldName[] = CELL_FIELD_NAMES;

function csvValue(record: CellRecord, name: CellFieldName): string {
  const v = record[name];
  if (v === null) return "";
  if (name === "unitCost") return moneyText(v as string);
  // SI numbers exactly as JavaScript writes them: they read back to the same value
  return String(v);
}

/** The cells as CSV: one header row of the field names, then one row per cell (SI numbers, money as decimals). */
export function cellsToCsv(records: readonly CellRecord[]): string {
  return Papa.unparse(
    { fields: [...CSV_COLUMNS], data: records.map((r) => CSV_COLUMNS.map((c) => csvValue(r, c))) },
    { newline: "\r\n", quotes: false, escapeFormulae: true },
  );
}

/** A template: the header and one example row with every value written as people type them. */
export function cellCsvTemplate(): string {
  const example: Record<CellFieldName, string> = Object.fromEntries(CELL_FIELDS.map((f) => [f.name, f.example])) as Record<CellFieldName, string>;
  example.sku = "NEW-CELL-01";
  example.length = "";
  example.width = "";
  return Papa.unparse({ fields: [...CSV_COLUMNS], data: [CSV_COLUMNS.map((c) => example[c])] }, { newline: "\r\n", escapeFormulae: true });
}

/** One problem of an import: the CSV row (the header is row 1), the column (a field name, or "" for the whole row) and why. */
export interface ImportError {
  row: number;
  column: string;
  message: string;
}

export type ImportRowStatus = "new" | "changed" | "unchanged" | "error";

export interface ImportRow {
  row: number;
  sku: string;
  status: ImportRowStatus;
  /** for changed rows: every changed field, old → new */
  changes: FieldChange[];
  errors: ImportError[];
  /** the cell as it will be stored (new and changed rows) */
  record?: CellRecord;
}

export interface ImportPlan {
  rows: ImportRow[];
  created: number;
  updated: number;
  unchanged: number;
  /** every error, rows in order (file-level problems are row 1, the header) */
  errors: ImportError[];
}

function fileError(message: string, column = ""): ImportPlan {
  return { rows: [], created: 0, updated: 0, unchanged: 0, errors: [{ row: 1, column, message }] };
}

/**
 * Reads a CSV and plans what importing it would do to the catalog (`existing`: the shop's cells by
 * SKU). The header names the columns (any order, any subset that includes `sku`; unknown columns are
 * refused). A row whose SKU is new must give every required field; a known SKU keeps the value of
 * any column the file does not have. Values: SI numbers or engineering strings (`3000 F`, `0.29 mΩ`,
 * `60 mm`), tolerances as `10 %` or `0.1`, money as decimal strings in the shop's currency.
 */
export function planCellImport(text: string, existing: ReadonlyMap<string, CellRecord>): ImportPlan {
  const body = text.replace(/^\uFEFF/, "");
  if (body.trim() === "") return fileError("The file is empty: it needs a header row and at least one cell.");
  const parsed = Papa.parse<string[]>(body, { skipEmptyLines: "greedy", delimitersToGuess: [",", ";", "\t"] });
  const [header, ...data] = parsed.data;
  if (!header) return fileError("The file has no header row.");
  const columns = header.map((h) => h.trim());
  const known = new Set<string>(CSV_COLUMNS);
  const headerErrors: ImportError[] = [];
  const seenColumns = new Set<string>();
  columns.forEach((c) => {
    if (!known.has(c)) headerErrors.push({ row: 1, column: c, message: `Unknown column "${c}"; the columns are: ${CSV_COLUMNS.join(", ")}` });
    else if (seenColumns.has(c)) headerErrors.push({ row: 1, column: c, message: `The column "${c}" appears twice` });
    seenColumns.add(c);
  });
  if (!seenColumns.has("sku")) headerErrors.push({ row: 1, column: "sku", message: "The header needs a sku column: it says which cell each row is" });
  if (headerErrors.length > 0) return { rows: [], created: 0, updated: 0, unchanged: 0, errors: headerErrors };
  if (data.length === 0) return fileError("The file has a header but no cells.");
  if (data.length > MAX_IMPORT_ROWS) return fileError(`The file has ${data.length} rows; one import takes at most ${MAX_IMPORT_ROWS}.`);

  // papaparse's own complaints (unclosed quotes, too few or too many fields), by data row
  const parseErrors = new Map<number, string>();
  for (const e of parsed.errors) if (e.row !== undefined && !parseErrors.has(e.row)) parseErrors.set(e.row, e.message);

  const rows: ImportRow[] = [];
  const seenSkus = new Map<string, number>();
  data.forEach((values, i) => {
    const row = i + 2;
    const cell = (name: string) => values[columns.indexOf(name)];
    const sku = (cell("sku") ?? "").trim();
    const fail = (errors: ImportError[]) => rows.push({ row, sku, status: "error", changes: [], errors });
    const problem = parseErrors.get(i);
    if (problem !== undefined || values.length !== columns.length) {
      fail([{ row, column: "", message: `The row has ${values.length} values for ${columns.length} columns${problem ? ` (${problem})` : ""}` }]);
      return;
    }
    const earlier = seenSkus.get(sku);
    if (sku !== "" && earlier !== undefined) {
      fail([{ row, column: "sku", message: `${sku} appears again (first on row ${earlier}); a cell may appear once` }]);
      return;
    }
    if (sku !== "") seenSkus.set(sku, row);
    const raw: Partial<Record<CellFieldName, string>> = {};
    columns.forEach((c, k) => {
      raw[c as CellFieldName] = values[k] ?? "";
    });
    const before = existing.get(sku);
    const read = readCell(raw, before);
    if (!read.ok) {
      fail(read.issues.map((issue) => ({ row, column: issue.field === "_cell" ? "" : issue.field, message: issue.message })));
      return;
    }
    if (!before) {
      rows.push({ row, sku, status: "new", changes: [], errors: [], record: read.record });
      return;
    }
    const changes = diffCells(before, read.record);
    rows.push({ row, sku, status: changes.length > 0 ? "changed" : "unchanged", changes, errors: [], ...(changes.length > 0 ? { record: read.record } : {}) });
  });
  return {
    rows,
    created: rows.filter((r) => r.status === "new").length,
    updated: rows.filter((r) => r.status === "changed").length,
    unchanged: rows.filter((r) => r.status === "unchanged").length,
    errors: rows.flatMap((r) => r.errors),
  };
}
