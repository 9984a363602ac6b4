"use server";
import { revalidatePath } from "next/cache";
import { createApiKey as makeKey, revokeApiKey as revokeKey } from "@/lib/auth/api-keys";
import { shopAction } from "@/lib/auth/guards";
import { createApiKeySchema, revokeApiKeySchema } from "@/lib/validation/api-keys";

/** Makes a key; the answer carries its secret, which is shown this once and never stored. */
export const createApiKey = shopAction(createApiKeySchema, "apikey:manage", async (ctx, input) => {
  const made = await makeKey(ctx, input.name, [...new Set(input.scopes)]);
  revalidatePath(`/desk/${ctx.shop.slug}/api-keys`);
  return { ok: true, data: made };
});

/** Revokes a key: the next request made with it is refused. */
export const revokeApiKey = shopAction(revokeApiKeySchema, "apikey:manage", async (ctx, input) => {
  const r = await revokeKey(ctx, input.id);
  if (!r) return { ok: false, code: "not-found", message: "No such live key in this shop." };
  revalidatePath(`/desk/${ctx.shop.slug}/api-keys`);
  return { ok: true, data: r };
});
