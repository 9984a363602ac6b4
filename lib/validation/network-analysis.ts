import { z } from "zod";
import { MAX_HISTOGRAM_BINS, MAX_TOLERANCE_SAMPLES, MAX_TOLERANCE_WORK } from "../bank/tolerance";
import type { NetworkNode } from "../bank/types";
import { checkNetworkBounds, fail, fromZod, networkNodeSchema, type ParseResult } from "./bank";

/** Highest applied voltage the analyses accept (V): far above any bank the engine sizes. */
export const MAX_APPLIED_VOLTAGE = 1_000_000;
/** Largest seed: seeds are 32-bit. */
export const MAX_SEED = 0xffffffff;

const appliedVoltage = z.number().positive().max(MAX_APPLIED_VOLTAGE);
const fraction = (max: number) => z.number().min(0).max(max);

export const failuresRequestSchema = z.strictObject({
  appliedVoltage,
  network: networkNodeSchema,
});
export type FailuresRequestInput = z.infer<typeof failuresRequestSchema>;

export const toleranceRequestSchema = z
  .strictObject({
    appliedVoltage,
    network: networkNodeSchema,
    samples: z.number().int().min(1).max(MAX_TOLERANCE_SAMPLES),
    seed: z.number().int().min(0).max(MAX_SEED),
    distribution: z.enum(["uniform", "normal"]),
    /** the shop's grading m: each cell's spread clipped to ±m of nominal */
    matchingTolerance: fraction(1).optional(),
    /** tolerance for cells that carry none */
    defaultTolerance: z.strictObject({ minus: fraction(0.99), plus: fraction(1) }).optional(),
    requirement: z
      .strictObject({
        capacitance: z.number().positive().optional(),
        energy: z.number().positive().optional(),
        minVoltage: z.number().nonnegative().optional(),
      })
      .optional(),
    bins: z.number().int().min(1).max(MAX_HISTOGRAM_BINS).optional(),
  })
  .superRefine((value, ctx) => {
    const vMin = value.requirement?.minVoltage;
    if (vMin !== undefined && !(vMin < value.appliedVoltage)) {
      ctx.addIssue({ code: "custom", path: ["requirement", "minVoltage"], message: "Minimum voltage must be below the applied voltage" });
    }
  });
export type ToleranceRequestInput = z.infer<typeof toleranceRequestSchema>;

const failureModeSchema = z.enum(["short", "open"]);
const failureWorstSchema = z.object({
  cellId: z.string().nullable(),
  shortCircuit: z.boolean(),
  capacitance: z.number().nullable(),
  stressed: z
    .object({ cells: z.string(), count: z.number().int(), voltage: z.number(), ratedVoltage: z.number(), surgeVoltage: z.number().nullable() })
    .nullable(),
  overstressedCount: z.number().int(),
  pastSurgeCount: z.number().int(),
});
const failureSummarySchema = z.object({
  mode: failureModeSchema,
  survives: z.boolean(),
  withinRating: z.boolean(),
  capacitanceRange: z.object({ min: z.number().nullable(), max: z.number().nullable() }),
  worst: failureWorstSchema.nullable(),
  text: z.string().meta({ description: "the verdict in plain words" }),
});

/** The answer of POST /api/v1/networks/failures. */
export const failuresAnswerSchema = z
  .object({
    appliedVoltage: z.number(),
    healthy: z.object({ capacitance: z.number(), maxCellVoltage: z.number(), withinRating: z.boolean(), withinSurge: z.boolean() }),
    cases: z
      .array(
        z.object({
          cellId: z.string(),
          mode: failureModeSchema,
          capacitance: z.number().nullable().meta({ description: "F after the fault; null when it shorts the whole network" }),
          maxCellVoltage: z.number(),
          overstressed: z.array(z.string()),
          overstressedCount: z.number().int(),
          pastSurge: z.array(z.string()),
          pastSurgeCount: z.number().int(),
          shortCircuit: z.boolean(),
        }),
      )
      .meta({ description: "each cell shorted, then open, in document order" }),
    summary: z.object({ short: failureSummarySchema, open: failureSummarySchema }),
    listLimit: z.number().int().meta({ description: "most cell ids each list of a case holds" }),
  })
  .meta({ id: "FailureAnalysis" });

const distributionSchema = z.object({
  mean: z.number(),
  std: z.number(),
  p01: z.number(),
  p50: z.number(),
  p99: z.number(),
  min: z.number(),
  max: z.number(),
});
const histogramSchema = z.array(z.object({ from: z.number(), to: z.number(), count: z.number().int() }));

/** The answer of POST /api/v1/networks/tolerance. */
export const toleranceAnswerSchema = z
  .object({
    samples: z.number().int(),
    seed: z.number().int(),
    distribution: z.enum(["uniform", "normal"]),
    nominal: z.object({ capacitance: z.number(), maxCellVoltage: z.number() }),
    capacitance: distributionSchema,
    maxCellVoltage: distributionSchema,
    histogram: z.object({ capacitance: histogramSchema, maxCellVoltage: histogramSchema }),
    shares: z.object({
      withinSurge: z.number().min(0).max(1),
      withinRating: z.number().min(0).max(1),
      meetingRequirement: z.number().min(0).max(1).nullable(),
    }),
    requiredCapacitance: z.number().nullable(),
  })
  .meta({ id: "ToleranceYield" });

/**
 * Walk a parsed network without recursion: its node count, and the first cell (by path) whose
 * surge voltage is below its rated voltage or whose id repeats an earlier one (when ids must be unique).
 */
function inspectNetwork(network: NetworkNode, uniqueIds: boolean): { nodes: number; issue: { path: string; message: string } | null } {
  const stack: { node: NetworkNode; path: string }[] = [{ node: network, path: "network" }];
  const seen = new Set<string>();
  let nodes = 0;
  let issue: { path: string; message: string } | null = null;
  while (stack.length > 0) {
    const { node, path } = stack.pop() as { node: NetworkNode; path: string };
    nodes++;
    if (node.kind !== "cell") {
      for (let c = node.children.length - 1; c >= 0; c--) stack.push({ node: node.children[c] as NetworkNode, path: `${path}.children[${c}]` });
      continue;
    }
    if (issue) continue;
    if (node.surgeVoltage !== undefined && node.surgeVoltage < node.ratedVoltage) {
      issue = { path: `${path}.surgeVoltage`, message: "Surge voltage must be at least the rated voltage" };
    } else if (uniqueIds && seen.has(node.id)) {
      issue = { path: `${path}.id`, message: `Cell ids must be unique: "${node.id}" is used twice` };
    }
    seen.add(node.id);
  }
  return { nodes, issue };
}

function asObject(json: unknown): json is Record<string, unknown> {
  return typeof json === "object" && json !== null && !Array.isArray(json);
}

/** Parse a POST /api/v1/networks/failures body. Cell ids must be unique (the cases name cells by id). */
export function parseFailuresRequest(json: unknown): ParseResult<FailuresRequestInput> {
  if (!asObject(json)) return fail("", "The body must be a JSON object");
  const bounds = checkNetworkBounds(json.network);
  if (bounds) return fail(bounds.path, bounds.message);
  const parsed = failuresRequestSchema.safeParse(json);
  if (!parsed.success) return fromZod(parsed.error);
  const { issue } = inspectNetwork(parsed.data.network, true);
  if (issue) return fail(issue.path, issue.message);
  return { ok: true, data: parsed.data };
}

/**
 * Parse a POST /api/v1/networks/tolerance body. Refuses a run whose samples × network size
 * (cells and groups) passes MAX_TOLERANCE_WORK, naming `samples`.
 */
export function parseToleranceRequest(json: unknown): ParseResult<ToleranceRequestInput> {
  if (!asObject(json)) return fail("", "The body must be a JSON object");
  const bounds = checkNetworkBounds(json.network);
  if (bounds) return fail(bounds.path, bounds.message);
  const parsed = toleranceRequestSchema.safeParse(json);
  if (!parsed.success) return fromZod(parsed.error);
  const { nodes, issue } = inspectNetwork(parsed.data.network, false);
  if (issue) return fail(issue.path, issue.message);
  if (parsed.data.samples * nodes > MAX_TOLERANCE_WORK) {
    const n = (x: number) => x.toLocaleString("en");
    return fail(
      "samples",
      `samples × network size (cells and groups) may be at most ${n(MAX_TOLERANCE_WORK)}; here ${n(parsed.data.samples)} × ${n(nodes)}: use at most ${n(Math.floor(MAX_TOLERANCE_WORK / nodes))} samples`,
    );
  }
  return { ok: true, data: parsed.data };
}
