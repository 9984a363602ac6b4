import { formatBound, MAX_AMBIENT_TEMPERATURE, MAX_BY_UNIT, MAX_LIFE_YEARS, MIN_AMBIENT_TEMPERATURE } from "../bank/bounds";
import { backupEnergy, capacitanceForEnergy, maxEsrFor, storedEnergy, usableEnergy as usableEnergyOf } from "../bank/energy";
import type { FaultFilter, RankBy, Requirement, Technology } from "../bank/types";
import { parseQuantity, type QuantityUnit } from "../quantities";
import { MAX_QUANTITY } from "./limits";

/**
 * The storefront's request form: what people type (`48 V`, `20 kJ`, `470 µF`, `5 kW`, `30 s`,
 * `25 kg`, `12 L`) checked field by field and turned into the engine's SI `Requirement`.
 * The reading here has no zod in it, so the storefront's first load carries none: the schema
 * (`request-form-schema.ts`) wraps it, and runs in the browser (react-hook-form, loaded on the
 * first check) and in the server action.
 */

export const SIZE_FOR = ["capacitance", "energy", "backup"] as const;
export type SizeFor = (typeof SIZE_FOR)[number];

/**
 * What the form holds: every field as typed. The zod schema of these fields
 * (`lib/validation/request-form-schema.ts`) checks their shapes and is held to this type.
 */
export type RequestFormValues = {
  maxVoltage: string;
  minVoltage: string;
  sizeFor: SizeFor;
  capacitance: string;
  energy: string;
  backupPower: string;
  backupTime: string;
  peakCurrent: string;
  maxDrop: string;
  maxMass: string;
  maxVolume: string;
  quantity: string;
  technology: "" | Technology;
  notes: string;
  // service conditions (optional) and the customer's filters over the options
  ambientTemperature: string;
  rmsCurrent: string;
  survives: "" | FaultFilter;
  minLifeYears: string;
  rankBy: RankBy;
};

export type RequestFormField = keyof RequestFormValues;

export const EMPTY_REQUEST_FORM: RequestFormValues = {
  maxVoltage: "",
  minVoltage: "",
  sizeFor: "energy",
  capacitance: "",
  energy: "",
  backupPower: "",
  backupTime: "",
  peakCurrent: "",
  maxDrop: "",
  maxMass: "",
  maxVolume: "",
  quantity: "1",
  technology: "",
  notes: "",
  ambientTemperature: "",
  rmsCurrent: "",
  survives: "",
  minLifeYears: "",
  rankBy: "price",
};

export interface RequestFormResult {
  requirement: Requirement & { quantity: number };
  notes: string;
}

type Issue = { field: RequestFormField; message: string };

/** Label words used in messages, so each message names what it is about. */
const WHAT: Record<string, string> = {
  maxVoltage: "maximum voltage",
  minVoltage: "minimum voltage",
  capacitance: "capacitance",
  energy: "usable energy",
  backupPower: "backup power",
  backupTime: "backup time",
  peakCurrent: "peak current",
  maxDrop: "allowed voltage drop",
  maxMass: "mass limit",
  maxVolume: "volume limit",
  rmsCurrent: "rms current",
};

const EXAMPLES: Record<QuantityUnit, string> = {
  V: "48 V",
  F: "470 µF or 58 F",
  J: "20 kJ (or 5.5 Wh)",
  W: "5 kW",
  s: "30 s or 2 min",
  A: "200 A",
  kg: "25 kg",
  "m³": "12 L",
  Ω: "10 mΩ",
  Wh: "5.5 Wh",
  m: "60 mm",
};

/**
 * Reads one quantity field. Empty → undefined (the caller decides whether it is required).
 * Energy also accepts watt-hours (1 Wh = 3600 J). A value above the physical bound of its kind
 * (lib/bank/bounds.ts) is refused at the field.
 */
function readQuantity(raw: string, field: RequestFormField, unit: QuantityUnit, issues: Issue[], allowZero = false): number | undefined {
  if (raw.trim() === "") return undefined;
  let parsed = parseQuantity(raw, unit, { allowZero });
  if (!parsed.ok && unit === "J") {
    const wh = parseQuantity(raw, "Wh", { allowZero });
    if (wh.ok && wh.unit === "Wh") parsed = { ok: true, value: wh.value * 3600, unit: "J" };
  }
  if (!parsed.ok) {
    issues.push({ field, message: `${parsed.message}; write the ${WHAT[field] ?? field} like ${EXAMPLES[unit]}` });
    return undefined;
  }
  const max = unit === "Wh" ? MAX_BY_UNIT.J / 3600 : MAX_BY_UNIT[unit];
  if (parsed.value > max) {
    const what = WHAT[field] ?? field;
    issues.push({ field, message: `The ${what} must be at most ${formatBound(max, unit)}` });
    return undefined;
  }
  return parsed.value;
}

function required(value: number | undefined, raw: string, field: RequestFormField, unit: QuantityUnit, issues: Issue[]): void {
  if (value === undefined && raw.trim() === "") {
    issues.push({ field, message: `Enter the ${WHAT[field] ?? field}, e.g. ${EXAMPLES[unit]}` });
  }
}

/**
 * Reads a temperature in °C: `40`, `40 °C`, `40 C`, `-20 °C`, `−20°C`, a decimal comma allowed.
 * Empty → undefined. Outside the physical bounds (lib/bank/bounds.ts) it is refused at the field.
 */
function readTemperature(raw: string, field: RequestFormField, issues: Issue[]): number | undefined {
  const s = raw.trim();
  if (s === "") return undefined;
  const m = /^([+\-\u2212]?\d+(?:[.,]\d+)?)\s*(?:°\s*C|℃|C|degC)?$/i.exec(s);
  if (!m) {
    issues.push({ field, message: `"${s}" is not a temperature; write it in degrees Celsius, like 40 °C or -20 °C` });
    return undefined;
  }
  const value = Number((m[1] as string).replace("\u2212", "-").replace(",", "."));
  if (value < MIN_AMBIENT_TEMPERATURE || value > MAX_AMBIENT_TEMPERATURE) {
    issues.push({ field, message: `The ambient temperature must be from ${MIN_AMBIENT_TEMPERATURE} °C to ${MAX_AMBIENT_TEMPERATURE} °C` });
    return undefined;
  }
  return value;
}

/** Reads a number of years: `10`, `7.5`, `10 years`. Empty → undefined. */
function readYears(raw: string, field: RequestFormField, issues: Issue[]): number | undefined {
  const s = raw.trim();
  if (s === "") return undefined;
  const m = /^(\d+(?:[.,]\d+)?)\s*(?:y|yr|yrs|year|years)?$/i.exec(s);
  const value = m ? Number((m[1] as string).replace(",", ".")) : NaN;
  if (!(value > 0) || value > MAX_LIFE_YEARS) {
    issues.push({ field, message: `Enter a number of years above 0 and at most ${MAX_LIFE_YEARS}, like 10` });
    return undefined;
  }
  return value;
}

/**
 * Checks every field and builds the requirement. Returns the issues (one per field at most, the
 * first found) or the SI requirement.
 */
export function readRequestForm(values: RequestFormValues): { ok: true; data: RequestFormResult } | { ok: false; issues: Issue[] } {
  const issues: Issue[] = [];
  const maxVoltage = readQuantity(values.maxVoltage, "maxVoltage", "V", issues);
  required(maxVoltage, values.maxVoltage, "maxVoltage", "V", issues);
  const minVoltage = readQuantity(values.minVoltage, "minVoltage", "V", issues, true);
  if (maxVoltage !== undefined && minVoltage !== undefined && !(minVoltage < maxVoltage)) {
    issues.push({ field: "minVoltage", message: "The minimum voltage must be below the maximum voltage" });
  }

  const requirement: Requirement & { quantity: number } = { maxVoltage: maxVoltage ?? 0, quantity: 1 };
  if (minVoltage !== undefined) requirement.minVoltage = minVoltage;

  if (values.sizeFor === "capacitance") {
    const c = readQuantity(values.capacitance, "capacitance", "F", issues);
    required(c, values.capacitance, "capacitance", "F", issues);
    if (c !== undefined) requirement.capacitance = c;
  } else if (values.sizeFor === "energy") {
    const e = readQuantity(values.energy, "energy", "J", issues);
    required(e, values.energy, "energy", "J", issues);
    if (e !== undefined) requirement.energy = e;
  } else {
    const p = readQuantity(values.backupPower, "backupPower", "W", issues);
    required(p, values.backupPower, "backupPower", "W", issues);
    const t = readQuantity(values.backupTime, "backupTime", "s", issues);
    required(t, values.backupTime, "backupTime", "s", issues);
    if (p !== undefined && t !== undefined) requirement.backup = { power: p, seconds: t };
  }

  const current = readQuantity(values.peakCurrent, "peakCurrent", "A", issues);
  const drop = readQuantity(values.maxDrop, "maxDrop", "V", issues);
  if (current !== undefined && drop === undefined && values.maxDrop.trim() === "") {
    issues.push({ field: "maxDrop", message: "With a peak current, say how far the voltage may drop, e.g. 4 V" });
  }
  if (drop !== undefined && current === undefined && values.peakCurrent.trim() === "") {
    issues.push({ field: "peakCurrent", message: "Say the peak current this drop is allowed at, e.g. 200 A" });
  }
  if (current !== undefined && drop !== undefined) {
    if (maxVoltage !== undefined && !(drop < maxVoltage)) {
      issues.push({ field: "maxDrop", message: "The allowed drop must be below the maximum voltage" });
    } else {
      requirement.peakCurrent = { current, maxDrop: drop };
    }
  }

  const mass = readQuantity(values.maxMass, "maxMass", "kg", issues);
  if (mass !== undefined) requirement.maxMass = mass;
  const volume = readQuantity(values.maxVolume, "maxVolume", "m³", issues);
  if (volume !== undefined) requirement.maxVolume = volume;

  const q = values.quantity.trim();
  if (q === "") {
    requirement.quantity = 1;
  } else if (!/^\d+$/.test(q) || Number(q) < 1 || Number(q) > MAX_QUANTITY) {
    issues.push({ field: "quantity", message: `Enter a whole number of banks from 1 to ${MAX_QUANTITY.toLocaleString("en-GB")}` });
  } else {
    requirement.quantity = Number(q);
  }
  if (values.technology !== "") requirement.technology = values.technology as Technology;

  const ambient = readTemperature(values.ambientTemperature, "ambientTemperature", issues);
  if (ambient !== undefined) requirement.ambientTemperature = ambient;
  const rms = readQuantity(values.rmsCurrent, "rmsCurrent", "A", issues);
  if (rms !== undefined) requirement.rmsCurrent = rms;
  if (values.survives !== "") requirement.survives = values.survives;
  const minLife = readYears(values.minLifeYears, "minLifeYears", issues);
  if (minLife !== undefined) requirement.minLifeYears = minLife;
  if (values.rankBy === "life") requirement.rankBy = "life";

  return issues.length > 0 ? { ok: false, issues } : { ok: true, data: { requirement, notes: values.notes.trim() } };
}

/** What the form gives once every field reads: the SI requirement and the notes. */
export type RequestFormOutput = RequestFormResult;

/** Figures derived live as people type (ideal capacitor, ESR neglected). */
export interface DerivedFigures {
  /** V_max² − V_min² is positive */
  voltages: { max: number; min: number } | null;
  /** capacitance needed (F) for the stated energy or backup, or the stated one */
  capacitance: number | null;
  /** usable energy between the voltages (J) */
  usableEnergy: number | null;
  /** stored energy at V_max (J) */
  storedEnergy: number | null;
  /** ESR the bank may have at most: ΔV / I (Ω) */
  maxEsr: number | null;
}

/** A field's value when it reads as a quantity within its bound, else null (the field shows why). */
function quiet(raw: string, unit: Exclude<QuantityUnit, "Wh" | "m">, allowZero = false): number | null {
  if (raw.trim() === "") return null;
  let value: number | null = null;
  const r = parseQuantity(raw, unit, { allowZero });
  if (r.ok) value = r.value;
  else if (unit === "J") {
    const wh = parseQuantity(raw, "Wh", { allowZero });
    if (wh.ok && wh.unit === "Wh") value = wh.value * 3600;
  }
  return value !== null && value <= MAX_BY_UNIT[unit] ? value : null;
}

/**
 * From whatever is readable so far, with the engine's closed forms (lib/bank/energy.ts): the
 * capacitance the stated energy needs, C = 2E / (V_max² − V_min²); a backup of P for t needs at
 * least E = P·t; from a capacitance, the usable energy ½·C·(V_max² − V_min²) and the stored energy
 * ½·C·V_max²; and ESR_max = ΔV / I_pk.
 */
export function deriveFigures(values: RequestFormValues): DerivedFigures {
  const vmax = quiet(values.maxVoltage, "V");
  const vmin = quiet(values.minVoltage, "V", true) ?? (values.minVoltage.trim() === "" ? 0 : null);
  const voltages = vmax !== null && vmin !== null && vmin < vmax ? { max: vmax, min: vmin } : null;

  let capacitance: number | null = null;
  let usableEnergy: number | null = null;
  if (values.sizeFor === "capacitance") {
    capacitance = quiet(values.capacitance, "F");
    if (capacitance !== null && voltages) usableEnergy = usableEnergyOf(capacitance, voltages.max, voltages.min);
  } else {
    if (values.sizeFor === "energy") {
      usableEnergy = quiet(values.energy, "J");
    } else {
      const p = quiet(values.backupPower, "W");
      const t = quiet(values.backupTime, "s");
      if (p !== null && t !== null) usableEnergy = backupEnergy(p, t);
    }
    if (usableEnergy !== null && voltages) capacitance = capacitanceForEnergy(usableEnergy, voltages.max, voltages.min);
  }
  const stored = capacitance !== null && voltages ? storedEnergy(capacitance, voltages.max) : null;
  const current = quiet(values.peakCurrent, "A");
  const drop = quiet(values.maxDrop, "V");
  const maxEsr = current !== null && drop !== null ? maxEsrFor(drop, current) : null;
  return { voltages, capacitance, usableEnergy, storedEnergy: stored, maxEsr };
}
