import { z } from "zod";
import { text } from "./text";

export const OUTBOX_STATUSES = ["waiting", "sent", "failed"] as const;

/** The desk's outbox list: filter, sort and page, all from the URL. */
export const outboxListSchema = z.object({
  q: text().trim().max(100).optional().default(""),
  status: z.enum(["all", ...OUTBOX_STATUSES]).optional().default("all"),
  sort: z.enum(["created", "to", "subject", "status", "attempts", "sent"]).optional().default("created"),
  dir: z.enum(["asc", "desc"]).optional().default("desc"),
  page: z.coerce.number().int().min(1).optional().default(1),
  size: z.coerce.number().int().min(5).max(100).optional().default(20),
});
export type OutboxListQuery = z.infer<typeof outboxListSchema>;
