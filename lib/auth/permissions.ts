/**
 * Who may do what in a shop. One table, checked on the server for every page, action and route
 * handler; the user interface only hides what this table refuses.
 */
export const ROLES = ["manager", "estimator", "customer"] as const;
export type Role = (typeof ROLES)[number];

export const STATEMENTS = {
  desk: ["enter"],
  catalog: ["read", "write"],
  pricing: ["read", "write"],
  request: ["create", "read-own", "read-all", "review"],
  quote: ["read-own", "read-all", "issue", "accept"],
  order: ["read-own", "read-all", "update-status", "refund"],
  team: ["read", "update-role"],
  settings: ["read", "write"],
  outbox: ["read", "requeue"],
  audit: ["read"],
  reports: ["read"],
  webhook: ["manage"],
  /** the shop's API keys for its own systems: make, see, revoke */
  apikey: ["manage"],
} as const;

type Statements = typeof STATEMENTS;
export type Permission = {
  [K in keyof Statements]: `${K & string}:${Statements[K][number]}`;
}[keyof Statements];

const ALL: Permission[] = Object.entries(STATEMENTS).flatMap(([resource, actions]) =>
  (actions as readonly string[]).map((a) => `${resource}:${a}` as Permission),
);

export const ROLE_PERMISSIONS: Record<Role, readonly Permission[]> = {
  manager: ALL.filter((p) => !["request:create", "quote:accept"].includes(p)),
  estimator: [
    "desk:enter",
    "catalog:read",
    "catalog:write",
    "pricing:read",
    "pricing:write",
    "request:read-all",
    "request:review",
    "quote:read-all",
    "quote:issue",
    "order:read-all",
  ],
  customer: ["request:create", "request:read-own", "quote:read-own", "quote:accept", "order:read-own"],
};

export function can(role: Role, permission: Permission): boolean {
  return ROLE_PERMISSIONS[role].includes(permission);
}

/** Role changes a manager may make from the team page (DESIGN: estimator ↔ customer). */
export const ASSIGNABLE_ROLES = ["estimator", "customer"] as const satisfies readonly Role[];
