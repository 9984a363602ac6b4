import { z } from "zod";
import { MAX_PARALLEL_COUNT, MAX_SERIES_COUNT } from "@/lib/bank/bounds";
import { TECHNOLOGIES, TOPOLOGIES } from "@/lib/bank/types";
import { QUOTE_STATUSES } from "@/lib/vocabulary";
import { arrangementRequestSchema } from "./bank";
import { MAX_NOTES_LENGTH } from "./limits";
import { text } from "./text";

/**
 * The quote API's request and response shapes (POST /api/v1/shops/{shop}/quotes, GET …/quotes/{number},
 * GET …/quotes/{number}/revisions/{n}), exported for the OpenAPI description. Money is a decimal
 * string with its ISO 4217 currency; physics in SI units. Customers see sell prices only.
 */

/** The caller's token for one quote: the same key with the same body answers the same quote. */
export const idempotencyKeySchema = z.string().regex(/^[A-Za-z0-9._:-]{8,100}$/, "The idempotency key must be 8 to 100 letters, digits or . _ : -");

export const createQuoteRequestSchema = z.strictObject({
  requirement: arrangementRequestSchema,
  /** the option to quote, as the arrangements endpoint lists it */
  choice: z.strictObject({
    sku: text().trim().min(1).max(200),
    topology: z.enum(TOPOLOGIES),
    seriesCount: z.number().int().positive().max(MAX_SERIES_COUNT),
    parallelCount: z.number().int().positive().max(MAX_PARALLEL_COUNT),
  }),
  idempotencyKey: idempotencyKeySchema,
  /** staff quoting for one of the shop's customers name them by e-mail; customers quote for themselves */
  customerEmail: z.string().trim().toLowerCase().email("Give the customer's e-mail address").max(320).optional(),
  notes: text().max(MAX_NOTES_LENGTH).default(""),
});
export type CreateQuoteRequest = z.output<typeof createQuoteRequestSchema>;

export const moneySchema = z.object({ amount: z.string().regex(/^-?\d+(\.\d+)?$/), currency: z.string().length(3) });

/** 201: the quote was issued at once. */
export const quoteCreatedResponseSchema = z.object({ number: z.string(), revision: z.number().int().positive(), total: moneySchema });
/** 202: the request waits for the shop's estimators. */
export const quoteInReviewResponseSchema = z.object({ requestId: z.string().uuid(), status: z.literal("needs-review") });

const lineSchema = z.object({
  code: z.string(),
  description: z.string(),
  quantity: z.string(),
  unit: z.string(),
  unitPrice: moneySchema,
  amount: moneySchema,
});

type CustomNodeShape = { kind: "cell"; sku: string } | { kind: "series" | "parallel"; children: CustomNodeShape[] };
const customNodeShape: z.ZodType<CustomNodeShape> = z.lazy(() =>
  z.union([z.object({ kind: z.literal("cell"), sku: z.string() }), z.object({ kind: z.enum(["series", "parallel"]), children: z.array(customNodeShape) })]),
);

/** One revision of a quote as the API answers it. */
export const quoteRevisionResponseSchema = z.object({
  number: z.string(),
  revision: z.number().int().positive(),
  /** this revision's state */
  state: z.enum(QUOTE_STATUSES),
  /** the quote's state (its latest revision's) */
  quoteState: z.enum(QUOTE_STATUSES),
  latestRevision: z.number().int().positive(),
  issuedAt: z.string(),
  validUntil: z.string(),
  requirement: z.record(z.string(), z.unknown()),
  arrangement: z.object({
    source: z.enum(["customer-choice", "engine", "custom"]),
    topology: z.enum(TOPOLOGIES),
    seriesCount: z.number().int(),
    parallelCount: z.number().int(),
    cellCount: z.number().int(),
    cell: z.object({ sku: z.string(), technology: z.enum(TECHNOLOGIES), capacitance: z.number(), ratedVoltage: z.number() }),
    capacitance: z.object({ nominal: z.number(), design: z.number() }),
    maxVoltage: z.number(),
    storedEnergy: z.number(),
    usableEnergy: z.number(),
    esr: z.object({ new: z.number(), endOfLife: z.number() }),
    mass: z.number(),
    volume: z.number(),
    worstCellVoltage: z.number(),
    leadTimeDays: z.number(),
    /** a custom bank's tree of groups and parts */
    network: customNodeShape.optional(),
  }),
  lines: z.array(lineSchema),
  totals: z.object({
    lines: moneySchema,
    quantityDiscount: moneySchema,
    discount: z.object({ amount: moneySchema, reason: z.string() }).nullable(),
    subtotal: moneySchema,
    tax: z.object({ ratePct: z.string(), amount: moneySchema }),
    total: moneySchema,
  }),
  cautions: z.array(z.string()),
  revisions: z.array(z.object({ revision: z.number().int(), state: z.enum(QUOTE_STATUSES), issuedAt: z.string() })),
});
export type QuoteRevisionResponse = z.infer<typeof quoteRevisionResponseSchema>;
