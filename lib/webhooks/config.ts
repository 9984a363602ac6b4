import "server-only";
import { env } from "@/lib/env";
import type { AddressPolicy, Resolver } from "./address-policy";

/** Everything outbound webhook delivery reads: the address policy, the limits and the retry schedule. */
export interface WebhookSettings extends AddressPolicy {
  /** one attempt, from connecting to the end of the answer */
  timeoutMs: number;
  /** the most of an answer read; a longer one is cut off (its status still counts) */
  maxResponseBytes: number;
  /** attempts per delivery, the first included */
  maxAttempts: number;
  /** the wait after the first failed attempt; it doubles after each further one … */
  retryBaseMs: number;
  /** … up to this */
  retryMaxMs: number;
  /** an endpoint whose every attempt has failed for this long is stopped, and its managers told */
  disableAfterMs: number;
  /** how often the dispatcher looks for due deliveries */
  pollIntervalMs: number;
  /** name resolution (tests replace it) */
  resolve?: Resolver;
}

const HOUR = 3_600_000;

// 30 s doubling to a 6 h cap: 20 attempts span about 68 hours (30 s·(2^10 − 1) ≈ 8.5 h, then ten
// waits of 6 h), so a receiver that is down over a weekend still gets every event; an endpoint
// failing for three days is stopped.
const defaults = (): WebhookSettings => ({
  allowLoopback: env.WEBHOOK_ALLOW_LOOPBACK,
  timeoutMs: 10_000,
  maxResponseBytes: 64 * 1024,
  maxAttempts: 20,
  retryBaseMs: 30_000,
  retryMaxMs: 6 * HOUR,
  disableAfterMs: 72 * HOUR,
  pollIntervalMs: 2_000,
});

const state = globalThis as unknown as { faradsmithWebhookOverrides?: Partial<WebhookSettings> };

export function webhookSettings(): WebhookSettings {
  return { ...defaults(), ...state.faradsmithWebhookOverrides };
}

/** Replaces some settings for this process (tests shorten the waits and lower the limits). */
export function configureWebhooks(overrides: Partial<WebhookSettings>): void {
  state.faradsmithWebhookOverrides = { ...state.faradsmithWebhookOverrides, ...overrides };
}

/** The wait before attempt `attempt + 1` after `attempt` failed ones, with up to 10 % jitter. */
export function retryDelayMs(attempt: number, s: Pick<WebhookSettings, "retryBaseMs" | "retryMaxMs">, random = Math.random): number {
  const base = Math.min(s.retryMaxMs, s.retryBaseMs * 2 ** Math.min(30, Math.max(0, attempt - 1)));
  return Math.round(base * (1 + 0.1 * random()));
}
