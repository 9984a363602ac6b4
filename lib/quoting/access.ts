import "server-only";
import { resolveShopContext, type ShopContext } from "@/lib/auth/context";
import { can } from "@/lib/auth/permissions";
import { jsonError } from "@/lib/http/json-error";

/** Staff who see every quote of the shop, or null for a customer who sees their own only. */
export function quoteScope(ctx: ShopContext): { all: true } | { all: false; userId: string } | null {
  if (can(ctx.role, "quote:read-all")) return { all: true };
  if (can(ctx.role, "quote:read-own")) return { all: false, userId: ctx.user.id };
  return null;
}

/** Whether this member may see a quote (or a request, or an attachment) owned by `ownerUserId`. */
export function maySeeOwned(ctx: ShopContext, ownerUserId: string, readAll: "quote:read-all" | "request:read-all" = "quote:read-all"): boolean {
  return can(ctx.role, readAll) || ownerUserId === ctx.user.id;
}

/**
 * For route handlers that customers and staff both use (a customer's own rows, staff all rows):
 * 404 no shop, 401 signed out, 403 not a member or a role that reads no quotes.
 */
export async function withQuoteReader(request: Request, shopSlug: string, handler: (ctx: ShopContext, scope: { all: true } | { all: false; userId: string }) => Promise<Response>): Promise<Response> {
  const r = await resolveShopContext(request.headers, shopSlug);
  if (r.status === "no-shop") return jsonError(404, "No such shop.");
  if (r.status === "signed-out") return jsonError(401, "Sign in to continue.");
  if (r.status === "not-member") return jsonError(403, "You are not a member of this shop.");
  const scope = quoteScope(r.ctx);
  if (!scope) return jsonError(403, "Your role may not do this.");
  return handler(r.ctx, scope);
}
