/**
 * A shop's API keys: made by the manager with scopes, stored as a hash only, sent as
 * `Authorization: Bearer …`; a key with catalog:read cannot write (403); a revoked key gets 401 at
 * once; every call with a key is in the audit log and moves its last use; each key has its own
 * rate limit (lowered here on purpose); a key works only in its own shop.
 */
import { eq } from "drizzle-orm";
import { afterAll, describe, expect, it, vi } from "vitest";

vi.hoisted(() => {
  vi.stubEnv("API_KEY_RATE_LIMIT_PER_MINUTE", "4");
});

import { createApiKey, revokeApiKey } from "@/app/desk/[shop]/api-keys/actions";
import { GET as listCellsRoute } from "@/app/api/v1/shops/[shop]/cells/route";
import { PATCH as patchCellRoute } from "@/app/api/v1/shops/[shop]/cells/[sku]/route";
import { GET as rulesRoute, PUT as putRulesRoute } from "@/app/api/v1/shops/[shop]/pricing-rules/route";
import { ownerDb as db } from "./owner-db";
import { apiKeys, auditEvents, pricingRuleVersions } from "@/db/schema";
import { hashApiKeySecret } from "@/lib/auth/api-keys";
import { createShop, type TestShop } from "./fixtures";
import { actAs, request } from "./helpers";

afterAll(() => vi.unstubAllEnvs());

const params = <T extends Record<string, string>>(p: T) => ({ params: Promise.resolve(p) });
const bearer = (secret: string) => ({ authorization: `Bearer ${secret}` });

async function makeKey(shop: TestShop, scopes: ("catalog:read" | "catalog:write" | "quotes:read")[]) {
  await actAs(shop.manager.email);
  const r = await createApiKey(shop.slug, { name: `Stock system ${scopes.join("+")}`, scopes });
  if (!r.ok) throw new Error(JSON.stringify(r));
  return r.data;
}

const list = (shop: TestShop, secret: string) =>
  listCellsRoute(request(`/api/v1/shops/${shop.slug}/cells`, { headers: bearer(secret) }), params({ shop: shop.slug }));
const patch = (shop: TestShop, secret: string) =>
  patchCellRoute(
    request(`/api/v1/shops/${shop.slug}/cells/QFS-1200R27`, { method: "PATCH", headers: bearer(secret), body: JSON.stringify({ stock: 3 }) }),
    params({ shop: shop.slug, sku: "QFS-1200R27" }),
  );

describe("API keys", () => {
  it("are made by the manager only, shown once and stored as a SHA-256 of the secret", async () => {
    const shop = await createShop("kestrel");
    await actAs(shop.estimator.email);
    expect(await createApiKey(shop.slug, { name: "Mine", scopes: ["catalog:read"] })).toMatchObject({ ok: false, code: "forbidden" });
    const key = await makeKey(shop, ["catalog:read"]);
    expect(key.secret).toMatch(/^fsk_[A-Za-z0-9_-]{43}$/);
    const [row] = await db.select().from(apiKeys).where(eq(apiKeys.id, key.id));
    // the stored hash is the secret's SHA-256 (FIPS 180-4), never the secret itself
    expect(row?.secretHash).toBe(hashApiKeySecret(key.secret));
    expect(JSON.stringify(row)).not.toContain(key.secret);
    expect(key.secret.startsWith(row!.prefix)).toBe(true);
  });

  it("a key with catalog:read reads but cannot write (403); catalog:write can; every call is audited with the key and moves its last use", async () => {
    const shop = await createShop("kestrel");
    const reader = await makeKey(shop, ["catalog:read"]);
    expect((await list(shop, reader.secret)).status).toBe(200);
    const refused = await patch(shop, reader.secret);
    expect(refused.status).toBe(403);
    expect((await refused.json()).error).toMatch(/scopes/);
    expect(
      (
        await putRulesRoute(
          request(`/api/v1/shops/${shop.slug}/pricing-rules`, { method: "PUT", headers: bearer(reader.secret), body: "{}" }),
          params({ shop: shop.slug }),
        )
      ).status,
    ).toBe(403);
    const writer = await makeKey(shop, ["catalog:write"]);
    expect((await patch(shop, writer.secret)).status).toBe(200);

    const calls = await db.select().from(auditEvents).where(eq(auditEvents.action, "api-key.call"));
    const mine = calls.filter((c) => c.shopId === shop.id);
    expect(mine.map((c) => [c.actorKeyId, c.actorUserId, c.summary]).sort()).toEqual(
      [
        [reader.id, null, `GET /api/v1/shops/${shop.slug}/cells → 200`],
        [reader.id, null, `PATCH /api/v1/shops/${shop.slug}/cells/QFS-1200R27 → 403`],
        [reader.id, null, `PUT /api/v1/shops/${shop.slug}/pricing-rules → 403`],
        [writer.id, null, `PATCH /api/v1/shops/${shop.slug}/cells/QFS-1200R27 → 200`],
      ].sort(),
    );
    // the change itself is recorded as the key's, not as a person's
    const change = (await db.select().from(auditEvents).where(eq(auditEvents.shopId, shop.id))).find((a) => a.action === "catalog-cell.update");
    expect(change).toMatchObject({ actorKeyId: writer.id, actorUserId: null });
    const [row] = await db.select().from(apiKeys).where(eq(apiKeys.id, writer.id));
    expect(row?.lastUsedAt).not.toBeNull();
  });

  it("a revoked key gets 401 on its very next request", async () => {
    const shop = await createShop("kestrel");
    const key = await makeKey(shop, ["catalog:read"]);
    expect((await list(shop, key.secret)).status).toBe(200);
    await actAs(shop.manager.email);
    expect(await revokeApiKey(shop.slug, { id: key.id })).toMatchObject({ ok: true });
    const res = await list(shop, key.secret);
    expect(res.status).toBe(401);
    expect(res.headers.get("www-authenticate")).toBe("Bearer");
    expect(await revokeApiKey(shop.slug, { id: key.id })).toMatchObject({ ok: false, code: "not-found" });
  });

  it("works only in its own shop, and an unknown or malformed key is 401", async () => {
    const [a, b] = await Promise.all([createShop("kestrel"), createShop("marlow")]);
    const key = await makeKey(a, ["catalog:read"]);
    expect((await list(b, key.secret)).status).toBe(401);
    expect((await list(a, `${key.secret.slice(0, -1)}x`)).status).toBe(401);
    expect((await list(a, "not-a-key")).status).toBe(401);
    const noShop = await listCellsRoute(request("/api/v1/shops/no-such-shop/cells", { headers: bearer(key.secret) }), params({ shop: "no-such-shop" }));
    expect(noShop.status).toBe(404);
  });

  it("each key has its own rate limit: past it, 429 with Retry-After, while another key still passes", async () => {
    const shop = await createShop("kestrel");
    const busy = await makeKey(shop, ["catalog:read"]);
    const other = await makeKey(shop, ["catalog:read"]);
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++)
      statuses.push(
        (await rulesRoute(request(`/api/v1/shops/${shop.slug}/pricing-rules`, { headers: bearer(busy.secret) }), params({ shop: shop.slug }))).status,
      );
    expect(statuses).toEqual([200, 200, 200, 200, 429]);
    const limited = await rulesRoute(request(`/api/v1/shops/${shop.slug}/pricing-rules`, { headers: bearer(busy.secret) }), params({ shop: shop.slug }));
    expect(Number(limited.headers.get("retry-after"))).toBeGreaterThan(0);
    expect((await rulesRoute(request(`/api/v1/shops/${shop.slug}/pricing-rules`, { headers: bearer(other.secret) }), params({ shop: shop.slug }))).status).toBe(
      200,
    );
  });

  it("a key with catalog:write saves the pricing rules as a version recorded as the key's", async () => {
    const shop = await createShop("marlow");
    const key = await makeKey(shop, ["catalog:write", "catalog:read"]);
    const got = await (
      await rulesRoute(request(`/api/v1/shops/${shop.slug}/pricing-rules`, { headers: bearer(key.secret) }), params({ shop: shop.slug }))
    ).json();
    expect(got).toMatchObject({ version: 0, rules: { currency: "GBP", depositPercent: 40 } });
    const put = await putRulesRoute(
      request(`/api/v1/shops/${shop.slug}/pricing-rules`, {
        method: "PUT",
        headers: bearer(key.secret),
        body: JSON.stringify({ rules: { ...got.rules, labourRatePerHour: "61.00" }, reason: "Wage round from the ERP", version: 0 }),
      }),
      params({ shop: shop.slug }),
    );
    expect(put.status).toBe(200);
    expect(await put.json()).toMatchObject({ version: 2, reason: "Wage round from the ERP", rules: { labourRatePerHour: "61.00" } });
    const versions = await db.select().from(pricingRuleVersions).where(eq(pricingRuleVersions.shopId, shop.id));
    expect(versions.find((v) => v.version === 2)).toMatchObject({ savedByKeyId: key.id, savedByUserId: null });
  });
});
