/**
 * The quote API: a customer (or staff for a named customer) makes a quote from a chosen option
 * with an idempotency key; the latest revision and any given one read back as JSON in the shapes
 * lib/validation/quote-api.ts exports; only the quote's customer and the shop's staff see it.
 */
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { createApiKey } from "@/app/desk/[shop]/api-keys/actions";
import { POST as createRoute } from "@/app/api/v1/shops/[shop]/quotes/route";
import { GET as quoteRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/route";
import { GET as revisionRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/revisions/[n]/route";
import { ownerDb as db } from "./owner-db";
import { getQuoteByNumber } from "@/db/queries/quotes";
import { quotes, shopSettings } from "@/db/schema";
import { issueQuoteRevision } from "@/lib/quoting/issue-revision";
import { NO_OVERRIDES } from "@/lib/quoting/review-search";
import { quoteCreatedResponseSchema, quoteInReviewResponseSchema, quoteRevisionResponseSchema } from "@/lib/validation/quote-api";
import { issueRevisionSchema } from "@/lib/validation/workbench";
import { cheapestOption, contextOf, createShop, KESTREL_REQUIREMENT, type TestShop } from "./fixtures";
import { actAs, request, sessionCookie } from "./helpers";

async function post(shop: TestShop, email: string, body: unknown) {
  return createRoute(request(`/api/v1/shops/${shop.slug}/quotes`, { method: "POST", cookie: await sessionCookie(email), body: JSON.stringify(body) }), {
    params: Promise.resolve({ shop: shop.slug }),
  });
}
async function get(shop: TestShop, email: string, number: string, n?: number) {
  const cookie = await sessionCookie(email);
  return n === undefined
    ? quoteRoute(request(`/api/v1/shops/${shop.slug}/quotes/${number}`, { cookie }), { params: Promise.resolve({ shop: shop.slug, number }) })
    : revisionRoute(request(`/api/v1/shops/${shop.slug}/quotes/${number}/revisions/${n}`, { cookie }), {
        params: Promise.resolve({ shop: shop.slug, number, n: String(n) }),
      });
}
async function choice(shop: TestShop) {
  const o = await cheapestOption(shop.id, KESTREL_REQUIREMENT);
  return { option: o, choice: { sku: o.cell.sku, topology: o.topology, seriesCount: o.seriesCount, parallelCount: o.parallelCount } };
}

describe("POST /api/v1/shops/{shop}/quotes", () => {
  it("makes a quote for the signed-in customer; the same key and body answer it again, another body is a conflict", async () => {
    const shop = await createShop("kestrel");
    const { option, choice: c } = await choice(shop);
    const body = { requirement: KESTREL_REQUIREMENT, choice: c, idempotencyKey: "erp-order-4711" };
    const first = await post(shop, shop.customers[0].email, body);
    expect(first.status).toBe(201);
    const made = quoteCreatedResponseSchema.parse(await first.json());
    expect(made).toEqual({ number: expect.stringMatching(/^Q-\d{4}-0001$/), revision: 1, total: { amount: option.price!.amount, currency: "EUR" } });
    const again = await post(shop, shop.customers[0].email, { ...body, requirement: { ...KESTREL_REQUIREMENT } });
    expect(again.status).toBe(201);
    expect(again.headers.get("idempotent-replayed")).toBe("true");
    expect(await again.json()).toEqual(made);
    const other = await post(shop, shop.customers[0].email, { ...body, requirement: { ...KESTREL_REQUIREMENT, quantity: 2 } });
    expect(other.status).toBe(409);
    expect((await db.select({ id: quotes.id }).from(quotes).where(eq(quotes.shopId, shop.id))).length).toBe(1);
  });

  it("answers 202 with the request when the shop reviews it first", async () => {
    const shop = await createShop("kestrel");
    await db
      .update(shopSettings)
      .set({ autoQuoteLimits: { maxVoltage: 40, maxStoredEnergy: 2_000_000, maxCellCount: 400 } })
      .where(eq(shopSettings.shopId, shop.id));
    const { choice: c } = await choice(shop);
    const body = { requirement: KESTREL_REQUIREMENT, choice: c, idempotencyKey: "erp-order-4712", notes: "Rack mounted" };
    const res = await post(shop, shop.customers[0].email, body);
    expect(res.status).toBe(202);
    const review = quoteInReviewResponseSchema.parse(await res.json());
    const again = await post(shop, shop.customers[0].email, body);
    expect([again.status, await again.json()]).toEqual([202, review]);
  });

  it("staff quote for a customer they name; a customer quotes only for themselves; a bad body is a 400 naming the field", async () => {
    const shop = await createShop("kestrel");
    const { choice: c } = await choice(shop);
    const base = { requirement: KESTREL_REQUIREMENT, choice: c };
    const staff = await post(shop, shop.estimator.email, { ...base, idempotencyKey: "staff-0001", customerEmail: shop.customers[1].email });
    expect(staff.status).toBe(201);
    const { number } = quoteCreatedResponseSchema.parse(await staff.json());
    expect((await getQuoteByNumber(shop.id, number))?.customerUserId).toBe(shop.customers[1].id);
    expect((await post(shop, shop.estimator.email, { ...base, idempotencyKey: "staff-0002" })).status).toBe(400);
    expect((await post(shop, shop.estimator.email, { ...base, idempotencyKey: "staff-0003", customerEmail: shop.manager.email })).status).toBe(400);
    expect((await post(shop, shop.customers[0].email, { ...base, idempotencyKey: "cust-00001", customerEmail: shop.customers[1].email })).status).toBe(403);
    const bad = await post(shop, shop.customers[0].email, { ...base, requirement: { ...KESTREL_REQUIREMENT, maxVoltage: 5e6 }, idempotencyKey: "cust-00002" });
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { issues: { path: string }[] }).issues.map((i) => i.path)).toEqual(["requirement.maxVoltage"]);
    expect((await post(shop, shop.customers[0].email, { ...base, idempotencyKey: "short" })).status).toBe(400);
  });
});

describe("GET /api/v1/shops/{shop}/quotes/{number}[/revisions/{n}]", () => {
  it("answers the latest revision and any given one, with their states, to the quote's customer and the staff only", async () => {
    const shop = await createShop("kestrel");
    const { choice: c } = await choice(shop);
    const made = quoteCreatedResponseSchema.parse(
      await (await post(shop, shop.customers[0].email, { requirement: KESTREL_REQUIREMENT, choice: c, idempotencyKey: "erp-order-5000" })).json(),
    );
    const quote = await getQuoteByNumber(shop.id, made.number);
    const r = await issueQuoteRevision(
      contextOf(shop, shop.estimator, "estimator"),
      issueRevisionSchema.parse({
        requestId: quote!.requestId,
        basedOnRevision: 1,
        draft: {
          bank: { kind: "engine", choice: c, overrides: NO_OVERRIDES },
          bankPrice: null,
          lines: [{ kind: "freight", description: "Freight", quantity: "1", unit: "lot", unitPrice: "90.00" }],
          discount: null,
          validityDays: 14,
          note: "",
        },
      }),
    );
    expect(r.ok).toBe(true);
    const latest = quoteRevisionResponseSchema.parse(await (await get(shop, shop.customers[0].email, made.number)).json());
    expect(latest).toMatchObject({ number: made.number, revision: 2, state: "sent", quoteState: "sent", latestRevision: 2 });
    expect(latest.lines.map((l) => [l.code, l.amount.currency])).toEqual([
      ["bank", "EUR"],
      ["freight", "EUR"],
    ]);
    expect(latest.revisions.map((x) => [x.revision, x.state])).toEqual([
      [1, "superseded"],
      [2, "sent"],
    ]);
    // sell prices only: nothing of the shop's cost build-up
    expect(JSON.stringify(latest)).not.toMatch(/marginPct|labour|overhead|unitCost/);
    const first = quoteRevisionResponseSchema.parse(await (await get(shop, shop.estimator.email, made.number, 1)).json());
    expect([first.revision, first.state, first.totals.total]).toEqual([1, "superseded", made.total]);
    expect((await get(shop, shop.customers[0].email, made.number, 3)).status).toBe(404);
    expect((await get(shop, shop.customers[1].email, made.number)).status).toBe(404);
    expect((await get(shop, shop.customers[1].email, made.number, 1)).status).toBe(404);
    expect((await get(shop, shop.customers[0].email, "Q-1999-0001")).status).toBe(404);
  });
});

describe("the quote API with a shop's API key", () => {
  it("quotes:read reads any of the shop's quotes but cannot make one (403); quotes:write makes one for a named customer", async () => {
    const shop = await createShop("kestrel");
    const { choice: c } = await choice(shop);
    await actAs(shop.manager.email);
    const keys = await Promise.all(
      (["quotes:read", "quotes:write"] as const).map(async (scope) => {
        const r = await createApiKey(shop.slug, { name: `Order system ${scope}`, scopes: [scope] });
        if (!r.ok) throw new Error(JSON.stringify(r));
        return r.data.secret;
      }),
    );
    const [reader, writer] = keys as [string, string];
    const byKey = (secret: string, body: unknown) =>
      createRoute(
        request(`/api/v1/shops/${shop.slug}/quotes`, { method: "POST", headers: { authorization: `Bearer ${secret}` }, body: JSON.stringify(body) }),
        {
          params: Promise.resolve({ shop: shop.slug }),
        },
      );
    const body = { requirement: KESTREL_REQUIREMENT, choice: c, idempotencyKey: "erp-order-9001", customerEmail: shop.customers[1].email };
    expect((await byKey(reader, body)).status).toBe(403);
    const made = await byKey(writer, body);
    expect(made.status).toBe(201);
    const { number } = quoteCreatedResponseSchema.parse(await made.json());
    expect((await getQuoteByNumber(shop.id, number))?.customerUserId).toBe(shop.customers[1].id);
    const read = await quoteRoute(request(`/api/v1/shops/${shop.slug}/quotes/${number}`, { headers: { authorization: `Bearer ${reader}` } }), {
      params: Promise.resolve({ shop: shop.slug, number }),
    });
    expect(read.status).toBe(200);
    expect(quoteRevisionResponseSchema.parse(await read.json())).toMatchObject({ number, revision: 1, state: "sent" });
  });
});
