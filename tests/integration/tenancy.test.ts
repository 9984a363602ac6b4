/**
 * A member of one shop can neither read nor change another shop's rows through any route
 * handler, server action or scoped query. Later work adds its handlers and actions to the lists
 * below; every entry is exercised.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as listMembersRoute } from "@/app/api/v1/shops/[shop]/members/route";
import { GET as downloadAttachmentRoute } from "@/app/api/v1/shops/[shop]/attachments/[id]/route";
import { POST as uploadAttachmentRoute } from "@/app/api/v1/shops/[shop]/attachments/route";
import { GET as quotePdfRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/pdf/route";
import { GET as listQuotesRoute } from "@/app/api/v1/shops/[shop]/quotes/route";
import { changeMemberRole } from "@/app/desk/[shop]/team/actions";
import { chooseArrangement, exploreArrangements } from "@/app/s/[shop]/actions";
import { db } from "@/db";
import { getMember, listMembers, updateMemberRole } from "@/db/queries/members";
import { listActiveCells, listCatalogCells } from "@/db/queries/catalog";
import { getShopSettings } from "@/db/queries/shops";
import { getQuoteByNumber, listQuotes } from "@/db/queries/quotes";
import { getRequest, listRequests } from "@/db/queries/requests";
import { bankRequests, members, quotes } from "@/db/schema";
import { demoPeople } from "@/db/seed/people";
import { requestList } from "@/lib/validation/lists";
import { EMPTY_REQUEST_FORM } from "@/lib/validation/request-form";
import { actAs, memberOf, request, sessionCookie, shopBySlug } from "./helpers";

const K = "kestrel-bank-works";
const M = "marlow-pulse";
const kManager = demoPeople[K].manager.email;
const kEstimator = demoPeople[K].estimator.email;
const kCustomer = demoPeople[K].customers[0].email;
const mEstimator = demoPeople[M].estimator.email;

const params = (shop: string) => ({ params: Promise.resolve({ shop }) });

/** Route handlers that exist: each must refuse a member of the other shop. */
const ROUTES: { name: string; call: (shop: string, cookie: string) => Promise<Response> }[] = [
  { name: "GET /api/v1/shops/{shop}/members", call: (shop, cookie) => listMembersRoute(request(`/api/v1/shops/${shop}/members`, { cookie }), params(shop)) },
  { name: "GET /api/v1/shops/{shop}/quotes", call: (shop, cookie) => listQuotesRoute(request(`/api/v1/shops/${shop}/quotes`, { cookie }), params(shop)) },
];

describe("tenancy", () => {
  let kShopId = "";
  let mShopId = "";
  beforeAll(async () => {
    kShopId = (await shopBySlug(K)).id;
    mShopId = (await shopBySlug(M)).id;
  });

  describe.each(ROUTES)("$name", ({ call }) => {
    it("answers 401 when signed out", async () => {
      expect((await call(M, "")).status).toBe(401);
    });
    it("answers 403 to a manager of the other shop, and 200 in their own", async () => {
      const cookie = await sessionCookie(kManager);
      const foreign = await call(M, cookie);
      expect(foreign.status).toBe(403);
      expect(await foreign.json()).toHaveProperty("error");
      expect((await call(K, cookie)).status).toBe(200);
    });
    it("answers 404 for a shop that does not exist", async () => {
      expect((await call("no-such-shop", await sessionCookie(kManager))).status).toBe(404);
    });
  });

  it("the members route lists only the shop's own members", async () => {
    const res = await listMembersRoute(request(`/api/v1/shops/${K}/members?size=100`, { cookie: await sessionCookie(kManager) }), params(K));
    const body = (await res.json()) as { rows: { email: string }[]; total: number };
    expect(body.rows.map((r) => r.email)).toContain(kCustomer);
    expect(body.rows.map((r) => r.email)).not.toContain(mEstimator);
    expect(body.total).toBe(body.rows.length);
  });

  it("the members route refuses an estimator (403) and a bad query (400)", async () => {
    expect((await listMembersRoute(request(`/api/v1/shops/${K}/members`, { cookie: await sessionCookie(kEstimator) }), params(K))).status).toBe(403);
    expect((await listMembersRoute(request(`/api/v1/shops/${K}/members?sort=password`, { cookie: await sessionCookie(kManager) }), params(K))).status).toBe(400);
  });

  describe("server action changeMemberRole", () => {
    it("refuses a manager of another shop, and leaves the row alone", async () => {
      const target = await memberOf(M, mEstimator);
      await actAs(kManager);
      const r = await changeMemberRole(M, { memberId: target.id, role: "customer" });
      expect(r).toMatchObject({ ok: false, code: "forbidden" });
      expect((await memberOf(M, mEstimator)).role).toBe("estimator");
    });

    it("answers not-found for another shop's member id sent through one's own shop", async () => {
      const target = await memberOf(M, mEstimator);
      await actAs(kManager);
      const r = await changeMemberRole(K, { memberId: target.id, role: "customer" });
      expect(r).toMatchObject({ ok: false, code: "not-found" });
      expect((await memberOf(M, mEstimator)).role).toBe("estimator");
    });

    it("refuses a signed-out caller and an estimator", async () => {
      const target = await memberOf(K, kCustomer);
      await actAs(null);
      expect(await changeMemberRole(K, { memberId: target.id, role: "estimator" })).toMatchObject({ ok: false, code: "unauthenticated" });
      await actAs(kEstimator);
      expect(await changeMemberRole(K, { memberId: target.id, role: "estimator" })).toMatchObject({ ok: false, code: "forbidden" });
      expect((await memberOf(K, kCustomer)).role).toBe("customer");
    });

    it("refuses a role outside estimator/customer at the field", async () => {
      const target = await memberOf(K, kCustomer);
      await actAs(kManager);
      const r = await changeMemberRole(K, { memberId: target.id, role: "manager" });
      expect(r).toMatchObject({ ok: false, code: "invalid" });
      if (!r.ok) expect(Object.keys(r.fieldErrors ?? {})).toEqual(["role"]);
    });

    it("lets the shop's manager move a customer to estimator and back", async () => {
      const target = await memberOf(K, kCustomer);
      await actAs(kManager);
      expect(await changeMemberRole(K, { memberId: target.id, role: "estimator" })).toMatchObject({ ok: true, data: { role: "estimator" } });
      expect((await memberOf(K, kCustomer)).role).toBe("estimator");
      expect(await changeMemberRole(K, { memberId: target.id, role: "customer" })).toMatchObject({ ok: true });
      expect((await memberOf(K, kCustomer)).role).toBe("customer");
    });

    it("will not change a manager's own role", async () => {
      const self = await memberOf(K, kManager);
      await actAs(kManager);
      expect(await changeMemberRole(K, { memberId: self.id, role: "customer" })).toMatchObject({ ok: false, code: "forbidden" });
    });
  });

  describe("quote PDF and attachment routes", () => {
    // A Kestrel quote and attachment, reached by a Marlow member through either shop's URL.
    const PDF_BYTES = Buffer.from("%PDF-1.4\n%%EOF\n", "latin1");
    it("another shop's staff get 403 through this shop's URL and 404 through their own", async () => {
      const kCookie = await sessionCookie(kCustomer);
      const form = new FormData();
      form.set("file", new File([new Uint8Array(PDF_BYTES)], "spec.pdf"));
      const up = await uploadAttachmentRoute(request(`/api/v1/shops/${K}/attachments`, { method: "POST", body: form, cookie: kCookie }), params(K));
      expect(up.status).toBe(201);
      const { id } = (await up.json()) as { id: string };
      const mCookie = await sessionCookie(mEstimator);
      const at = (shop: string) => ({ params: Promise.resolve({ shop, id }) });
      expect((await downloadAttachmentRoute(request(`/api/v1/shops/${M}/attachments/${id}`, { cookie: mCookie }), at(M))).status).toBe(404);
      expect((await downloadAttachmentRoute(request(`/api/v1/shops/${K}/attachments/${id}`, { cookie: mCookie }), at(K))).status).toBe(403);
      const mForm = new FormData();
      mForm.set("file", new File([new Uint8Array(PDF_BYTES)], "spec.pdf"));
      expect((await uploadAttachmentRoute(request(`/api/v1/shops/${M}/attachments`, { method: "POST", body: mForm, cookie: kCookie }), params(M))).status).toBe(403);
      // a Kestrel quote number that Marlow does not also have
      const kNumbers = await db.select({ number: quotes.number }).from(quotes).where(eq(quotes.shopId, kShopId));
      const mNumbers = new Set((await db.select({ number: quotes.number }).from(quotes).where(eq(quotes.shopId, mShopId))).map((r) => r.number));
      const kQuote = kNumbers.find((r) => !mNumbers.has(r.number));
      expect(kQuote).toBeDefined();
      const number = kQuote?.number ?? "";
      const num = (shop: string) => ({ params: Promise.resolve({ shop, number }) });
      expect((await quotePdfRoute(request(`/api/v1/shops/${M}/quotes/${number}/pdf`, { cookie: mCookie }), num(M))).status).toBe(404);
      expect((await quotePdfRoute(request(`/api/v1/shops/${K}/quotes/${number}/pdf`, { cookie: mCookie }), num(K))).status).toBe(403);
    });

    it("list queries for quotes and requests return only the shop's own rows", async () => {
      const q = { q: "", status: "all" as const, sort: "created" as const, dir: "desc" as const, page: 1, size: 100 };
      const k = await listQuotes(kShopId, { all: true }, q);
      const m = await listQuotes(mShopId, { all: true }, q);
      const mIds = new Set(m.rows.map((r) => r.id));
      expect(k.rows.some((r) => mIds.has(r.id))).toBe(false);
      const kr = await listRequests(kShopId, requestList.parse({ size: "100" }).query);
      const mr = await listRequests(mShopId, requestList.parse({ size: "100" }).query);
      const mrIds = new Set(mr.rows.map((r) => r.id));
      expect(kr.rows.some((r) => mrIds.has(r.id))).toBe(false);
      for (const r of kr.rows) expect(await getRequest(mShopId, r.id)).toBeNull();
      for (const r of k.rows) expect(await getQuoteByNumber(mShopId, r.number).then((x) => x?.id === r.id)).toBe(false);
    });
  });

  describe("storefront actions exploreArrangements and chooseArrangement", () => {
    const requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 1 };
    const formValues = { ...EMPTY_REQUEST_FORM, maxVoltage: "48 V", minVoltage: "24 V", sizeFor: "energy" as const, energy: "20 kJ" };

    it("exploring a shop searches that shop's catalog only", async () => {
      await actAs(null);
      for (const [slug, shopId] of [[K, kShopId], [M, mShopId]] as const) {
        const r = await exploreArrangements(slug, formValues);
        expect(r.ok).toBe(true);
        if (!r.ok) continue;
        const own = new Set((await listActiveCells(shopId)).map((c) => c.sku));
        for (const o of r.data.options) expect(own.has(o.cell.sku), `${slug}: ${o.cell.sku}`).toBe(true);
      }
    });

    it("a customer of one shop cannot choose in another, nor can a signed-out caller or a manager", async () => {
      const { data } = (await exploreArrangements(K, formValues)) as { data: { options: { cell: { sku: string }; topology: "series-of-parallel-groups" | "parallel-of-series-strings"; seriesCount: number; parallelCount: number }[] } };
      const o = data.options[0];
      expect(o).toBeDefined();
      const option = { cellSku: o?.cell.sku ?? "", topology: o?.topology ?? "series-of-parallel-groups", seriesCount: o?.seriesCount ?? 1, parallelCount: o?.parallelCount ?? 1 };
      const key = crypto.randomUUID();
      await actAs(kCustomer);
      expect(await chooseArrangement(M, { idempotencyKey: key, requirement, option })).toMatchObject({ ok: false, code: "forbidden" });
      await actAs(null);
      expect(await chooseArrangement(K, { idempotencyKey: key, requirement, option })).toMatchObject({ ok: false, code: "unauthenticated" });
      await actAs(kManager);
      expect(await chooseArrangement(K, { idempotencyKey: key, requirement, option })).toMatchObject({ ok: false, code: "forbidden" });
      expect(await db.select({ id: bankRequests.id }).from(bankRequests).where(eq(bankRequests.idempotencyKey, key))).toEqual([]);
    });
  });

  describe("scoped queries", () => {
    it("getMember and updateMemberRole do not reach another shop's row", async () => {
      const target = await memberOf(M, mEstimator);
      expect(await getMember(kShopId, target.id)).toBeNull();
      expect(await updateMemberRole(kShopId, target.id, "customer")).toBeNull();
      const [row] = await db.select({ role: members.role }).from(members).where(eq(members.id, target.id));
      expect(row?.role).toBe("estimator");
    });

    it("list queries return only the shop's own rows", async () => {
      const all = { q: "", role: "all" as const, sort: "name" as const, dir: "asc" as const, page: 1, size: 100 };
      const k = await listMembers(kShopId, all);
      const m = await listMembers(mShopId, all);
      const kIds = new Set(k.rows.map((r) => r.id));
      expect(m.rows.some((r) => kIds.has(r.id))).toBe(false);
      expect(k.rows.length).toBeGreaterThan(0);
      const kCells = await listActiveCells(kShopId);
      expect(kCells.length).toBeGreaterThanOrEqual(30);
      expect(kCells.every((c) => c.shopId === kShopId)).toBe(true);
      const page = await listCatalogCells(mShopId, { q: "", technology: "all", sort: "sku", dir: "asc", page: 1, size: 100 });
      expect(page.rows.every((c) => c.shopId === mShopId)).toBe(true);
      expect((await getShopSettings(kShopId))?.currency).toBe("EUR");
      expect((await getShopSettings(mShopId))?.currency).toBe("GBP");
    });
  });
});
