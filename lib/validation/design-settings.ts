import { z } from "zod";
import { MAX_CELLS_PER_BANK, MAX_ENERGY, MAX_VOLTAGE } from "../bank/bounds";
import { DEFAULT_RELIABILITY_SETTINGS, RELIABILITY_SETTING_BOUNDS, type ReliabilitySettings } from "../bank/reliability-settings";
import { TECHNOLOGIES, type DesignFactors } from "../bank/types";
import { formatQuantity, parseQuantity, type QuantityUnit } from "../quantities";
import type { AutoQuoteLimits } from "../quoting/auto-quote-limits";
import { TECHNOLOGY_LABELS } from "../vocabulary";
import { text } from "./text";

/**
 * The shop's design factors and auto-quote limits (DESIGN.md §3.2), as one list of groups and
 * fields: label, unit, bounds and one sentence on what each does. The settings form renders the
 * fields from this list and the server reads them with it, so a new group (e.g. life settings per
 * technology) is one more entry in SETTINGS_GROUPS and one more key in `ShopSettingsGroups`.
 */

/** The settings objects a group edits, by their key in the shop's settings (db/schema/settings.ts). */
export interface ShopSettingsGroups {
  designFactors: DesignFactors;
  autoQuoteLimits: AutoQuoteLimits;
  reliabilitySettings: ReliabilitySettings;
}
export type SettingsGroupKey = keyof ShopSettingsGroups;

export interface SettingField {
  /** the field's key in its group's object; a dotted key ("voltageDoublingStep.edlc") reaches into a nested object */
  key: string;
  label: string;
  /**
   * percent: stored as a fraction, typed in % (20 % → 0.2); number: a plain number; integer;
   * quantity: typed with its SI unit (60 V, 5 s, 2 MJ); choice: one of `choices`.
   */
  kind: "percent" | "number" | "integer" | "quantity" | "choice";
  unit?: QuantityUnit;
  /** inclusive bounds, in the stored value's terms (fractions for percent, SI for quantities) */
  min?: number;
  max?: number;
  /** the value must be above `min` rather than at least it */
  minExclusive?: boolean;
  choices?: readonly string[];
  /** one sentence: what the setting does */
  help: string;
  /** the default, when it is common practice rather than a shop's own figure: the form says so beside the field */
  commonPractice?: number | string;
}

export interface SettingsGroup {
  key: SettingsGroupKey;
  title: string;
  description: string;
  fields: SettingField[];
}

export const SETTINGS_GROUPS: readonly SettingsGroup[] = [
  {
    key: "designFactors",
    title: "Design factors",
    description: "How conservatively the engine sizes every bank it offers.",
    fields: [
      {
        key: "capacitanceFade",
        label: "End-of-life capacitance fade",
        kind: "percent",
        min: 0,
        max: 0.9,
        help: "Banks are sized to still meet the requirement after the cells lose this share of their capacitance.",
      },
      {
        key: "esrGrowth",
        label: "End-of-life ESR growth",
        kind: "percent",
        min: 0,
        max: 5,
        help: "Voltage drop and heating are checked with the ESR grown by this much.",
      },
      {
        key: "voltageDerating",
        label: "Cell voltage derating",
        kind: "number",
        min: 0.5,
        max: 1,
        help: "Cells are charged to at most this fraction of their rated voltage (1 = the full rating).",
      },
      {
        key: "matchingTolerance",
        label: "Cell matching after grading",
        kind: "percent",
        min: 0,
        max: 0.3,
        help: "How far graded cells may differ in capacitance; sets the worst cell's charging voltage.",
      },
      {
        key: "balancingFactor",
        label: "Balancing factor",
        kind: "number",
        min: 1,
        max: 100,
        help: "Balancing resistors carry at least this many times a cell's leakage current.",
      },
      {
        key: "resistorSeries",
        label: "Resistor series",
        kind: "choice",
        choices: ["E12", "E24", "E48", "E96"],
        help: "Resistor values are rounded to this IEC 60063 series.",
      },
      {
        key: "safeVoltage",
        label: "Safe voltage",
        kind: "quantity",
        unit: "V",
        min: 0,
        minExclusive: true,
        max: 1000,
        help: "Below this a bank counts as safe to touch; above it a bleeder must bring it down in time.",
      },
      {
        key: "safeTime",
        label: "Time to the safe voltage",
        kind: "quantity",
        unit: "s",
        min: 0,
        minExclusive: true,
        max: 3600,
        help: "How soon after switch-off the bank must be below the safe voltage.",
      },
    ],
  },
  {
    key: "autoQuoteLimits",
    title: "Auto-quote limits",
    description: "Beyond any of these a customer's choice goes to the estimators instead of being quoted at once.",
    fields: [
      {
        key: "maxVoltage",
        label: "Highest voltage quoted at once",
        kind: "quantity",
        unit: "V",
        min: 0,
        minExclusive: true,
        max: MAX_VOLTAGE,
        help: "Requirements above this voltage get an engineer's review first.",
      },
      {
        key: "maxStoredEnergy",
        label: "Most stored energy quoted at once",
        kind: "quantity",
        unit: "J",
        min: 0,
        minExclusive: true,
        max: MAX_ENERGY,
        help: "Banks storing more than this (per bank, at their rating) get an engineer's review first.",
      },
      {
        key: "maxCellCount",
        label: "Most cells per bank quoted at once",
        kind: "integer",
        min: 1,
        max: MAX_CELLS_PER_BANK,
        help: "Banks with more cells than this get an engineer's review first.",
      },
    ],
  },
  {
    key: "reliabilitySettings",
    title: "Failure, yield and life",
    description:
      "How options estimate expected life, how long a switched-off hybrid bank must stay above its cells' minimum voltage, and how cell capacitances spread in the tolerance yield. The defaults are common practice recalled from memory, not a maker's data: set them from your suppliers' life curves.",
    fields: [
      ...TECHNOLOGIES.map((t): SettingField => ({
        key: `voltageDoublingStep.${t}`,
        label: `${TECHNOLOGY_LABELS[t]}: voltage step per doubling of life`,
        kind: "percent",
        min: RELIABILITY_SETTING_BOUNDS.voltageDoublingStep.min,
        max: RELIABILITY_SETTING_BOUNDS.voltageDoublingStep.max,
        help: "Expected life doubles for each step of this share of the rated voltage that the cells run below it.",
        commonPractice: DEFAULT_RELIABILITY_SETTINGS.voltageDoublingStep[t],
      })),
      {
        key: "maxLifeYears",
        label: "Longest life ever stated",
        kind: "integer",
        min: RELIABILITY_SETTING_BOUNDS.maxLifeYears.min,
        max: RELIABILITY_SETTING_BOUNDS.maxLifeYears.max,
        help: "Expected life is never stated beyond this many years, however cool and lightly loaded the cells run.",
        commonPractice: DEFAULT_RELIABILITY_SETTINGS.maxLifeYears,
      },
      {
        key: "standbyDays",
        label: "Standby a hybrid bank must outlast (days)",
        kind: "integer",
        min: RELIABILITY_SETTING_BOUNDS.standbyDays.min,
        max: RELIABILITY_SETTING_BOUNDS.standbyDays.max,
        help: "A switched-off hybrid bank must stay above its cells' minimum voltage this long, or the option says it needs a disconnect.",
        commonPractice: DEFAULT_RELIABILITY_SETTINGS.standbyDays,
      },
      {
        key: "yieldDistribution",
        label: "Spread of cell capacitance",
        kind: "choice",
        choices: ["uniform", "normal"],
        help: "Tolerance yield draws each cell's capacitance evenly over its graded band (uniform), or with the band as ±3σ (normal).",
        commonPractice: DEFAULT_RELIABILITY_SETTINGS.yieldDistribution,
      },
    ],
  },
];

export type SettingsFormValues = Record<SettingsGroupKey, Record<string, string>>;

const bound = (f: SettingField, v: number) =>
  f.kind === "percent" ? `${Number((v * 100).toPrecision(6))} %` : f.kind === "quantity" ? formatQuantity(v, f.unit ?? "") : String(v);

/** A group object's value at a field's (possibly dotted) key. */
export function valueAt(obj: unknown, key: string): unknown {
  return key.split(".").reduce<unknown>((o, k) => (o !== null && typeof o === "object" ? (o as Record<string, unknown>)[k] : undefined), obj);
}

function setAt(obj: Record<string, unknown>, key: string, value: unknown): void {
  const parts = key.split(".");
  let o = obj;
  for (const k of parts.slice(0, -1)) o = (o[k] ??= {}) as Record<string, unknown>;
  o[parts[parts.length - 1] as string] = value;
}

/** A field's stored value as the form shows it. */
export function settingText(f: SettingField, value: unknown): string {
  if (value === undefined || value === null) return "";
  if (f.kind === "percent") return `${Number(((value as number) * 100).toPrecision(10))} %`;
  if (f.kind === "quantity") return formatQuantity(value as number, f.unit ?? "", { digits: 10 });
  return String(value);
}

/** One field read from its text: the stored value, or the message for the field. */
export function readSetting(f: SettingField, raw: string): { ok: true; value: number | string } | { ok: false; message: string } {
  const t = raw.trim();
  const what = f.label.charAt(0).toLowerCase() + f.label.slice(1);
  if (t === "") return { ok: false, message: `Enter the ${what}` };
  let v: number;
  if (f.kind === "choice") return f.choices?.includes(t) ? { ok: true, value: t } : { ok: false, message: `Choose one of ${f.choices?.join(", ")}` };
  if (f.kind === "percent") {
    const m = /^(\d+(?:[.,]\d+)?)\s*%?$/.exec(t);
    if (!m) return { ok: false, message: `Write the ${what} as a percentage, like 20 %` };
    // as typed, without the float noise of dividing by 100 (3.7 % is 0.037, not 0.037000000000000005)
    v = Number((Number((m[1] ?? "").replace(",", ".")) / 100).toPrecision(12));
  } else if (f.kind === "quantity") {
    const r = parseQuantity(t, f.unit as QuantityUnit);
    if (!r.ok) return { ok: false, message: `${r.message}; write it like ${formatQuantity(f.max ?? 1, f.unit ?? "")}` };
    v = r.value;
  } else {
    if (!/^\d+(\.\d+)?$/.test(t)) return { ok: false, message: `Write the ${what} as a number` };
    v = Number(t);
    if (f.kind === "integer" && !Number.isInteger(v)) return { ok: false, message: `The ${what} is a whole number` };
  }
  const low = f.min ?? 0;
  if (f.minExclusive ? !(v > low) : v < low) return { ok: false, message: `The ${what} must be ${f.minExclusive ? "above" : "at least"} ${bound(f, low)}` };
  if (f.max !== undefined && v > f.max) return { ok: false, message: `The ${what} must be at most ${bound(f, f.max)}` };
  return { ok: true, value: v };
}

/** The form's text read group by group: the settings objects, or the message for each field ("designFactors.safeVoltage"). */
export function readSettingsForm(values: SettingsFormValues): { ok: true; groups: ShopSettingsGroups } | { ok: false; fieldErrors: Record<string, string> } {
  const fieldErrors: Record<string, string> = {};
  const out: Record<string, Record<string, unknown>> = {};
  for (const g of SETTINGS_GROUPS) {
    const group: Record<string, unknown> = {};
    out[g.key] = group;
    for (const f of g.fields) {
      const r = readSetting(f, values[g.key]?.[f.key] ?? "");
      if (r.ok) setAt(group, f.key, r.value);
      else fieldErrors[`${g.key}.${f.key}`] = r.message;
    }
  }
  if (Object.keys(fieldErrors).length > 0) return { ok: false, fieldErrors };
  return { ok: true, groups: out as unknown as ShopSettingsGroups };
}

/** The settings as the form's text. */
export function settingsFormText(groups: ShopSettingsGroups): SettingsFormValues {
  const out = {} as SettingsFormValues;
  for (const g of SETTINGS_GROUPS) {
    out[g.key] = Object.fromEntries(g.fields.map((f) => [f.key, settingText(f, valueAt(groups[g.key], f.key))]));
  }
  return out;
}

const groupText = z.record(z.string(), text().max(40, "Keep this under 40 characters"));
export const settingsFormSchema = z.object(Object.fromEntries(SETTINGS_GROUPS.map((g) => [g.key, groupText])) as Record<SettingsGroupKey, typeof groupText>);

/** The sample requirement the preview searches with, as typed. */
export const sampleRequirementSchema = z.object({
  maxVoltage: text().max(40),
  minVoltage: text().max(40),
  sizeFor: z.enum(["capacitance", "energy"]),
  amount: text().max(40),
});
export type SampleRequirement = z.infer<typeof sampleRequirementSchema>;

export const saveSettingsSchema = z.object({ values: settingsFormSchema });
export const previewSettingsSchema = z.object({ values: settingsFormSchema, sample: sampleRequirementSchema });
