/**
 * A catalog cell's fields, defined once: their names (as the arrangements answer's `cell` object
 * names them, so the API, the CSV and the form say the same thing), labels, units, bounds and one
 * sentence each. The desk's form, the CSV import and the cells API all read a cell through
 * `readCell` and compare two versions through `diffCells`. Pure: no database, no framework.
 */
import { MAX_CAPACITANCE, MAX_CURRENT, MAX_LENGTH, MAX_MASS, MAX_RESISTANCE, MAX_VOLTAGE, formatBound } from "../bank/bounds";
import { TECHNOLOGIES, cellVolume, type EngineCell, type Technology } from "../bank/types";
import { Dec, isDecimalString } from "../pricing/decimal";
import { formatQuantity, parseQuantity, type QuantityUnit } from "../quantities";

/** Most cells in stock the catalog records for one part. */
export const MAX_STOCK = 1_000_000;
/** Longest lead time a part may have: a year. */
export const MAX_LEAD_TIME_DAYS = 365;
/** Largest unit cost of one cell or part (in the shop's currency): far beyond any cell. */
export const MAX_UNIT_COST = "1000000";
/** Most decimals a unit cost keeps (the catalog's numeric(14,4)); prices are rounded to the currency. */
export const UNIT_COST_DECIMALS = 4;
export const MAX_TEXT = 120;
export const MAX_SKU = 40;
const SKU_SHAPE = /^[A-Za-z0-9][A-Za-z0-9._/-]*$/;

export const CELL_SHAPES = ["cylinder", "box"] as const;
export type CellShape = (typeof CELL_SHAPES)[number];

/** A cell as the catalog stores it (the database's units: percent, millimetres). */
export interface CellValues {
  sku: string;
  manufacturer: string;
  series: string;
  technology: Technology;
  capacitanceF: number;
  toleranceMinusPct: number;
  tolerancePlusPct: number;
  ratedVoltageV: number;
  surgeVoltageV: number;
  esrOhm: number;
  leakageCurrentA: number;
  continuousCurrentA: number;
  peakCurrentA: number;
  massKg: number;
  shape: CellShape;
  diameterMm: number | null;
  lengthMm: number | null;
  widthMm: number | null;
  heightMm: number;
  unitCost: string;
  stock: number;
  leadTimeDays: number;
  isActive: boolean;
}

type Kind = "text" | "quantity" | "fraction" | "integer" | "money" | "choice" | "boolean";

export interface CellField {
  /** the name in the API, the CSV header and the form */
  name: CellFieldName;
  label: string;
  kind: Kind;
  /** the SI unit a quantity is typed in */
  unit?: QuantityUnit;
  /** inclusive lower bound; `minExclusive` when the value must be above it */
  min?: number;
  minExclusive?: boolean;
  max?: number;
  choices?: readonly string[];
  /** an example as people type it (form placeholders, the CSV template) */
  example: string;
  /** one sentence: what the field is and where it is used */
  help: string;
  /** present only for some cells (a cylinder's diameter, a box's length and width) */
  optional?: boolean;
}

export const CELL_FIELD_NAMES = [
  "sku",
  "manufacturer",
  "series",
  "technology",
  "capacitance",
  "toleranceMinus",
  "tolerancePlus",
  "ratedVoltage",
  "surgeVoltage",
  "esr",
  "leakageCurrent",
  "continuousCurrent",
  "peakCurrent",
  "mass",
  "shape",
  "diameter",
  "length",
  "width",
  "height",
  "unitCost",
  "stock",
  "leadTimeDays",
  "active",
] as const;
export type CellFieldName = (typeof CELL_FIELD_NAMES)[number];

/** Every field of a cell, in the order of the form, the CSV columns and the API. */
export const CELL_FIELDS: readonly CellField[] = [
  { name: "sku", label: "Part number (SKU)", kind: "text", example: "QFS-1200R27", help: "The shop's own part number; unique in the catalog." },
  { name: "manufacturer", label: "Maker", kind: "text", example: "Quillfen", help: "Who makes the cell; shown on quotes." },
  { name: "series", label: "Family", kind: "text", example: "Fenwall", help: "The maker's product family; shown on quotes." },
  {
    name: "technology",
    label: "Technology",
    kind: "choice",
    choices: TECHNOLOGIES,
    example: "edlc",
    help: "edlc, hybrid, electrolytic or film: sets the engine's limits and the cautions.",
  },
  {
    name: "capacitance",
    label: "Capacitance",
    kind: "quantity",
    unit: "F",
    min: 0,
    minExclusive: true,
    max: MAX_CAPACITANCE,
    example: "1200 F",
    help: "Nominal capacitance of one cell.",
  },
  {
    name: "toleranceMinus",
    label: "Tolerance below",
    kind: "fraction",
    min: 0,
    max: 0.99,
    example: "10 %",
    help: "How far below nominal a cell may be (10 % or 0.1); the engine designs with the low end.",
  },
  {
    name: "tolerancePlus",
    label: "Tolerance above",
    kind: "fraction",
    min: 0,
    max: 1,
    example: "20 %",
    help: "How far above nominal a cell may be (20 % or 0.2); sets the worst-case discharge time.",
  },
  {
    name: "ratedVoltage",
    label: "Rated voltage",
    kind: "quantity",
    unit: "V",
    min: 0,
    minExclusive: true,
    max: MAX_VOLTAGE,
    example: "2.7 V",
    help: "The highest continuous voltage across one cell.",
  },
  {
    name: "surgeVoltage",
    label: "Surge voltage",
    kind: "quantity",
    unit: "V",
    min: 0,
    minExclusive: true,
    max: MAX_VOLTAGE,
    example: "2.85 V",
    help: "The most a cell may briefly see while charging; at least the rated voltage.",
  },
  {
    name: "esr",
    label: "ESR",
    kind: "quantity",
    unit: "Ω",
    min: 0,
    minExclusive: true,
    max: MAX_RESISTANCE,
    example: "0.58 mΩ",
    help: "Equivalent series resistance of a new cell; sets voltage drop and heating.",
  },
  {
    name: "leakageCurrent",
    label: "Leakage current",
    kind: "quantity",
    unit: "A",
    min: 0,
    max: MAX_CURRENT,
    example: "2.7 mA",
    help: "Self-discharge current at rated voltage; sizes the balancing resistors.",
  },
  {
    name: "continuousCurrent",
    label: "Continuous current",
    kind: "quantity",
    unit: "A",
    min: 0,
    minExclusive: true,
    max: MAX_CURRENT,
    example: "80 A",
    help: "The current one cell carries continuously.",
  },
  {
    name: "peakCurrent",
    label: "Peak current",
    kind: "quantity",
    unit: "A",
    min: 0,
    minExclusive: true,
    max: MAX_CURRENT,
    example: "955 A",
    help: "The most one cell delivers for a short pulse; at least the continuous current.",
  },
  { name: "mass", label: "Mass", kind: "quantity", unit: "kg", min: 0, minExclusive: true, max: MAX_MASS, example: "272 g", help: "Mass of one cell." },
  {
    name: "shape",
    label: "Shape",
    kind: "choice",
    choices: CELL_SHAPES,
    example: "cylinder",
    help: "cylinder (give the diameter) or box (give length and width).",
  },
  {
    name: "diameter",
    label: "Diameter",
    kind: "quantity",
    unit: "m",
    min: 0,
    minExclusive: true,
    max: MAX_LENGTH,
    example: "60 mm",
    help: "A cylinder's diameter; cylinders pack on a square grid.",
    optional: true,
  },
  {
    name: "length",
    label: "Length",
    kind: "quantity",
    unit: "m",
    min: 0,
    minExclusive: true,
    max: MAX_LENGTH,
    example: "",
    help: "A box cell's length.",
    optional: true,
  },
  {
    name: "width",
    label: "Width",
    kind: "quantity",
    unit: "m",
    min: 0,
    minExclusive: true,
    max: MAX_LENGTH,
    example: "",
    help: "A box cell's width.",
    optional: true,
  },
  {
    name: "height",
    label: "Height",
    kind: "quantity",
    unit: "m",
    min: 0,
    minExclusive: true,
    max: MAX_LENGTH,
    example: "74 mm",
    help: "Height of one cell, terminals included.",
  },
  {
    name: "unitCost",
    label: "Unit cost",
    kind: "money",
    min: 0,
    example: "23.80",
    help: "What one cell costs the shop, in the shop's currency (up to 4 decimals); never shown to customers.",
  },
  { name: "stock", label: "In stock", kind: "integer", min: 0, max: MAX_STOCK, example: "240", help: "Cells on the shelf." },
  {
    name: "leadTimeDays",
    label: "Lead time (days)",
    kind: "integer",
    min: 0,
    max: MAX_LEAD_TIME_DAYS,
    example: "3",
    help: "Days to get more cells; a bank's lead time is its slowest part's.",
  },
  {
    name: "active",
    label: "Offered",
    kind: "boolean",
    example: "true",
    help: "true: the engine builds from it; false: retired, kept for old quotes but never offered.",
  },
];

export const CELL_FIELD_BY_NAME: Readonly<Record<CellFieldName, CellField>> = Object.fromEntries(CELL_FIELDS.map((f) => [f.name, f])) as Record<
  CellFieldName,
  CellField
>;

/** A cell in the API's and the CSV's terms: SI numbers, tolerances as fractions, money as a decimal string. */
export interface CellRecord extends Pick<
  EngineCell,
  | "sku"
  | "technology"
  | "capacitance"
  | "toleranceMinus"
  | "tolerancePlus"
  | "ratedVoltage"
  | "surgeVoltage"
  | "esr"
  | "leakageCurrent"
  | "continuousCurrent"
  | "peakCurrent"
  | "mass"
> {
  manufacturer: string;
  series: string;
  shape: CellShape;
  diameter: number | null;
  length: number | null;
  width: number | null;
  height: number;
  unitCost: string;
  stock: number;
  leadTimeDays: number;
  active: boolean;
}

/** Scales by a power of ten without leaving float dust (0.0607 m → 60.7 mm, not 60.699999999999996). */
function scaled(value: number, factor: number): number {
  return Number((value * factor).toPrecision(12));
}

export function toCellRecord(v: CellValues): CellRecord {
  const m = (mm: number | null) => (mm === null ? null : scaled(mm, 1e-3));
  return {
    sku: v.sku,
    manufacturer: v.manufacturer,
    series: v.series,
    technology: v.technology,
    capacitance: v.capacitanceF,
    toleranceMinus: scaled(v.toleranceMinusPct, 1e-2),
    tolerancePlus: scaled(v.tolerancePlusPct, 1e-2),
    ratedVoltage: v.ratedVoltageV,
    surgeVoltage: v.surgeVoltageV,
    esr: v.esrOhm,
    leakageCurrent: v.leakageCurrentA,
    continuousCurrent: v.continuousCurrentA,
    peakCurrent: v.peakCurrentA,
    mass: v.massKg,
    shape: v.shape,
    diameter: m(v.diameterMm),
    length: m(v.lengthMm),
    width: m(v.widthMm),
    height: scaled(v.heightMm, 1e-3),
    unitCost: v.unitCost,
    stock: v.stock,
    leadTimeDays: v.leadTimeDays,
    active: v.isActive,
  };
}

export function fromCellRecord(r: CellRecord): CellValues {
  const mm = (m: number | null) => (m === null ? null : scaled(m, 1e3));
  return {
    sku: r.sku,
    manufacturer: r.manufacturer,
    series: r.series,
    technology: r.technology,
    capacitanceF: r.capacitance,
    toleranceMinusPct: scaled(r.toleranceMinus, 100),
    tolerancePlusPct: scaled(r.tolerancePlus, 100),
    ratedVoltageV: r.ratedVoltage,
    surgeVoltageV: r.surgeVoltage,
    esrOhm: r.esr,
    leakageCurrentA: r.leakageCurrent,
    continuousCurrentA: r.continuousCurrent,
    peakCurrentA: r.peakCurrent,
    massKg: r.mass,
    shape: r.shape,
    diameterMm: r.shape === "cylinder" ? mm(r.diameter) : null,
    lengthMm: r.shape === "box" ? mm(r.length) : null,
    widthMm: r.shape === "box" ? mm(r.width) : null,
    heightMm: scaled(r.height, 1e3),
    unitCost: new Dec(r.unitCost).toFixed(UNIT_COST_DECIMALS),
    stock: r.stock,
    leadTimeDays: r.leadTimeDays,
    isActive: r.active,
  };
}

export interface FieldIssue {
  /** the field (API name, CSV column) */
  field: CellFieldName | "_cell";
  message: string;
}

type Raw = Partial<Record<CellFieldName, unknown>>;

function describe(f: CellField): string {
  return f.label.charAt(0).toLowerCase() + f.label.slice(1);
}

function boundsMessage(f: CellField, what: string): string | null {
  return f.max !== undefined ? `The ${what} must be at most ${formatBound(f.max, f.unit ?? "")}` : null;
}

/** Reads one field's value (a string as typed, or a JSON value): the value, or the message for its field. */
function readField(f: CellField, raw: unknown): { ok: true; value: unknown } | { ok: false; message: string } {
  const what = describe(f);
  const text = typeof raw === "string" ? raw.trim() : raw;
  const empty = text === "" || text === null || text === undefined;
  if (empty) {
    if (f.optional) return { ok: true, value: null };
    return { ok: false, message: `Enter the ${what}${f.example ? `, e.g. ${f.example}` : ""}` };
  }
  switch (f.kind) {
    case "text": {
      if (typeof text !== "string") return { ok: false, message: `The ${what} must be text` };
      const max = f.name === "sku" ? MAX_SKU : MAX_TEXT;
      if (text.length > max) return { ok: false, message: `Keep the ${what} under ${max + 1} characters` };
      if (f.name === "sku" && !SKU_SHAPE.test(text))
        return { ok: false, message: "A part number uses letters, digits and . _ / - only, and starts with a letter or digit" };
      // eslint-disable-next-line no-control-regex
      if (/[\u0000-\u001f\u007f]/.test(text)) return { ok: false, message: `The ${what} may not hold control characters` };
      return { ok: true, value: text };
    }
    case "choice": {
      const v = typeof text === "string" ? text.toLowerCase() : text;
      if (typeof v !== "string" || !f.choices?.includes(v)) return { ok: false, message: `The ${what} must be one of: ${f.choices?.join(", ")}` };
      return { ok: true, value: v };
    }
    case "boolean": {
      if (typeof text === "boolean") return { ok: true, value: text };
      const v = String(text).toLowerCase();
      if (["true", "yes", "1"].includes(v)) return { ok: true, value: true };
      if (["false", "no", "0"].includes(v)) return { ok: true, value: false };
      return { ok: false, message: `Write true or false for ${what}` };
    }
    case "integer": {
      const n = typeof text === "number" ? text : /^\d+$/.test(String(text)) ? Number(text) : Number.NaN;
      if (!Number.isInteger(n) || n < (f.min ?? 0) || n > (f.max ?? Number.MAX_SAFE_INTEGER))
        return { ok: false, message: `The ${what} must be a whole number from ${f.min ?? 0} to ${(f.max ?? 0).toLocaleString("en-GB")}` };
      return { ok: true, value: n };
    }
    case "money": {
      const s = typeof text === "number" ? String(text) : String(text);
      if (!isDecimalString(s) || s.startsWith("-") || s.startsWith("+"))
        return { ok: false, message: `Write the ${what} as a decimal in the shop's currency, like 23.80 (a point, no currency sign)` };
      const d = new Dec(s);
      if (d.decimalPlaces() > UNIT_COST_DECIMALS) return { ok: false, message: `The ${what} keeps at most ${UNIT_COST_DECIMALS} decimals` };
      if (d.greaterThan(MAX_UNIT_COST)) return { ok: false, message: `The ${what} must be at most ${MAX_UNIT_COST}` };
      return { ok: true, value: d.toFixed(UNIT_COST_DECIMALS) };
    }
    case "fraction": {
      let value: number;
      if (typeof text === "number") value = text;
      else {
        const t = String(text);
        const pct = /^\s*([0-9]+(?:[.,][0-9]+)?)\s*%\s*$/.exec(t);
        if (pct) value = Number((pct[1] ?? "").replace(",", ".")) / 100;
        else if (/^\s*[0-9]*[.,]?[0-9]+\s*$/.test(t)) value = Number(t.replace(",", "."));
        else return { ok: false, message: `Write the ${what} as a percentage like 10 % (or a fraction like 0.1)` };
      }
      if (!Number.isFinite(value) || value < (f.min ?? 0) || value > (f.max ?? 1))
        return { ok: false, message: `The ${what} must be from 0 % to ${Math.round((f.max ?? 1) * 100)} % (write 10 % or 0.1)` };
      return { ok: true, value: scaled(value, 1) };
    }
    case "quantity": {
      const unit = f.unit as QuantityUnit;
      let value: number;
      if (typeof text === "number") {
        if (!Number.isFinite(text)) return { ok: false, message: `The ${what} must be a number` };
        value = text;
      } else {
        const r = parseQuantity(String(text), unit, { allowZero: !f.minExclusive });
        if (!r.ok) return { ok: false, message: `${r.message}; write the ${what} like ${f.example || `1 ${unit}`}` };
        value = r.value;
      }
      if (f.minExclusive ? !(value > (f.min ?? 0)) : value < (f.min ?? 0))
        return { ok: false, message: f.minExclusive ? `The ${what} must be greater than zero` : `The ${what} must not be negative` };
      if (f.max !== undefined && value > f.max) return { ok: false, message: boundsMessage(f, what) ?? "" };
      return { ok: true, value };
    }
  }
}

export type ReadCellResult = { ok: true; record: CellRecord } | { ok: false; issues: FieldIssue[] };

/**
 * Reads a whole cell from what people typed (the form), a CSV row or a JSON body: every field
 * through its definition, then the checks across fields (surge ≥ rated, peak ≥ continuous, the
 * shape's dimensions). Fields absent from `raw` are taken from `base` (an update names only what it
 * changes); without a base they are missing. One message per field at most, the first found.
 */
export function readCell(raw: Raw, base?: CellRecord): ReadCellResult {
  const issues: FieldIssue[] = [];
  const out: Record<string, unknown> = {};
  for (const f of CELL_FIELDS) {
    const given = Object.prototype.hasOwnProperty.call(raw, f.name) && raw[f.name] !== undefined;
    if (!given && base) {
      out[f.name] = base[f.name];
      continue;
    }
    const r = readField(f, given ? raw[f.name] : undefined);
    if (r.ok) out[f.name] = r.value;
    else issues.push({ field: f.name, message: r.message });
  }
  const failed = new Set(issues.map((i) => i.field));
  const num = (name: CellFieldName) => (failed.has(name) ? null : (out[name] as number | null));
  const rated = num("ratedVoltage");
  const surge = num("surgeVoltage");
  if (rated !== null && surge !== null && surge < rated)
    issues.push({ field: "surgeVoltage", message: "The surge voltage must be at least the rated voltage" });
  const cont = num("continuousCurrent");
  const peak = num("peakCurrent");
  if (cont !== null && peak !== null && peak < cont) issues.push({ field: "peakCurrent", message: "The peak current must be at least the continuous current" });
  if (!failed.has("shape")) {
    const need: CellFieldName[] = out.shape === "cylinder" ? ["diameter"] : ["length", "width"];
    for (const name of need)
      if (!failed.has(name) && out[name] === null)
        issues.push({ field: name, message: `A ${String(out.shape)} cell needs its ${describe(CELL_FIELD_BY_NAME[name])}, e.g. 60 mm` });
    // what the other shape would use is not kept
    for (const name of ["diameter", "length", "width"] as const) if (!need.includes(name)) out[name] = null;
  }
  if (issues.length > 0) return { ok: false, issues };
  const record = out as unknown as CellRecord;
  try {
    // the engine reads the volume from the shape: make sure it can
    cellVolume({
      shape: record.shape,
      diameterMm: record.diameter ?? undefined,
      lengthMm: record.length ?? undefined,
      widthMm: record.width ?? undefined,
      heightMm: record.height,
    });
  } catch (error) {
    return { ok: false, issues: [{ field: "_cell", message: error instanceof Error ? error.message : "The shape's dimensions do not make a volume" }] };
  }
  return { ok: true, record };
}

/** One changed field: its name and both values as people read them. */
export interface FieldChange {
  field: CellFieldName;
  from: string;
  to: string;
}

/** A field's value as people read it (engineering units for quantities, % for tolerances); `digits` significant figures. */
export function formatCellValue(name: CellFieldName, value: unknown, digits = 6): string {
  const f = CELL_FIELD_BY_NAME[name];
  if (value === null || value === undefined) return "—";
  switch (f.kind) {
    case "quantity":
      return formatQuantity(value as number, f.unit === "Ω" ? "ohm" : (f.unit as string), { digits });
    case "fraction":
      return `${scaled((value as number) * 100, 1)} %`;
    case "money":
      return new Dec(value as string).toString();
    default:
      return String(value);
  }
}

/** Two values of a field are the same: numbers within a relative 1e-9 (float dust from unit changes), money as decimals. */
function same(f: CellField, a: unknown, b: unknown): boolean {
  if (a === null || b === null) return a === b;
  if (f.kind === "money") return new Dec(a as string).equals(new Dec(b as string));
  if (typeof a === "number" && typeof b === "number") return a === b || Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
  return a === b;
}

/** The fields that differ between a stored cell and an incoming one, each worded old → new; empty when nothing changed. */
export function diffCells(before: CellRecord, after: CellRecord): FieldChange[] {
  const out: FieldChange[] = [];
  for (const f of CELL_FIELDS) {
    const a = before[f.name];
    const b = after[f.name];
    if (!same(f, a, b)) out.push({ field: f.name, from: formatCellValue(f.name, a), to: formatCellValue(f.name, b) });
  }
  return out;
}

/** Money as people type it: at least two decimals, and every stored decimal that is not zero ("38.5000" → "38.50", "12.3456" → "12.3456"). */
export function moneyText(value: string): string {
  const d = new Dec(value);
  return d.decimalPlaces() <= 2 ? d.toFixed(2) : d.toString();
}

/**
 * The form's text for each field of a cell (what the edit form starts from). Quantities keep ten
 * significant figures, so text that is sent back unchanged reads as the same value (diffCells
 * compares within a relative 1e-9).
 */
export function cellFormText(r: CellRecord): Record<CellFieldName, string> {
  const out = {} as Record<CellFieldName, string>;
  for (const f of CELL_FIELDS) {
    const v = r[f.name];
    out[f.name] =
      v === null
        ? ""
        : f.kind === "quantity" || f.kind === "fraction"
          ? formatCellValue(f.name, v, 10)
          : f.kind === "money"
            ? moneyText(v as string)
            : String(v);
  }
  return out;
}
