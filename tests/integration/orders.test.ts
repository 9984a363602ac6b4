/**
 * Orders the manager tracks: every stage through the desk's actions with who, when and a note kept;
 * "ready" only after every bank passed its test; shipping with carrier and tracking; hold and resume;
 * cancellation before kitting with its refund; the customer's e-mails; the orders API; the traveler
 * and the certificate. Payments go through a Stripe stand-in of this file's own.
 */
import { and, asc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { cancelOrder, moveOrder, recordTest, refundOrder } from "@/app/desk/[shop]/orders/actions";
import { GET as certificateRoute } from "@/app/api/v1/shops/[shop]/orders/[number]/certificate/route";
import { GET as travelerRoute } from "@/app/api/v1/shops/[shop]/orders/[number]/traveler/route";
import { GET as ordersRoute } from "@/app/api/v1/shops/[shop]/orders/route";
import { ownerDb as db } from "./owner-db";
import { getOrderDetail } from "@/db/queries/orders";
import { auditEvents, emailOutbox, orderStatusHistory, shopEvents } from "@/db/schema";
import { buildOutboxMessage } from "@/lib/mail/messages";
import { ordersResponseSchema } from "@/lib/validation/orders";
import type { OrderStatus } from "@/lib/vocabulary";
import { createShop, type TestShop } from "./fixtures";
import { actAs, request, sessionCookie } from "./helpers";
import { acceptedQuote, checkoutFor, ordersOfQuote, payAndSettle, usePaymentRig } from "./payments-support";
import { settle } from "./stripe-standin/helpers";

const rig = usePaymentRig();
let K: TestShop;

beforeAll(async () => {
  K = await createShop("kestrel", { depositPercent: 30 });
});

/** A paid order of the shop's first customer. */
async function paidOrder(shop: TestShop = K, customer = shop.customers[0]) {
  const number = await acceptedQuote(shop, customer);
  await payAndSettle(rig, (await checkoutFor(shop, number, "full", customer)).sessionId);
  const [order] = await ordersOfQuote(shop, number);
  if (!order) throw new Error("no order was made");
  return order;
}

/**
 * Measurements of a bank built exactly to its frozen specification: the nominal capacitance, the
 * new ESR, no leakage and the working voltage shared equally by the series positions. Any sound set
 * of limits passes them.
 */
async function nominalMeasurements(shop: TestShop, number: string) {
  const d = await getOrderDetail(shop.id, number);
  if (!d) throw new Error("no order");
  const o = d.arrangement;
  const positions = o.topology === "series-of-parallel-groups" ? o.seriesCount : o.seriesCount * o.parallelCount;
  const vPosition = d.requirement.maxVoltage / o.seriesCount;
  return {
    capacitance: `${o.capacitance.nominal} F`,
    esr: `${o.esr.new} Ω`,
    leakageCurrent: "0 A",
    holdMinutes: 120,
    positionVoltages: Array.from({ length: positions }, () => `${vPosition} V`).join("\n"),
  };
}

async function move(number: string, from: OrderStatus, to: OrderStatus, extra: { note?: string; carrier?: string; trackingReference?: string } = {}) {
  return moveOrder(K.slug, { number, from, to, note: "", ...extra });
}

describe("moving an order through the floor", () => {
  it("goes through every stage with who, when and note kept; ready needs every bank's passing test; each move is audited and announced", async () => {
    const order = await paidOrder();
    await actAs(K.manager.email);
    expect(await move(order.number, "paid", "kitting", { note: "Cells pulled from graded stock" })).toMatchObject({ ok: true });
    expect(await move(order.number, "kitting", "assembling")).toMatchObject({ ok: true });
    // skipping a stage is refused
    expect(await move(order.number, "assembling", "ready")).toMatchObject({ ok: false, code: "conflict" });
    expect(await move(order.number, "assembling", "testing")).toMatchObject({ ok: true });
    // no test yet: not ready
    expect(await move(order.number, "testing", "ready")).toMatchObject({
      ok: false,
      code: "conflict",
      message: expect.stringMatching(/no test recorded for bank 1/),
    });

    const good = await nominalMeasurements(K, order.number);
    const failing = await recordTest(K.slug, { number: order.number, bank: 1, ...good, capacitance: `${parseFloat(good.capacitance) * 0.5} F`, note: "" });
    expect(failing).toMatchObject({ ok: true, data: { passed: false, failed: ["Capacitance"] } });
    expect(await move(order.number, "testing", "ready")).toMatchObject({ ok: false, message: expect.stringMatching(/latest test of bank 1 failed/) });
    // the count of position voltages must match the bank
    expect(await recordTest(K.slug, { number: order.number, bank: 1, ...good, positionVoltages: "2.5 V", note: "" })).toMatchObject({
      ok: false,
      code: "invalid",
      fieldErrors: { positionVoltages: [expect.stringMatching(/Enter \d+ voltages/)] },
    });
    expect(await recordTest(K.slug, { number: order.number, bank: 2, ...good, note: "" })).toMatchObject({
      ok: false,
      fieldErrors: { bank: [expect.any(String)] },
    });
    expect(await recordTest(K.slug, { number: order.number, bank: 1, ...good, note: "Retest after re-torquing g3" })).toMatchObject({
      ok: true,
      data: { passed: true },
    });
    expect(await move(order.number, "testing", "ready")).toMatchObject({ ok: true });

    // shipping needs a carrier and a tracking reference
    expect(await move(order.number, "ready", "shipped")).toMatchObject({
      ok: false,
      code: "invalid",
      fieldErrors: { carrier: [expect.any(String)], trackingReference: [expect.any(String)] },
    });
    expect(await move(order.number, "ready", "shipped", { carrier: "Tollway Freight", trackingReference: "TW-55812-KB" })).toMatchObject({ ok: true });
    expect(await move(order.number, "shipped", "delivered")).toMatchObject({ ok: true });
    expect(await move(order.number, "delivered", "shipped")).toMatchObject({ ok: false });

    const history = await db.select().from(orderStatusHistory).where(eq(orderStatusHistory.orderId, order.id)).orderBy(asc(orderStatusHistory.at));
    expect(history.map((h) => h.toStatus)).toEqual(["paid", "kitting", "assembling", "testing", "ready", "shipped", "delivered"]);
    expect(history[0]?.actorUserId).toBeNull();
    expect(history.slice(1).every((h) => h.actorUserId === K.manager.id)).toBe(true);
    expect(history[1]?.note).toBe("Cells pulled from graded stock");

    const audits = await db
      .select({ action: auditEvents.action })
      .from(auditEvents)
      .where(and(eq(auditEvents.shopId, K.id), eq(auditEvents.subjectId, order.id)));
    expect(audits.filter((a) => a.action === "order.move")).toHaveLength(6);
    expect(audits.filter((a) => a.action === "order.test")).toHaveLength(2);
    const events = await db
      .select({ payload: shopEvents.payload })
      .from(shopEvents)
      .where(and(eq(shopEvents.shopId, K.id), eq(shopEvents.type, "order.status_changed")));
    expect(events.filter((e) => e.payload.order === order.number).map((e) => e.payload.to)).toEqual([
      "paid",
      "kitting",
      "assembling",
      "testing",
      "ready",
      "shipped",
      "delivered",
    ]);

    // the customer hears of confirmed, ready, shipped and delivered: once each, with what matters in each
    const mail = await db
      .select()
      .from(emailOutbox)
      .where(and(eq(emailOutbox.shopId, K.id), eq(emailOutbox.orderId, order.id)));
    expect(mail.map((m) => m.kind).sort()).toEqual(["order-confirmed", "order-delivered", "order-ready", "order-shipped"]);
    expect(mail.every((m) => m.toEmail === K.customers[0].email)).toBe(true);
    const shipped = mail.find((m) => m.kind === "order-shipped");
    if (!shipped) throw new Error("no shipped message");
    const message = await buildOutboxMessage(shipped);
    expect(message.subject).toBe(`Order ${order.number} has shipped with Tollway Freight`);
    expect(message.text).toContain("TW-55812-KB");
    // what travels with the bank depends on its cells: hybrid cells are never shorted (DESIGN.md §6)
    const technology = (await getOrderDetail(K.id, order.number))?.arrangement.cell.technology;
    expect(message.text).toMatch(technology === "hybrid" ? /must never be shorted/ : /shorting link across its terminals/);
  });

  it("refuses a move made from a stale page, and holds and resumes an order where it stopped", async () => {
    const order = await paidOrder();
    await actAs(K.manager.email);
    expect(await move(order.number, "paid", "kitting")).toMatchObject({ ok: true });
    expect(await move(order.number, "paid", "kitting")).toMatchObject({ ok: false, code: "conflict", message: expect.stringMatching(/moved meanwhile/) });
    expect(await move(order.number, "kitting", "on-hold", { note: "Cells delayed at the supplier" })).toMatchObject({ ok: true });
    // on hold from kitting: only back to kitting; not cancellable (kitting has started)
    expect(await move(order.number, "on-hold", "assembling")).toMatchObject({ ok: false });
    expect(
      await cancelOrder(K.slug, { number: order.number, from: "on-hold", note: "Customer changed plans", refund: false, idempotencyKey: crypto.randomUUID() }),
    ).toMatchObject({
      ok: false,
      message: expect.stringMatching(/not started kitting/),
    });
    expect(await move(order.number, "on-hold", "kitting")).toMatchObject({ ok: true });
    expect((await getOrderDetail(K.id, order.number))?.order).toMatchObject({ status: "kitting", heldFrom: null });
  });

  it("lets only the manager move, test, refund or cancel", async () => {
    const order = await paidOrder();
    for (const who of [K.estimator.email, K.customers[0].email]) {
      await actAs(who);
      expect(await move(order.number, "paid", "kitting")).toMatchObject({ ok: false, code: "forbidden" });
      expect(await refundOrder(K.slug, { number: order.number, amount: "1.00", reason: "x", idempotencyKey: crypto.randomUUID() })).toMatchObject({
        ok: false,
        code: "forbidden",
      });
      expect(await cancelOrder(K.slug, { number: order.number, from: "paid", note: "x", refund: true, idempotencyKey: crypto.randomUUID() })).toMatchObject({
        ok: false,
        code: "forbidden",
      });
    }
    expect((await getOrderDetail(K.id, order.number))?.order.status).toBe("paid");
  });

  it("cancels before kitting and refunds what was paid; the order becomes refunded when the payment service confirms", async () => {
    const order = await paidOrder();
    await actAs(K.manager.email);
    const r = await cancelOrder(K.slug, {
      number: order.number,
      from: "paid",
      note: "Project withdrawn by the customer",
      refund: true,
      idempotencyKey: crypto.randomUUID(),
    });
    expect(r).toMatchObject({ ok: true, data: { status: "cancelled", refunded: expect.stringMatching(/^€/) } });
    await settle(rig.standin);
    const after = (await getOrderDetail(K.id, order.number))?.order;
    expect(after?.status).toBe("refunded");
    expect(after?.amountRefunded).toBe(after?.amountPaid);
    const history = await db
      .select({ to: orderStatusHistory.toStatus })
      .from(orderStatusHistory)
      .where(eq(orderStatusHistory.orderId, order.id))
      .orderBy(asc(orderStatusHistory.at));
    expect(history.map((h) => h.to)).toEqual(["paid", "cancelled", "refunded"]);
  });
});

describe("the orders API, the traveler and the certificate", () => {
  it("gives staff every order and a customer their own, each with its history", async () => {
    const mine = await paidOrder(K, K.customers[0]);
    const theirs = await paidOrder(K, K.customers[1]);
    const read = async (email: string) => {
      const res = await ordersRoute(request(`/api/v1/shops/${K.slug}/orders?size=100`, { cookie: await sessionCookie(email) }), {
        params: Promise.resolve({ shop: K.slug }),
      });
      expect(res.status).toBe(200);
      return ordersResponseSchema.parse(await res.json());
    };
    const staff = await read(K.estimator.email);
    expect(staff.orders.map((o) => o.number)).toEqual(expect.arrayContaining([mine.number, theirs.number]));
    const own = await read(K.customers[0].email);
    expect(own.orders.map((o) => o.number)).toContain(mine.number);
    expect(own.orders.map((o) => o.number)).not.toContain(theirs.number);
    const first = own.orders.find((o) => o.number === mine.number);
    expect(first).toMatchObject({ status: "paid", amountPaid: { currency: "EUR" }, history: [{ status: "paid" }] });
    expect(first?.amountPaid.amount).toMatch(/^\d+\.\d{2}$/);
    const bad = await ordersRoute(request(`/api/v1/shops/${K.slug}/orders?sort=price`, { cookie: await sessionCookie(K.manager.email) }), {
      params: Promise.resolve({ shop: K.slug }),
    });
    expect(bad.status).toBe(400);
  });

  it("serves the traveler to staff only, and the certificate to the order's customer once every bank passed", async () => {
    const order = await paidOrder();
    const params = { params: Promise.resolve({ shop: K.slug, number: order.number }) };
    const get = async (route: typeof travelerRoute, path: string, email: string) => route(request(path, { cookie: await sessionCookie(email) }), params);
    const traveler = await get(travelerRoute, `/api/v1/shops/${K.slug}/orders/${order.number}/traveler`, K.estimator.email);
    expect(traveler.status).toBe(200);
    expect(traveler.headers.get("content-type")).toBe("application/pdf");
    expect((await get(travelerRoute, `/api/v1/shops/${K.slug}/orders/${order.number}/traveler`, K.customers[0].email)).status).toBe(403);

    const certificate = `/api/v1/shops/${K.slug}/orders/${order.number}/certificate`;
    expect((await get(certificateRoute, certificate, K.customers[0].email)).status).toBe(409);
    await actAs(K.manager.email);
    for (const [from, to] of [
      ["paid", "kitting"],
      ["kitting", "assembling"],
      ["assembling", "testing"],
    ] as const)
      await move(order.number, from, to);
    await recordTest(K.slug, { number: order.number, bank: 1, ...(await nominalMeasurements(K, order.number)), note: "" });
    const pdf = await get(certificateRoute, certificate, K.customers[0].email);
    expect(pdf.status).toBe(200);
    // ISO 32000-1 §7.5.2: a PDF starts with "%PDF-"
    expect(
      Buffer.from(await pdf.arrayBuffer())
        .subarray(0, 5)
        .toString("latin1"),
    ).toBe("%PDF-");
    expect((await get(certificateRoute, certificate, K.customers[1].email)).status).toBe(404);
  });
});
