/**
 * Accept and pay, end to end against a Stripe stand-in of this file's own, through the official SDK
 * and the app's real webhook route over HTTP: checkout for an accepted quote, events handled once
 * however they arrive (three copies at once, out of order, with a refund first), signatures and
 * their time checked, the app down while the service delivers, declines, deposits and refunds.
 */
import { and, count, eq, sql } from "drizzle-orm";
import Stripe from "stripe";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as checkoutRoute, GET as checkoutStateRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/checkout/route";
import { POST as webhookRoute } from "@/app/api/webhooks/stripe/route";
import { ownerDb as db } from "./owner-db";
import { getStripeEvent } from "@/db/queries/payments";
import { getQuoteByNumber } from "@/db/queries/quotes";
import { emailOutbox, orderStatusHistory, quoteRevisions, quotes, shopEvents, stripeEvents } from "@/db/schema";
import { env } from "@/lib/env";
import { openCheckout } from "@/lib/payments/checkout";
import { issueQuoteRevision } from "@/lib/quoting/issue-revision";
import { declineQuoteRevision } from "@/lib/quoting/lifecycle";
import { NO_OVERRIDES } from "@/lib/quoting/review-search";
import { issueRevisionSchema } from "@/lib/validation/workbench";
import { reconcileStripeEvents } from "@/lib/payments/reconcile";
import { requestRefund } from "@/lib/payments/refunds";
import { fromMinorUnits, toMinorUnits } from "@/lib/pricing";
import { Dec } from "@/lib/pricing/decimal";
import { cheapestOption, contextOf, createQuote, createShop, KESTREL_REQUIREMENT, type TestShop } from "./fixtures";
import { request, sessionCookie } from "./helpers";
import { acceptedQuote, checkoutFor, ordersOfQuote, payAndSettle, paymentOf, usePaymentRig } from "./payments-support";
import { control, settle } from "./stripe-standin/helpers";

const rig = usePaymentRig();
let K: TestShop; // Kestrel-like: EUR, 30 % deposit
let M: TestShop; // Marlow-like: GBP, full payment only

beforeAll(async () => {
  [K, M] = await Promise.all([createShop("kestrel", { depositPercent: 30 }), createShop("marlow", { depositPercent: 0 })]);
});

const routeParams = (shop: string, number: string) => ({ params: Promise.resolve({ shop, number }) });

async function postCheckout(shop: TestShop, number: string, cookie: string, body: unknown = { revision: 1, kind: "full" }) {
  return checkoutRoute(
    request(`/api/v1/shops/${shop.slug}/quotes/${number}/checkout`, { method: "POST", cookie, body: JSON.stringify(body) }),
    routeParams(shop.slug, number),
  );
}

async function revisionOf(shop: TestShop, number: string) {
  const [row] = await db
    .select({ id: quoteRevisions.id, total: quoteRevisions.total, currency: quoteRevisions.currency, quoteId: quotes.id })
    .from(quoteRevisions)
    .innerJoin(quotes, eq(quotes.id, quoteRevisions.quoteId))
    .where(and(eq(quotes.shopId, shop.id), eq(quotes.number, number)));
  if (!row) throw new Error(`no revision of ${number}`);
  return row;
}

async function countWhere(table: typeof orderStatusHistory | typeof emailOutbox | typeof shopEvents, where: ReturnType<typeof and>) {
  const [row] = await db.select({ n: count() }).from(table).where(where);
  return row?.n ?? 0;
}

describe("checkout", () => {
  it("gives the quote's customer a session with the revision's lines in minor units, the revision as reference, and shop and quote in its metadata", async () => {
    const number = await acceptedQuote(K);
    const res = await postCheckout(K, number, await sessionCookie(K.customers[0].email));
    expect(res.status).toBe(200);
    const { url, sessionId } = (await res.json()) as { url: string; sessionId: string };
    expect(url).toContain(sessionId);
    const rev = await revisionOf(K, number);
    const session = await rig.sdk.checkout.sessions.retrieve(sessionId, { expand: ["line_items"] });
    // ISO 4217: EUR has 2 minor digits, so the total in cents is the decimal total × 100
    expect(session.amount_total).toBe(toMinorUnits(new Dec(rev.total).toFixed(2), "EUR"));
    expect(session.currency).toBe("eur");
    expect(session.client_reference_id).toBe(rev.id);
    expect(session.metadata).toMatchObject({ shop: K.slug, shop_id: K.id, quote: number, revision: "1" });
    const lines = session.line_items?.data ?? [];
    expect(lines.reduce((sum, l) => sum + l.amount_total, 0)).toBe(session.amount_total);
    expect(lines[0]?.description).toContain(number);
    expect(session.success_url).toContain(`/s/${K.slug}/quotes/${number}/paid?session={CHECKOUT_SESSION_ID}`);
    expect(session.cancel_url).toContain(`/s/${K.slug}/quotes/${number}`);
  });

  it("hands two tabs the same open session, even at the same moment", async () => {
    const number = await acceptedQuote(K);
    const [a, b] = await Promise.all([checkoutFor(K, number), checkoutFor(K, number)]);
    expect(a.sessionId).toBe(b.sessionId);
    expect((await checkoutFor(K, number)).sessionId).toBe(a.sessionId);
  });

  it("answers 404 to another customer of the shop and 403 to staff; makes no session", async () => {
    const number = await acceptedQuote(K);
    expect((await postCheckout(K, number, await sessionCookie(K.customers[1].email))).status).toBe(404);
    expect((await postCheckout(K, number, await sessionCookie(K.manager.email))).status).toBe(403);
    expect((await rig.sdk.events.list({ type: "checkout.session.*" } as Stripe.EventListParams)).data).toEqual([]);
  });

  it("accepts a sent revision through the quote's accept move, once, and refuses a declined quote, an expired one, a superseded revision and a malformed body", async () => {
    const cookie = await sessionCookie(K.customers[0].email);
    const customer = contextOf(K, K.customers[0], "customer");
    const acceptedEvents = async (number: string) =>
      (
        await db
          .select({ payload: shopEvents.payload })
          .from(shopEvents)
          .where(and(eq(shopEvents.shopId, K.id), eq(shopEvents.type, "quote.accepted")))
      ).filter((e) => (e.payload as { number?: string }).number === number).length;
    // "Accept and pay" on a sent quote: the checkout accepts revision 1, and a second tab finds the same acceptance and page
    const sent = await createQuote(K, K.customers[0]);
    const first = await postCheckout(K, sent, cookie);
    expect(first.status).toBe(200);
    const again = await postCheckout(K, sent, cookie);
    expect(((await again.json()) as { sessionId: string }).sessionId).toBe(((await first.json()) as { sessionId: string }).sessionId);
    expect(
      (
        await db
          .select({ status: quotes.status })
          .from(quotes)
          .where(and(eq(quotes.shopId, K.id), eq(quotes.number, sent)))
      )[0]?.status,
    ).toBe("accepted");
    expect(await acceptedEvents(sent)).toBe(1);

    // a declined quote cannot be accepted by paying it
    const declined = await createQuote(K, K.customers[0]);
    expect(await declineQuoteRevision(customer, { number: declined, revision: 1, reason: "Bought elsewhere" })).toMatchObject({ ok: true });
    const refusedDeclined = await postCheckout(K, declined, cookie);
    expect(refusedDeclined.status).toBe(409);
    expect(await acceptedEvents(declined)).toBe(0);

    // a sent revision past its validity is expired by the attempt, not accepted
    const late = await createQuote(K, K.customers[0]);
    const pastValidity = new Date(Date.now() + 400 * 86_400_000);
    expect(await openCheckout(customer, { number: late, revision: 1, kind: "full" }, pastValidity)).toMatchObject({
      ok: false,
      code: "conflict",
      message: expect.stringMatching(/expired/),
    });
    expect(
      (
        await db
          .select({ status: quotes.status })
          .from(quotes)
          .where(and(eq(quotes.shopId, K.id), eq(quotes.number, late)))
      )[0]?.status,
    ).toBe("expired");

    const expiring = await acceptedQuote(K);
    const later = new Date(Date.now() + 400 * 86_400_000);
    const expired = await openCheckout(contextOf(K, K.customers[0], "customer"), { number: expiring, revision: 1, kind: "full" }, later);
    expect(expired).toMatchObject({ ok: false, code: "conflict", message: expect.stringMatching(/expired/) });

    // a second revision supersedes the first
    const revised = await acceptedQuote(K);
    const rev1 = await revisionOf(K, revised);
    const [r1] = await db.select().from(quoteRevisions).where(eq(quoteRevisions.id, rev1.id));
    if (!r1) throw new Error("no revision 1");
    const { id: _id, createdAt: _c, ...copy } = r1;
    await db.insert(quoteRevisions).values({ ...copy, revision: 2 });
    await db.update(quotes).set({ currentRevision: 2 }).where(eq(quotes.id, rev1.quoteId));
    const superseded = await postCheckout(K, revised, cookie, { revision: 1, kind: "full" });
    expect(superseded.status).toBe(409);
    expect(((await superseded.json()) as { error: string }).error).toMatch(/superseded by revision 2/);
    expect((await postCheckout(K, revised, cookie, { revision: "1", kind: "all" })).status).toBe(400);
  });

  it("offers the deposit only where the shop asks one: Kestrel 30 %, Marlow full payment only", async () => {
    const k = await acceptedQuote(K);
    const deposit = await checkoutFor(K, k, "deposit");
    const rev = await revisionOf(K, k);
    const session = await rig.sdk.checkout.sessions.retrieve(deposit.sessionId);
    // 30 % of the total, rounded half-up to the cent (common commercial practice)
    expect(session.amount_total).toBe(toMinorUnits(new Dec(rev.total).times("0.3").toDecimalPlaces(2, Dec.ROUND_HALF_UP).toFixed(2), "EUR"));
    const m = await acceptedQuote(M, M.customers[0], { maxVoltage: 800, capacitance: 10e-6, quantity: 1 });
    const refused = await openCheckout(contextOf(M, M.customers[0], "customer"), { number: m, revision: 1, kind: "deposit" });
    expect(refused).toMatchObject({ ok: false, code: "conflict", message: expect.stringMatching(/not offered/) });
  });
});

describe("checkout of an estimator's revision", () => {
  it("charges the revision's sheet: the bank, an added line and the discount with its reason, tax included", async () => {
    const number = await createQuote(K, K.customers[0]);
    const quote = await getQuoteByNumber(K.id, number);
    const o = await cheapestOption(K.id, KESTREL_REQUIREMENT);
    const draft = {
      bank: {
        kind: "engine",
        choice: { sku: o.cell.sku, topology: o.topology, seriesCount: o.seriesCount, parallelCount: o.parallelCount },
        overrides: NO_OVERRIDES,
      },
      bankPrice: null,
      lines: [{ kind: "freight", description: "Pallet freight", quantity: "1", unit: "lot", unitPrice: "85.00" }],
      discount: { kind: "percent", value: "5", reason: "Repeat order" },
      validityDays: 30,
      note: "",
    };
    const issued = await issueQuoteRevision(
      contextOf(K, K.estimator, "estimator"),
      issueRevisionSchema.parse({ requestId: quote!.requestId, draft, basedOnRevision: 1 }),
    );
    expect(issued).toMatchObject({ ok: true, data: { revision: 2 } });
    const [rev2] = await db
      .select()
      .from(quoteRevisions)
      .where(and(eq(quoteRevisions.shopId, K.id), eq(quoteRevisions.quoteId, quote!.id), eq(quoteRevisions.revision, 2)));
    const sheetTotal = rev2!.sheet!.total;
    // the price rules alone would ask another amount: the sheet's total is what is charged
    expect(sheetTotal).not.toBe(rev2!.pricing.total);
    const opened = await openCheckout(contextOf(K, K.customers[0], "customer"), { number, revision: 2, kind: "full" });
    if (!opened.ok) throw new Error(JSON.stringify(opened));
    const session = await rig.sdk.checkout.sessions.retrieve(opened.data.sessionId);
    expect(session.amount_total).toBe(toMinorUnits(sheetTotal, "EUR"));
  });
});

describe("webhooks, exactly once", () => {
  it("makes one order from a paid session whose events arrive three times at once and in reverse order", async () => {
    const number = await acceptedQuote(K);
    const { sessionId } = await checkoutFor(K, number);
    await control(rig.standin, "POST", "/_standin/webhooks", { duplicates: 2, order: "reverse" });
    const paid = await payAndSettle(rig, sessionId);
    expect(paid.status).toBe(200);
    const made = await ordersOfQuote(K, number);
    expect(made).toHaveLength(1);
    const order = made[0]!;
    expect(order.number).toMatch(/^O-\d{4}-0001$/);
    expect(order.status).toBe("paid");
    const rev = await revisionOf(K, number);
    expect(new Dec(order.amountPaid).equals(rev.total)).toBe(true);
    expect(await countWhere(orderStatusHistory, and(eq(orderStatusHistory.shopId, K.id), eq(orderStatusHistory.orderId, order.id)))).toBe(1);
    expect(await countWhere(emailOutbox, and(eq(emailOutbox.shopId, K.id), eq(emailOutbox.kind, "order-confirmed"), eq(emailOutbox.orderId, order.id)))).toBe(
      1,
    );
    expect(
      await countWhere(
        shopEvents,
        and(eq(shopEvents.shopId, K.id), eq(shopEvents.type, "order.status_changed"), sql`${shopEvents.payload}->>'order' = ${order.number}`),
      ),
    ).toBe(1);
    expect((await paymentOf(K, sessionId))?.status).toBe("paid");
    // every copy was answered 200: the completion's three copies each delivered once
    const log = (await control<{ deliveries: { type: string; status: number; copy: number }[] }>(rig.standin, "GET", "/_standin/webhooks/deliveries")).body
      .deliveries;
    const completions = log.filter((d) => d.type === "checkout.session.completed");
    expect(completions.map((d) => d.status)).toEqual([200, 200, 200]);
    // the next order of the shop counts on
    const second = await acceptedQuote(K);
    await payAndSettle(rig, (await checkoutFor(K, second)).sessionId);
    expect((await ordersOfQuote(K, second))[0]?.number).toBe(order.number.replace(/0001$/, "0002"));
  });

  it("a refund delivered before the payment it refunds leaves one order, refunded, with nothing counted twice", async () => {
    const number = await acceptedQuote(M, M.customers[0], { maxVoltage: 800, capacitance: 10e-6, quantity: 1 });
    const { sessionId } = await checkoutFor(M, number);
    await control(rig.standin, "POST", "/_standin/webhooks", { hold: true });
    await control(rig.standin, "POST", `/_standin/checkout/sessions/${sessionId}/pay`, { card: "success" });
    const session = await rig.sdk.checkout.sessions.retrieve(sessionId);
    await rig.sdk.refunds.create({ payment_intent: session.payment_intent as string, amount: 1000 });
    await rig.sdk.refunds.create({ payment_intent: session.payment_intent as string });
    await control(rig.standin, "POST", "/_standin/webhooks", { duplicates: 1 });
    await control(rig.standin, "POST", "/_standin/webhooks/flush", { order: "reverse" });
    await control(rig.standin, "POST", "/_standin/webhooks", { hold: false });
    await settle(rig.standin);
    const made = await ordersOfQuote(M, number);
    expect(made).toHaveLength(1);
    const order = made[0]!;
    expect(order.status).toBe("refunded");
    expect(new Dec(order.amountRefunded).equals(order.amountPaid)).toBe(true);
    expect(new Dec(order.amountPaid).equals(fromMinorUnits(session.amount_total ?? 0, "GBP"))).toBe(true);
    const history = await db
      .select({ to: orderStatusHistory.toStatus })
      .from(orderStatusHistory)
      .where(eq(orderStatusHistory.orderId, order.id))
      .orderBy(orderStatusHistory.at);
    expect(history.map((h) => h.to)).toEqual(["paid", "refunded"]);
  });

  it("a partial refund keeps the order in its stage and counts the refunded amount once", async () => {
    const number = await acceptedQuote(K);
    const { sessionId } = await checkoutFor(K, number);
    await payAndSettle(rig, sessionId);
    const session = await rig.sdk.checkout.sessions.retrieve(sessionId);
    await control(rig.standin, "POST", "/_standin/webhooks", { duplicates: 2, order: "shuffle" });
    await rig.sdk.refunds.create({ payment_intent: session.payment_intent as string, amount: 2500 });
    await settle(rig.standin);
    const [order] = await ordersOfQuote(K, number);
    expect(order?.status).toBe("paid");
    expect(order?.amountRefunded).toBe("25.0000");
  });

  it("refuses a forged signature and a timestamp outside 300 s with 400, and acknowledges a type it does not need", async () => {
    const payload = JSON.stringify({ id: "evt_forged_1", object: "event", type: "checkout.session.completed", created: 1, data: { object: {} } });
    const post = (body: string, signature: string) =>
      webhookRoute(new Request("http://127.0.0.1/api/webhooks/stripe", { method: "POST", headers: { "stripe-signature": signature }, body }));
    const forged = rig.sdk.webhooks.generateTestHeaderString({ payload, secret: "whsec_not_the_endpoint_secret" });
    expect((await post(payload, forged)).status).toBe(400);
    expect((await post(payload, "")).status).toBe(400);
    const stale = rig.sdk.webhooks.generateTestHeaderString({ payload, secret: env.STRIPE_WEBHOOK_SECRET, timestamp: Math.floor(Date.now() / 1000) - 301 });
    expect((await post(payload, stale)).status).toBe(400);
    // the same body signed properly but altered after signing
    const good = rig.sdk.webhooks.generateTestHeaderString({ payload, secret: env.STRIPE_WEBHOOK_SECRET });
    expect((await post(payload.replace("evt_forged_1", "evt_forged_2"), good)).status).toBe(400);
    expect(await getStripeEvent("evt_forged_1")).toBeNull();

    const unknown = JSON.stringify({
      id: "evt_unknown_type_1",
      object: "event",
      type: "customer.created",
      created: 1_700_000_000,
      data: { object: { id: "cus_1" } },
    });
    const signed = rig.sdk.webhooks.generateTestHeaderString({ payload: unknown, secret: env.STRIPE_WEBHOOK_SECRET });
    const first = await post(unknown, signed);
    expect(first.status).toBe(200);
    expect(await first.json()).toMatchObject({ received: true, duplicate: false });
    expect(await (await post(unknown, signed)).json()).toMatchObject({ received: true, duplicate: true });
  });

  it("a decline makes no order; the session stays open for another card", async () => {
    const number = await acceptedQuote(K);
    const { sessionId } = await checkoutFor(K, number);
    const declined = await payAndSettle(rig, sessionId, "decline");
    expect(declined.status).toBe(402);
    expect(await ordersOfQuote(K, number)).toEqual([]);
    expect((await paymentOf(K, sessionId))?.status).toBe("open");
    // the same session, paid with the approving card, then makes the order
    await payAndSettle(rig, sessionId);
    expect(await ordersOfQuote(K, number)).toHaveLength(1);
  });

  it("an expired session marks its checkout expired and the next checkout opens a new one", async () => {
    const number = await acceptedQuote(K);
    const { sessionId } = await checkoutFor(K, number);
    await rig.sdk.checkout.sessions.expire(sessionId);
    await settle(rig.standin);
    expect((await paymentOf(K, sessionId))?.status).toBe("expired");
    expect((await checkoutFor(K, number)).sessionId).not.toBe(sessionId);
  });
});

describe("the app down while the service delivers", () => {
  it("the service's retry makes the order once the app answers again", async () => {
    const number = await acceptedQuote(K);
    const { sessionId } = await checkoutFor(K, number);
    rig.app.state.down = true;
    await control(rig.standin, "POST", "/_standin/webhooks", { retry: { maxAttempts: 6, initialDelayMs: 150, maxDelayMs: 400 } });
    await control(rig.standin, "POST", `/_standin/checkout/sessions/${sessionId}/pay`, { card: "success" });
    // the first attempt has been refused with 503 before the app comes back
    const until = Date.now() + 10_000;
    let log: { outcome: string }[] = [];
    while (Date.now() < until && !log.some((d) => d.outcome === "retrying")) {
      log = (await control<{ deliveries: { outcome: string }[] }>(rig.standin, "GET", "/_standin/webhooks/deliveries")).body.deliveries;
    }
    expect(log.some((d) => d.outcome === "retrying")).toBe(true);
    rig.app.state.down = false;
    await settle(rig.standin);
    expect(await ordersOfQuote(K, number)).toHaveLength(1);
  });

  it("when the service gives up, the reconciliation job makes the order, once however often it runs", async () => {
    const number = await acceptedQuote(K);
    const { sessionId } = await checkoutFor(K, number);
    rig.app.state.down = true;
    await payAndSettle(rig, sessionId);
    const log = (await control<{ deliveries: { type: string; outcome: string }[] }>(rig.standin, "GET", "/_standin/webhooks/deliveries")).body.deliveries;
    expect(log.filter((d) => d.type === "checkout.session.completed").at(-1)?.outcome).toBe("gave_up");
    expect(await ordersOfQuote(K, number)).toEqual([]);
    rig.app.state.down = false;

    const [first, second] = await Promise.all([reconcileStripeEvents(), reconcileStripeEvents()]);
    expect(first.failed + second.failed).toBe(0);
    expect(await ordersOfQuote(K, number)).toHaveLength(1);
    const again = await reconcileStripeEvents();
    expect(again.handled).toBe(0);
    const completion = (await rig.sdk.events.list({ type: "checkout.session.completed" })).data[0];
    expect((await getStripeEvent(completion?.id ?? ""))?.source).toBe("reconciliation");
    const [events] = await db
      .select({ n: count() })
      .from(stripeEvents)
      .where(eq(stripeEvents.id, completion?.id ?? ""));
    expect(events?.n).toBe(1);
  });
});

describe("deposits, balances and refunds", () => {
  it("a deposit makes the order, the balance completes it, and the success page's route follows both", async () => {
    const number = await acceptedQuote(K);
    const rev = await revisionOf(K, number);
    const deposit = await checkoutFor(K, number, "deposit");
    const cookie = await sessionCookie(K.customers[0].email);
    const state = async (session: string) =>
      (await (
        await checkoutStateRoute(request(`/api/v1/shops/${K.slug}/quotes/${number}/checkout?session=${session}`, { cookie }), routeParams(K.slug, number))
      ).json()) as { status: string; orderNumber: string | null };
    expect(await state(deposit.sessionId)).toMatchObject({ status: "open", orderNumber: null });
    await payAndSettle(rig, deposit.sessionId);
    const after = await state(deposit.sessionId);
    expect(after.status).toBe("paid");
    expect(after.orderNumber).toMatch(/^O-/);
    expect((await checkoutFor(K, number, "deposit").catch((e: Error) => e.message)) as string).toMatch(/not offered/);
    const balance = await checkoutFor(K, number, "balance");
    await payAndSettle(rig, balance.sessionId);
    const [order] = await ordersOfQuote(K, number);
    expect(new Dec(order?.amountPaid ?? "0").equals(rev.total)).toBe(true);
    expect(await ordersOfQuote(K, number)).toHaveLength(1);
    // paid in full: nothing more to pay
    await expect(checkoutFor(K, number, "balance")).rejects.toThrow(/paid in full/);
    // another customer of the shop cannot read this checkout
    const other = await checkoutStateRoute(
      request(`/api/v1/shops/${K.slug}/quotes/${number}/checkout?session=${deposit.sessionId}`, { cookie: await sessionCookie(K.customers[1].email) }),
      routeParams(K.slug, number),
    );
    expect(other.status).toBe(404);
  });

  it("the manager refunds in part and in full with a reason; the order follows the webhooks; more than is left is refused at the field", async () => {
    const number = await acceptedQuote(M, M.customers[0], { maxVoltage: 800, capacitance: 10e-6, quantity: 1 });
    await payAndSettle(rig, (await checkoutFor(M, number)).sessionId);
    const [order] = await ordersOfQuote(M, number);
    if (!order) throw new Error("no order");
    const manager = contextOf(M, M.manager, "manager");
    const key = crypto.randomUUID();
    const partial = await requestRefund(manager, { number: order.number, amount: "10.00", reason: "One shroud arrived cracked", idempotencyKey: key });
    expect(partial).toMatchObject({ ok: true, data: { requested: "10.00", currency: "GBP" } });
    // the same submit again refunds nothing more
    expect(await requestRefund(manager, { number: order.number, amount: "10.00", reason: "One shroud arrived cracked", idempotencyKey: key })).toMatchObject({
      ok: true,
    });
    await settle(rig.standin);
    const [afterPartial] = await ordersOfQuote(M, number);
    expect(afterPartial?.amountRefunded).toBe("10.0000");
    expect(afterPartial?.status).toBe("paid");

    const tooMuch = await requestRefund(manager, { number: order.number, amount: "999999.00", reason: "x", idempotencyKey: crypto.randomUUID() });
    expect(tooMuch).toMatchObject({ ok: false, code: "invalid", fieldErrors: { amount: [expect.stringMatching(/is left to refund/)] } });

    const rest = new Dec(order.amountPaid).minus(10).toFixed(2);
    expect(await requestRefund(manager, { number: order.number, amount: rest, reason: "Order withdrawn", idempotencyKey: crypto.randomUUID() })).toMatchObject({
      ok: true,
    });
    await settle(rig.standin);
    const [refunded] = await ordersOfQuote(M, number);
    expect(refunded?.status).toBe("refunded");
    expect(
      await countWhere(
        shopEvents,
        and(eq(shopEvents.shopId, M.id), eq(shopEvents.type, "payment.refunded"), sql`${shopEvents.payload}->>'order' = ${order.number}`),
      ),
    ).toBe(2);
  });
});
