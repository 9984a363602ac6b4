import "server-only";
import { headers } from "next/headers";
import { cache } from "react";
import { getMemberRole } from "@/db/queries/members";
import { getShopBySlug } from "@/db/queries/shops";
import type { ApiKeyScope } from "./api-key-scopes";
import type { Role } from "./permissions";
import { auth } from "./server";

export interface ShopContext {
  user: { id: string; name: string; email: string };
  shop: { id: string; slug: string; name: string };
  role: Role;
  /**
   * Set when a shop's API key made the request (lib/auth/api-keys.ts): then `user` is the person
   * who created the key (who answers for it) and `role` is staff, but only the key's scopes count.
   */
  apiKey?: { id: string; name: string; scopes: readonly ApiKeyScope[] };
}

/** Who acted, for the audit log: the signed-in person, or the API key (never both). */
export function actorOf(ctx: ShopContext): { actorUserId: string | null; actorKeyId: string | null } {
  return ctx.apiKey ? { actorUserId: null, actorKeyId: ctx.apiKey.id } : { actorUserId: ctx.user.id, actorKeyId: null };
}

/** Who is asking in a shop: a member with a role, or one of the three ways not to be one. */
export type ContextResult =
  | { status: "ok"; ctx: ShopContext }
  | { status: "no-shop" }
  | { status: "signed-out"; shop: ShopContext["shop"] }
  | { status: "not-member"; shop: ShopContext["shop"]; user: ShopContext["user"] };

/**
 * Who is asking, in which shop, in which role. The shop comes from the URL's slug, the user from
 * the session cookie, and the role from the members table on every request — never from the client.
 */
export async function resolveShopContext(requestHeaders: Headers, shopSlug: string): Promise<ContextResult> {
  const shop = await getShopBySlug(shopSlug);
  if (!shop) return { status: "no-shop" };
  const session = await auth.api.getSession({ headers: requestHeaders });
  if (!session) return { status: "signed-out", shop };
  const user = { id: session.user.id, name: session.user.name, email: session.user.email };
  const role = await getMemberRole(shop.id, user.id);
  if (!role) return { status: "not-member", shop, user };
  return { status: "ok", ctx: { user, shop, role } };
}

/** The signed-in user, or null (for pages that are not tied to one shop). */
export const getSessionUser = cache(async () => {
  const session = await auth.api.getSession({ headers: await headers() });
  return session ? { id: session.user.id, name: session.user.name, email: session.user.email } : null;
});

/** For server components: React-cached per request. */
export const getShopContext = cache(async (shopSlug: string) => resolveShopContext(await headers(), shopSlug));
