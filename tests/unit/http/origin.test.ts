import { describe, expect, it } from "vitest";
import { crossOriginRefusal } from "@/lib/http/origin";

// Origin: RFC 6454 §7 (serialized as scheme://host[:port], or "null"); Sec-Fetch-Site: W3C Fetch
// Metadata Request Headers §2.1 ("cross-site", "same-origin", "same-site", "none").
const APP = ["http://127.0.0.1:3000"];
const req = (method: string, headers: Record<string, string>) => new Request("http://127.0.0.1:3000/api/v1/shops/x/attachments", { method, headers });

describe("cross-origin writes", () => {
  it.each([
    ["the app's own origin", "POST", { origin: "http://127.0.0.1:3000" }],
    ["a program that sends no Origin", "POST", {}],
    ["a same-origin fetch that names no Origin", "POST", { "sec-fetch-site": "same-origin" }],
    ["a read from anywhere", "GET", { origin: "https://evil.example" }],
  ])("lets %s through", (_label, method, headers) => {
    expect(crossOriginRefusal(req(method, headers), APP)).toBeNull();
  });

  it.each([
    ["another site", "POST", { origin: "https://evil.example" }],
    ["a look-alike host", "POST", { origin: "http://127.0.0.1.evil.example:3000" }],
    ["another port", "PUT", { origin: "http://127.0.0.1:3001" }],
    ["https for http", "DELETE", { origin: "https://127.0.0.1:3000" }],
    ["an opaque origin", "POST", { origin: "null" }],
    ["an origin with a path", "POST", { origin: "http://127.0.0.1:3000/evil" }],
    ["a cross-site fetch without Origin", "POST", { "sec-fetch-site": "cross-site" }],
    ["a sibling site without Origin", "PATCH", { "sec-fetch-site": "same-site" }],
  ])("refuses %s with 403 JSON", async (_label, method, headers) => {
    const res = crossOriginRefusal(req(method, headers), APP);
    expect(res?.status).toBe(403);
    expect(await res?.json()).toMatchObject({ error: expect.any(String) });
  });
});
