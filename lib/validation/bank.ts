import { z } from "zod";
import { optionFailuresSchema, optionHandlingSchema, optionLifeSchema, yieldBasisSchema } from "./arrangement-depth";
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
import { FAULT_FILTERS, RANK_BY, TECHNOLOGIES, TOPOLOGIES, type NetworkNode, type Requirement } from "../bank/types";

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

export const networkNodeSchema: z.ZodType<NetworkNode> = z
  .lazy(() =>
    z.discriminatedUnion("kind", [
      cellSchema,
      z.strictObject({
        kind: z.enum(["series", "parallel"]),
        children: z.array(networkNodeSchema).min(1),
      }),
    ]),
  )
  .meta({
    id: "NetworkNode",
    description: `A cell, or a series or parallel group of networks (SI units: F, V, Ω, A). At most ${MAX_NETWORK_DEPTH} levels deep and ${MAX_CELLS_PER_BANK.toLocaleString("en")} cells.`,
  });

export const evaluateNetworkSchema = z.strictObject({
  appliedVoltage: quantity("Applied voltage", "V", MAX_VOLTAGE).optional(),
  network: networkNodeSchema,
});

export type EvaluateNetworkInput = z.infer<typeof evaluateNetworkSchema>;

/** The answer of POST /api/v1/networks/evaluate: the network's figures and every cell's state. */
export const evaluateNetworkAnswerSchema = z
  .object({
    capacitance: z.number().meta({ description: "equivalent capacitance (F)" }),
    esr: z.number().optional().meta({ description: "equivalent ESR (Ω), only when every cell has one" }),
    maxVoltage: z.number().meta({ description: "largest applied voltage at which no cell exceeds its rated voltage (V): the weakest cell limits it" }),
    energy: z.number().meta({ description: "½·C·V² at the applied voltage (J)" }),
    charge: z.number().meta({ description: "C·V at the applied voltage (C)" }),
    cells: z
      .array(z.object({ id: z.string(), voltage: z.number(), charge: z.number(), energy: z.number() }))
      .meta({ description: "every cell at the applied voltage (or at maxVoltage when none was given), depth-first, children left to right" }),
  })
  .meta({ id: "NetworkEvaluation" });

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

/** A decimal amount of money as a string in the currency's minor unit ("1234.50"): never a float. */
export const decimalSchema = z.string().regex(/^-?\d+(\.\d+)?$/, "A decimal number as a string");
const nullableNumber = (description: string) => z.number().nullable().meta({ description });

const designFactorsSchema = z
  .object({
    capacitanceFade: z.number().meta({ description: "end-of-life capacitance fade f_C (fraction)" }),
    esrGrowth: z.number().meta({ description: "end-of-life ESR growth g (fraction: 1 = +100 %)" }),
    voltageDerating: z.number().meta({ description: "cell voltage derating d (≤ 1)" }),
    matchingTolerance: z.number().meta({ description: "cell matching tolerance m after incoming grading (fraction)" }),
    balancingFactor: z.number().meta({ description: "balancing factor k: balancing current ≥ k × leakage" }),
    resistorSeries: z.enum(["E12", "E24", "E48", "E96"]),
    safeVoltage: z.number().meta({ description: "V_safe (V)" }),
    safeTime: z.number().meta({ description: "t_safe (s)" }),
  })
  .meta({ id: "DesignFactors" });

/** One buildable, priced arrangement (lib/quoting/types.ts PricedOption) as the JSON routes send it. */
export const pricedOptionSchema = z
  .object({
    cell: z.object({
      sku: z.string(),
      technology: technologySchema,
      capacitance: z.number(),
      toleranceMinus: z.number(),
      tolerancePlus: z.number(),
      ratedVoltage: z.number(),
      surgeVoltage: z.number(),
      esr: z.number(),
      leakageCurrent: z.number(),
      peakCurrent: z.number(),
      mass: z.number(),
      volume: z.number(),
      minVoltage: z.number().positive().nullable().meta({ description: "the cell's minimum voltage (V; hybrid cells), null when it may go to 0 V" }),
    }),
    topology: z.enum(TOPOLOGIES),
    seriesCount: z.number().int(),
    parallelCount: z.number().int(),
    cellCount: z.number().int(),
    longerLife: z.boolean().meta({ description: "one more cell in series than the shortest safe string: cells run further below their rating" }),
    capacitance: z.object({ nominal: z.number(), design: z.number() }).meta({ description: "F; design: lower tolerance and end-of-life fade" }),
    maxVoltage: z.number(),
    storedEnergy: z.number().meta({ description: "½·C_nominal·V_max² (J)" }),
    usableEnergy: z.number().meta({ description: "½·C_design·(V_max² − V_min²) (J), guaranteed at end of life" }),
    esr: z.object({ new: z.number(), endOfLife: z.number() }),
    peakDrop: nullableNumber("voltage drop at the peak current with end-of-life ESR (V); null without a peak-current requirement"),
    mass: z.number(),
    volume: z.number(),
    worstCellVoltage: z.number().meta({ description: "worst-case transient cell voltage while charging with matched cells (V)" }),
    balancing: z.object({
      resistance: nullableNumber("balancing resistor (Ω); null with a single series position"),
      power: z.number(),
      powerRating: nullableNumber("standard rating ≥ 2 × power (W); null above the largest standard rating"),
      count: z.number().int(),
      standbyLoss: z.number(),
      timeConstant: nullableNumber("R·N_p·C_n (s); null when there is no balancing resistor"),
      activeBoard: z.object({ sku: z.string(), count: z.number().int() }).nullable(),
    }),
    discharge: z.object({
      secondsToSafe: z.number(),
      capacitance: z.number(),
      chainResistance: nullableNumber("the balancing resistors seen across the terminals (Ω)"),
      resistance: nullableNumber("chain and bleeder in parallel (Ω); null when neither is fitted"),
      bleeder: z
        .object({ resistance: z.number(), power: z.number(), powerRating: z.number().nullable(), energy: z.number(), switched: z.boolean() })
        .nullable(),
    }),
    backupSeconds: z.number().optional(),
    leadTimeDays: z.number(),
    warnings: z.array(z.string()),
    cautions: z.array(z.string()),
    price: z
      .object({
        amount: decimalSchema.meta({ description: "the order total" }),
        currency: z.string().length(3),
        perBank: decimalSchema,
        quantity: z.number().int(),
        tax: decimalSchema,
        subtotal: decimalSchema,
      })
      .nullable()
      .meta({ description: "sell price; null when the shop's rules cannot price it automatically" }),
    pareto: z.boolean().meta({ description: "Pareto-optimal over price, mass and volume" }),
    failures: optionFailuresSchema.meta({ description: "what one shorted and one open cell do to the bank" }),
    life: optionLifeSchema.nullable().meta({ description: "self-heating, cell temperature and expected life; null without life data in the catalog" }),
    handling: optionHandlingSchema,
    yieldBasis: yieldBasisSchema.meta({ description: "the spread the tolerance-yield figures are drawn from" }),
  })
  .meta({ id: "PricedOption" });

/** The answer of POST /api/v1/shops/{shop}/arrangements. */
export const arrangementAnswerSchema = z
  .object({
    designFactors: designFactorsSchema,
    options: z.array(pricedOptionSchema).meta({ description: "at most a dozen, cheapest first" }),
    reasons: z.array(z.string()).optional().meta({ description: "when no option fits: what ruled each technology out" }),
  })
  .meta({ id: "Arrangements" });

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
