import { z } from "zod";
import { arrangementRequestSchema } from "./bank";
import { text } from "./text";

export const topologySchema = z.enum(["series-of-parallel-groups", "parallel-of-series-strings"]);

/** The option a customer picked, as its identity only: the server re-prices it from the catalog. */
export const chosenOptionSchema = z.object({
  cellSku: text().trim().min(1).max(200),
  topology: topologySchema,
  seriesCount: z.number().int().positive(),
  parallelCount: z.number().int().positive(),
});

/**
 * Choosing an arrangement: the requirement as entered, the customer's notes and attachments, and
 * the option. Without an option the request goes to the estimators ("no option fits").
 */
export const chooseArrangementSchema = z.object({
  idempotencyKey: z.string().uuid(),
  requirement: arrangementRequestSchema,
  notes: text().max(4000).default(""),
  attachmentIds: z.array(z.string().uuid()).max(10).default([]),
  option: chosenOptionSchema.optional(),
});

export type ChooseArrangementInput = z.infer<typeof chooseArrangementSchema>;
export type ChosenOption = z.infer<typeof chosenOptionSchema>;

/** Quote lists: page, sort and filter as they appear in the URL. */
export const quoteListQuerySchema = z.object({
  q: text().trim().max(100).catch(""),
  status: z.enum(["all", "issued", "accepted", "expired", "withdrawn"]).catch("all"),
  sort: z.enum(["number", "created", "total", "validUntil"]).catch("created"),
  dir: z.enum(["asc", "desc"]).catch("desc"),
  page: z.coerce.number().int().min(1).max(10_000).catch(1),
  size: z.coerce.number().int().min(1).max(100).catch(20),
});

export type QuoteListQuery = z.infer<typeof quoteListQuerySchema>;

/** Request lists on the desk. */
export const requestListQuerySchema = z.object({
  status: z.enum(["all", "quoted", "needs-review", "closed"]).catch("all"),
  sort: z.enum(["created", "status", "voltage"]).catch("created"),
  dir: z.enum(["asc", "desc"]).catch("desc"),
  page: z.coerce.number().int().min(1).max(10_000).catch(1),
  size: z.coerce.number().int().min(1).max(100).catch(20),
});

export type RequestListQuery = z.infer<typeof requestListQuerySchema>;
