import "server-only";
import type Stripe from "stripe";
import { knownStripeEventIds } from "@/db/queries/payments";
import { HANDLED_EVENT_TYPES, handleStripeEvent } from "./events";
import { stripe } from "./stripe";

/** How far back the job looks (the payment service keeps events for 30 days; three are plenty between runs). */
export const RECONCILE_LOOKBACK_SECONDS = 3 * 24 * 3600;
/** Most events one run reads: a bound on a run, not on the shop (the next run carries on). */
export const RECONCILE_MAX_EVENTS = 2000;

export interface ReconcileReport {
  /** events of the handled types the service listed */
  listed: number;
  /** of those, handled now (the webhook had missed them) */
  handled: number;
  /** handled now but already handled meanwhile (a webhook got there first) */
  duplicates: number;
  /** could not be handled now; the next run tries again */
  failed: number;
}

/**
 * Lists the payment service's recent events of the types the app handles and handles every one it
 * has not recorded, oldest first (so a payment's completion comes before its refunds): what the
 * webhook missed while the app was down, or what the service gave up delivering. Handling is the
 * webhook's own, once per event id, so running this at any time, or twice at once, is harmless.
 */
export async function reconcileStripeEvents({ now = new Date(), lookbackSeconds = RECONCILE_LOOKBACK_SECONDS, maxEvents = RECONCILE_MAX_EVENTS } = {}) {
  const since = Math.floor(now.getTime() / 1000) - lookbackSeconds;
  const events: Stripe.Event[] = [];
  for await (const event of stripe().events.list({ types: [...HANDLED_EVENT_TYPES], created: { gte: since }, limit: 100 })) {
    events.push(event);
    if (events.length >= maxEvents) break;
  }
  const known = await knownStripeEventIds(events.map((e) => e.id));
  const missed = events.filter((e) => !known.has(e.id)).sort((a, b) => a.created - b.created);
  const report: ReconcileReport = { listed: events.length, handled: 0, duplicates: 0, failed: 0 };
  for (const event of missed) {
    try {
      const r = await handleStripeEvent(event, "reconciliation");
      if (r.duplicate) report.duplicates += 1;
      else report.handled += 1;
    } catch (error) {
      report.failed += 1;
      console.error(`[payments] reconciliation could not handle ${event.type} ${event.id}:`, error instanceof Error ? error.message : error);
    }
  }
  return report;
}
