import { createAccessControl } from "better-auth/plugins/access";
import { defaultStatements } from "better-auth/plugins/organization/access";
import { ROLE_PERMISSIONS, STATEMENTS, type Role } from "./permissions";

/** better-auth's access control built from our permission table (lib/auth/permissions.ts). */
export const ac = createAccessControl({ ...defaultStatements, ...STATEMENTS });

function grants(role: Role) {
  const out: Record<string, string[]> = {};
  for (const p of ROLE_PERMISSIONS[role]) {
    const [resource, action] = p.split(":") as [string, string];
    (out[resource] ??= []).push(action);
  }
  return out;
}

export const roles = {
  manager: ac.newRole({
    ...grants("manager"),
    organization: ["update"],
    member: ["create", "update", "delete"],
    invitation: ["create", "cancel"],
  } as never),
  estimator: ac.newRole(grants("estimator") as never),
  customer: ac.newRole(grants("customer") as never),
};
