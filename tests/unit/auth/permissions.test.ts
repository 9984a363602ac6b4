import { describe, expect, it } from "vitest";
import { roles } from "@/lib/auth/access";
import type { ShopContext } from "@/lib/auth/context";
import { maySee, ownerScope } from "@/lib/auth/ownership";
import { can, ROLES, STATEMENTS, type Permission, type Role } from "@/lib/auth/permissions";

// The role/permission table is the product's own rule (DESIGN.md §1 describes who does what).
describe("role permissions", () => {
  const table: [Permission, boolean, boolean, boolean][] = [
    // permission            manager estimator customer
    ["desk:enter", true, true, false],
    ["catalog:read", true, true, false],
    ["catalog:write", true, true, false],
    ["pricing:write", true, true, false],
    ["request:create", false, false, true],
    ["request:read-own", true, false, true],
    ["request:read-all", true, true, false],
    ["request:review", true, true, false],
    ["quote:issue", true, true, false],
    ["quote:read-own", true, false, true],
    ["quote:accept", false, false, true],
    ["order:update-status", true, false, false],
    ["order:read-all", true, true, false],
    ["order:read-own", true, false, true],
    ["order:refund", true, false, false],
    ["reports:read", true, false, false],
    ["team:read", true, false, false],
    ["team:update-role", true, false, false],
    ["settings:write", true, false, false],
    ["outbox:read", true, false, false],
    ["outbox:requeue", true, false, false],
    ["audit:read", true, false, false],
    ["apikey:manage", true, false, false],
  ];
  it.each(table)("%s → manager %s, estimator %s, customer %s", (permission, manager, estimator, customer) => {
    expect(can("manager", permission)).toBe(manager);
    expect(can("estimator", permission)).toBe(estimator);
    expect(can("customer", permission)).toBe(customer);
  });

  it("gives customers nothing that reads the whole shop, the desk or the team", () => {
    const all = Object.entries(STATEMENTS).flatMap(([r, actions]) => actions.map((a) => `${r}:${a}` as Permission));
    expect(all.filter((p) => can("customer", p) && (p.endsWith("-all") || p.startsWith("desk") || p.startsWith("team")))).toEqual([]);
  });

  it("builds better-auth's access control so that it grants exactly what the table grants", () => {
    for (const role of ROLES) {
      for (const [resource, actions] of Object.entries(STATEMENTS)) {
        for (const action of actions) {
          const granted = roles[role].authorize({ [resource]: [action] } as never).success;
          expect(granted, `${role} ${resource}:${action}`).toBe(can(role, `${resource}:${action}` as Permission));
        }
      }
    }
  });
});

describe("who sees which owned records", () => {
  const ctx = (role: Role, userId = "u-1"): ShopContext => ({
    user: { id: userId, name: "Test", email: "t@shop.example" },
    shop: { id: "s-1", slug: "shop", name: "Shop" },
    role,
  });

  it.each([
    // role, quote owned by self, quote owned by someone else
    ["customer", true, false],
    ["estimator", true, true],
    ["manager", true, true],
  ] as const)("%s: own quote %s, another customer's %s", (role, own, others) => {
    expect(maySee(ctx(role), "quote", "u-1")).toBe(own);
    expect(maySee(ctx(role), "quote", "u-2")).toBe(others);
    expect(maySee(ctx(role), "attachment", "u-2")).toBe(others);
    expect(ownerScope(ctx(role), "quote")).toEqual(others ? { all: true } : { all: false, userId: "u-1" });
  });
});
