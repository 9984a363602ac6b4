/**
 * Starts the local Stripe stand-in where the app will call it: on the loopback host and port of
 * STRIPE_API_BASE, accepting STRIPE_SECRET_KEY and signing webhooks with STRIPE_WEBHOOK_SECRET
 * (the same variables and defaults as the app, from lib/env.ts). Its own settings:
 *   STANDIN_WEBHOOK_URL            where webhooks go at start (the app's /api/webhooks/stripe); none if unset
 *   STANDIN_WEBHOOK_MAX_ATTEMPTS   attempts per event (default 8)
 *   STANDIN_WEBHOOK_RETRY_MS       delay before the first retry, doubling each time (default 1000)
 *   STANDIN_WEBHOOK_RETRY_MAX_MS   longest delay between retries (default 120000)
 *   STANDIN_WEBHOOK_TIMEOUT_MS     an attempt without an answer after this long has failed (default 10000)
 * Run by scripts/services.mjs for `npm start` and `npm test`; by hand: `npx tsx dev/stripe-standin/main.ts`.
 */
import { z } from "zod";
import { env } from "../../lib/env";
import { DEFAULT_RETRY, startStandin } from "./server";
import { WEBHOOK_LIMITS } from "./webhooks";

const bounded = (limits: { min: number; max: number }) => z.coerce.number().int().min(limits.min).max(limits.max).optional();
const settings = z
  .object({
    STANDIN_WEBHOOK_URL: z
      .string()
      .url()
      .refine((u) => /^https?:\/\//.test(u), "must be an http(s) URL")
      .optional()
      .or(z.literal("").transform(() => undefined)),
    STANDIN_WEBHOOK_MAX_ATTEMPTS: bounded(WEBHOOK_LIMITS.maxAttempts),
    STANDIN_WEBHOOK_RETRY_MS: bounded(WEBHOOK_LIMITS.initialDelayMs),
    STANDIN_WEBHOOK_RETRY_MAX_MS: bounded(WEBHOOK_LIMITS.maxDelayMs),
    STANDIN_WEBHOOK_TIMEOUT_MS: bounded(WEBHOOK_LIMITS.timeoutMs),
  })
  .safeParse(process.env);

function fail(message: string): never {
  process.stderr.write(`[stripe-standin] ${message}\n`);
  process.exit(1);
}

if (!settings.success) fail(`invalid settings: ${settings.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
const s = settings.data;
const base = new URL(env.STRIPE_API_BASE);
if (base.protocol !== "http:" || !["127.0.0.1", "localhost", "[::1]"].includes(base.hostname)) {
  fail(`STRIPE_API_BASE=${env.STRIPE_API_BASE} is not a loopback http address; the stand-in runs only on this machine`);
}
if (!env.STRIPE_SECRET_KEY.startsWith("sk_test_")) fail("STRIPE_SECRET_KEY is not a test key (sk_test_…); the stand-in never takes live keys");

const standin = await startStandin({
  host: base.hostname === "[::1]" ? "::1" : "127.0.0.1",
  port: Number(base.port || 80),
  secretKey: env.STRIPE_SECRET_KEY,
  webhookSecret: env.STRIPE_WEBHOOK_SECRET,
  webhook: {
    url: s.STANDIN_WEBHOOK_URL ?? null,
    retry: {
      maxAttempts: s.STANDIN_WEBHOOK_MAX_ATTEMPTS ?? DEFAULT_RETRY.maxAttempts,
      initialDelayMs: s.STANDIN_WEBHOOK_RETRY_MS ?? DEFAULT_RETRY.initialDelayMs,
      maxDelayMs: s.STANDIN_WEBHOOK_RETRY_MAX_MS ?? DEFAULT_RETRY.maxDelayMs,
      timeoutMs: s.STANDIN_WEBHOOK_TIMEOUT_MS ?? DEFAULT_RETRY.timeoutMs,
    },
  },
  log: (line) => process.stderr.write(`[stripe-standin] ${line}\n`),
}).catch((e: unknown) => fail(`could not start: ${e instanceof Error ? e.message : String(e)}`));

process.stdout.write(`[stripe-standin] Stripe API stand-in on ${standin.url}; webhooks to ${s.STANDIN_WEBHOOK_URL ?? "(none until set)"}\n`);

let closing = false;
for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.on(signal, () => {
    if (closing) return;
    closing = true;
    void standin.close().then(() => process.exit(0));
  });
}
