"use server";
import { revalidatePath } from "next/cache";
import { shopAction } from "@/lib/auth/guards";
import { postQuoteMessage, resendQuoteEmail, withdrawQuote } from "@/lib/quoting/lifecycle";
import { quoteMessageSchema, quoteRefSchema, withdrawQuoteSchema } from "@/lib/validation/quote-life";

/** The staff's moves on a quote: reply in the thread, send the quote's e-mail again, withdraw the open revision. */

const revalidate = (slug: string, number: string) => {
  revalidatePath(`/desk/${slug}/quotes/${number}`);
  revalidatePath(`/desk/${slug}/quotes`);
};

const reply = shopAction(quoteMessageSchema, "quote:issue", async (ctx, input) => {
  const r = await postQuoteMessage(ctx, { ...input, kind: "message" });
  if (r.ok) revalidate(ctx.shop.slug, input.number);
  return r;
});

export async function replyToQuote(shopSlug: string, input: unknown) {
  return reply(shopSlug, input);
}

const resend = shopAction(quoteRefSchema, "quote:issue", async (ctx, input) => {
  const r = await resendQuoteEmail(ctx, input);
  if (r.ok) revalidate(ctx.shop.slug, input.number);
  return r;
});

export async function resendQuote(shopSlug: string, input: unknown) {
  return resend(shopSlug, input);
}

const withdraw = shopAction(withdrawQuoteSchema, "quote:issue", async (ctx, input) => {
  const r = await withdrawQuote(ctx, input);
  if (r.ok) revalidate(ctx.shop.slug, input.number);
  return r;
});

export async function withdrawQuoteRevision(shopSlug: string, input: unknown) {
  return withdraw(shopSlug, input);
}
