import "server-only";
import { and, eq } from "drizzle-orm";
import { headers } from "next/headers";
import { forbidden, notFound, redirect } from "next/navigation";
import { cache } from "react";
import { db } from "@/db";
import { members, shops } from "@/db/schema";
import { can, isRole, type Permission, type Role } from "./permissions";
import { auth } from "./server";

export interface ShopContext {
  user: { id: string; name: string; email: string };
  shop: { id: string; slug: string; name: string };
  role: Role;
}

export type ContextResult =
  | { status: "ok"; ctx: ShopContext }
  | { status: "no-shop" }
  | { status: "signed-out"; shop: ShopContext["shop"] }
  | { status: "not-member"; shop: ShopContext["shop"]; user: ShopContext["user"] };

/** A slug as shops are given them (lib/validation/auth.ts): anything else cannot name a shop. */
const SLUG_SHAPE = /^[a-z0-9-]{1,64}$/;

export async function getShopBySlug(slug: string) {
  if (!SLUG_SHAPE.test(slug)) return null;
  const [shop] = await db
    .select({ id: shops.id, slug: shops.slug, name: shops.name })
    .from(shops)
    .where(eq(shops.slug, slug))
    .limit(1);
  return shop ?? null;
}

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
  const [member] = await db
    .select({ role: members.role })
    .from(members)
    .where(and(eq(members.shopId, shop.id), eq(members.userId, user.id)))
    .limit(1);
  if (!member || !isRole(member.role)) return { status: "not-member", shop, user };
  return { status: "ok", ctx: { user, shop, role: member.role } };
}

/** The signed-in user, or null (for pages that are not tied to one shop). */
export const getSessionUser = cache(async () => {
  const session = await auth.api.getSession({ headers: await headers() });
  return session ? { id: session.user.id, name: session.user.name, email: session.user.email } : null;
});

/** For server components: React-cached per request. */
export const getShopContext = cache(async (shopSlug: string) => resolveShopContext(await headers(), shopSlug));

/**
 * For pages: the context when the signed-in member may do `permission`; otherwise the sign-in page
 * (signed out), the not-found page (no such shop) or the not-allowed page (403).
 */
export async function requireShopPage(shopSlug: string, permission?: Permission, next?: string): Promise<ShopContext> {
  const r = await getShopContext(shopSlug);
  if (r.status === "no-shop") notFound();
  if (r.status === "signed-out") {
    const back = next ?? `/desk/${shopSlug}`;
    redirect(`/sign-in?shop=${encodeURIComponent(shopSlug)}&next=${encodeURIComponent(back)}`);
  }
  if (r.status === "not-member") forbidden();
  if (permission && !can(r.ctx.role, permission)) forbidden();
  return r.ctx;
}

export class NotAllowedError extends Error {
  constructor(public readonly permission: Permission) {
    super(`not allowed: ${permission}`);
  }
}

export function assertCan(role: Role, permission: Permission): void {
  if (!can(role, permission)) throw new NotAllowedError(permission);
}
