import "server-only";
import { env } from "@/lib/env";
import { clientAddress } from "./client-address";
import { jsonError } from "./json-error";
import { createRateLimiter, type RateDecision } from "./rate-limit";
import { postgresRateLimitStore } from "@/db/queries/rate-limits";

/**
 * The client address our own limits key on (see lib/http/client-address.ts and DEVELOPERS.md,
 * "Security model"); null when it cannot be trusted, which counts in one shared bucket.
 */
export function requestClient(headers: Headers): string | null {
  return clientAddress(headers, { trustedProxies: env.TRUSTED_PROXIES, peerAppended: env.PEER_ADDRESS_APPENDED });
}

const store = postgresRateLimitStore;

/** Every limit of our own, in one place; the counts live in PostgreSQL, shared by all app servers. */
export const limits = {
  /** the public arrangements endpoint (POST /api/v1/shops/{shop}/arrangements) */
  publicApi: createRateLimiter({ name: "api", limit: env.API_RATE_LIMIT_PER_MINUTE, windowSeconds: 60, store }),
  /** the engine's public network endpoints (evaluate, failures, tolerance): one budget per client */
  engine: createRateLimiter({ name: "engine", limit: env.API_RATE_LIMIT_PER_MINUTE, windowSeconds: 60, store }),
  /** the storefront's search action: the same budget as the endpoint, counted apart */
  storefrontSearch: createRateLimiter({ name: "search", limit: env.API_RATE_LIMIT_PER_MINUTE, windowSeconds: 60, store }),
  /** attachment uploads per person (any shop), keyed by user id */
  uploadsPerUser: createRateLimiter({ name: "upload-user", limit: env.UPLOAD_RATE_PER_USER, windowSeconds: 600, store }),
  /** attachment uploads per shop (all its people together), keyed by shop id */
  uploadsPerShop: createRateLimiter({ name: "upload-shop", limit: env.UPLOAD_RATE_PER_SHOP, windowSeconds: 3600, store }),
  /** each shop API key (Authorization: Bearer …), counted by key wherever it calls from */
  apiKey: createRateLimiter({ name: "api-key", limit: env.API_KEY_RATE_LIMIT_PER_MINUTE, windowSeconds: 60, store }),
  /** new accounts (open a shop, join a shop): as many per address as sign-in attempts */
  signUp: createRateLimiter({ name: "sign-up", limit: env.AUTH_SIGN_IN_LIMIT, windowSeconds: 10, store }),
  /** messages in quote threads, per person (each is e-mailed): a conversation's pace, not a flood */
  quoteMessages: createRateLimiter({ name: "quote-message", limit: 30, windowSeconds: 600, store }),
  /** quotes made through the quote API (each runs a priced search), per client */
  quoteApi: createRateLimiter({ name: "quote-api", limit: env.API_RATE_LIMIT_PER_MINUTE, windowSeconds: 60, store }),
};

/** 429 with Retry-After, for route handlers. */
export function tooManyRequests(decision: Extract<RateDecision, { allowed: false }>): Response {
  return jsonError(429, `Too many requests; try again in ${decision.retryAfterSeconds} s.`, undefined, {
    headers: { "retry-after": String(decision.retryAfterSeconds) },
  });
}
