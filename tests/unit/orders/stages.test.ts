import { describe, expect, it } from "vitest";
import { allowedMoves, boardStage, checkMove, isCancellable, isLate } from "@/lib/orders/stages";
import { ORDER_STATUSES, type OrderStatus } from "@/lib/vocabulary";

// The shop's floor rules (the product's own; DESIGN.md §5 lists the stages): one step forward at a
// time, rework back from testing and ready, hold from any working stage and resume where it
// stopped, cancel only before kitting, refunded only by the payment service.
const EXPECTED: [from: OrderStatus, heldFrom: OrderStatus | null, allowed: OrderStatus[]][] = [
  ["paid", null, ["kitting", "on-hold", "cancelled"]],
  ["kitting", null, ["assembling", "on-hold"]],
  ["assembling", null, ["testing", "on-hold"]],
  ["testing", null, ["ready", "assembling", "on-hold"]],
  ["ready", null, ["shipped", "testing", "on-hold"]],
  ["shipped", null, ["delivered"]],
  ["delivered", null, []],
  ["cancelled", null, []],
  ["refunded", null, []],
  ["on-hold", "paid", ["paid", "cancelled"]],
  ["on-hold", "kitting", ["kitting"]],
  ["on-hold", "assembling", ["assembling"]],
  ["on-hold", "testing", ["testing"]],
  ["on-hold", "ready", ["ready"]],
];

describe("order moves", () => {
  it.each(EXPECTED)("from %s (held from %s) allows exactly %j", (status, heldFrom, allowed) => {
    expect(allowedMoves({ status, heldFrom })).toEqual(allowed);
    for (const to of ORDER_STATUSES) {
      const r = checkMove({ status, heldFrom }, to);
      expect(r.ok, `${status} → ${to}`).toBe(allowed.includes(to));
    }
  });

  it("remembers the stage an order is held from, and forgets it on any other move", () => {
    expect(checkMove({ status: "testing", heldFrom: null }, "on-hold")).toEqual({ ok: true, heldFrom: "testing" });
    expect(checkMove({ status: "on-hold", heldFrom: "testing" }, "testing")).toEqual({ ok: true, heldFrom: null });
    expect(checkMove({ status: "kitting", heldFrom: null }, "assembling")).toEqual({ ok: true, heldFrom: null });
  });

  it("says why a move is refused", () => {
    expect(checkMove({ status: "kitting", heldFrom: null }, "cancelled")).toEqual({
      ok: false,
      reason: expect.stringMatching(/not started kitting can be cancelled; this one is kitting/),
    });
    expect(checkMove({ status: "paid", heldFrom: null }, "refunded")).toEqual({ ok: false, reason: expect.stringMatching(/payment service confirms/) });
    expect(checkMove({ status: "paid", heldFrom: null }, "paid")).toEqual({ ok: false, reason: "The order is already paid." });
    expect(checkMove({ status: "paid", heldFrom: null }, "ready")).toEqual({ ok: false, reason: "An order that is paid cannot move to ready to ship." });
  });

  it("cancels only before kitting, and puts held orders on the board where they stopped", () => {
    expect(isCancellable({ status: "paid", heldFrom: null })).toBe(true);
    expect(isCancellable({ status: "on-hold", heldFrom: "paid" })).toBe(true);
    expect(isCancellable({ status: "on-hold", heldFrom: "kitting" })).toBe(false);
    expect(boardStage({ status: "on-hold", heldFrom: "assembling" })).toBe("assembling");
    expect(boardStage({ status: "shipped", heldFrom: null })).toBe("shipped");
  });

  it.each([
    ["testing", "2026-03-09", "2026-03-10", true],
    ["testing", "2026-03-10", "2026-03-10", false],
    ["on-hold", "2026-03-01", "2026-03-10", true],
    ["shipped", "2026-03-01", "2026-03-10", false],
    ["cancelled", "2026-03-01", "2026-03-10", false],
  ] as const)("an order %s due %s is late on %s: %s", (status, dueDate, today, late) => {
    expect(isLate({ status, dueDate }, today)).toBe(late);
  });
});
