import { describe, expect, it } from "vitest";
import { clientKey, createRateLimiter } from "@/lib/http/rate-limit";

describe("rate limiter", () => {
  it("allows the limit per window, refuses the next with the seconds to wait, and opens again", () => {
    const l = createRateLimiter({ limit: 3, windowMs: 60_000 });
    expect(l.hit("a", 0)).toEqual({ allowed: true, remaining: 2 });
    l.hit("a", 1000);
    l.hit("a", 2000);
    expect(l.hit("a", 30_000)).toEqual({ allowed: false, retryAfterSeconds: 30 });
    expect(l.hit("b", 30_000)).toMatchObject({ allowed: true });
    expect(l.hit("a", 60_000)).toMatchObject({ allowed: true });
  });
  it("keys a client by its first forwarded address", () => {
    expect(clientKey(new Headers({ "x-forwarded-for": "10.0.0.1, 10.0.0.2" }))).toBe("10.0.0.1");
    expect(clientKey(new Headers())).toBe("direct");
  });
});
