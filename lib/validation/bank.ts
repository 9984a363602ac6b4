import { z } from "zod";
import {
  MAX_CAPACITANCE,
  MAX_CELLS_PER_BANK,
  MAX_AMBIENT_TEMPERATURE,
  MAX_CURRENT,
  MAX_ENERGY,
  MAX_LIFE_YEARS,
  MAX_MASS,
  MAX_POWER,
  MAX_QUANTITY,
  MAX_RESISTANCE,
  MAX_SECONDS,
  MAX_VOLTAGE,
  MAX_VOLUME,
  MIN_AMBIENT_TEMPERATURE,
  formatBound,
} from "../bank/bounds";
import { FAULT_FILTERS, RANK_BY, TECHNOLOGIES, type NetworkNode, type Requirement } from "../bank/types";

/** Deepest network accepted (levels of groups and cells, the root is level 1). */
export const MAX_NETWORK_DEPTH = 64;
/** Most cells in one network: as many as one bank may hold. */
export const MAX_NETWORK_CELLS = MAX_CELLS_PER_BANK;
/** Most nodes (cells and groups) in one network. */
export const MAX_NETWORK_NODES = 100_000;

/**
 * A physical quantity in SI units: finite, positive (or zero where allowed), and at most its bound
 * (lib/bank/bounds.ts), with a message that names the bound in readable units.
 */
function quantity(what: string, unit: string, max: number, { allowZero = false } = {}) {
  const base = z.number({ message: `${what} must be a number in ${unit}` });
  return (allowZero ? base.nonnegative(`${what} must not be negative`) : base.positive(`${what} must be greater than zero`)).max(
    max,
    `${what} must be at most ${formatBound(max, unit)}`,
  );
}

const cellSchema = z.strictObject({
  kind: z.literal("cell"),
  id: z.string().trim().min(1),
  capacitance: quantity("Capacitance", "F", MAX_CAPACITANCE),
  ratedVoltage: quantity("Rated voltage", "V", MAX_VOLTAGE),
  esr: quantity("ESR", "Ω", MAX_RESISTANCE, { allowZero: true }).optional(),
  leakage: quantity("Leakage current", "A", MAX_CURRENT, { allowZero: true }).optional(),
  // read by the failure and tolerance analyses (lib/validation/network-analysis.ts); others ignore them
  surgeVoltage: quantity("Surge voltage", "V", MAX_VOLTAGE).optional(),
  toleranceMinus: z.number().min(0).max(0.99).optional(),
  tolerancePlus: z.number().min(0).max(1).optional(),
});

export const networkNodeSchema: z.ZodType<NetworkNode> = z.lazy(() =>
  z.discriminatedUnion("kind", [
    cellSchema,
    z.strictObject({
      kind: z.enum(["series", "parallel"]),
      children: z.array(networkNodeSchema).min(1),
    }),
  ]),
);

export const evaluateNetworkSchema = z.strictObject({
  appliedVoltage: quantity("Applied voltage", "V", MAX_VOLTAGE).optional(),
  network: networkNodeSchema,
});

export type EvaluateNetworkInput = z.infer<typeof evaluateNetworkSchema>;

export const technologySchema = z.enum(TECHNOLOGIES);

export const arrangementRequestSchema = z
  .strictObject({
    maxVoltage: quantity("Maximum voltage", "V", MAX_VOLTAGE),
    minVoltage: quantity("Minimum voltage", "V", MAX_VOLTAGE, { allowZero: true }).optional(),
    capacitance: quantity("Capacitance", "F", MAX_CAPACITANCE).optional(),
    energy: quantity("Energy", "J", MAX_ENERGY).optional(),
    backup: z.strictObject({ power: quantity("Backup power", "W", MAX_POWER), seconds: quantity("Backup time", "s", MAX_SECONDS) }).optional(),
    peakCurrent: z.strictObject({ current: quantity("Peak current", "A", MAX_CURRENT), maxDrop: quantity("Allowed drop", "V", MAX_VOLTAGE) }).optional(),
    maxMass: quantity("Mass limit", "kg", MAX_MASS).optional(),
    maxVolume: quantity("Volume limit", "m³", MAX_VOLUME).optional(),
    quantity: z
      .number()
      .int("Quantity must be a whole number of banks")
      .min(1, "Quantity must be at least 1")
      .max(MAX_QUANTITY, `Quantity must be at most ${MAX_QUANTITY.toLocaleString("en-GB")}`)
      .default(1),
    technology: technologySchema.optional(),
    ambientTemperature: z
      .number({ message: "Ambient temperature must be a number in °C" })
      .min(MIN_AMBIENT_TEMPERATURE, `Ambient temperature must be at least ${MIN_AMBIENT_TEMPERATURE} °C`)
      .max(MAX_AMBIENT_TEMPERATURE, `Ambient temperature must be at most ${MAX_AMBIENT_TEMPERATURE} °C`)
      .optional(),
    rmsCurrent: quantity("RMS current", "A", MAX_CURRENT).optional(),
    survives: z.enum(FAULT_FILTERS, { message: 'survives must be "short", "open" or "both"' }).optional(),
    minLifeYears: z
      .number({ message: "Minimum life must be a number of years" })
      .positive("Minimum life must be greater than zero")
      .max(MAX_LIFE_YEARS, `Minimum life must be at most ${MAX_LIFE_YEARS} years`)
      .optional(),
    rankBy: z.enum(RANK_BY, { message: 'rankBy must be "price" or "life"' }).optional(),
  })
  .superRefine((value, ctx) => {
    if (value.capacitance === undefined && value.energy === undefined && value.backup === undefined) {
      ctx.addIssue({
        code: "custom",
        path: ["capacitance"],
        message: "State at least one of capacitance, energy or backup",
      });
    }
    if (value.minVoltage !== undefined && !(value.minVoltage < value.maxVoltage)) {
      ctx.addIssue({ code: "custom", path: ["minVoltage"], message: "Minimum voltage must be below the maximum voltage" });
    }
  });

export type ArrangementRequestInput = z.infer<typeof arrangementRequestSchema>;

export interface ValidationIssue {
  path: string;
  message: string;
}

export type ParseResult<T> = { ok: true; data: T } | { ok: false; error: string; issues: ValidationIssue[] };

/** ['network', 'children', 0, 'capacitance'] → "network.children[0].capacitance" */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = "";
  for (const key of path) {
    if (typeof key === "number") out += `[${key}]`;
    else out += out === "" ? String(key) : `.${String(key)}`;
  }
  return out;
}

export function fail<T>(path: string, message: string): ParseResult<T> {
  return { ok: false, error: path ? `${path}: ${message}` : message, issues: [{ path, message }] };
}

export function fromZod<T>(error: z.ZodError): ParseResult<T> {
  const issues = error.issues.map((issue) => ({ path: formatPath(issue.path), message: issue.message }));
  const first = issues[0];
  return {
    ok: false,
    error: first ? (first.path ? `${first.path}: ${first.message}` : first.message) : "Invalid request",
    issues,
  };
}

/**
 * Walk the raw JSON network without recursion and refuse it when it is too deep, has too many
 * cells or too many nodes, before any recursive parser sees it. Anything else that is wrong is
 * left to the schema. Returns null when the shape is within bounds.
 */
export function checkNetworkBounds(network: unknown, rootPath = "network"): ValidationIssue | null {
  const nodes: unknown[] = [network];
  const depths: number[] = [1];
  const parents: number[] = [-1];
  const indexInParent: number[] = [-1];
  let cells = 0;
  let head = 0;
  // breadth-first; the arrays double as parent links to name the path of an offending node
  const pathOf = (i: number): string => {
    const parts: number[] = [];
    let k = i;
    while (k > 0) {
      parts.push(indexInParent[k] as number);
      k = parents[k] as number;
    }
    let out = rootPath;
    for (let p = parts.length - 1; p >= 0; p--) out += `.children[${parts[p] as number}]`;
    return out;
  };
  while (head < nodes.length) {
    const i = head++;
    const node = nodes[i];
    if (typeof node !== "object" || node === null) continue;
    const kind = (node as { kind?: unknown }).kind;
    if (kind === "cell") {
      cells++;
      if (cells > MAX_NETWORK_CELLS) return { path: pathOf(i), message: `A network may hold at most ${MAX_NETWORK_CELLS} cells` };
      continue;
    }
    const children = (node as { children?: unknown }).children;
    if (!Array.isArray(children)) continue;
    const depth = depths[i] as number;
    if (children.length > 0 && depth + 1 > MAX_NETWORK_DEPTH) {
      return { path: pathOf(i), message: `A network may be nested at most ${MAX_NETWORK_DEPTH} levels deep` };
    }
    if (nodes.length + children.length > MAX_NETWORK_NODES) {
      return { path: pathOf(i), message: `A network may hold at most ${MAX_NETWORK_NODES} nodes` };
    }
    for (let c = 0; c < children.length; c++) {
      nodes.push(children[c]);
      depths.push(depth + 1);
      parents.push(i);
      indexInParent.push(c);
    }
  }
  return null;
}

/** Parse a POST /api/v1/networks/evaluate body. */
export function parseEvaluateRequest(json: unknown): ParseResult<EvaluateNetworkInput> {
  if (typeof json !== "object" || json === null || Array.isArray(json)) {
    return fail("", "The body must be a JSON object");
  }
  const bounds = checkNetworkBounds((json as { network?: unknown }).network);
  if (bounds) return fail(bounds.path, bounds.message);
  const parsed = evaluateNetworkSchema.safeParse(json);
  return parsed.success ? { ok: true, data: parsed.data } : fromZod(parsed.error);
}

/** Parse an arrangement request (a customer's requirement). */
export function parseArrangementRequest(json: unknown): ParseResult<ArrangementRequestInput & Requirement> {
  if (typeof json !== "object" || json === null || Array.isArray(json)) {
    return fail("", "The body must be a JSON object");
  }
  const parsed = arrangementRequestSchema.safeParse(json);
  return parsed.success ? { ok: true, data: parsed.data } : fromZod(parsed.error);
}
