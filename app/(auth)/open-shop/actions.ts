"use server";
import { headers } from "next/headers";
import { createShopSettings, deleteUserAccount, isEmailTaken, isSlugTaken } from "@/db/queries/shops";
import { invalidResult, type ActionResult } from "@/lib/auth/guards";
import { auth } from "@/lib/auth/server";
import { openShopSchema } from "@/lib/validation/auth";

/**
 * Opens a shop: a new account, a new shop with its slug, and the account as its manager.
 * Everything is checked before anything is created, so bad input creates nothing.
 */
export async function openShop(input: unknown): Promise<ActionResult<{ slug: string }>> {
  const parsed = openShopSchema.safeParse(input);
  if (!parsed.success) return invalidResult(parsed.error);
  const v = parsed.data;
  const fieldErrors: Record<string, string[]> = {};
  if (await isSlugTaken(v.slug)) fieldErrors.slug = ["That address is taken; choose another."];
  if (await isEmailTaken(v.email)) fieldErrors.email = ["An account with this e-mail exists; sign in instead."];
  if (Object.keys(fieldErrors).length > 0) return { ok: false, code: "conflict", message: "Please correct the marked fields.", fieldErrors };

  const requestHeaders = await headers();
  const signUp = await auth.api.signUpEmail({ body: { name: v.name, email: v.email, password: v.password }, headers: requestHeaders });
  try {
    const shop = await auth.api.createOrganization({ body: { name: v.shopName, slug: v.slug, userId: signUp.user.id } });
    if (!shop) throw new Error("shop not created");
    await createShopSettings(shop.id, v.currency);
    return { ok: true, data: { slug: v.slug } };
  } catch (error) {
    // The slug was taken between the check and the insert: undo the account so nothing is left behind.
    await deleteUserAccount(signUp.user.id);
    if (await isSlugTaken(v.slug)) return { ok: false, code: "conflict", fieldErrors: { slug: ["That address is taken; choose another."] } };
    throw error;
  }
}
