import Stripe from "stripe";
import { describe, expect, it } from "vitest";
import { ordered, retryDelayMs, signatureHeader } from "@/dev/stripe-standin/webhooks";

// Outside check: the pinned official SDK's own signing and verification.
const sdk = new Stripe("sk_test_unit", {});
const secret = "whsec_unit_test_secret";
const payload = JSON.stringify({ id: "evt_1", object: "event", type: "checkout.session.completed" }, null, 2);

describe("signatureHeader", () => {
  it("is the header the SDK generates for the same payload, secret and time", () => {
    const timestamp = 1_800_000_000;
    expect(signatureHeader(payload, secret, timestamp)).toBe(sdk.webhooks.generateTestHeaderString({ payload, secret, timestamp }));
  });

  it("verifies with the SDK's constructEvent within its 300 s tolerance and not after", () => {
    const now = Math.floor(Date.now() / 1000);
    expect(sdk.webhooks.constructEvent(payload, signatureHeader(payload, secret, now), secret).id).toBe("evt_1");
    expect(() => sdk.webhooks.constructEvent(payload, signatureHeader(payload, secret, now - 301), secret)).toThrow(/tolerance/);
  });
});

describe("retryDelayMs", () => {
  it.each([
    [1, 1000],
    [2, 2000],
    [3, 4000],
    [7, 64000],
    [8, 120000],
    [20, 120000],
  ])("after failed attempt %i waits %i ms (1 s doubling, capped at 2 min)", (attempt, ms) => {
    expect(retryDelayMs({ maxAttempts: 8, initialDelayMs: 1000, maxDelayMs: 120_000, timeoutMs: 10_000 }, attempt)).toBe(ms);
  });
});

describe("ordered", () => {
  it("keeps, reverses or shuffles without losing or adding events", () => {
    const items = ["a", "b", "c", "d", "e"];
    expect(ordered(items, "created")).toEqual(items);
    expect(ordered(items, "reverse")).toEqual(["e", "d", "c", "b", "a"]);
    expect([...ordered(items, "shuffle")].sort()).toEqual(items);
    expect(items).toEqual(["a", "b", "c", "d", "e"]);
  });
});
