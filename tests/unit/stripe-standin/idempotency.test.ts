import { describe, expect, it } from "vitest";
import { IdempotencyStore } from "@/dev/stripe-standin/idempotency";

const result = (n: number) => ({ endpoint: "POST /v1/refunds", fingerprint: `f${n}`, status: 200, body: `{"n":${n}}`, requestId: `req_${n}` });

describe("IdempotencyStore", () => {
  it("forgets a key once its time is up (Stripe keeps keys 24 hours)", () => {
    let now = 0;
    const store = new IdempotencyStore(24 * 3600_000, 100, () => now);
    store.set("sk", "k", result(1));
    now = 24 * 3600_000 - 1;
    expect(store.get("sk", "k")?.body).toBe('{"n":1}');
    now = 24 * 3600_000;
    expect(store.get("sk", "k")).toBeUndefined();
  });

  it("holds at most its bound, dropping the oldest first", () => {
    const store = new IdempotencyStore(3600_000, 3, () => 0);
    for (let i = 1; i <= 5; i++) store.set("sk", `k${i}`, result(i));
    expect(store.size).toBe(3);
    expect(store.get("sk", "k1")).toBeUndefined();
    expect(store.get("sk", "k2")).toBeUndefined();
    expect(store.get("sk", "k5")?.requestId).toBe("req_5");
  });

  it("drops expired keys when new ones arrive, so the store does not grow with old keys", () => {
    let now = 0;
    const store = new IdempotencyStore(1000, 100, () => now);
    for (let i = 0; i < 50; i++) store.set("sk", `old${i}`, result(i));
    now = 2000;
    store.set("sk", "new", result(99));
    expect(store.size).toBe(1);
  });

  it("keeps keys of different API keys apart", () => {
    const store = new IdempotencyStore(1000, 10, () => 0);
    store.set("sk_a", "k", result(1));
    expect(store.get("sk_b", "k")).toBeUndefined();
  });
});
