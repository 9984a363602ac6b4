"use server";
import { revalidatePath } from "next/cache";
import { shopAction, type ActionResult } from "@/lib/auth/guards";
import { reads } from "@/lib/auth/ownership";
import { openCheckout } from "@/lib/payments/checkout";
import { acceptQuoteRevision, declineQuoteRevision, postQuoteMessage } from "@/lib/quoting/lifecycle";
import { startCheckoutSchema } from "@/lib/validation/orders";
import { acceptQuoteSchema, declineQuoteSchema, quoteMessageSchema } from "@/lib/validation/quote-life";

/** The customer's moves on their quote page: accept a revision, decline it with a reason, write (or ask for a change). */

const revalidate = (slug: string, number: string) => {
  revalidatePath(`/s/${slug}/quotes/${number}`);
  revalidatePath(`/s/${slug}/quotes`);
};

const accept = shopAction(acceptQuoteSchema, "quote:accept", async (ctx, input): Promise<ActionResult<{ revision: number }>> => {
  const r = await acceptQuoteRevision(ctx, input);
  if (!r.ok) return r;
  revalidate(ctx.shop.slug, input.number);
  return { ok: true, data: { revision: r.data.revision } };
});

export async function acceptQuote(shopSlug: string, input: unknown) {
  return accept(shopSlug, input);
}

const decline = shopAction(declineQuoteSchema, "quote:accept", async (ctx, input) => {
  const r = await declineQuoteRevision(ctx, input);
  if (r.ok) revalidate(ctx.shop.slug, input.number);
  return r;
});

export async function declineQuote(shopSlug: string, input: unknown) {
  return decline(shopSlug, input);
}

const write = shopAction(quoteMessageSchema, reads("quote"), async (ctx, input) => {
  const r = await postQuoteMessage(ctx, input);
  if (r.ok) revalidate(ctx.shop.slug, input.number);
  return r;
});

export async function writeQuoteMessage(shopSlug: string, input: unknown) {
  return write(shopSlug, input);
}

/**
 * "Accept and pay": the quote's own customer accepts the revision and is handed the Checkout
 * Session to pay it (the whole amount, the deposit or the balance). `openCheckout` accepts the
 * latest sent revision through the quote's own move (`acceptQuoteRevisionIn`) in its transaction.
 */
export const startCheckout = shopAction(startCheckoutSchema, "quote:accept", async (ctx, input) => openCheckout(ctx, input));
