import { describe, expect, it } from "vitest";
import { can, ROLE_PERMISSIONS, ROLES, STATEMENTS, type Permission } from "@/lib/auth/permissions";

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
    ["team:read", true, false, false],
    ["team:update-role", true, false, false],
    ["settings:write", true, false, false],
    ["outbox:read", true, false, false],
  ];
  it.each(table)("%s → manager %s, estimator %s, customer %s", (permission, manager, estimator, customer) => {
    expect(can("manager", permission)).toBe(manager);
    expect(can("estimator", permission)).toBe(estimator);
    expect(can("customer", permission)).toBe(customer);
  });

  it("grants only permissions that exist in the statements", () => {
    const all = new Set(Object.entries(STATEMENTS).flatMap(([r, actions]) => actions.map((a) => `${r}:${a}`)));
    for (const role of ROLES) for (const p of ROLE_PERMISSIONS[role]) expect(all.has(p)).toBe(true);
  });

  it("gives customers nothing on the desk", () => {
    expect(ROLE_PERMISSIONS.customer.filter((p) => p.endsWith("-all") || p.startsWith("desk") || p.startsWith("team"))).toEqual([]);
  });
});
