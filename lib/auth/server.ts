import "server-only";
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { nextCookies } from "better-auth/next-js";
import { organization } from "better-auth/plugins";
import { randomBytes } from "node:crypto";
import { ambientDb, currentShopId } from "@/db/tx";
import { accounts, invitations, members, sessions, shops, users, verifications } from "@/db/schema";
import { env } from "@/lib/env";
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from "@/lib/validation/limits";
import { postgresRateLimitStore } from "@/db/queries/rate-limits";
import { ac, roles } from "./access";
import { authHooks, organizationHooks } from "./plugin-rules";

/**
 * The request header better-auth keys its rate limits on. The auth route handler
 * (app/api/auth/[...all]/route.ts) overwrites it with the client address resolved by
 * lib/http/client-address.ts, so a client cannot choose its own bucket.
 */
export const CLIENT_ADDRESS_HEADER = "x-faradsmith-client-address";

/** An id in better-auth's own shape (32 letters and digits), e.g. for a shop about to be opened. */
export function randomId(): string {
  const alphabet = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789";
  // 248 = 4 · 62: bytes at or above it are skipped so every character is equally likely
  let id = "";
  while (id.length < 32) for (const b of randomBytes(48)) if (b < 248 && id.length < 32) id += alphabet[b % 62];
  return id;
}

export const auth = betterAuth({
  appName: "Faradsmith",
  baseURL: env.BETTER_AUTH_URL,
  secret: env.BETTER_AUTH_SECRET,
  trustedOrigins: [env.BETTER_AUTH_URL, env.APP_URL],
  // Inside withShop / withUser the adapter works in that transaction, under its row-level security
  // scope (db/tx.ts ambientDb): members and invitations are tenant tables. A shop created inside
  // withShop(id) takes that id, so its founder's membership is written in its own scope.
  database: drizzleAdapter(ambientDb, {
    provider: "pg",
    schema: { users, sessions, accounts, verifications, shops, members, invitations },
  }),
  user: { modelName: "users" },
  session: { modelName: "sessions", fields: {} },
  account: { modelName: "accounts" },
  verification: { modelName: "verifications" },
  emailAndPassword: { enabled: true, minPasswordLength: PASSWORD_MIN_LENGTH, maxPasswordLength: PASSWORD_MAX_LENGTH, autoSignIn: true },
  rateLimit: {
    // on in every mode; test runs raise the numbers (scripts/test.mjs) rather than turning it off
    enabled: true,
    window: 10,
    max: env.AUTH_RATE_LIMIT_MAX,
    // better-auth's own default for these paths is 3 per 10 s per client; test runs raise it
    customRules: {
      "/sign-in/*": { window: 10, max: env.AUTH_SIGN_IN_LIMIT },
      "/sign-up/*": { window: 10, max: env.AUTH_SIGN_IN_LIMIT },
    },
    // counters in PostgreSQL, shared by every app server (db/queries/rate-limits.ts)
    customStorage: {
      async consume(key, rule) {
        const d = await postgresRateLimitStore.consume(`auth:${key}`, { limit: rule.max, windowSeconds: rule.window });
        return d.allowed ? { allowed: true, retryAfter: null } : { allowed: false, retryAfter: d.retryAfterSeconds };
      },
    },
  },
  advanced: {
    ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
    database: { generateId: ({ model }) => (model === "organization" ? (currentShopId() ?? randomId()) : randomId()) },
  },
  hooks: authHooks,
  plugins: [
    organization({
      ac,
      roles,
      creatorRole: "manager",
      // shops are opened by the open-shop action (a server call on the new account's behalf)
      allowUserToCreateOrganization: false,
      disableOrganizationDeletion: true,
      organizationHooks,
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
