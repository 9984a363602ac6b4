"use server";
import { hashPassword } from "better-auth/crypto";
import { headers } from "next/headers";
import { deleteUserAccount, isEmailTaken } from "@/db/queries/shops";
import { resolveShopContext } from "@/lib/auth/context";
import { invalidResult, refusedResult, type ActionResult } from "@/lib/auth/guards";
import { withShop } from "@/db/tx";
import { auth } from "@/lib/auth/server";
import { limits, requestClient } from "@/lib/http/limits";
import { enqueueAccountExists } from "@/lib/mail/account-notice";
import { joinShopSchema } from "@/lib/validation/auth";

/** The plugin adds the member inside the shop's scope: `members` is a tenant table (db/tx.ts ambientDb). */
function addCustomer(shopId: string, userId: string) {
  return withShop(shopId, () => auth.api.addMember({ body: { userId, organizationId: shopId, role: "customer" } }));
}

/**
 * A customer joins a shop from its storefront: a new account (or the signed-in one) becomes a
 * member with the customer role. The role is fixed here on the server, never taken from the form.
 *
 * An e-mail that already has an account gets the same answer as a new one (so the form tells
 * nobody which addresses have accounts); its owner is told by e-mail instead, and nothing is
 * created or signed in.
 */
export async function joinShop(shopSlug: string, input: unknown): Promise<ActionResult<{ slug: string }>> {
  const requestHeaders = await headers();
  const r = await resolveShopContext(requestHeaders, String(shopSlug));
  if (r.status === "no-shop") return refusedResult("no-shop");
  if (r.status === "ok") return { ok: true, data: { slug: r.ctx.shop.slug } };
  if (r.status === "not-member") {
    await addCustomer(r.shop.id, r.user.id);
    return { ok: true, data: { slug: r.shop.slug } };
  }
  const gate = await limits.signUp.hit(requestClient(requestHeaders));
  if (!gate.allowed) return { ok: false, code: "conflict", message: `Too many new accounts from here; try again in ${gate.retryAfterSeconds} s.` };
  const parsed = joinShopSchema.safeParse(input);
  if (!parsed.success) return invalidResult(parsed.error);
  const v = parsed.data;
  if (await isEmailTaken(v.email)) {
    // as long as creating the account would take (the password hash is the slow part)
    await hashPassword(v.password);
    await enqueueAccountExists({ shopId: r.shop.id, shopName: r.shop.name, email: v.email });
    return { ok: true, data: { slug: r.shop.slug } };
  }
  const signUp = await auth.api.signUpEmail({ body: { name: v.name, email: v.email, password: v.password }, headers: requestHeaders });
  try {
    await addCustomer(r.shop.id, signUp.user.id);
  } catch (error) {
    await deleteUserAccount(signUp.user.id);
    throw error;
  }
  return { ok: true, data: { slug: r.shop.slug } };
}
