import "server-only";
import { env } from "@/lib/env";
import { jsonError } from "@/lib/http/json-error";
import { crossOriginRefusal } from "@/lib/http/origin";
import { can, type Permission } from "./permissions";
import { resolveShopContext, type ShopContext } from "./context";

export { jsonError };

/**
 * For route handlers: resolves the shop context from the request itself and answers 404 (no such
 * shop), 401 (signed out) or 403 (not a member, or the role may not) as JSON before the handler runs.
 * A write (any method but GET/HEAD/OPTIONS) sent by a page of another site is refused first (403).
 */
export async function withShopApi(
  request: Request,
  shopSlug: string,
  permission: Permission,
  handler: (ctx: ShopContext) => Promise<Response>,
): Promise<Response> {
  const crossOrigin = crossOriginRefusal(request, env.APP_ORIGINS);
  if (crossOrigin) return crossOrigin;
  const r = await resolveShopContext(request.headers, shopSlug);
  if (r.status === "no-shop") return jsonError(404, "No such shop.");
  if (r.status === "signed-out") return jsonError(401, "Sign in to continue.");
  if (r.status === "not-member") return jsonError(403, "You are not a member of this shop.");
  if (!can(r.ctx.role, permission)) return jsonError(403, "Your role may not do this.");
  return handler(r.ctx);
}
