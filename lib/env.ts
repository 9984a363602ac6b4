import ipaddr from "ipaddr.js";
import { z } from "zod";

/** The development secret: fine on a laptop, refused by a production server (see below). */
export const DEVELOPMENT_AUTH_SECRET = "faradsmith-local-secret-change-me-in-production";
/** The development key for webhook signing secrets at rest: fine on a laptop, refused by a production server. */
export const DEVELOPMENT_WEBHOOK_KEY = "faradsmith-local-webhook-key-change-me-in-production";

/** "10.0.0.0/8, 127.0.0.1 ::1" → ["10.0.0.0/8", "127.0.0.1", "::1"]; each must be an address or a CIDR range. */
const addressList = z
  .string()
  .default("")
  .transform((v) => v.split(/[\s,]+/).filter(Boolean))
  .superRefine((list, ctx) => {
    for (const entry of list) {
      const ok = entry.includes("/") ? ipaddr.isValidCIDR(entry) : ipaddr.isValid(entry);
      if (!ok) ctx.addIssue({ code: "custom", message: `"${entry}" is not an IP address or CIDR range` });
    }
  });

/** The environment, read and validated once. Nothing else reads process.env. */
const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z.string().url().default("postgres://faradsmith@127.0.0.1:54329/faradsmith"),
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  BETTER_AUTH_URL: z.string().url().optional(),
  BETTER_AUTH_SECRET: z.string().min(16).default(DEVELOPMENT_AUTH_SECRET),
  AUTH_RATE_LIMIT_MAX: z.coerce.number().int().positive().default(30),
  /** sign-in and sign-up attempts per client address per 10 s */
  AUTH_SIGN_IN_LIMIT: z.coerce.number().int().positive().default(3),
  /** failed sign-ins for one e-mail address (from anywhere) before it waits; the wait doubles from there */
  AUTH_ACCOUNT_FAILURE_LIMIT: z.coerce.number().int().positive().default(5),
  /**
   * Reverse proxies (addresses or CIDR ranges) whose X-Forwarded-For / X-Real-IP are believed.
   * Empty: the client is the connection's own address. See DEVELOPERS.md, "Security model".
   */
  TRUSTED_PROXIES: addressList,
  /** Set by scripts/serve.mjs, which appends each connection's address to X-Forwarded-For. */
  PEER_ADDRESS_APPENDED: z
    .enum(["true", "false"])
    .default("false")
    .transform((v) => v === "true"),
  API_RATE_LIMIT_PER_MINUTE: z.coerce.number().int().positive().default(120),
  /** requests per minute each shop API key may make (lib/http/limits.ts `apiKey`) */
  API_KEY_RATE_LIMIT_PER_MINUTE: z.coerce.number().int().positive().default(300),
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().positive().default(1025),
  /** production SMTP: TLS from the first byte ("true", port 465) and credentials; none on loopback */
  SMTP_SECURE: z
    .enum(["true", "false"])
    .default("false")
    .transform((v) => v === "true"),
  SMTP_USER: z.string().min(1).optional(),
  SMTP_PASSWORD: z.string().min(1).optional(),
  MAIL_FROM: z.string().default("Faradsmith <quotes@faradsmith.example>"),
  /** "off" keeps the e-mail worker out of this server (another process runs it, or none is wanted) */
  MAIL_WORKER: z.enum(["on", "off"]).default("on"),
  /** "off" keeps the payment reconciliation job out of this server (another process runs it) */
  PAYMENTS_WORKER: z.enum(["on", "off"]).default("on"),
  MAIL_INBOX_URL: z.string().url().default("http://127.0.0.1:1080"),
  UPLOAD_DIR: z.string().default(".data/uploads"),
  /** uploads one person may make per 10 minutes, and a shop's people together per hour */
  UPLOAD_RATE_PER_USER: z.coerce.number().int().positive().default(30),
  UPLOAD_RATE_PER_SHOP: z.coerce.number().int().positive().default(600),
  /** stored attachment bytes one person may hold in a shop, and a shop in all (MB: 1,048,576 bytes) */
  UPLOAD_USER_QUOTA_MB: z.coerce.number().positive().default(500),
  UPLOAD_SHOP_QUOTA_MB: z.coerce.number().positive().default(20_480),
  /**
   * Stripe. The defaults point at the local stand-in (dev/stripe-standin) with its fixed test key
   * and webhook secret, which guard nothing real (the stand-in runs on loopback only). For the
   * real service set STRIPE_API_BASE=https://api.stripe.com and the account's key and secret.
   */
  STRIPE_API_BASE: z
    .string()
    .url()
    .refine((u) => /^https?:\/\//.test(u), "must be an http(s) URL")
    .default("http://127.0.0.1:12111"),
  STRIPE_SECRET_KEY: z
    .string()
    .regex(/^(sk|rk)_(test|live)_[A-Za-z0-9_]+$/, "must be a Stripe secret key (sk_test_…, sk_live_…)")
    .default("sk_test_faradsmith_local_standin_key"),
  STRIPE_WEBHOOK_SECRET: z.string().startsWith("whsec_").default("whsec_faradsmith_local_standin_secret"),
  /**
   * Outbound webhooks. WEBHOOK_SECRET_KEY encrypts the endpoints' signing secrets at rest (at least
   * 32 characters; npm start generates one into .data/webhook-key). WEBHOOK_ALLOW_LOOPBACK lets
   * endpoints on 127.0.0.0/8 and ::1 through (default: yes outside production, no in production);
   * private, link-local and other non-public addresses are refused always. WEBHOOK_WORKER=off keeps
   * the delivery worker out of this server.
   */
  WEBHOOK_SECRET_KEY: z.string().min(32).default(DEVELOPMENT_WEBHOOK_KEY),
  WEBHOOK_ALLOW_LOOPBACK: z.enum(["true", "false"]).optional(),
  WEBHOOK_WORKER: z.enum(["on", "off"]).default("on"),
});

const parsed = schema.safeParse(process.env);
if (!parsed.success) {
  throw new Error(`Invalid environment: ${parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
}

// A production server never signs sessions with the secret everyone can read in this file
// (`npm start` generates one into .data/; see README, "Secrets"). The build itself may load it.
const building = process.env.NEXT_PHASE === "phase-production-build";
if (parsed.data.NODE_ENV === "production" && !building) {
  if (parsed.data.BETTER_AUTH_SECRET === DEVELOPMENT_AUTH_SECRET) {
    throw new Error(
      "Invalid environment: BETTER_AUTH_SECRET is the built-in development secret; a production server needs its own (npm start generates one into .data/auth-secret)",
    );
  }
  if (parsed.data.BETTER_AUTH_SECRET.length < 32) {
    throw new Error("Invalid environment: BETTER_AUTH_SECRET must be at least 32 characters in production");
  }
  if (parsed.data.WEBHOOK_SECRET_KEY === DEVELOPMENT_WEBHOOK_KEY) {
    throw new Error(
      "Invalid environment: WEBHOOK_SECRET_KEY is the built-in development key; a production server needs its own (npm start generates one into .data/webhook-key)",
    );
  }
}

const betterAuthUrl = parsed.data.BETTER_AUTH_URL ?? parsed.data.APP_URL;
const stripeBase = new URL(parsed.data.STRIPE_API_BASE);

export const env = {
  ...parsed.data,
  BETTER_AUTH_URL: betterAuthUrl,
  WEBHOOK_ALLOW_LOOPBACK: parsed.data.WEBHOOK_ALLOW_LOOPBACK ? parsed.data.WEBHOOK_ALLOW_LOOPBACK === "true" : parsed.data.NODE_ENV !== "production",
  /** the origins our pages are served from: writes sent by any other are refused */
  APP_ORIGINS: [...new Set([new URL(parsed.data.APP_URL).origin, new URL(betterAuthUrl).origin])],
  /** STRIPE_API_BASE as the SDK takes it: `new Stripe(key, { ...env.STRIPE_API })`. */
  STRIPE_API: {
    host: stripeBase.hostname,
    port: Number(stripeBase.port || (stripeBase.protocol === "https:" ? 443 : 80)),
    protocol: stripeBase.protocol === "https:" ? ("https" as const) : ("http" as const),
  },
};
export type Env = typeof env;
