import type { Permission } from "./permissions";

/**
 * What a shop's API key may be given, and the one mapping from the permission a route asks of a
 * signed-in member to the key scope that stands in for it. A route states its permission once
 * (`withShopApi(request, shop, "catalog:write", …)`): a member needs the permission through their
 * role, a key needs the scope this table maps it to. A permission missing here cannot be used with a
 * key at all (team, settings, the customer's own actions). Pure: no database, no framework.
 */
export const API_KEY_SCOPES = ["catalog:read", "catalog:write", "quotes:read", "quotes:write", "orders:read"] as const;
export type ApiKeyScope = (typeof API_KEY_SCOPES)[number];

export const API_KEY_SCOPE_LABELS: Record<ApiKeyScope, string> = {
  "catalog:read": "Read the catalog and the pricing rules",
  "catalog:write": "Change the catalog and the pricing rules (import, edit)",
  "quotes:read": "Read quotes",
  "quotes:write": "Issue and change quotes",
  "orders:read": "Read orders",
};

export const API_KEY_SCOPE_FOR: Partial<Record<Permission, ApiKeyScope>> = {
  "catalog:read": "catalog:read",
  "catalog:write": "catalog:write",
  "pricing:read": "catalog:read",
  "pricing:write": "catalog:write",
  "quote:read-all": "quotes:read",
  "quote:issue": "quotes:write",
  "request:read-all": "quotes:read",
  "request:review": "quotes:write",
  "order:read-all": "orders:read",
};

/** Whether a key holding `scopes` may do what a route asks (`access`: one permission or any one of several). */
export function keyAllows(scopes: readonly ApiKeyScope[], access: Permission | readonly Permission[]): boolean {
  const asked = typeof access === "string" ? [access] : access;
  return asked.some((p) => {
    const scope = API_KEY_SCOPE_FOR[p];
    return scope !== undefined && scopes.includes(scope);
  });
}
