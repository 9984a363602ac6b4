import "server-only";
import { APIError, createAuthMiddleware, getSessionFromCtx } from "better-auth/api";
import { countMembers, getMemberRole } from "@/db/queries/members";
import { createShopSettings, getShopBySlug } from "@/db/queries/shops";
import { env } from "@/lib/env";
import { slugProblem } from "@/lib/validation/auth";
import { ASSIGNABLE_ROLES, can } from "./permissions";
import { accountWaitSeconds, clearSignInFailures, recordSignInFailure } from "@/db/queries/sign-in-failures";

/**
 * better-auth and its organization plugin mount many endpoints under /api/auth/*. The browser
 * needs three of them; every other one answers 404 over HTTP, whoever asks. Our own server code
 * still calls a few more directly (sign-up, creating a shop, adding a member), and those obey the
 * same rules as our actions through the plugin's hooks below. The full list, with what each role
 * gets, is tested in tests/integration/auth-endpoints.test.ts.
 */
export const HTTP_AUTH_PATHS: ReadonlySet<string> = new Set(["/sign-in/email", "/sign-out", "/get-session"]);

/** Plugin reads that list a shop's people: only a role that may read the team gets an answer. */
const TEAM_READS: ReadonlySet<string> = new Set(["/organization/list-members", "/organization/get-full-organization", "/organization/list-invitations"]);

const assignable = (role: unknown) => (ASSIGNABLE_ROLES as readonly unknown[]).includes(role);

const roleIn = getMemberRole;

async function shopIdFor(query: Record<string, unknown> | undefined, activeShopId: unknown): Promise<string | null> {
  if (typeof query?.organizationId === "string") return query.organizationId;
  if (typeof query?.organizationSlug === "string") {
    return (await getShopBySlug(query.organizationSlug))?.id ?? null;
  }
  return typeof activeShopId === "string" ? activeShopId : null;
}

const emailOf = (body: unknown) =>
  body && typeof body === "object" && typeof (body as { email?: unknown }).email === "string" ? (body as { email: string }).email : null;

export const authHooks = {
  before: createAuthMiddleware(async (ctx) => {
    // Over HTTP (the router passes the request), only the browser's three endpoints exist.
    if (ctx.request && !HTTP_AUTH_PATHS.has(ctx.path)) throw new APIError("NOT_FOUND", { message: "Not found." });

    if (ctx.path === "/sign-in/email") {
      const email = emailOf(ctx.body);
      const wait = email ? await accountWaitSeconds(email) : 0;
      if (wait > 0) {
        throw new APIError(
          "TOO_MANY_REQUESTS",
          { message: `Too many failed sign-ins for this e-mail; try again in ${wait} s.`, code: "ACCOUNT_WAIT" },
          { "retry-after": String(wait) },
        );
      }
    }

    if (TEAM_READS.has(ctx.path)) {
      const session = await getSessionFromCtx(ctx);
      if (!session) throw new APIError("UNAUTHORIZED");
      const shopId = await shopIdFor(ctx.query, (session.session as { activeOrganizationId?: unknown }).activeOrganizationId);
      const role = shopId ? await roleIn(shopId, session.user.id) : null;
      if (!role || !can(role, "team:read")) throw new APIError("FORBIDDEN", { message: "Only the shop's manager sees its members." });
    }
  }),

  after: createAuthMiddleware(async (ctx) => {
    if (ctx.path !== "/sign-in/email") return;
    const email = emailOf(ctx.body);
    if (!email) return;
    const returned = ctx.context.returned as { statusCode?: unknown } | undefined;
    const status = returned && typeof returned === "object" && "statusCode" in returned ? returned.statusCode : 200;
    if (status === 401) await recordSignInFailure(email, env.AUTH_ACCOUNT_FAILURE_LIMIT);
    else if (status === 200) await clearSignInFailures(email);
  }),
};

/**
 * The organization plugin's own hooks: whoever calls it (our server code, or an endpoint opened
 * later), a shop gets a valid slug and its settings row, a manager is only ever a shop's founder,
 * and roles move only between estimator and customer (lib/auth/permissions.ts ASSIGNABLE_ROLES).
 */
export const organizationHooks = {
  async beforeCreateOrganization({ organization }: { organization: { name?: string; slug?: string } }) {
    const problem = slugProblem(organization.slug ?? "");
    if (problem) throw new APIError("BAD_REQUEST", { message: problem, code: "INVALID_SLUG" });
    const name = (organization.name ?? "").trim();
    if (name.length < 2 || name.length > 80 || name.includes("\u0000"))
      throw new APIError("BAD_REQUEST", { message: "A shop's name has 2 to 80 characters.", code: "INVALID_NAME" });
  },
  /** No shop without its settings row: the defaults, in euros until the opener picks a currency. */
  async afterCreateOrganization({ organization }: { organization: { id: string } }) {
    await createShopSettings(organization.id, "EUR");
  },
  async beforeUpdateOrganization({ organization }: { organization: { name?: string; slug?: string } }) {
    if (organization.slug !== undefined) {
      const problem = slugProblem(organization.slug);
      if (problem) throw new APIError("BAD_REQUEST", { message: problem, code: "INVALID_SLUG" });
    }
  },
  /** The founder joins as manager when the shop is created; everyone after that as customer or estimator. */
  async beforeAddMember({ member }: { member: { organizationId: string; role: string } }) {
    if (assignable(member.role)) return;
    if (member.role === "manager") {
      if ((await countMembers(member.organizationId)) === 0) return;
    }
    throw new APIError("FORBIDDEN", { message: "A member joins as customer or estimator.", code: "ROLE_NOT_ASSIGNABLE" });
  },
  async beforeUpdateMemberRole({ member, newRole }: { member: { role: string }; newRole: string }) {
    if (!assignable(member.role) || !assignable(newRole)) {
      throw new APIError("FORBIDDEN", { message: "Roles move only between estimator and customer.", code: "ROLE_NOT_ASSIGNABLE" });
    }
  },
  async beforeRemoveMember({ member }: { member: { role: string } }) {
    if (!assignable(member.role)) throw new APIError("FORBIDDEN", { message: "A manager is not removed from here.", code: "MANAGER_NOT_REMOVABLE" });
  },
  async beforeCreateInvitation(): Promise<void> {
    throw new APIError("FORBIDDEN", { message: "Shops do not invite by e-mail; customers join from the storefront.", code: "INVITATIONS_CLOSED" });
  },
};
