import { describe, expect, it } from "vitest";
import { contentSecurityPolicy, createNonce, urlHasNulByte } from "@/lib/http/security-headers";

const directives = (policy: string) =>
  new Map(
    policy
      .split(";")
      .map((d) => d.trim().split(/\s+/))
      .map(([name, ...values]) => [name, values]),
  );

// Directive names and keywords from CSP Level 3 (W3C), §6.
describe("the page Content-Security-Policy", () => {
  const nonce = createNonce();
  const csp = directives(contentSecurityPolicy(nonce));

  it("runs scripts only with this request's nonce, never inline or from elsewhere", () => {
    expect(csp.get("script-src")).toContain(`'nonce-${nonce}'`);
    expect(csp.get("script-src")).not.toContain("'unsafe-inline'");
    expect(csp.get("script-src")).not.toContain("'unsafe-eval'");
    expect(csp.get("script-src")?.some((v) => v.includes("*") || v.startsWith("http"))).toBe(false);
    expect(csp.get("object-src")).toEqual(["'none'"]);
    expect(csp.get("base-uri")).toEqual(["'self'"]);
  });

  it("lets no other site frame the page and posts forms only to the app", () => {
    expect(csp.get("frame-ancestors")).toEqual(["'none'"]);
    expect(csp.get("form-action")).toEqual(["'self'"]);
  });

  it("allows eval only in development, and upgrades requests only over https", () => {
    expect(directives(contentSecurityPolicy(nonce, { development: true })).get("script-src")).toContain("'unsafe-eval'");
    expect(csp.has("upgrade-insecure-requests")).toBe(false);
    expect(directives(contentSecurityPolicy(nonce, { https: true })).has("upgrade-insecure-requests")).toBe(true);
  });

  it("gives each request a nonce of its own, 128 bits of it", () => {
    const nonces = new Set(Array.from({ length: 100 }, createNonce));
    expect(nonces.size).toBe(100);
    for (const n of nonces) expect(Buffer.from(n, "base64")).toHaveLength(16);
  });
});

describe("NUL in a URL", () => {
  it.each([
    ["/s/%00", true],
    ["/s/x?q=%00", true],
    ["/s/x?q=a%00b", true],
    ["/s/x?q=%2500", false],
    ["/s/x?q=%0", false],
    ["/s/x", false],
  ])("%s → %s", (url, expected) => {
    expect(urlHasNulByte(url)).toBe(expected);
  });
});
