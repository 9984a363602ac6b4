import { z } from "zod";
import { MAX_PARALLEL_COUNT, MAX_SERIES_COUNT } from "../bank/bounds";
import { TOPOLOGIES } from "@/lib/bank/types";
import { arrangementRequestSchema } from "./bank";
import { MAX_ATTACHMENTS_PER_REQUEST, MAX_NOTES_LENGTH } from "./limits";
import { text } from "./text";

const topologySchema = z.enum(TOPOLOGIES);

/** The option a customer picked, as its identity only: the server re-prices it from the catalog. */
const chosenOptionSchema = z.object({
  cellSku: text().trim().min(1).max(200),
  topology: topologySchema,
  seriesCount: z.number().int().positive().max(MAX_SERIES_COUNT),
  parallelCount: z.number().int().positive().max(MAX_PARALLEL_COUNT),
});

/**
 * Choosing an arrangement: the requirement as entered, the customer's notes and attachments, and
 * the option. Without an option the request goes to the estimators ("no option fits").
 */
export const chooseArrangementSchema = z.object({
  idempotencyKey: z.string().uuid(),
  requirement: arrangementRequestSchema,
  notes: text().max(MAX_NOTES_LENGTH).default(""),
  attachmentIds: z.array(z.string().uuid()).max(MAX_ATTACHMENTS_PER_REQUEST).default([]),
  option: chosenOptionSchema.optional(),
});

// kept beside the choice schema for its readers; it lives in a module without zod
export { optionId } from "@/lib/quoting/option-id";

export type ChooseArrangementInput = z.infer<typeof chooseArrangementSchema>;
export type ChosenOption = z.infer<typeof chosenOptionSchema>;
