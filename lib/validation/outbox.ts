import { z } from "zod";

/** A manager sends a failed e-mail again from the outbox. */
export const requeueMessageSchema = z.object({
  outboxId: z.string().uuid("Which message?"),
});
export type RequeueMessageInput = z.infer<typeof requeueMessageSchema>;
