import "server-only";
import { recordAudit } from "@/db/queries/audit";
import {
  getOrderDetail,
  getRevisionForOrder,
  insertOrderHistory,
  insertTestRecord,
  latestTestsOfOrder,
  lockOrderByNumber,
  updateOrder,
} from "@/db/queries/orders";
import { recordShopEvent } from "@/db/queries/shop-events";
import { withShop } from "@/db/tx";
import type { ActionResult } from "@/lib/auth/guards";
import type { ShopContext } from "@/lib/auth/context";
import { dispatchOutbox } from "@/lib/mail/outbox";
import { refundableOf, requestRefund } from "@/lib/payments/refunds";
import { formatMoney } from "@/lib/pricing";
import { Dec } from "@/lib/pricing/decimal";
import type { CancelOrderInput, MoveOrderInput } from "@/lib/validation/orders";
import { ORDER_STATUS_LABELS, type OrderStatus } from "@/lib/vocabulary";
import { enqueueOrderMessage, type OrderMessageKind } from "./messages";
import { checkMove } from "./stages";
import { banksNotPassed, judgeTest, testLimitsOf } from "./test-limits";
import type { TestMeasurement } from "./types";

/** The moves the customer hears of by e-mail. */
const ANNOUNCED: Partial<Record<OrderStatus, OrderMessageKind>> = { ready: "ready", shipped: "shipped", delivered: "delivered" };

const label = (s: OrderStatus) => ORDER_STATUS_LABELS[s].toLowerCase();

/** "banks 2, 5 and 7" / "bank 1" — at most a handful named. */
function namedBanks(banks: number[]): string {
  const shown = banks.slice(0, 6);
  const more = banks.length - shown.length;
  const list = shown.length === 1 ? String(shown[0]) : `${shown.slice(0, -1).join(", ")} and ${shown.at(-1)}`;
  return `${banks.length === 1 ? "bank" : "banks"} ${list}${more > 0 ? ` (and ${more} more)` : ""}`;
}

async function announce() {
  try {
    await dispatchOutbox();
  } catch (error) {
    // the messages wait in the outbox; the queue's sweep sends them
    console.error("[orders] dispatchOutbox failed after an order move:", error);
  }
}

/**
 * A member of staff moves an order one step: only the moves lib/orders/stages.ts allows, from the
 * status the form showed (a move made meanwhile is refused, not overwritten), to "ready" only when
 * every bank's latest test passed, to "shipped" only with a carrier and tracking reference. The
 * move, its history entry (who, when, note), the shop event, the audit entry and the customer's
 * e-mail are written in one transaction with the order row locked.
 */
export async function applyOrderMove(ctx: ShopContext, input: MoveOrderInput, now = new Date()): Promise<ActionResult<{ status: OrderStatus }>> {
  const shopId = ctx.shop.id;
  const result = await withShop(shopId, async (tx): Promise<ActionResult<{ status: OrderStatus }>> => {
    const order = await lockOrderByNumber(tx, shopId, input.number);
    if (!order) return { ok: false, code: "not-found", message: "No such order." };
    if (order.status !== input.from) {
      return {
        ok: false,
        code: "conflict",
        message: `Order ${order.number} is ${label(order.status)} now (it moved meanwhile); reload to see where it stands.`,
      };
    }
    const check = checkMove(order, input.to);
    if (!check.ok) return { ok: false, code: "conflict", message: check.reason };
    if (input.to === "ready") {
      const { missing, failed } = banksNotPassed(order.quantity, await latestTestsOfOrder(tx, shopId, order.id));
      const problems = [
        ...(missing.length > 0 ? [`no test recorded for ${namedBanks(missing)}`] : []),
        ...(failed.length > 0 ? [`the latest test of ${namedBanks(failed)} failed`] : []),
      ];
      if (problems.length > 0) return { ok: false, code: "conflict", message: `Not ready to ship: ${problems.join("; ")}.` };
    }
    const shipping = input.to === "shipped" ? { carrier: input.carrier, trackingReference: input.trackingReference } : {};
    await updateOrder(tx, shopId, order.id, { status: input.to, heldFrom: check.heldFrom, ...shipping });
    await insertOrderHistory(tx, shopId, {
      orderId: order.id,
      fromStatus: order.status,
      toStatus: input.to,
      actorUserId: ctx.user.id,
      note: input.note,
      at: now,
    });
    await recordShopEvent(tx, shopId, "order.status_changed", { order: order.number, from: order.status, to: input.to, at: now.toISOString() });
    await recordAudit(tx, shopId, {
      actorUserId: ctx.user.id,
      action: "order.move",
      subjectType: "order",
      subjectId: order.id,
      summary: `${order.number} from ${label(order.status)} to ${label(input.to)}${input.note ? `: ${input.note}` : ""}`,
      changes: {
        status: { from: order.status, to: input.to },
        ...(input.to === "shipped"
          ? { carrier: { from: order.carrier, to: input.carrier }, trackingReference: { from: order.trackingReference, to: input.trackingReference } }
          : {}),
      },
    });
    const kind = ANNOUNCED[input.to];
    if (kind) {
      const rev = await getRevisionForOrder(tx, shopId, order.quoteRevisionId);
      if (rev)
        await enqueueOrderMessage(tx, {
          shopId,
          orderId: order.id,
          orderNumber: order.number,
          quoteNumber: rev.quoteNumber,
          kind,
          toEmail: rev.customerEmail,
          carrier: input.carrier,
        });
    }
    return { ok: true, data: { status: input.to } };
  });
  if (result.ok) await announce();
  return result;
}

/**
 * Cancels an order before kitting (a move to "cancelled" with the reason), and with `refund`
 * refunds everything still held through the payment service; the order becomes "refunded" when the
 * service's refund events confirm it.
 */
export async function applyCancellation(
  ctx: ShopContext,
  input: CancelOrderInput,
  now = new Date(),
): Promise<ActionResult<{ status: OrderStatus; refunded: string | null }>> {
  const moved = await applyOrderMove(
    ctx,
    { number: input.number, from: input.from, to: "cancelled", note: input.note, carrier: "", trackingReference: "" },
    now,
  );
  if (!moved.ok) return moved;
  if (!input.refund) return { ok: true, data: { status: "cancelled", refunded: null } };
  const detail = await getOrderDetail(ctx.shop.id, input.number);
  if (!detail) return { ok: true, data: { status: "cancelled", refunded: null } };
  const { left } = await refundableOf(ctx.shop.id, detail.order.quoteId);
  if (!new Dec(left).greaterThan(0)) return { ok: true, data: { status: "cancelled", refunded: null } };
  const refund = await requestRefund(ctx, {
    number: input.number,
    amount: left,
    reason: `Order cancelled: ${input.note}`,
    idempotencyKey: input.idempotencyKey,
  });
  if (!refund.ok)
    return {
      ok: false,
      code: "conflict",
      message: `The order is cancelled, but the refund was not made: ${refund.message ?? "try again from the refund form"}`,
    };
  return { ok: true, data: { status: "cancelled", refunded: formatMoney(refund.data.requested, refund.data.currency) } };
}

export interface RecordTestRequest {
  number: string;
  bank: number;
  measured: TestMeasurement;
  note: string;
}

/**
 * Records one built bank's acceptance test while the order is in testing: the limits are derived
 * from the quote revision's frozen specification (lib/orders/test-limits.ts) and kept with the
 * record, the verdict computed here; a retest adds a record (the latest counts).
 */
export async function saveBankTest(ctx: ShopContext, input: RecordTestRequest): Promise<ActionResult<{ passed: boolean; failed: string[] }>> {
  const shopId = ctx.shop.id;
  return withShop(shopId, async (tx): Promise<ActionResult<{ passed: boolean; failed: string[] }>> => {
    const order = await lockOrderByNumber(tx, shopId, input.number);
    if (!order) return { ok: false, code: "not-found", message: "No such order." };
    if (order.status !== "testing")
      return { ok: false, code: "conflict", message: `Tests are recorded while an order is in testing; ${order.number} is ${label(order.status)}.` };
    if (input.bank > order.quantity)
      return {
        ok: false,
        code: "invalid",
        message: "Please correct the marked fields.",
        fieldErrors: { bank: [`This order has ${order.quantity} bank${order.quantity === 1 ? "" : "s"}.`] },
      };
    const rev = await getRevisionForOrder(tx, shopId, order.quoteRevisionId);
    if (!rev) return { ok: false, code: "not-found", message: "The order's quote revision is missing." };
    const limits = testLimitsOf(rev.arrangement, rev.requirement);
    if (input.measured.positionVoltages.length !== limits.positions.length) {
      return {
        ok: false,
        code: "invalid",
        message: "Please correct the marked fields.",
        fieldErrors: {
          positionVoltages: [
            `Enter ${limits.positions.length} voltages, one per position (${limits.positions.slice(0, 3).join(", ")}${limits.positions.length > 3 ? ", …" : ""}); ${input.measured.positionVoltages.length} were given.`,
          ],
        },
      };
    }
    const verdict = judgeTest(input.measured, limits);
    await insertTestRecord(tx, shopId, {
      orderId: order.id,
      bank: input.bank,
      measured: input.measured,
      limits,
      checks: verdict.checks,
      isPassed: verdict.passed,
      note: input.note,
      testedByUserId: ctx.user.id,
    });
    await recordAudit(tx, shopId, {
      actorUserId: ctx.user.id,
      action: "order.test",
      subjectType: "order",
      subjectId: order.id,
      summary: `${order.number} bank ${input.bank} tested: ${
        verdict.passed
          ? "passed"
          : `failed (${verdict.checks
              .filter((c) => !c.passed)
              .map((c) => c.label.toLowerCase())
              .join(", ")})`
      }`,
    });
    return { ok: true, data: { passed: verdict.passed, failed: verdict.checks.filter((c) => !c.passed).map((c) => c.label) } };
  });
}
