import "server-only";
import Stripe from "stripe";
import { env } from "@/lib/env";

/**
 * The app's one Stripe client: the official SDK with the key and address from the environment
 * (`new Stripe(env.STRIPE_SECRET_KEY, { ...env.STRIPE_API })`). Locally that is the stand-in
 * (dev/stripe-standin); for the real service only STRIPE_API_BASE, STRIPE_SECRET_KEY and
 * STRIPE_WEBHOOK_SECRET change (README, "Payments").
 */

type Address = { host: string; port: number; protocol: "http" | "https" };

const state = globalThis as unknown as { faradsmithStripe?: Stripe; faradsmithStripeAddress?: Address };

export function stripe(): Stripe {
  state.faradsmithStripe ??= new Stripe(env.STRIPE_SECRET_KEY, { ...env.STRIPE_API, ...state.faradsmithStripeAddress });
  return state.faradsmithStripe;
}

/** Points this process's client at another address (tests run a stand-in of their own). */
export function configureStripe(address: Address): void {
  state.faradsmithStripeAddress = address;
  state.faradsmithStripe = undefined;
}

/** How far a webhook's signature time may be from ours (Stripe's default, 300 s). */
export const WEBHOOK_TOLERANCE_SECONDS = 300;

/**
 * Verifies a webhook's raw body against its `Stripe-Signature` header with the endpoint's secret:
 * the event, or the SDK's reason for refusing it (bad signature, or a time outside the tolerance).
 */
export function verifyWebhook(rawBody: Buffer | string, signature: string | null): { ok: true; event: Stripe.Event } | { ok: false; reason: string } {
  if (!signature) return { ok: false, reason: "No Stripe-Signature header." };
  try {
    return { ok: true, event: stripe().webhooks.constructEvent(rawBody, signature, env.STRIPE_WEBHOOK_SECRET, WEBHOOK_TOLERANCE_SECONDS) };
  } catch (error) {
    return { ok: false, reason: error instanceof Error ? error.message : "The signature does not verify." };
  }
}
