import { describe, expect, it } from "vitest";
import { clientAddress } from "@/lib/http/client-address";

// Forwarding semantics from RFC 7239 §5.2 and the de-facto X-Forwarded-For convention: each
// proxy appends the address it received the request from, so only the right-most entries written
// by proxies we run can be believed. Addresses from the documentation ranges of RFC 5737 (IPv4)
// and RFC 3849 (IPv6).
const served = { trustedProxies: [] as string[], peerAppended: true };
const behindLoopbackProxy = { trustedProxies: ["127.0.0.1", "::1"], peerAppended: true };
const h = (xff?: string, realIp?: string) => {
  const headers = new Headers();
  if (xff !== undefined) headers.set("x-forwarded-for", xff);
  if (realIp !== undefined) headers.set("x-real-ip", realIp);
  return headers;
};

describe("client address", () => {
  it.each([
    ["the connection alone", h("203.0.113.9"), served, "203.0.113.9"],
    ["a forged hop before the connection", h("198.51.100.1, 203.0.113.9"), served, "203.0.113.9"],
    ["a forged X-Real-IP from an untrusted connection", h("203.0.113.9", "198.51.100.1"), served, "203.0.113.9"],
    ["an IPv4-mapped IPv6 connection", h("::ffff:203.0.113.9"), served, "203.0.113.9"],
    ["an IPv6 connection, by its /64", h("2001:db8:1:2:aaaa::1"), served, "2001:db8:1:2::"],
    ["a bracketed IPv6 connection", h("[2001:db8:1:2::7]"), served, "2001:db8:1:2::"],
    ["the client a trusted proxy saw", h("198.51.100.7, 127.0.0.1"), behindLoopbackProxy, "198.51.100.7"],
    ["the client a trusted proxy saw, past a forged hop", h("6.6.6.6, 198.51.100.7, 127.0.0.1"), behindLoopbackProxy, "198.51.100.7"],
    ["X-Real-IP from a trusted proxy that sent no chain", h("127.0.0.1", "198.51.100.7"), behindLoopbackProxy, "198.51.100.7"],
    ["the proxy itself when it names nobody", h("127.0.0.1"), behindLoopbackProxy, "127.0.0.1"],
    ["a CIDR range of proxies", h("6.6.6.6, 198.51.100.7, 10.1.2.3, 10.9.9.9"), { trustedProxies: ["10.0.0.0/8"], peerAppended: true }, "198.51.100.7"],
    ["a trusted proxy in front of plain next start", h("6.6.6.6, 198.51.100.7"), { trustedProxies: ["10.0.0.0/8"], peerAppended: false }, "198.51.100.7"],
  ])("%s", (_label, headers, options, expected) => {
    expect(clientAddress(headers, options)).toBe(expected);
  });

  it.each([
    ["no header at all", h(), served],
    ["an unreadable hop next to a trusted proxy", h("not-an-address, 127.0.0.1"), behindLoopbackProxy],
    ["plain next start with no trusted proxy, whatever the header says", h("203.0.113.9"), { trustedProxies: [], peerAppended: false }],
  ])("answers null (one shared bucket) for %s", (_label, headers, options) => {
    expect(clientAddress(headers, options)).toBeNull();
  });

  it("gives thirty forged X-Forwarded-For values from one connection one key", () => {
    const keys = new Set(Array.from({ length: 30 }, (_, i) => clientAddress(h(`198.51.100.${i + 1}, 203.0.113.9`, `198.51.100.${i + 1}`), served)));
    expect([...keys]).toEqual(["203.0.113.9"]);
  });
});
