import { describe, expect, it } from "vitest";
import { checkoutRequestSchema, moveOrderSchema, recordTestSchema, refundOrderSchema } from "@/lib/validation/orders";

const test = {
  number: "O-2026-0007",
  bank: "1",
  capacitance: "23.4 F",
  esr: "52 mΩ",
  leakageCurrent: "1,2 mA",
  holdMinutes: "90",
  positionVoltages: "2.66 V\n2.67\n\n2.65 V",
  note: "",
};

describe("what the desk's order forms take", () => {
  it("reads measurements as people type them, in SI units", () => {
    const r = recordTestSchema.parse(test);
    expect(r.capacitance).toBeCloseTo(23.4, 12);
    expect(r.esr).toBeCloseTo(0.052, 12);
    expect(r.leakageCurrent).toBeCloseTo(0.0012, 12);
    expect(r.holdMinutes).toBe(90);
    expect(r.positionVoltages).toEqual([2.66, 2.67, 2.65]);
  });

  it.each([
    ["capacitance", "23.4 V", /Capacitance: "23.4 V" is not a value in farads/],
    ["esr", "2 kΩ", /beyond any bank/],
    ["positionVoltages", "2.66\n2,6x", /Line 2: /],
    ["positionVoltages", "", /one per line/],
    ["holdMinutes", "20000", /At most a week/],
    ["bank", "0", /Choose the bank/],
  ])("refuses %s %j at the field", (field, value, message) => {
    const r = recordTestSchema.safeParse({ ...test, [field]: value });
    expect(r.success).toBe(false);
    const issue = r.error?.issues.find((i) => i.path[0] === field);
    expect(issue?.message).toMatch(message);
  });

  it("wants a carrier and a tracking reference only for shipping", () => {
    expect(moveOrderSchema.safeParse({ number: "O-2026-0007", from: "testing", to: "ready" }).success).toBe(true);
    const shipped = moveOrderSchema.safeParse({ number: "O-2026-0007", from: "ready", to: "shipped", carrier: " " });
    expect(shipped.error?.issues.map((i) => i.path.join("."))).toEqual(["carrier", "trackingReference"]);
  });

  it("takes a refund amount with a point or a comma, and always a reason", () => {
    const key = "7c0a1a52-3a64-4a3b-9c55-5b1b9c2b2f10";
    expect(refundOrderSchema.parse({ number: "O-2026-0007", amount: "120,50", reason: "Cracked shroud", idempotencyKey: key }).amount).toBe("120.50");
    expect(refundOrderSchema.safeParse({ number: "O-2026-0007", amount: "-5", reason: "x", idempotencyKey: key }).success).toBe(false);
    expect(refundOrderSchema.safeParse({ number: "O-2026-0007", amount: "5", reason: "  ", idempotencyKey: key }).success).toBe(false);
  });

  it("takes a checkout for a revision and a kind of payment only", () => {
    expect(checkoutRequestSchema.safeParse({ revision: 1, kind: "deposit" }).success).toBe(true);
    expect(checkoutRequestSchema.safeParse({ revision: 0, kind: "full" }).success).toBe(false);
    expect(checkoutRequestSchema.safeParse({ revision: 1, kind: "half" }).success).toBe(false);
  });
});
