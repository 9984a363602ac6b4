/**
 * What payment tests share: a Stripe stand-in of the file's own (in this process, real HTTP) whose
 * webhooks go to the app's real route handler through a small HTTP server that can play "the app
 * is down", the app's Stripe client pointed at that stand-in, and a quote made, accepted and
 * checked out by its customer.
 */
import http from "node:http";
import type { AddressInfo } from "node:net";
import { and, eq } from "drizzle-orm";
import type Stripe from "stripe";
import { afterAll, beforeAll, beforeEach } from "vitest";
import { POST as webhookRoute } from "@/app/api/webhooks/stripe/route";
import type { Standin } from "@/dev/stripe-standin/server";
import { ownerDb as db } from "./owner-db";
import { orders, payments, quotes } from "@/db/schema";
import { acceptQuoteRevision } from "@/lib/quoting/lifecycle";
import { openCheckout } from "@/lib/payments/checkout";
import { configureStripe } from "@/lib/payments/stripe";
import type { Requirement } from "@/lib/bank";
import type { PaymentKind } from "@/lib/vocabulary";
import { contextOf, createQuote, KESTREL_REQUIREMENT, type TestPerson, type TestShop } from "./fixtures";
import { control, sdkFor, settle, startTestStandin } from "./stripe-standin/helpers";

/** The app's webhook endpoint over real HTTP: forwards each POST to the route handler, or answers 503 while `down`. */
async function startAppEndpoint() {
  const state = { down: false, answered: 0 };
  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      void (async () => {
        if (state.down) {
          res.writeHead(503).end();
          return;
        }
        const headers = new Headers();
        for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
        const answer = await webhookRoute(new Request("http://127.0.0.1/api/webhooks/stripe", { method: "POST", headers, body: Buffer.concat(chunks) }));
        state.answered += 1;
        res.writeHead(answer.status, { "content-type": "application/json" }).end(await answer.text());
      })().catch((error: unknown) => {
        res.writeHead(500).end(String(error));
      });
    });
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/webhooks/stripe`;
  return {
    url,
    state,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

export interface PaymentRig {
  standin: Standin;
  /** the official SDK pointed at the stand-in (the test's own calls: refunds, reads) */
  sdk: Stripe;
  app: Awaited<ReturnType<typeof startAppEndpoint>>;
}

/** Registers the file's hooks: a stand-in delivering to the app's webhook route, reset before each test. */
export function usePaymentRig(): PaymentRig {
  const rig = {} as PaymentRig;
  beforeAll(async () => {
    rig.app = await startAppEndpoint();
    rig.standin = await startTestStandin({ webhook: { url: rig.app.url } });
    rig.sdk = sdkFor(rig.standin);
    configureStripe({ host: "127.0.0.1", port: rig.standin.port, protocol: "http" });
  });
  afterAll(async () => {
    await rig.standin?.close();
    await rig.app?.close();
  });
  beforeEach(async () => {
    await control(rig.standin, "POST", "/_standin/reset");
    await control(rig.standin, "POST", "/_standin/webhooks", { url: rig.app.url });
    rig.app.state.down = false;
  });
  return rig;
}

/** A quote of the customer's, accepted by the customer through the quote's own accept move. */
export async function acceptedQuote(shop: TestShop, customer: TestPerson = shop.customers[0], requirement: Requirement = KESTREL_REQUIREMENT): Promise<string> {
  const number = await createQuote(shop, customer, requirement);
  const accepted = await acceptQuoteRevision(contextOf(shop, customer, "customer"), { number, revision: 1 });
  if (!accepted.ok) throw new Error(`accept refused: ${JSON.stringify(accepted)}`);
  return number;
}

/** The customer opens checkout for their accepted quote (revision 1), as the "Accept and pay" button does. */
export async function checkoutFor(shop: TestShop, number: string, kind: PaymentKind = "full", customer: TestPerson = shop.customers[0]) {
  const r = await openCheckout(contextOf(shop, customer, "customer"), { number, revision: 1, kind });
  if (!r.ok) throw new Error(`checkout refused: ${JSON.stringify(r)}`);
  return r.data;
}

/** Pays a session on the stand-in as the hosted page does, and waits until its webhooks are delivered. */
export async function payAndSettle(rig: PaymentRig, sessionId: string, card: "success" | "decline" = "success") {
  const r = await control(rig.standin, "POST", `/_standin/checkout/sessions/${sessionId}/pay`, { card });
  await settle(rig.standin);
  return r;
}

/** The quote's orders (there must never be more than one). */
export async function ordersOfQuote(shop: TestShop, number: string) {
  const [q] = await db
    .select({ id: quotes.id })
    .from(quotes)
    .where(and(eq(quotes.shopId, shop.id), eq(quotes.number, number)));
  if (!q) throw new Error(`no quote ${number}`);
  return db
    .select()
    .from(orders)
    .where(and(eq(orders.shopId, shop.id), eq(orders.quoteId, q.id)));
}

/** The payment row of a session. */
export async function paymentOf(shop: TestShop, sessionId: string) {
  const [row] = await db
    .select()
    .from(payments)
    .where(and(eq(payments.shopId, shop.id), eq(payments.stripeSessionId, sessionId)));
  return row ?? null;
}
