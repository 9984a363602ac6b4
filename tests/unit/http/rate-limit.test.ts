import { describe, expect, it } from "vitest";
import { createRateLimiter, memoryRateLimitStore } from "@/lib/http/rate-limit";

describe("rate limiter", () => {
  it("allows the limit per window, refuses the next with the seconds to wait, and opens again", async () => {
    let now = 0;
    const l = createRateLimiter({ name: "t", limit: 3, windowSeconds: 60, store: memoryRateLimitStore(() => now) });
    expect(await l.hit("a")).toEqual({ allowed: true, remaining: 2 });
    now = 1000;
    await l.hit("a");
    now = 2000;
    await l.hit("a");
    now = 30_000;
    expect(await l.hit("a")).toEqual({ allowed: false, retryAfterSeconds: 30 });
    expect(await l.hit("b")).toMatchObject({ allowed: true });
    now = 60_000;
    expect(await l.hit("a")).toMatchObject({ allowed: true });
  });

  it("counts every caller without a trusted address in one shared bucket", async () => {
    const l = createRateLimiter({ name: "t", limit: 2, windowSeconds: 60, store: memoryRateLimitStore(() => 0) });
    await l.hit(null);
    await l.hit(null);
    expect(await l.hit(null)).toMatchObject({ allowed: false });
    expect(await l.hit("198.51.100.7")).toMatchObject({ allowed: true });
  });

  it("keeps two limiters on one store apart by name", async () => {
    const store = memoryRateLimitStore(() => 0);
    const a = createRateLimiter({ name: "a", limit: 1, windowSeconds: 60, store });
    const b = createRateLimiter({ name: "b", limit: 1, windowSeconds: 60, store });
    await a.hit("x");
    expect(await a.hit("x")).toMatchObject({ allowed: false });
    expect(await b.hit("x")).toMatchObject({ allowed: true });
  });
});
