// Webhook delivery of the local Stripe stand-in. Outside checks: every delivery is verified with
// the pinned official SDK's `stripe.webhooks.constructEvent` (the app's own check) and every
// payload validated against Stripe's published description (event schema and the schema of the
// event's object). Retries, duplicates and reordering are driven through the `/_standin/…`
// control endpoints the app's tests will use.
import Stripe from "stripe";
import { afterEach, describe, expect, it } from "vitest";
import { env } from "@/lib/env";
import type { Standin } from "@/dev/stripe-standin/server";
import type { DeliveryAttempt } from "@/dev/stripe-standin/webhooks";
import { control, eventProblems, pay, sessionParams, settle, startReceiver, useTestStandin } from "./helpers";

let standin: Standin;
let stripe: Stripe;
let receivers: { close(): Promise<void> }[] = [];

async function receiver(...args: Parameters<typeof startReceiver>) {
  const r = await startReceiver(...args);
  receivers.push(r);
  await control(standin, "POST", "/_standin/webhooks", { url: r.url });
  return r;
}

async function deliveries(eventId?: string): Promise<DeliveryAttempt[]> {
  const q = eventId ? `?wait=1&event=${eventId}` : "?wait=1";
  const r = await control<{ settled: boolean; deliveries: DeliveryAttempt[] }>(standin, "GET", `/_standin/webhooks/deliveries${q}`);
  expect(r.body.settled).toBe(true);
  return r.body.deliveries;
}

async function paidSession() {
  const s = await stripe.checkout.sessions.create(sessionParams());
  await pay(standin, s.id, "success");
  return stripe.checkout.sessions.retrieve(s.id);
}

/** A port with nothing listening: the app is down. */
const DOWN = "http://127.0.0.1:9/api/webhooks/stripe";

useTestStandin((s, sdk) => {
  standin = s;
  stripe = sdk;
});
afterEach(async () => {
  await control(standin, "POST", "/_standin/reset");
  await Promise.all(receivers.map((r) => r.close()));
  receivers = [];
});

describe("signed delivery", () => {
  it("posts each event signed as Stripe signs, verified by the SDK with the app's secret", async () => {
    const r = await receiver();
    const s = await paidSession();
    await settle(standin);
    expect(r.received.map((x) => x.event.type)).toEqual([
      "payment_intent.created",
      "charge.succeeded",
      "payment_intent.succeeded",
      "checkout.session.completed",
    ]);
    for (const x of r.received) {
      expect(x.headers["content-type"]).toBe("application/json; charset=utf-8");
      expect(x.headers["stripe-signature"]).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
      const verified = stripe.webhooks.constructEvent(x.body, x.headers["stripe-signature"] as string, env.STRIPE_WEBHOOK_SECRET);
      expect(verified.id).toBe(x.event.id);
      expect(eventProblems(JSON.parse(x.body))).toEqual([]);
    }
    const completed = r.received[3]?.event as Stripe.CheckoutSessionCompletedEvent;
    expect(completed.data.object).toMatchObject({ id: s.id, status: "complete", payment_status: "paid", client_reference_id: "revision-7" });
    // The API's copy of the event is the one delivered, now with nothing pending.
    const listed = await stripe.events.retrieve(completed.id);
    expect(listed.pending_webhooks).toBe(0);
    expect(listed.data.object).toEqual(completed.data.object);
  });

  it("does not verify with another secret or a changed body", async () => {
    const r = await receiver();
    await paidSession();
    await settle(standin);
    const x = r.received[0];
    if (!x) throw new Error("nothing delivered");
    const header = x.headers["stripe-signature"] as string;
    expect(() => stripe.webhooks.constructEvent(x.body, header, "whsec_someone_else")).toThrow(Stripe.errors.StripeSignatureVerificationError);
    expect(() => stripe.webhooks.constructEvent(x.body.replace('"livemode": false', '"livemode": true'), header, env.STRIPE_WEBHOOK_SECRET)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
  });

  it("delivers an expiry caused by the API with its request id and idempotency key", async () => {
    const r = await receiver();
    const s = await stripe.checkout.sessions.create(sessionParams());
    const expired = await stripe.checkout.sessions.expire(s.id, {}, { idempotencyKey: "expire-7" });
    await settle(standin);
    expect(r.received.map((x) => x.event.type)).toEqual(["checkout.session.expired"]);
    expect(r.received[0]?.event.request).toEqual({ id: expired.lastResponse.requestId, idempotency_key: "expire-7" });
  });

  it("sends nothing for a declined card but the failure events", async () => {
    const r = await receiver();
    const s = await stripe.checkout.sessions.create(sessionParams());
    await pay(standin, s.id, "decline");
    await settle(standin);
    expect(r.received.map((x) => x.event.type)).toEqual(["payment_intent.created", "charge.failed", "payment_intent.payment_failed"]);
  });
});

describe("retries with back-off", () => {
  it("retries a non-2xx answer until the endpoint takes the event", async () => {
    const r = await receiver([500, 503]);
    const s = await stripe.checkout.sessions.create(sessionParams());
    await stripe.checkout.sessions.expire(s.id);
    const [event] = (await stripe.events.list()).data;
    const log = await deliveries(event?.id);
    expect(log.map((d) => [d.attempt, d.status, d.outcome])).toEqual([
      [1, 500, "retrying"],
      [2, 503, "retrying"],
      [3, 200, "delivered"],
    ]);
    expect(r.received.map((x) => x.event.id)).toEqual([event?.id, event?.id, event?.id]);
    // Each attempt is signed afresh and verifies.
    for (const x of r.received) stripe.webhooks.constructEvent(x.body, x.headers["stripe-signature"] as string, env.STRIPE_WEBHOOK_SECRET);
    expect((await stripe.events.retrieve(event?.id as string)).pending_webhooks).toBe(0);
  });

  it("counts an endpoint that does not answer in time as a failure and retries it", async () => {
    await control(standin, "POST", "/_standin/webhooks", { retry: { timeoutMs: 200 } });
    await receiver(["hang"], 1_000);
    const s = await stripe.checkout.sessions.create(sessionParams());
    await stripe.checkout.sessions.expire(s.id);
    const log = await deliveries();
    expect(log[0]).toMatchObject({ attempt: 1, status: null, outcome: "retrying" });
    expect(log[0]?.error).toContain("no answer within 200 ms");
    expect(log.at(-1)).toMatchObject({ outcome: "delivered", status: 200 });
  });

  it("delivers by a retry once the app is back (the endpoint moved while events waited)", async () => {
    await control(standin, "POST", "/_standin/webhooks", { url: DOWN, retry: { initialDelayMs: 200, maxAttempts: 6 } });
    await paidSession();
    // Wait (bounded) until the first attempt has failed against the closed port.
    let first: DeliveryAttempt[] = [];
    for (let i = 0; i < 200 && first.length === 0; i++) {
      first = (await control<{ deliveries: DeliveryAttempt[] }>(standin, "GET", "/_standin/webhooks/deliveries")).body.deliveries;
      if (first.length === 0) await new Promise((resolve) => setTimeout(resolve, 10));
    }
    expect(first.length).toBeGreaterThan(0);
    const r = await startReceiver();
    receivers.push(r);
    await control(standin, "POST", "/_standin/webhooks", { url: r.url });
    await settle(standin);
    expect(first.every((d) => d.outcome === "retrying" && d.status === null && d.error !== null)).toBe(true);
    expect(new Set(r.received.map((x) => x.event.type))).toEqual(
      new Set(["payment_intent.created", "charge.succeeded", "payment_intent.succeeded", "checkout.session.completed"]),
    );
  });

  it("gives up after the last attempt; the events list still shows the failed delivery", async () => {
    await control(standin, "POST", "/_standin/webhooks", { retry: { maxAttempts: 3 } });
    await receiver([500, 500, 500]);
    const s = await stripe.checkout.sessions.create(sessionParams());
    await stripe.checkout.sessions.expire(s.id);
    const log = await deliveries();
    expect(log.map((d) => d.outcome)).toEqual(["retrying", "retrying", "gave_up"]);
    const failed = await stripe.events.list({ delivery_success: false });
    expect(failed.data.map((e) => e.type)).toEqual(["checkout.session.expired"]);
    expect(failed.data[0]?.pending_webhooks).toBe(1);
    expect((await stripe.events.list({ delivery_success: true })).data).toHaveLength(0);
  });
});

describe("test switches: duplicates and order", () => {
  it("delivers every event several times at once when asked", async () => {
    await control(standin, "POST", "/_standin/webhooks", { duplicates: 2 });
    const r = await receiver();
    await paidSession();
    await settle(standin);
    const completed = r.received.filter((x) => x.event.type === "checkout.session.completed");
    expect(completed).toHaveLength(3);
    expect(new Set(completed.map((x) => x.event.id)).size).toBe(1);
    expect(r.received).toHaveLength(12);
  });

  it("reverses the events of one change", async () => {
    await control(standin, "POST", "/_standin/webhooks", { order: "reverse" });
    const r = await receiver();
    await paidSession();
    await settle(standin);
    expect(r.received.map((x) => x.event.type)).toEqual([
      "checkout.session.completed",
      "payment_intent.succeeded",
      "charge.succeeded",
      "payment_intent.created",
    ]);
  });

  it("holds events and flushes them in reverse: the refund arrives before the payment it refunds", async () => {
    const r = await receiver();
    await control(standin, "POST", "/_standin/webhooks", { hold: true });
    const s = await paidSession();
    await stripe.refunds.create({ payment_intent: s.payment_intent as string, amount: 1000 });
    const held = await control<{ held: number; pending: number }>(standin, "GET", "/_standin/webhooks");
    expect(held.body).toMatchObject({ held: 6, pending: 0 });
    expect(r.received).toHaveLength(0);
    const flushed = await control<{ flushed: number }>(standin, "POST", "/_standin/webhooks/flush", { order: "reverse" });
    expect(flushed.body.flushed).toBe(6);
    await settle(standin);
    const types = r.received.map((x) => x.event.type);
    expect(types).toEqual([
      "refund.created",
      "charge.refunded",
      "checkout.session.completed",
      "payment_intent.succeeded",
      "charge.succeeded",
      "payment_intent.created",
    ]);
  });

  it("turning hold off sends what was held, in order", async () => {
    const r = await receiver();
    await control(standin, "POST", "/_standin/webhooks", { hold: true });
    const s = await stripe.checkout.sessions.create(sessionParams());
    await stripe.checkout.sessions.expire(s.id);
    await control(standin, "POST", "/_standin/webhooks", { hold: false });
    await settle(standin);
    expect(r.received.map((x) => x.event.type)).toEqual(["checkout.session.expired"]);
  });
});

describe("control endpoints", () => {
  it("refuses settings outside their bounds and unknown ones", async () => {
    for (const body of [{ duplicates: 50 }, { retry: { maxAttempts: 0 } }, { url: "ftp://127.0.0.1/x" }, { order: "sideways" }, { colour: "red" }]) {
      const r = await control<{ error: { message: string } }>(standin, "POST", "/_standin/webhooks", body);
      expect(r.status).toBe(400);
      expect(r.body.error.message.length).toBeGreaterThan(0);
    }
    const pay400 = await control(standin, "POST", "/_standin/checkout/sessions/cs_test_x/pay", { card: "gold" });
    expect(pay400.status).toBe(400);
    const unknown = await pay(standin, "cs_test_missing", "success");
    expect(unknown.status).toBe(404);
  });

  it("reset forgets objects, events, keys and webhook settings", async () => {
    await control(standin, "POST", "/_standin/webhooks", { url: DOWN, duplicates: 1 });
    const s = await stripe.checkout.sessions.create(sessionParams(), { idempotencyKey: "before-reset" });
    await stripe.checkout.sessions.expire(s.id);
    const reset = await control<{ webhooks: { url: string | null; duplicates: number; pending: number } }>(standin, "POST", "/_standin/reset");
    expect(reset.body.webhooks).toMatchObject({ url: null, duplicates: 0, pending: 0 });
    expect((await stripe.events.list()).data).toHaveLength(0);
    await expect(stripe.checkout.sessions.retrieve(s.id)).rejects.toMatchObject({ statusCode: 404 });
    const again = await stripe.checkout.sessions.create(sessionParams({ client_reference_id: "after" }), { idempotencyKey: "before-reset" });
    expect(again.client_reference_id).toBe("after");
  });

  it("sends no webhook while no endpoint is set, and says so in pending_webhooks", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    await stripe.checkout.sessions.expire(s.id);
    const [event] = (await stripe.events.list()).data;
    expect(event?.pending_webhooks).toBe(0);
    expect((await control<{ deliveries: unknown[] }>(standin, "GET", "/_standin/webhooks/deliveries")).body.deliveries).toHaveLength(0);
  });
});
