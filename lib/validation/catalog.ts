import { z } from "zod";
import { TECHNOLOGIES } from "../bank/types";
import { CELL_FIELDS, CELL_SHAPES, readCell, type CellFieldName, type CellRecord } from "../catalog/cell-fields";
import { COMPONENT_KIND_VALUES, readComponent, type ComponentFormText } from "../catalog/component-fields";
import { text } from "./text";

/**
 * The catalog's request and response shapes, for the desk's forms, the server actions and the
 * cells API (the OpenAPI description is generated from these). Every field's bounds and words come
 * from lib/catalog/cell-fields.ts, so the form, the CSV and the API refuse the same values alike.
 */

// ---- the form: text as people type it ----

const formText = text().max(200, "Keep this under 200 characters");

/** The cell form's fields, all text (`2.7 V`, `0.29 mΩ`, `10 %`, `60 mm`). */
export const cellFormFieldsSchema = z.object(Object.fromEntries(CELL_FIELDS.map((f) => [f.name, formText])) as Record<CellFieldName, typeof formText>);
export type CellFormValues = z.infer<typeof cellFormFieldsSchema>;

/** The cell form: every field read through lib/catalog (messages at the field); outputs the SI record. */
export const cellFormSchema = cellFormFieldsSchema
  .superRefine((values, ctx) => {
    const r = readCell(values);
    if (!r.ok) for (const issue of r.issues) ctx.addIssue({ code: "custom", path: [issue.field === "_cell" ? "shape" : issue.field], message: issue.message });
  })
  .transform((values): CellRecord => {
    const r = readCell(values);
    if (!r.ok) throw new Error("unreachable: cell form refused after refinement");
    return r.record;
  });

/** Creating a cell from the desk. */
export const createCellSchema = z.object({ values: cellFormFieldsSchema });

/** Changing a cell from the desk: the version the form was loaded at and only the fields that changed. */
export const updateCellSchema = z.object({
  sku: text().min(1).max(40),
  version: z.number().int().min(1),
  changes: cellFormFieldsSchema.partial(),
});

/** A CSV import from the desk: the file's text and whether valid rows go in when others have errors. */
export const importCellsSchema = z.object({
  csv: z.string().max(2 * 1024 * 1024, "The file is larger than 2 MB"),
  applyValid: z.boolean().default(false),
});

/** A component form: common fields and the figures of its kind, all text. */
export const componentFormSchema = z
  .object({
    kind: z.enum(COMPONENT_KIND_VALUES, { message: "Choose a kind" }),
    sku: formText,
    name: formText,
    unitCost: formText,
    stock: formText,
    leadTimeDays: formText,
    active: z.enum(["true", "false"]),
  })
  .catchall(formText)
  .superRefine((values, ctx) => {
    const r = readComponent(values as ComponentFormText);
    if (!r.ok) for (const i of r.issues) ctx.addIssue({ code: "custom", path: [i.field], message: i.message });
  });

export const saveComponentSchema = z.object({
  /** the part number it had when the form was opened (absent: a new part) */
  sku: text().max(40).optional(),
  version: z.number().int().min(1).optional(),
  values: componentFormSchema,
});

// ---- the API: SI numbers, fields named as the arrangements answer's cell ----

const money = z.string().regex(/^\d+(\.\d+)?$/, 'a decimal string like "23.80"');

export const moneySchema = z.strictObject({ amount: money, currency: z.string().length(3) });

function fieldSchema(name: CellFieldName): z.ZodType {
  const f = CELL_FIELDS.find((x) => x.name === name)!;
  let s: z.ZodType;
  switch (f.kind) {
    case "text":
      s = text()
        .min(1)
        .max(name === "sku" ? 40 : 120);
      break;
    case "choice":
      s = z.enum(f.choices as [string, ...string[]]);
      break;
    case "boolean":
      s = z.boolean();
      break;
    case "integer":
      s = z
        .number()
        .int()
        .min(f.min ?? 0)
        .max(f.max ?? Number.MAX_SAFE_INTEGER);
      break;
    case "money":
      s = moneySchema;
      break;
    case "fraction":
    case "quantity": {
      let n = z.number().describe(`${f.help}${f.unit ? ` (SI: ${f.unit})` : " (a fraction: 0.1 = 10 %)"}`);
      n = f.minExclusive ? n.gt(f.min ?? 0) : n.min(f.min ?? 0);
      if (f.max !== undefined) n = n.max(f.max);
      s = f.optional ? n.nullable() : n;
      break;
    }
  }
  return s.describe(f.help);
}

const cellShape = Object.fromEntries(CELL_FIELDS.map((f) => [f.name, fieldSchema(f.name)])) as Record<CellFieldName, z.ZodType>;

/** POST /api/v1/shops/{shop}/cells: a whole cell (diameter for a cylinder, length and width for a box). */
export const cellCreateSchema = z.strictObject({
  ...cellShape,
  diameter: cellShape.diameter.optional(),
  length: cellShape.length.optional(),
  width: cellShape.width.optional(),
  active: z.boolean().default(true),
  stock: cellShape.stock.default(0),
  leadTimeDays: cellShape.leadTimeDays.default(0),
});

/** PATCH /api/v1/shops/{shop}/cells/{sku}: the fields to change; `version` (from a GET) makes it refuse a cell changed since (409). */
export const cellPatchSchema = z.strictObject({
  ...Object.fromEntries(Object.entries(cellShape).map(([k, v]) => [k, v.optional()])),
  version: z.number().int().min(1).optional(),
});

/** A cell as the API answers it. */
export const cellResponseSchema = z.object({
  sku: z.string(),
  manufacturer: z.string(),
  series: z.string(),
  technology: z.enum(TECHNOLOGIES),
  capacitance: z.number(),
  toleranceMinus: z.number(),
  tolerancePlus: z.number(),
  ratedVoltage: z.number(),
  surgeVoltage: z.number(),
  esr: z.number(),
  leakageCurrent: z.number(),
  continuousCurrent: z.number(),
  peakCurrent: z.number(),
  mass: z.number(),
  /** m³, from the shape (what the engine uses) */
  volume: z.number(),
  shape: z.enum(CELL_SHAPES),
  diameter: z.number().nullable(),
  length: z.number().nullable(),
  width: z.number().nullable(),
  height: z.number(),
  unitCost: moneySchema,
  stock: z.number().int(),
  leadTimeDays: z.number().int(),
  active: z.boolean(),
  version: z.number().int(),
  /** the datasheet's address, or null when the cell has none */
  datasheet: z.string().nullable(),
  updatedAt: z.string(),
});
export type CellResponse = z.infer<typeof cellResponseSchema>;

export const cellListResponseSchema = z.object({
  rows: z.array(cellResponseSchema),
  total: z.number().int(),
  page: z.number().int(),
  size: z.number().int(),
});

/** POST /api/v1/shops/{shop}/cells.csv: what the import did (or would do, with dryRun=1). */
export const cellImportResponseSchema = z.object({
  created: z.number().int(),
  updated: z.number().int(),
  unchanged: z.number().int(),
  errors: z.array(z.object({ row: z.number().int(), column: z.string(), message: z.string() })),
  /** whether anything was written */
  applied: z.boolean(),
  dryRun: z.boolean(),
});
export type CellImportResponse = z.infer<typeof cellImportResponseSchema>;

/** POST /api/v1/shops/{shop}/cells/{sku}/datasheet (multipart `file`, a PDF): what was stored. */
export const datasheetUploadResponseSchema = z.object({ sku: z.string(), fileName: z.string() });
