"use server";
import { revalidatePath } from "next/cache";
import { shopAction } from "@/lib/auth/guards";
import { requeueFailedMessage } from "@/lib/mail/outbox";
import { requeueMessageSchema } from "@/lib/validation/outbox";

/** A manager sends a failed message again (it gets the full retry policy anew); recorded in the audit log. */
export const requeueMessage = shopAction(requeueMessageSchema, "outbox:requeue", async (ctx, input) => {
  const outcome = await requeueFailedMessage(ctx.shop.id, input.outboxId, ctx.user.id);
  if (outcome === "missing") return { ok: false, code: "not-found", message: "No such message in this shop." };
  if (outcome === "not-failed") return { ok: false, code: "conflict", message: "Only a failed message can be sent again; this one is sent or still waiting." };
  revalidatePath(`/desk/${ctx.shop.slug}/outbox`);
  return { ok: true, data: { id: input.outboxId } };
});
