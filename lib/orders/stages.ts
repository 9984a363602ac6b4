/**
 * The moves an order may make, in one place (pure: no database, no framework). The floor's stages
 * run paid → kitting → assembling → testing → ready → shipped → delivered, one step at a time, with
 * the steps back a shop needs (testing → assembling to rework a bank, ready → testing to test
 * again). Any working stage may be put on hold and resumed where it stopped. An order is cancelled
 * only before kitting starts (paid, or on hold from paid). "Refunded" is never a staff move: the
 * payment service's refund events put an order there once everything paid has been returned.
 */
import { ORDER_STATUS_LABELS, type OrderStatus } from "@/lib/vocabulary";

/** The floor's stages in order (the board's columns). */
export const ORDER_STAGES = ["paid", "kitting", "assembling", "testing", "ready", "shipped", "delivered"] as const satisfies readonly OrderStatus[];

/** Stages still on the shop's floor: an order in one of these past its due date is late. */
export const OPEN_STATUSES: readonly OrderStatus[] = ["paid", "kitting", "assembling", "testing", "ready", "on-hold"];

/** Stages an order may be put on hold from. */
const HOLDABLE: readonly OrderStatus[] = ["paid", "kitting", "assembling", "testing", "ready"];

const FORWARD: Partial<Record<OrderStatus, OrderStatus>> = {
  paid: "kitting",
  kitting: "assembling",
  assembling: "testing",
  testing: "ready",
  ready: "shipped",
  shipped: "delivered",
};

const BACK: Partial<Record<OrderStatus, OrderStatus>> = {
  testing: "assembling",
  ready: "testing",
};

export interface OrderPosition {
  status: OrderStatus;
  /** where an order on hold stopped; null otherwise */
  heldFrom: OrderStatus | null;
}

/** The statuses a member of staff may move an order to from where it is, in the order a form offers them. */
export function allowedMoves(o: OrderPosition): OrderStatus[] {
  if (o.status === "on-hold") {
    const back = o.heldFrom && HOLDABLE.includes(o.heldFrom) ? [o.heldFrom] : [];
    return o.heldFrom === "paid" ? [...back, "cancelled"] : back;
  }
  const moves: OrderStatus[] = [];
  const forward = FORWARD[o.status];
  if (forward) moves.push(forward);
  const back = BACK[o.status];
  if (back) moves.push(back);
  if (HOLDABLE.includes(o.status)) moves.push("on-hold");
  if (o.status === "paid") moves.push("cancelled");
  return moves;
}

export type MoveCheck = { ok: true; heldFrom: OrderStatus | null } | { ok: false; reason: string };

/**
 * Whether staff may move an order from where it is to `to`, and what it then remembers as the stage
 * to resume (set when it goes on hold, cleared otherwise).
 */
export function checkMove(o: OrderPosition, to: OrderStatus): MoveCheck {
  if (to === o.status) return { ok: false, reason: `The order is already ${ORDER_STATUS_LABELS[to].toLowerCase()}.` };
  if (to === "refunded") return { ok: false, reason: "An order becomes refunded when the payment service confirms that everything paid was returned." };
  if (!allowedMoves(o).includes(to)) {
    const from = ORDER_STATUS_LABELS[o.status].toLowerCase();
    if (to === "cancelled") return { ok: false, reason: `Only an order that has not started kitting can be cancelled; this one is ${from}.` };
    return { ok: false, reason: `An order that is ${from} cannot move to ${ORDER_STATUS_LABELS[to].toLowerCase()}.` };
  }
  return { ok: true, heldFrom: to === "on-hold" ? o.status : null };
}

/** Whether an order may still be cancelled (before kitting). */
export function isCancellable(o: OrderPosition): boolean {
  return allowedMoves(o).includes("cancelled");
}

/** Where an order stands on the board: its own stage, or for an order on hold, the stage it stopped at. */
export function boardStage(o: OrderPosition): OrderStatus {
  return o.status === "on-hold" && o.heldFrom ? o.heldFrom : o.status;
}

/** Whether an order is past its due date (YYYY-MM-DD, the last day it is due) and still on the floor. */
export function isLate(o: { status: OrderStatus; dueDate: string }, today: string): boolean {
  return OPEN_STATUSES.includes(o.status) && today > o.dueDate;
}
