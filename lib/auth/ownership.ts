import type { ShopContext } from "./context";
import { can, type Permission } from "./permissions";

/**
 * Who sees which owned records, in one place: a customer sees only their own quotes, requests,
 * files and orders; the shop's staff see all of the shop's. Every page, route handler and action that reads an
 * owned record asks here. A record the member may not see answers "not found", never "forbidden",
 * so ids and numbers cannot be probed.
 */
type Owned = "quote" | "request" | "attachment" | "order";

const RULES: Record<Owned, { all: Permission; own: Permission }> = {
  quote: { all: "quote:read-all", own: "quote:read-own" },
  request: { all: "request:read-all", own: "request:read-own" },
  // a drawing belongs to the request it was uploaded for
  attachment: { all: "request:read-all", own: "request:read-own" },
  order: { all: "order:read-all", own: "order:read-own" },
};

/** The permissions that let a member read some records of this kind: for a guard's `access`. */
export function reads(kind: Owned): readonly Permission[] {
  return [RULES[kind].all, RULES[kind].own];
}

/** Which of the shop's records of this kind the member sees: all of them, or those they own. */
export type OwnerScope = { all: true } | { all: false; userId: string };

export function ownerScope(ctx: ShopContext, kind: Owned): OwnerScope {
  return can(ctx.role, RULES[kind].all) ? { all: true } : { all: false, userId: ctx.user.id };
}

/** Whether the member may see one record of this kind owned by `ownerUserId`. */
export function maySee(ctx: ShopContext, kind: Owned, ownerUserId: string): boolean {
  const rule = RULES[kind];
  return can(ctx.role, rule.all) || (can(ctx.role, rule.own) && ownerUserId === ctx.user.id);
}
