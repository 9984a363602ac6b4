import http from "node:http";
import type { AddressInfo } from "node:net";
import Stripe from "stripe";
import { afterAll, beforeAll, beforeEach } from "vitest";
import { env } from "@/lib/env";
import { startStandin, type Standin, type StandinOptions } from "@/dev/stripe-standin/server";
import { StripeOpenApi } from "@/tests/support/stripe-openapi";

/** One compiled copy of Stripe's description per test file (compiling takes about a second). */
let openapi: StripeOpenApi | null = null;
export function stripeSpec(): StripeOpenApi {
  openapi ??= new StripeOpenApi();
  return openapi;
}

/** Every API answer a stand-in sent, as it went on the wire. */
export interface Answer {
  op: string | null;
  status: number;
  body: string;
}

/**
 * Problems of one answer against Stripe's description: the operation's answer schema (the error
 * schema for errors), and for events each `data.object` against the schema of its own type.
 * Empty when it is valid.
 */
export function answerProblems(answer: Answer): string[] {
  const spec = stripeSpec();
  const body = JSON.parse(answer.body) as { object?: string; data?: unknown };
  // An address the API does not have answers with the error schema; any operation's will do.
  const [method, path] = (answer.op ?? "get /v1/events").split(" ") as [string, string];
  const problems: string[] = [];
  const whole = spec.response(method.toUpperCase() as "GET" | "POST", path, answer.status, body);
  if (!whole.ok) problems.push(`${answer.op} ${answer.status}: ${whole.errors}`);
  const events =
    body.object === "event"
      ? [body]
      : body.object === "list" && Array.isArray(body.data)
        ? (body.data as { object?: string }[]).filter((x) => x.object === "event")
        : [];
  for (const e of events) problems.push(...eventProblems(e));
  return problems;
}

/** An event against the event schema, and its `data.object` against the schema of its type. */
export function eventProblems(event: unknown): string[] {
  const spec = stripeSpec();
  const problems: string[] = [];
  const e = spec.object(event as { object?: unknown });
  if (!e.ok) problems.push(`event: ${e.errors}`);
  const inner = (event as { data?: { object?: { object?: unknown } } }).data?.object;
  const o = spec.object(inner ?? {});
  if (!o.ok) problems.push(`${String(inner?.object)} in ${(event as { type?: string }).type}: ${o.errors}`);
  return problems;
}

/**
 * A stand-in of the test's own on a free port, with the app's fixed local key and webhook secret
 * and quick retries (the one `npm test` starts is left to the app's tests).
 */
export function startTestStandin(options: Partial<StandinOptions> = {}): Promise<Standin> {
  return startStandin({
    port: 0,
    secretKey: env.STRIPE_SECRET_KEY,
    webhookSecret: env.STRIPE_WEBHOOK_SECRET,
    ...options,
    webhook: { ...options.webhook, retry: { maxAttempts: 4, initialDelayMs: 20, maxDelayMs: 200, timeoutMs: 2_000, ...options.webhook?.retry } },
  });
}

/**
 * Registers the file's hooks: a stand-in of its own for the whole file (handed over with an SDK
 * client through `onStart`), reset before every test, closed at the end.
 */
export function useTestStandin(onStart: (standin: Standin, stripe: Stripe) => void, options: Partial<StandinOptions> = {}): void {
  let standin: Standin | null = null;
  beforeAll(async () => {
    standin = await startTestStandin(options);
    onStart(standin, sdkFor(standin));
  });
  afterAll(async () => {
    await standin?.close();
  });
  beforeEach(async () => {
    if (standin) await control(standin, "POST", "/_standin/reset");
  });
}

/** The pinned official SDK with its default retries, pointed at a stand-in. */
export function sdkFor(standin: Standin, key = env.STRIPE_SECRET_KEY): Stripe {
  return new Stripe(key, { host: "127.0.0.1", port: standin.port, protocol: "http" });
}

export async function control<T = Record<string, unknown>>(
  standin: Standin,
  method: "GET" | "POST",
  path: string,
  body?: unknown,
): Promise<{ status: number; body: T }> {
  const res = await fetch(`${standin.url}${path}`, {
    method,
    headers: body === undefined ? {} : { "content-type": "application/json" },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  return { status: res.status, body: (await res.json()) as T };
}

export function pay(standin: Standin, sessionId: string, card: "success" | "decline", extra: { email?: string; name?: string } = {}) {
  return control<{ session?: Stripe.Checkout.Session; redirectUrl?: string; error?: { type: string; code: string; decline_code?: string; message: string } }>(
    standin,
    "POST",
    `/_standin/checkout/sessions/${sessionId}/pay`,
    { card, ...extra },
  );
}

/** A typical session: two lines in EUR (2 × €123.45 + 1 × €5.00 = €251.90, 25190 minor units). */
export function sessionParams(overrides: Partial<Stripe.Checkout.SessionCreateParams> = {}): Stripe.Checkout.SessionCreateParams {
  return {
    mode: "payment",
    success_url: "http://127.0.0.1:3999/paid?session={CHECKOUT_SESSION_ID}",
    cancel_url: "http://127.0.0.1:3999/quote",
    client_reference_id: "revision-7",
    customer_email: "buyer@tollmere-tramways.example",
    metadata: { shop: "kestrel-bank-works", quote: "Q-2026-0007" },
    payment_intent_data: { description: "Quote Q-2026-0007", metadata: { quote: "Q-2026-0007" } },
    line_items: [
      { quantity: 2, price_data: { currency: "eur", unit_amount: 12345, product_data: { name: "48 V supercapacitor module", metadata: { line: "1" } } } },
      { quantity: 1, price_data: { currency: "eur", unit_amount: 500, product_data: { name: "Shorting link for shipping" } } },
    ],
    ...overrides,
  };
}

export interface Received {
  headers: http.IncomingHttpHeaders;
  body: string;
  event: Stripe.Event;
}

/**
 * A webhook endpoint for tests: records every POST and answers with the next planned status
 * (200 once the plan runs out); a planned `"hang"` answers only after `hangMs`.
 */
export async function startReceiver(plan: (number | "hang")[] = [], hangMs = 3_000) {
  const received: Received[] = [];
  const waiting: (() => void)[] = [];
  const server = http.createServer((req, res) => {
    let body = "";
    req.setEncoding("utf8");
    req.on("data", (c: string) => (body += c));
    req.on("end", () => {
      const step = plan.shift() ?? 200;
      const answer = () => {
        received.push({ headers: req.headers, body, event: JSON.parse(body) as Stripe.Event });
        for (const w of waiting.splice(0)) w();
        res.writeHead(step === "hang" ? 200 : step);
        res.end();
      };
      if (step === "hang") setTimeout(answer, hangMs);
      else answer();
    });
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/webhooks/stripe`;
  return {
    url,
    received,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

/** Waits until the stand-in has nothing left to send or retry; the limit only bounds a broken run. */
export async function settle(standin: Standin): Promise<void> {
  const ok = await standin.webhooks.idle(20_000);
  if (!ok) throw new Error("webhook deliveries did not settle");
}
