"use server";
import { revalidatePath } from "next/cache";
import { shopAction, type ActionResult } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { applyCancellation, applyOrderMove, saveBankTest } from "@/lib/orders/moves";
import { requestRefund } from "@/lib/payments/refunds";
import { cancelOrderSchema, moveOrderSchema, recordTestSchema, refundOrderSchema } from "@/lib/validation/orders";

function revalidated<T>(shop: string, number: string, r: ActionResult<T>): ActionResult<T> {
  if (r.ok) {
    revalidatePath(`/desk/${shop}/orders`);
    revalidatePath(`/desk/${shop}/orders/${number}`);
    revalidatePath(`/s/${shop}/orders/${number}`);
  }
  return r;
}

/** The manager moves an order one step (lib/orders/stages.ts), with a note; to "shipped" with carrier and tracking. */
export const moveOrder = shopAction(moveOrderSchema, "order:update-status", async (ctx, input) =>
  revalidated(ctx.shop.slug, input.number, await applyOrderMove(ctx, input)),
);

/** The manager cancels an order before kitting, with a reason, refunding what was paid when asked. */
export const cancelOrder = shopAction(cancelOrderSchema, ["order:update-status"], async (ctx, input) => {
  if (input.refund && !can(ctx.role, "order:refund")) return { ok: false, code: "forbidden", message: "Your role may not refund." };
  return revalidated(ctx.shop.slug, input.number, await applyCancellation(ctx, input));
});

/** The manager records one bank's acceptance test (limits from the frozen specification). */
export const recordTest = shopAction(recordTestSchema, "order:update-status", async (ctx, input) => {
  const { number, bank, note, ...measured } = input;
  return revalidated(ctx.shop.slug, number, await saveBankTest(ctx, { number, bank, note, measured }));
});

/** The manager refunds part or all of what the order's customer paid, with a reason. */
export const refundOrder = shopAction(refundOrderSchema, "order:refund", async (ctx, input) =>
  revalidated(ctx.shop.slug, input.number, await requestRefund(ctx, input)),
);
