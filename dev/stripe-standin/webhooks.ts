/**
 * Webhook delivery as Stripe does it: each event POSTed as JSON to the endpoint with
 * `Stripe-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256(secret, "<t>.<payload>")>`, signed
 * afresh on every attempt; a non-2xx answer, a redirect, a refused connection or a timeout is a
 * failure, retried with exponential back-off (bounded attempts, delays capped).
 *
 * Test switches: `duplicates` sends every event that many extra times at once; `order`
 * ("reverse" or "shuffle") reorders the events of one change; `hold` keeps events back until
 * `flush`, which can deliver everything held in reverse or shuffled order (a refund before the
 * payment that it refunds).
 */
import { createHmac } from "node:crypto";
import type { EventRecord, JsonObject } from "./objects";

export interface RetryPolicy {
  /** Attempts per event and copy, the first included. */
  maxAttempts: number;
  /** Delay before the second attempt; each later delay doubles, up to maxDelayMs. */
  initialDelayMs: number;
  maxDelayMs: number;
  /** An attempt without an answer after this long has failed. */
  timeoutMs: number;
}

export type DeliveryOrder = "created" | "reverse" | "shuffle";

export interface WebhookConfig {
  url: string | null;
  hold: boolean;
  duplicates: number;
  order: DeliveryOrder;
  retry: RetryPolicy;
}

export interface DeliveryAttempt {
  eventId: string;
  type: string;
  /** 0 for the event itself, 1… for the duplicates the test switch adds. */
  copy: number;
  attempt: number;
  url: string;
  status: number | null;
  error: string | null;
  outcome: "delivered" | "retrying" | "gave_up";
  /** Milliseconds since 1970, when the attempt ended. */
  at: number;
}

/** Bounds for the control endpoint (a test cannot make the stand-in spin or wait for hours). */
export const WEBHOOK_LIMITS = {
  duplicates: { min: 0, max: 5 },
  maxAttempts: { min: 1, max: 20 },
  initialDelayMs: { min: 1, max: 3_600_000 },
  maxDelayMs: { min: 1, max: 86_400_000 },
  timeoutMs: { min: 50, max: 60_000 },
} as const;

const MAX_LOG = 2_000;

/** The `Stripe-Signature` header for a payload at a given time. */
export function signatureHeader(payload: string, secret: string, timestampS: number): string {
  const v1 = createHmac("sha256", secret).update(`${timestampS}.${payload}`, "utf8").digest("hex");
  return `t=${timestampS},v1=${v1}`;
}

export function retryDelayMs(policy: RetryPolicy, failedAttempt: number): number {
  return Math.min(policy.initialDelayMs * 2 ** (failedAttempt - 1), policy.maxDelayMs);
}

export function ordered<T>(items: readonly T[], order: DeliveryOrder): T[] {
  const out = [...items];
  if (order === "reverse") out.reverse();
  if (order === "shuffle") {
    for (let i = out.length - 1; i > 0; i--) {
      const j = Math.floor(Math.random() * (i + 1));
      [out[i], out[j]] = [out[j] as T, out[i] as T];
    }
  }
  return out;
}

export class WebhookDispatcher {
  config: WebhookConfig;
  readonly log: DeliveryAttempt[] = [];
  private held: EventRecord[] = [];
  private pending = 0;
  private generation = 0;
  private chain: Promise<unknown> = Promise.resolve();
  private readonly timers = new Set<NodeJS.Timeout>();
  private readonly inFlight = new Set<AbortController>();
  private waiters: (() => void)[] = [];

  constructor(
    private readonly secret: string,
    private readonly initial: WebhookConfig,
    /** The event's JSON at the moment of sending (its pending_webhooks then). */
    private readonly toJson: (event: EventRecord) => JsonObject,
  ) {
    this.config = structuredClone(initial);
  }

  get counts(): { pending: number; held: number } {
    return { pending: this.pending, held: this.held.length };
  }

  /** Hands over the events of one change: delivered now, or held while `hold` is on. */
  enqueue(events: readonly EventRecord[]): void {
    if (events.length === 0) return;
    if (!this.config.url) {
      for (const e of events) e.pendingWebhooks = 0;
      return;
    }
    if (this.config.hold) {
      this.held.push(...events);
      return;
    }
    this.deliver(ordered(events, this.config.order));
  }

  /** Delivers everything held, in creation order or as asked; returns how many events. */
  flush(order: DeliveryOrder = this.config.order): number {
    const events = this.held;
    this.held = [];
    if (events.length > 0) this.deliver(ordered(events, order));
    return events.length;
  }

  /** Resolves once nothing is waiting to be sent or retried (held events do not count), or at the limit. */
  idle(limitMs: number): Promise<boolean> {
    if (this.pending === 0) return Promise.resolve(true);
    return new Promise((resolve) => {
      const timer = setTimeout(() => {
        this.waiters = this.waiters.filter((w) => w !== done);
        resolve(false);
      }, limitMs);
      const done = () => {
        clearTimeout(timer);
        resolve(true);
      };
      this.waiters.push(done);
    });
  }

  /** Forgets held events, pending retries and the log; goes back to the configuration at start. */
  reset(): void {
    this.stop();
    this.config = structuredClone(this.initial);
    this.log.length = 0;
  }

  /** Cancels every timer and request in flight. */
  stop(): void {
    this.generation += 1;
    for (const t of this.timers) clearTimeout(t);
    this.timers.clear();
    for (const c of this.inFlight) c.abort();
    this.inFlight.clear();
    this.held = [];
    this.pending = 0;
    this.chain = Promise.resolve();
    this.wake();
  }

  private wake(): void {
    if (this.pending !== 0) return;
    const waiters = this.waiters;
    this.waiters = [];
    for (const w of waiters) w();
  }

  /**
   * First attempts go out one event after another (each event's copies at once), so that in the
   * plain configuration the endpoint sees events in the order they happened; retries run on
   * their own timers and do not hold up later events.
   */
  private deliver(events: readonly EventRecord[]): void {
    const generation = this.generation;
    const copies = this.config.duplicates;
    this.pending += events.length * (copies + 1);
    for (const event of events) {
      this.chain = this.chain
        .then(() => Promise.all(Array.from({ length: copies + 1 }, (_, copy) => this.attempt(event, copy, 1, generation))))
        .catch(() => undefined); // one broken attempt must not stop the events after it
    }
  }

  private async attempt(event: EventRecord, copy: number, n: number, generation: number): Promise<void> {
    if (generation !== this.generation) return;
    const url = this.config.url;
    const { retry } = this.config;
    let status: number | null = null;
    let error: string | null = null;
    if (!url) {
      error = "no webhook endpoint configured";
    } else {
      const payload = JSON.stringify(this.toJson(event), null, 2);
      const controller = new AbortController();
      this.inFlight.add(controller);
      const timeout = setTimeout(() => controller.abort(new Error(`no answer within ${retry.timeoutMs} ms`)), retry.timeoutMs);
      try {
        const res = await fetch(url, {
          method: "POST",
          redirect: "manual",
          signal: controller.signal,
          headers: {
            "content-type": "application/json; charset=utf-8",
            "user-agent": "Stripe/1.0 (+https://stripe.com/docs/webhooks)",
            "cache-control": "no-cache",
            "stripe-signature": signatureHeader(payload, this.secret, Math.floor(Date.now() / 1000)),
          },
          body: payload,
        });
        status = res.status;
        await res.body?.cancel().catch(() => undefined);
      } catch (e) {
        const reason = controller.signal.aborted ? controller.signal.reason : e;
        error = reason instanceof Error ? (reason.cause instanceof Error ? `${reason.message}: ${reason.cause.message}` : reason.message) : String(reason);
      } finally {
        clearTimeout(timeout);
        this.inFlight.delete(controller);
      }
    }
    if (generation !== this.generation) return;
    const delivered = status !== null && status >= 200 && status < 300;
    const outcome = delivered ? "delivered" : n < retry.maxAttempts ? "retrying" : "gave_up";
    this.log.push({ eventId: event.id, type: event.type, copy, attempt: n, url: url ?? "", status, error, outcome, at: Date.now() });
    if (this.log.length > MAX_LOG) this.log.splice(0, this.log.length - MAX_LOG);
    if (outcome === "retrying") {
      const timer = setTimeout(
        () => {
          this.timers.delete(timer);
          void this.attempt(event, copy, n + 1, generation);
        },
        retryDelayMs(retry, n),
      );
      this.timers.add(timer);
      return;
    }
    if (delivered) event.pendingWebhooks = 0;
    this.pending -= 1;
    this.wake();
  }
}
