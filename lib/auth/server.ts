import "server-only";
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { nextCookies } from "better-auth/next-js";
import { organization } from "better-auth/plugins";
import { db } from "@/db";
import { accounts, invitations, members, sessions, shops, users, verifications } from "@/db/schema";
import { env } from "@/lib/env";
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from "@/lib/validation/limits";
import { ac, roles } from "./access";

export const auth = betterAuth({
  appName: "Faradsmith",
  baseURL: env.BETTER_AUTH_URL,
  secret: env.BETTER_AUTH_SECRET,
  trustedOrigins: [env.BETTER_AUTH_URL, env.APP_URL],
  database: drizzleAdapter(db, {
    provider: "pg",
    schema: { users, sessions, accounts, verifications, shops, members, invitations },
  }),
  user: { modelName: "users" },
  session: { modelName: "sessions", fields: {} },
  account: { modelName: "accounts" },
  verification: { modelName: "verifications" },
  emailAndPassword: { enabled: true, minPasswordLength: PASSWORD_MIN_LENGTH, maxPasswordLength: PASSWORD_MAX_LENGTH, autoSignIn: true },
  rateLimit: {
    enabled: env.NODE_ENV === "production",
    window: 10,
    max: env.AUTH_RATE_LIMIT_MAX,
    // better-auth's own default for these paths is 3 per 10 s per client; test runs raise it
    customRules: {
      "/sign-in/*": { window: 10, max: env.AUTH_SIGN_IN_LIMIT },
      "/sign-up/*": { window: 10, max: env.AUTH_SIGN_IN_LIMIT },
    },
  },
  plugins: [
    organization({
      ac,
      roles,
      creatorRole: "manager",
      allowUserToCreateOrganization: true,
      schema: {
        organization: { modelName: "shops" },
        member: { modelName: "members", fields: { organizationId: "shopId" } },
        invitation: { modelName: "invitations", fields: { organizationId: "shopId" } },
        session: { fields: { activeOrganizationId: "activeShopId" } },
      },
    }),
    nextCookies(),
  ],
});

export type Session = typeof auth.$Infer.Session;
