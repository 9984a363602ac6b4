"use server";
import { hashPassword } from "better-auth/crypto";
import { headers } from "next/headers";
import { deleteUserAccount, isEmailTaken, isSlugTaken, setOpeningCurrency } from "@/db/queries/shops";
import { invalidResult, type ActionResult } from "@/lib/auth/guards";
import { withShop } from "@/db/tx";
import { auth, randomId } from "@/lib/auth/server";
import { limits, requestClient } from "@/lib/http/limits";
import { sendOpenShopNotice } from "@/lib/mail/account-notice";
import { openShopSchema } from "@/lib/validation/auth";

/**
 * Opens a shop: a new account, a new shop with its slug, and the account as its manager.
 * Everything is checked before anything is created, so bad input creates nothing.
 *
 * An e-mail that already has an account gets the same answer as a new one (the form tells nobody
 * which addresses have accounts); nothing is created and its owner is told by e-mail instead.
 */
export async function openShop(input: unknown): Promise<ActionResult<{ slug: string }>> {
  const requestHeaders = await headers();
  const gate = await limits.signUp.hit(requestClient(requestHeaders));
  if (!gate.allowed) return { ok: false, code: "conflict", message: `Too many new accounts from here; try again in ${gate.retryAfterSeconds} s.` };
  const parsed = openShopSchema.safeParse(input);
  if (!parsed.success) return invalidResult(parsed.error);
  const v = parsed.data;
  // shop addresses are public (every storefront has one): saying one is taken tells nothing private
  if (await isSlugTaken(v.slug))
    return { ok: false, code: "conflict", message: "Please correct the marked fields.", fieldErrors: { slug: ["That address is taken; choose another."] } };
  if (await isEmailTaken(v.email)) {
    await hashPassword(v.password); // as long as creating the account would take
    sendOpenShopNotice({ email: v.email, shopName: v.shopName });
    return { ok: true, data: { slug: v.slug } };
  }

  const signUp = await auth.api.signUpEmail({ body: { name: v.name, email: v.email, password: v.password }, headers: requestHeaders });
  try {
    // A server call on the new account's behalf, in one transaction scoped to the new shop (its id
    // chosen here, so the founder's membership is written under the shop's own row-level policy):
    // the shop, its founder, its settings row (the plugin's hooks, lib/auth/plugin-rules.ts) and
    // the opener's currency commit together or not at all.
    const shopId = randomId();
    await withShop(shopId, async () => {
      const shop = await auth.api.createOrganization({ body: { name: v.shopName, slug: v.slug, userId: signUp.user.id } });
      if (!shop || shop.id !== shopId) throw new Error("shop not created");
      await setOpeningCurrency(shopId, v.currency);
    });
  } catch (error) {
    // The slug was taken between the check and the insert: undo the account so nothing is left behind.
    await deleteUserAccount(signUp.user.id);
    if (await isSlugTaken(v.slug)) return { ok: false, code: "conflict", fieldErrors: { slug: ["That address is taken; choose another."] } };
    throw error;
  }
  return { ok: true, data: { slug: v.slug } };
}
