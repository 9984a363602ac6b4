import { z } from "zod";
import { MAX_LONGER_STRINGS, MAX_PARALLEL_COUNT, MAX_SERIES_COUNT } from "@/lib/bank/bounds";
import { TOPOLOGIES } from "@/lib/bank/types";
import { LINE_QUANTITY_DECIMALS, MAX_LINE_QUANTITY } from "@/lib/pricing/price-sheet";
import { FACTOR_OVERRIDES } from "@/lib/quoting/review-search";
import { OVERRIDABLE_FACTORS, type CustomNode } from "@/lib/quoting/types";
import { EXTRA_LINE_KINDS } from "@/lib/vocabulary";
import { MAX_CUSTOM_BANK_CELLS, MAX_CUSTOM_BANK_DEPTH, MAX_EXTRA_LINES, MAX_LINE_TEXT_LENGTH, MAX_MESSAGE_LENGTH, MAX_VALIDITY_DAYS } from "./limits";
import { text } from "./text";

/**
 * The estimator's workbench: what a draft holds (saved as they go, loosely checked so nothing is
 * lost) and what issuing a revision takes (every field checked, with a message at the field).
 */

const DECIMAL = /^\d+(\.\d+)?$/;

/** A decimal number typed as text: "12.50", "2.5"; at most `digits` decimals and at most `max`. */
function decimalText(what: string, { digits, max, positive }: { digits: number; max?: number; positive?: boolean }) {
  return text()
    .trim()
    .regex(DECIMAL, `${what} must be a number like 12.50`)
    .refine((v) => (v.split(".")[1]?.length ?? 0) <= digits, `${what} may have at most ${digits} decimal places`)
    .refine((v) => max === undefined || Number(v) <= max, `${what} must be at most ${(max ?? 0).toLocaleString("en-GB")}`)
    .refine((v) => !positive || Number(v) > 0, `${what} must be greater than zero`);
}

const SKU = text().trim().max(200);

const factorsSchema = z.strictObject(
  Object.fromEntries(
    OVERRIDABLE_FACTORS.map((k) => {
      const f = FACTOR_OVERRIDES[k];
      const shown = (x: number) => (f.percent ? `${x * 100} %` : String(x));
      return [
        k,
        z
          .number({ message: `${f.label} must be a number` })
          .min(f.min, `${f.label} must be at least ${shown(f.min)}`)
          .max(f.max, `${f.label} must be at most ${shown(f.max)}`)
          .optional(),
      ];
    }),
  ) as Record<(typeof OVERRIDABLE_FACTORS)[number], z.ZodOptional<z.ZodNumber>>,
);

export const overridesSchema = z.strictObject({
  factors: factorsSchema.default({}),
  includeRetiredCells: z.boolean().default(false),
  longerStrings: z
    .number()
    .int("Longer strings must be a whole number")
    .min(0, "Longer strings must be at least 0")
    .max(MAX_LONGER_STRINGS, `Longer strings must be at most ${MAX_LONGER_STRINGS}`)
    .default(1),
});

/** An option's identity: the part, the topology and the counts (the server finds it again). */
export const optionChoiceSchema = z.strictObject({
  sku: SKU.min(1, "Choose an option"),
  topology: z.enum(TOPOLOGIES),
  seriesCount: z.number().int().positive().max(MAX_SERIES_COUNT),
  parallelCount: z.number().int().positive().max(MAX_PARALLEL_COUNT),
});

export const customNodeSchema: z.ZodType<CustomNode> = z.lazy(() =>
  z.discriminatedUnion("kind", [
    z.strictObject({ kind: z.literal("cell"), sku: SKU }),
    z.strictObject({ kind: z.enum(["series", "parallel"]), children: z.array(customNodeSchema).max(MAX_CUSTOM_BANK_CELLS) }),
  ]),
);

/** Depth and cell count of a tree, walked without recursion, checked after the shape. */
const boundedTree = customNodeSchema.superRefine((tree, ctx) => {
  const stack: [CustomNode, number][] = [[tree, 1]];
  let cells = 0;
  while (stack.length > 0) {
    const [node, depth] = stack.pop() as [CustomNode, number];
    if (depth > MAX_CUSTOM_BANK_DEPTH) {
      ctx.addIssue({ code: "custom", message: `Groups may nest at most ${MAX_CUSTOM_BANK_DEPTH} levels deep` });
      return;
    }
    if (node.kind === "cell") cells++;
    else for (const child of node.children) stack.push([child, depth + 1]);
    if (cells > MAX_CUSTOM_BANK_CELLS) {
      ctx.addIssue({ code: "custom", message: `A custom bank may hold at most ${MAX_CUSTOM_BANK_CELLS.toLocaleString("en-GB")} cells` });
      return;
    }
  }
});

function draftShape(strict: boolean) {
  const loose = text().max(MAX_LINE_TEXT_LENGTH);
  const money = (what: string) => (strict ? decimalText(what, { digits: 4, max: 1e12 }) : loose);
  const quantity = strict ? decimalText("Quantity", { digits: LINE_QUANTITY_DECIMALS, max: MAX_LINE_QUANTITY, positive: true }) : loose;
  const reason = strict ? text().trim().min(3, "Say why the discount is given").max(MAX_LINE_TEXT_LENGTH) : loose;
  return z.strictObject({
    bank: z.discriminatedUnion("kind", [
      z.strictObject({ kind: z.literal("engine"), choice: strict ? optionChoiceSchema : optionChoiceSchema.nullable(), overrides: overridesSchema }),
      z.strictObject({ kind: z.literal("custom"), network: boundedTree, overrides: overridesSchema }),
    ]),
    bankPrice: z
      .strictObject({ unitPrice: money("Price per bank"), reason: text().trim().max(MAX_LINE_TEXT_LENGTH).default("") })
      .nullable()
      .default(null),
    lines: z
      .array(
        z.strictObject({
          kind: z.enum(EXTRA_LINE_KINDS),
          description: strict ? text().trim().min(1, "Describe the line").max(MAX_LINE_TEXT_LENGTH) : loose,
          quantity,
          unit: strict ? text().trim().min(1, "Give a unit (pc, h, lot)").max(12, "At most 12 characters") : text().max(12),
          unitPrice: money("Unit price"),
        }),
      )
      .max(MAX_EXTRA_LINES, `At most ${MAX_EXTRA_LINES} lines`)
      .default([]),
    discount: z
      .strictObject({
        kind: z.enum(["percent", "amount"]),
        value: strict ? decimalText("Discount", { digits: 4, max: 1e12, positive: true }) : loose,
        reason,
      })
      .nullable()
      .default(null),
    validityDays: z
      .number()
      .int("Validity must be a whole number of days")
      .min(1, "Validity must be at least 1 day")
      .max(MAX_VALIDITY_DAYS, `Validity must be at most ${MAX_VALIDITY_DAYS} days`),
    note: text()
      .max(MAX_MESSAGE_LENGTH, `At most ${MAX_MESSAGE_LENGTH.toLocaleString("en-GB")} characters`)
      .default(""),
  });
}

/** What a saved draft holds (loosely checked: an unfinished line or reason is kept as typed). */
export const workbenchDraftSchema = draftShape(false);
export type WorkbenchDraft = z.output<typeof workbenchDraftSchema>;

/** A draft ready to issue: every field checked. */
export const issuableDraftSchema = draftShape(true);
export type IssuableDraft = z.output<typeof issuableDraftSchema>;

export const saveDraftSchema = z.strictObject({
  requestId: z.string().uuid(),
  draft: workbenchDraftSchema,
  /** the version the estimator started from: 0 for a new draft */
  version: z.number().int().min(0),
});

export const issueRevisionSchema = z.strictObject({
  requestId: z.string().uuid(),
  draft: issuableDraftSchema,
  /** the revision the estimator saw as the latest (0 when the request had no quote): a newer one means someone else issued first */
  basedOnRevision: z.number().int().min(0),
});
export type IssueRevisionInput = z.output<typeof issueRevisionSchema>;

export const exploreOptionsSchema = z.strictObject({ requestId: z.string().uuid(), overrides: overridesSchema });
