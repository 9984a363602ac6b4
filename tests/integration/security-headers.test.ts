/**
 * Headers and cross-site writes: pages get a Content-Security-Policy with a fresh script nonce
 * (proxy.ts) that Next.js also receives on the request; every response gets the static security
 * headers (next.config.ts); a state-changing route handler refuses a write sent by another site
 * with 403 JSON, before it reads the body or touches the database.
 */
import { count, eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { describe, expect, it } from "vitest";
import { GET as membersRoute } from "@/app/api/v1/shops/[shop]/members/route";
import { POST as uploadRoute } from "@/app/api/v1/shops/[shop]/attachments/route";
import { ownerDb as db } from "./owner-db";
import { requestAttachments as attachments } from "@/db/schema";
import { demoPeople } from "@/db/seed/people";
import { env } from "@/lib/env";
import nextConfig from "@/next.config";
import { proxy } from "@/proxy";
import { request, sessionCookie, shopBySlug } from "./helpers";

const K = "kestrel-bank-works";
const kCustomer = demoPeople[K].customers[0].email;
const PDF = Buffer.from("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n", "latin1");
const params = { params: Promise.resolve({ shop: K }) };

const nonceOf = (policy: string | null) => /'nonce-([^']+)'/.exec(policy ?? "")?.[1];

describe("page headers", () => {
  it("every page gets a policy with a nonce of its own, and Next.js sees the same policy on the request", async () => {
    const a = await proxy(new NextRequest(`${env.APP_URL}/s/${K}`));
    const b = await proxy(new NextRequest(`${env.APP_URL}/s/${K}`));
    const policy = a.headers.get("content-security-policy");
    expect(nonceOf(policy)).toBeTruthy();
    expect(nonceOf(policy)).not.toBe(nonceOf(b.headers.get("content-security-policy")));
    expect(policy).toContain("frame-ancestors 'none'");
    // NextResponse.next({ request: { headers } }) passes request headers on as x-middleware-request-*
    expect(a.headers.get("x-middleware-request-content-security-policy")).toBe(policy);
    expect(a.headers.get("x-middleware-request-x-nonce")).toBe(nonceOf(policy));
  });

  it("JSON answers get a policy that loads nothing and sits in no frame", async () => {
    expect((await proxy(new NextRequest(`${env.APP_URL}/api/v1/shops/${K}/members`))).headers.get("content-security-policy")).toBe(
      "default-src 'none'; frame-ancestors 'none'",
    );
  });

  it("every response gets nosniff, a referrer policy, a permissions policy and no framing", async () => {
    const rules = (await nextConfig.headers?.()) ?? [];
    const all = rules.find((r) => r.source === "/:path*");
    const headers = new Map(all?.headers.map((h) => [h.key.toLowerCase(), h.value]));
    expect(headers.get("x-content-type-options")).toBe("nosniff");
    expect(headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
    expect(headers.get("permissions-policy")).toContain("camera=()");
    expect(headers.get("x-frame-options")).toBe("DENY");
  });
});

describe("cross-site writes to route handlers", () => {
  async function upload(headers: Record<string, string>) {
    const form = new FormData();
    form.set("file", new File([new Uint8Array(PDF)], "spec.pdf"));
    return uploadRoute(request(`/api/v1/shops/${K}/attachments`, { method: "POST", body: form, cookie: await sessionCookie(kCustomer), headers }), params);
  }
  const stored = async () =>
    (
      await db
        .select({ n: count() })
        .from(attachments)
        .where(eq(attachments.shopId, (await shopBySlug(K)).id))
    )[0]?.n ?? 0;

  it.each([
    ["another site's Origin", { origin: "https://evil.example" }],
    ["a look-alike Origin", { origin: `${env.APP_URL}.evil.example` }],
    ["an opaque Origin", { origin: "null" }],
    ["a cross-site fetch that names no Origin", { "sec-fetch-site": "cross-site" }],
  ])("refuses an upload with %s: 403 JSON, nothing stored", async (_label, headers) => {
    const before = await stored();
    const res = await upload(headers);
    expect(res.status).toBe(403);
    expect(await res.json()).toMatchObject({ error: expect.any(String) });
    expect(await stored()).toBe(before);
  });

  it("takes the upload from the app's own pages and from programs that send no Origin", async () => {
    expect((await upload({ origin: new URL(env.APP_URL).origin })).status).toBe(201);
    expect((await upload({})).status).toBe(201);
  });

  it("leaves reads alone whatever their Origin", async () => {
    const res = await membersRoute(
      request(`/api/v1/shops/${K}/members`, { cookie: await sessionCookie(demoPeople[K].manager.email), headers: { origin: "https://evil.example" } }),
      params,
    );
    expect(res.status).toBe(200);
  });
});
