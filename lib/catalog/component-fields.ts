/**
 * Catalog components (parts other than cells): what each kind carries, defined once for the form
 * and the server. Pure: no database, no framework.
 */
import { MAX_CURRENT, MAX_POWER, MAX_VOLTAGE, MAX_VOLUME, formatBound } from "../bank/bounds";
import { Dec, isDecimalString } from "../pricing/decimal";
import { formatQuantity, parseQuantity, type QuantityUnit } from "../quantities";
import { MAX_LEAD_TIME_DAYS, MAX_SKU, MAX_STOCK, MAX_TEXT, MAX_UNIT_COST, UNIT_COST_DECIMALS, moneyText } from "./cell-fields";

export const COMPONENT_KIND_VALUES = ["balancing-board", "interconnect", "terminal", "enclosure", "resistor"] as const;
export type ComponentKind = (typeof COMPONENT_KIND_VALUES)[number];

export const COMPONENT_KIND_LABELS: Record<ComponentKind, string> = {
  "balancing-board": "Active balancing board",
  interconnect: "Interconnect",
  terminal: "Terminal set",
  enclosure: "Enclosure",
  resistor: "Resistor (balancing, bleeder)",
};

export interface SpecField {
  key: string;
  label: string;
  kind: "quantity" | "integer" | "text";
  unit?: QuantityUnit;
  max: number;
  example: string;
  help: string;
}

/** The figures each kind of component carries, and what reads them. */
export const COMPONENT_SPEC_FIELDS: Record<ComponentKind, SpecField[]> = {
  "balancing-board": [
    { key: "channels", label: "Channels", kind: "integer", max: 256, example: "12", help: "Series positions one board balances." },
    {
      key: "maxCellVoltage",
      label: "Clamp voltage per cell",
      kind: "quantity",
      unit: "V",
      max: MAX_VOLTAGE,
      example: "2.7 V",
      help: "The voltage the board holds each position at or below; the engine fits boards that clamp at or below a cell's rating.",
    },
  ],
  interconnect: [],
  terminal: [
    {
      key: "maxCurrentA",
      label: "Current rating",
      kind: "quantity",
      unit: "A",
      max: MAX_CURRENT,
      example: "350 A",
      help: "The current the terminal set carries.",
    },
  ],
  enclosure: [
    { key: "volumeM3", label: "Inner volume", kind: "quantity", unit: "m³", max: MAX_VOLUME, example: "20 L", help: "Space inside for the cells." },
    { key: "ipRating", label: "IP rating", kind: "text", max: 4, example: "IP54", help: "Protection against solids and water (IEC 60529), e.g. IP54." },
  ],
  resistor: [
    {
      key: "powerRatingW",
      label: "Power rating",
      kind: "quantity",
      unit: "W",
      max: MAX_POWER,
      example: "0.5 W",
      help: "Its power class: a bank takes the smallest resistor rated for twice what each one dissipates.",
    },
  ],
};

/** A component as the catalog stores it. */
export interface ComponentValues {
  kind: ComponentKind;
  sku: string;
  name: string;
  unitCost: string;
  specs: Record<string, number | string>;
  stock: number;
  leadTimeDays: number;
  isActive: boolean;
}

/** The component form's text fields: the common ones and each spec key. */
export type ComponentFormText = { kind: string; sku: string; name: string; unitCost: string; stock: string; leadTimeDays: string; active: string } & Record<
  string,
  string
>;

export type ReadComponentResult = { ok: true; values: ComponentValues } | { ok: false; issues: { field: string; message: string }[] };

const SKU_SHAPE = /^[A-Za-z0-9][A-Za-z0-9._/-]*$/;

/** Reads a component form: the common fields, then the figures its kind needs. One message per field at most. */
export function readComponent(raw: ComponentFormText): ReadComponentResult {
  const issues: { field: string; message: string }[] = [];
  const kind = raw.kind as ComponentKind;
  if (!COMPONENT_KIND_VALUES.includes(kind)) issues.push({ field: "kind", message: `Choose a kind: ${COMPONENT_KIND_VALUES.join(", ")}` });
  const sku = (raw.sku ?? "").trim();
  if (sku === "" || sku.length > MAX_SKU || !SKU_SHAPE.test(sku))
    issues.push({ field: "sku", message: "A part number uses letters, digits and . _ / - only (up to 40), and starts with a letter or digit" });
  const name = (raw.name ?? "").trim();
  if (name === "" || name.length > MAX_TEXT) issues.push({ field: "name", message: `Name the part in 1 to ${MAX_TEXT} characters` });
  const cost = (raw.unitCost ?? "").trim();
  let unitCost = "0";
  if (!isDecimalString(cost) || cost.startsWith("-") || cost.startsWith("+"))
    issues.push({ field: "unitCost", message: "Write the unit cost as a decimal like 12.50" });
  else if (new Dec(cost).decimalPlaces() > UNIT_COST_DECIMALS)
    issues.push({ field: "unitCost", message: `The unit cost keeps at most ${UNIT_COST_DECIMALS} decimals` });
  else if (new Dec(cost).greaterThan(MAX_UNIT_COST)) issues.push({ field: "unitCost", message: `The unit cost must be at most ${MAX_UNIT_COST}` });
  else unitCost = new Dec(cost).toFixed(UNIT_COST_DECIMALS);
  const whole = (field: "stock" | "leadTimeDays", max: number) => {
    const t = (raw[field] ?? "").trim();
    if (!/^\d+$/.test(t) || Number(t) > max) {
      issues.push({ field, message: `A whole number from 0 to ${max.toLocaleString("en-GB")}` });
      return 0;
    }
    return Number(t);
  };
  const stock = whole("stock", MAX_STOCK);
  const leadTimeDays = whole("leadTimeDays", MAX_LEAD_TIME_DAYS);
  const specs: Record<string, number | string> = kind === "interconnect" ? { perCell: 1 } : {};
  for (const f of COMPONENT_SPEC_FIELDS[kind] ?? []) {
    const t = (raw[f.key] ?? "").trim();
    if (t === "") {
      issues.push({ field: f.key, message: `Enter the ${f.label.toLowerCase()}, e.g. ${f.example}` });
      continue;
    }
    if (f.kind === "text") {
      if (f.key === "ipRating" && !/^IP[0-6][0-9]$/.test(t))
        issues.push({ field: f.key, message: "An IP code is IP, a solids digit 0–6 and a water digit 0–9, e.g. IP54" });
      else specs[f.key] = t;
    } else if (f.kind === "integer") {
      if (!/^\d+$/.test(t) || Number(t) < 1 || Number(t) > f.max) issues.push({ field: f.key, message: `A whole number from 1 to ${f.max}` });
      else specs[f.key] = Number(t);
    } else {
      const r = parseQuantity(t, f.unit as QuantityUnit);
      if (!r.ok) issues.push({ field: f.key, message: `${r.message}; write it like ${f.example}` });
      else if (r.value > f.max) issues.push({ field: f.key, message: `At most ${formatBound(f.max, f.unit ?? "")}` });
      else specs[f.key] = r.value;
    }
  }
  if (issues.length > 0) return { ok: false, issues };
  return { ok: true, values: { kind, sku, name, unitCost, specs, stock, leadTimeDays, isActive: raw.active !== "false" } };
}

/** The form's text for a stored component. */
export function componentFormText(v: ComponentValues): ComponentFormText {
  const out: ComponentFormText = {
    kind: v.kind,
    sku: v.sku,
    name: v.name,
    unitCost: moneyText(v.unitCost),
    stock: String(v.stock),
    leadTimeDays: String(v.leadTimeDays),
    active: v.isActive ? "true" : "false",
  };
  for (const f of COMPONENT_SPEC_FIELDS[v.kind] ?? []) {
    const s = v.specs[f.key];
    out[f.key] = s === undefined ? "" : f.kind === "quantity" ? formatQuantity(Number(s), f.unit as string, { digits: 10 }) : String(s);
  }
  return out;
}

/** A component's figures as one line people read ("12 channels, clamps at 2.7 V"). */
export function describeSpecs(kind: ComponentKind, specs: Record<string, number | string>): string {
  return (COMPONENT_SPEC_FIELDS[kind] ?? [])
    .map((f) => {
      const v = specs[f.key];
      if (v === undefined) return null;
      return `${f.label}: ${f.kind === "quantity" ? formatQuantity(Number(v), f.unit as string) : String(v)}`;
    })
    .filter(Boolean)
    .join(" · ");
}
