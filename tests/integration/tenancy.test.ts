/**
 * A member of one shop can neither read nor change another shop's rows through any route handler,
 * server action, page or scoped query. Two shops of the test's own (A copies Kestrel's catalog,
 * B Marlow's). Every route handler and server action in app/ must be listed below: the first test
 * reads the tree and fails when one is missing.
 */
import fs from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { changeMemberRole } from "@/app/desk/[shop]/team/actions";
import { openShop } from "@/app/(auth)/open-shop/actions";
import { GET as listMembersRoute } from "@/app/api/v1/shops/[shop]/members/route";
import { GET as downloadAttachmentRoute } from "@/app/api/v1/shops/[shop]/attachments/[id]/route";
import { POST as uploadAttachmentRoute } from "@/app/api/v1/shops/[shop]/attachments/route";
import { POST as networkFailuresRoute } from "@/app/api/v1/networks/failures/route";
import { POST as networkToleranceRoute } from "@/app/api/v1/networks/tolerance/route";
import { POST as arrangementsRoute } from "@/app/api/v1/shops/[shop]/arrangements/route";
import { GET as quotePdfRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/pdf/route";
import { GET as listQuotesRoute, POST as createQuoteRoute } from "@/app/api/v1/shops/[shop]/quotes/route";
import { GET as quoteRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/route";
import { GET as quoteRevisionRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/revisions/[n]/route";
import { replyToQuote, resendQuote, withdrawQuoteRevision } from "@/app/desk/[shop]/quotes/[number]/actions";
import { exploreReviewOptions, issueRevision, saveReviewDraft } from "@/app/desk/[shop]/requests/[id]/actions";
import WorkbenchPage from "@/app/desk/[shop]/requests/[id]/page";
import { acceptQuote, declineQuote, writeQuoteMessage } from "@/app/s/[shop]/quotes/[number]/actions";
import DeskCatalogPage from "@/app/desk/[shop]/catalog/page";
import DeskLayout from "@/app/desk/[shop]/layout";
import DeskOutboxPage from "@/app/desk/[shop]/outbox/page";
import DeskQuotePage from "@/app/desk/[shop]/quotes/[number]/page";
import DeskQuotesPage from "@/app/desk/[shop]/quotes/page";
import DeskRequestsPage from "@/app/desk/[shop]/requests/page";
import DeskTeamPage from "@/app/desk/[shop]/team/page";
import { chooseArrangement, exploreArrangements } from "@/app/s/[shop]/actions";
import { joinShop } from "@/app/s/[shop]/join/actions";
import MyQuotesPage from "@/app/s/[shop]/quotes/page";
import StorefrontQuotePage from "@/app/s/[shop]/quotes/[number]/page";
import { db } from "@/db";
import { listActiveCells, listCatalogCells } from "@/db/queries/catalog";
import { getMember, getMemberRole, listMembers, updateMemberRole } from "@/db/queries/members";
import { listOutbox } from "@/db/queries/outbox";
import { getQuoteByNumber, listQuotes } from "@/db/queries/quotes";
import { getRequest, listRequests } from "@/db/queries/requests";
import { getShopSettings, isSlugTaken } from "@/db/queries/shops";
import { bankRequests, quoteDrafts, quoteMessages, quoteRevisions, quotes, shops } from "@/db/schema";
import { NO_OVERRIDES } from "@/lib/quoting/review-search";
import { catalogList, memberList, outboxList, quoteList, requestList } from "@/lib/validation/lists";
import { EMPTY_REQUEST_FORM } from "@/lib/validation/request-form";
import { cheapestOption, createQuote, createShop, KESTREL_REQUIREMENT, MARLOW_REQUIREMENT, type TestShop } from "./fixtures";
import { actAs, pageAnswer, request, sessionCookie } from "./helpers";

const shopParams = (shop: string) => ({ params: Promise.resolve({ shop }) });
const PDF_BYTES = Buffer.from("%PDF-1.4\n%%EOF\n", "latin1");

let A: TestShop;
let B: TestShop;
let aQuote = "";
let bQuote = "";
let aAttachment = "";
let aRequest = "";
let aQuoteKey = "";
let aChoice = {
  sku: "",
  topology: "series-of-parallel-groups" as "series-of-parallel-groups" | "parallel-of-series-strings",
  seriesCount: 1,
  parallelCount: 1,
};

async function upload(shop: string, cookie: string) {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(PDF_BYTES)], "spec.pdf"));
  return uploadAttachmentRoute(request(`/api/v1/shops/${shop}/attachments`, { method: "POST", body: form, cookie }), shopParams(shop));
}

/**
 * Each shop-scoped route handler, called for a shop (through that shop's URL) by the holder of a
 * cookie, with what it answers the shop's own member who may use it.
 */
const ROUTES: { name: string; call: (shop: TestShop, cookie: string) => Promise<Response>; own: (shop: TestShop) => TestShop["manager"]; ok: number }[] = [
  {
    name: "GET /api/v1/shops/[shop]/members",
    call: (s, cookie) => listMembersRoute(request(`/api/v1/shops/${s.slug}/members`, { cookie }), shopParams(s.slug)),
    own: (s) => s.manager,
    ok: 200,
  },
  {
    name: "GET /api/v1/shops/[shop]/quotes",
    call: (s, cookie) => listQuotesRoute(request(`/api/v1/shops/${s.slug}/quotes`, { cookie }), shopParams(s.slug)),
    own: (s) => s.estimator,
    ok: 200,
  },
  {
    name: "GET /api/v1/shops/[shop]/quotes/[number]/pdf",
    call: (s, cookie) => {
      const number = s === A ? aQuote : bQuote;
      return quotePdfRoute(request(`/api/v1/shops/${s.slug}/quotes/${number}/pdf`, { cookie }), { params: Promise.resolve({ shop: s.slug, number }) });
    },
    own: (s) => s.customers[0],
    ok: 200,
  },
  {
    name: "POST /api/v1/shops/[shop]/quotes",
    call: (s, cookie) =>
      createQuoteRoute(
        request(`/api/v1/shops/${s.slug}/quotes`, {
          method: "POST",
          cookie,
          // the key and body of A's quote: the shop's own customer is answered that quote again (a replay makes nothing new)
          body: JSON.stringify({ requirement: KESTREL_REQUIREMENT, choice: aChoice, idempotencyKey: aQuoteKey }),
        }),
        shopParams(s.slug),
      ),
    own: (s) => s.customers[0],
    ok: 201,
  },
  {
    name: "GET /api/v1/shops/[shop]/quotes/[number]",
    call: (s, cookie) =>
      quoteRoute(request(`/api/v1/shops/${s.slug}/quotes/${aQuote}`, { cookie }), { params: Promise.resolve({ shop: s.slug, number: aQuote }) }),
    own: (s) => s.customers[0],
    ok: 200,
  },
  {
    name: "GET /api/v1/shops/[shop]/quotes/[number]/revisions/[n]",
    call: (s, cookie) =>
      quoteRevisionRoute(request(`/api/v1/shops/${s.slug}/quotes/${aQuote}/revisions/1`, { cookie }), {
        params: Promise.resolve({ shop: s.slug, number: aQuote, n: "1" }),
      }),
    own: (s) => s.estimator,
    ok: 200,
  },
  { name: "POST /api/v1/shops/[shop]/attachments", call: (s, cookie) => upload(s.slug, cookie), own: (s) => s.customers[0], ok: 201 },
  {
    name: "GET /api/v1/shops/[shop]/attachments/[id]",
    // A's attachment, asked for through each shop's URL
    call: (s, cookie) =>
      downloadAttachmentRoute(request(`/api/v1/shops/${s.slug}/attachments/${aAttachment}`, { cookie }), {
        params: Promise.resolve({ shop: s.slug, id: aAttachment }),
      }),
    own: (s) => s.estimator,
    ok: 200,
  },
];

/** Route handlers that hold no shop's data, or whose shop rules are checked elsewhere. */
const NOT_SHOP_SCOPED = new Set([
  "GET /api/health", // liveness only
  "POST /api/v1/networks/evaluate", // pure engine, no shop
  "POST /api/v1/networks/failures", // pure engine, no shop: answered alike below
  "POST /api/v1/networks/tolerance", // pure engine, no shop: answered alike below
  "GET /api/auth/[...all]", // better-auth's own endpoints: its organization plugin checks membership
  "POST /api/auth/[...all]",
]);
/** Public, but reads only the shop its URL names: tested below. */
const PUBLIC_SHOP_ROUTES = new Set(["POST /api/v1/shops/[shop]/arrangements"]);
const ACTIONS = new Set([
  "changeMemberRole",
  "chooseArrangement",
  "exploreArrangements",
  "joinShop",
  "openShop",
  "acceptQuote",
  "declineQuote",
  "writeQuoteMessage",
  "replyToQuote",
  "resendQuote",
  "withdrawQuoteRevision",
  "exploreReviewOptions",
  "saveReviewDraft",
  "issueRevision",
]);

/** The engine's network analyses: open to visitors, holding no shop's data, so every caller gets the same answer. */
const ENGINE_NETWORK = {
  kind: "series",
  children: [0, 1, 2].map((i) => ({
    kind: "cell",
    id: `c${i}`,
    capacitance: 100,
    ratedVoltage: 2.7,
    surgeVoltage: 2.85,
    toleranceMinus: 0.1,
    tolerancePlus: 0.2,
  })),
};
const ENGINE_ROUTES: { name: string; call: (cookie: string) => Promise<Response> }[] = [
  {
    name: "POST /api/v1/networks/failures",
    call: (cookie) =>
      networkFailuresRoute(
        request("/api/v1/networks/failures", { method: "POST", cookie, body: JSON.stringify({ appliedVoltage: 7, network: ENGINE_NETWORK }) }),
      ),
  },
  {
    name: "POST /api/v1/networks/tolerance",
    call: (cookie) =>
      networkToleranceRoute(
        request("/api/v1/networks/tolerance", {
          method: "POST",
          cookie,
          body: JSON.stringify({ appliedVoltage: 7, network: ENGINE_NETWORK, samples: 500, seed: 3, distribution: "uniform" }),
        }),
      ),
  },
];

function filesUnder(dir: string, name: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? filesUnder(p, name) : e.name === name ? [p] : [];
  });
}

beforeAll(async () => {
  [A, B] = await Promise.all([createShop("kestrel"), createShop("marlow")]);
  bQuote = await createQuote(B, B.customers[0], MARLOW_REQUIREMENT);
  // A's second quote has a number B does not have
  await createQuote(A, A.customers[0], KESTREL_REQUIREMENT);
  aQuote = await createQuote(A, A.customers[0], KESTREL_REQUIREMENT);
  aRequest = (await getQuoteByNumber(A.id, aQuote))?.requestId ?? "";
  aQuoteKey = (await getRequest(A.id, aRequest))?.idempotencyKey ?? "";
  const option = await cheapestOption(A.id, KESTREL_REQUIREMENT);
  aChoice = { sku: option.cell.sku, topology: option.topology, seriesCount: option.seriesCount, parallelCount: option.parallelCount };
  const up = await upload(A.slug, await sessionCookie(A.customers[0].email));
  aAttachment = ((await up.json()) as { id: string }).id;
});

describe.each(ENGINE_ROUTES)("public $name", ({ call }) => {
  it("answers a visitor, and members of either shop, the same", async () => {
    const anonymous = await call("");
    expect(anonymous.status).toBe(200);
    const body = await anonymous.json();
    for (const person of [A.manager, B.estimator]) {
      const signedIn = await call(await sessionCookie(person.email));
      expect(signedIn.status).toBe(200);
      expect(await signedIn.json()).toEqual(body);
    }
  });
});

describe("tenancy", () => {
  it("lists every route handler and server action the app has", () => {
    const routes = filesUnder("app", "route.ts").flatMap((file) => {
      const source = fs.readFileSync(file, "utf8");
      const methods = [...source.matchAll(/export (?:async function|const \{?) ?([A-Z, ]+)/g)].flatMap((m) =>
        (m[1] ?? "")
          .split(",")
          .map((s) => s.trim())
          .filter(Boolean),
      );
      const route = `/${path.relative("app", path.dirname(file)).split(path.sep).join("/")}`;
      return methods.map((m) => `${m} ${route}`);
    });
    const covered = new Set([...ROUTES.map((r) => r.name), ...NOT_SHOP_SCOPED, ...PUBLIC_SHOP_ROUTES]);
    expect(routes.filter((r) => !covered.has(r))).toEqual([]);
    expect(new Set(routes)).toEqual(covered);
    const actions = filesUnder("app", "actions.ts").flatMap((file) =>
      [...fs.readFileSync(file, "utf8").matchAll(/export (?:async function|const) (\w+)/g)].map((m) => m[1]),
    );
    expect(new Set(actions)).toEqual(ACTIONS);
  });

  describe.each(ROUTES)("$name", ({ call, own, ok }) => {
    it("answers 401 signed out, 403 to the other shop's manager, 404 for no such shop, and serves the shop's own member", async () => {
      expect((await call(A, "")).status).toBe(401);
      const foreign = await call(A, await sessionCookie(B.manager.email));
      expect(foreign.status).toBe(403);
      expect(await foreign.json()).toHaveProperty("error");
      expect((await call({ ...A, slug: "no-such-shop" }, await sessionCookie(A.manager.email))).status).toBe(404);
      expect((await call(A, await sessionCookie(own(A).email))).status).toBe(ok);
    });
  });

  it("another shop's quote number and attachment id, asked through one's own shop, are not found", async () => {
    const bCookie = await sessionCookie(B.estimator.email);
    const pdf = await quotePdfRoute(request(`/api/v1/shops/${B.slug}/quotes/${aQuote}/pdf`, { cookie: bCookie }), {
      params: Promise.resolve({ shop: B.slug, number: aQuote }),
    });
    expect(pdf.status).toBe(404);
    const file = await downloadAttachmentRoute(request(`/api/v1/shops/${B.slug}/attachments/${aAttachment}`, { cookie: bCookie }), {
      params: Promise.resolve({ shop: B.slug, id: aAttachment }),
    });
    expect(file.status).toBe(404);
    const quote = await quoteRoute(request(`/api/v1/shops/${B.slug}/quotes/${aQuote}`, { cookie: bCookie }), {
      params: Promise.resolve({ shop: B.slug, number: aQuote }),
    });
    expect(quote.status).toBe(404);
    const revision = await quoteRevisionRoute(request(`/api/v1/shops/${B.slug}/quotes/${aQuote}/revisions/1`, { cookie: bCookie }), {
      params: Promise.resolve({ shop: B.slug, number: aQuote, n: "1" }),
    });
    expect(revision.status).toBe(404);
    // another customer of the same shop: not found either
    const other = await quoteRoute(request(`/api/v1/shops/${A.slug}/quotes/${aQuote}`, { cookie: await sessionCookie(A.customers[1].email) }), {
      params: Promise.resolve({ shop: A.slug, number: aQuote }),
    });
    expect(other.status).toBe(404);
  });

  it("the members and quotes routes list only the shop's own rows", async () => {
    const members = (await (
      await listMembersRoute(request(`/api/v1/shops/${A.slug}/members?size=100`, { cookie: await sessionCookie(A.manager.email) }), shopParams(A.slug))
    ).json()) as { rows: { email: string }[]; total: number };
    expect(members.rows.map((r) => r.email).sort()).toEqual([A.manager, A.estimator, ...A.customers].map((p) => p.email).sort());
    const quotes = (await (
      await listQuotesRoute(request(`/api/v1/shops/${A.slug}/quotes`, { cookie: await sessionCookie(A.estimator.email) }), shopParams(A.slug))
    ).json()) as { rows: { number: string; customerEmail: string }[] };
    expect(quotes.rows.map((r) => r.customerEmail)).toEqual([A.customers[0].email, A.customers[0].email]);
  });

  it("the public arrangements route searches only the named shop's catalog", async () => {
    for (const [shop, requirement] of [
      [A, KESTREL_REQUIREMENT],
      [B, MARLOW_REQUIREMENT],
    ] as const) {
      const res = await arrangementsRoute(
        new Request(`http://127.0.0.1/api/v1/shops/${shop.slug}/arrangements`, { method: "POST", body: JSON.stringify(requirement) }),
        shopParams(shop.slug),
      );
      const body = (await res.json()) as { options: { cell: { sku: string } }[] };
      const own = new Set((await listActiveCells(shop.id)).map((c) => c.sku));
      expect(body.options.length).toBeGreaterThan(0);
      for (const o of body.options) expect(own.has(o.cell.sku), o.cell.sku).toBe(true);
    }
  });

  describe("server actions", () => {
    it("changeMemberRole refuses the other shop's manager and leaves the row alone", async () => {
      const target = await getMemberIdOf(B, B.estimator.id);
      await actAs(A.manager.email);
      expect(await changeMemberRole(B.slug, { memberId: target, role: "customer" })).toMatchObject({ ok: false, code: "forbidden" });
      // the other shop's member id, sent through one's own shop: not found
      expect(await changeMemberRole(A.slug, { memberId: target, role: "customer" })).toMatchObject({ ok: false, code: "not-found" });
      expect(await getMemberRole(B.id, B.estimator.id)).toBe("estimator");
    });

    it("chooseArrangement refuses another shop's customer and makes nothing", async () => {
      const key = crypto.randomUUID();
      await actAs(A.customers[0].email);
      expect(await chooseArrangement(B.slug, { idempotencyKey: key, requirement: MARLOW_REQUIREMENT })).toMatchObject({ ok: false, code: "forbidden" });
      expect(await db.select({ id: bankRequests.id }).from(bankRequests).where(eq(bankRequests.idempotencyKey, key))).toEqual([]);
    });

    it("exploreArrangements searches the named shop's catalog only", async () => {
      await actAs(A.customers[0].email);
      const r = await exploreArrangements(B.slug, { ...EMPTY_REQUEST_FORM, maxVoltage: "800 V", sizeFor: "capacitance", capacitance: "10 µF" });
      if (!r.ok) throw new Error(JSON.stringify(r));
      const own = new Set((await listActiveCells(B.id)).map((c) => c.sku));
      expect(r.data.options.length).toBeGreaterThan(0);
      for (const o of r.data.options) expect(own.has(o.cell.sku), o.cell.sku).toBe(true);
    });

    it("joinShop makes a member of one shop a customer of the other, and changes nothing in their own", async () => {
      await actAs(A.estimator.email);
      expect(await joinShop(B.slug, null)).toMatchObject({ ok: true, data: { slug: B.slug } });
      expect(await getMemberRole(B.id, A.estimator.id)).toBe("customer");
      expect(await getMemberRole(A.id, A.estimator.id)).toBe("estimator");
      // a member joining their own shop again keeps their role
      await actAs(B.manager.email);
      expect(await joinShop(B.slug, null)).toMatchObject({ ok: true });
      expect(await getMemberRole(B.id, B.manager.id)).toBe("manager");
    });

    it("the customer's quote moves refuse another shop's customer (forbidden) and another customer of the shop (not found), and change nothing", async () => {
      const before = await db.select({ status: quotes.status, rev: quotes.currentRevision }).from(quotes).where(eq(quotes.number, aQuote));
      for (const [who, code] of [
        [B.customers[0].email, "forbidden"],
        [A.customers[1].email, "not-found"],
      ] as const) {
        await actAs(who);
        expect(await acceptQuote(A.slug, { number: aQuote, revision: 1 })).toMatchObject({ ok: false, code });
        expect(await declineQuote(A.slug, { number: aQuote, revision: 1, reason: "Not for us" })).toMatchObject({ ok: false, code });
        expect(await writeQuoteMessage(A.slug, { number: aQuote, body: "hello", kind: "change-request" })).toMatchObject({ ok: false, code });
      }
      // A's quote number sent through B's own shop by B's customer: B has no such quote
      await actAs(B.customers[0].email);
      expect(await acceptQuote(B.slug, { number: aQuote, revision: 1 })).toMatchObject({ ok: false, code: "not-found" });
      expect(await db.select({ status: quotes.status, rev: quotes.currentRevision }).from(quotes).where(eq(quotes.number, aQuote))).toEqual(before);
      expect(await db.select({ id: quoteMessages.id }).from(quoteMessages).where(eq(quoteMessages.shopId, A.id))).toEqual([]);
    });

    it("the staff's quote moves and the workbench refuse the other shop's staff, and A's records sent through B's shop are not found", async () => {
      const draft = {
        bank: { kind: "engine", choice: aChoice, overrides: NO_OVERRIDES },
        bankPrice: null,
        lines: [],
        discount: null,
        validityDays: 30,
        note: "",
      };
      const revisions = async () => (await db.select({ id: quoteRevisions.id }).from(quoteRevisions).where(eq(quoteRevisions.shopId, A.id))).length;
      const count = await revisions();
      await actAs(B.manager.email);
      for (const [slug, code] of [
        [A.slug, "forbidden"],
        [B.slug, "not-found"],
      ] as const) {
        expect(await replyToQuote(slug, { number: aQuote, body: "hello" })).toMatchObject({ ok: false, code });
        expect(await resendQuote(slug, { number: aQuote })).toMatchObject({ ok: false, code });
        expect(await withdrawQuoteRevision(slug, { number: aQuote, reason: "Not ours to withdraw" })).toMatchObject({ ok: false, code });
        expect(await exploreReviewOptions(slug, { requestId: aRequest, overrides: NO_OVERRIDES })).toMatchObject({ ok: false, code });
        expect(await saveReviewDraft(slug, { requestId: aRequest, draft, version: 0 })).toMatchObject({ ok: false, code });
        expect(await issueRevision(slug, { requestId: aRequest, draft, basedOnRevision: 1 })).toMatchObject({ ok: false, code });
      }
      // a customer may not use the staff's moves in their own shop
      await actAs(A.customers[0].email);
      expect(await resendQuote(A.slug, { number: aQuote })).toMatchObject({ ok: false, code: "forbidden" });
      expect(await issueRevision(A.slug, { requestId: aRequest, draft, basedOnRevision: 1 })).toMatchObject({ ok: false, code: "forbidden" });
      expect(await revisions()).toBe(count);
      expect(await db.select({ id: quoteDrafts.id }).from(quoteDrafts).where(eq(quoteDrafts.shopId, A.id))).toEqual([]);
      expect((await db.select({ status: quotes.status }).from(quotes).where(eq(quotes.number, aQuote))).map((q) => q.status)).not.toContain("withdrawn");
    });

    it("openShop cannot take another shop's address, and creates nothing when refused", async () => {
      await actAs(null);
      const email = `opener.${crypto.randomUUID().slice(0, 8)}@elsewhere.example`;
      const r = await openShop({ name: "Ada Quill", email, password: "a-long-enough-password", shopName: "Another", slug: A.slug, currency: "EUR" });
      expect(r).toMatchObject({ ok: false, code: "conflict", fieldErrors: { slug: [expect.stringMatching(/taken/)] } });
      expect(await db.select({ id: shops.id }).from(shops).where(eq(shops.slug, A.slug))).toEqual([{ id: A.id }]);
      expect(await isSlugTaken(A.slug)).toBe(true);
    });
  });

  describe("pages", () => {
    const desk = [
      ["layout", (s: string) => DeskLayout({ children: null, params: Promise.resolve({ shop: s }) })],
      ["requests", (s: string) => DeskRequestsPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
      ["quotes", (s: string) => DeskQuotesPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
      ["quote", (s: string) => DeskQuotePage({ params: Promise.resolve({ shop: s, number: aQuote }) })],
      ["catalog", (s: string) => DeskCatalogPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
      ["team", (s: string) => DeskTeamPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
      ["outbox", (s: string) => DeskOutboxPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
      ["workbench", (s: string) => WorkbenchPage({ params: Promise.resolve({ shop: s, id: aRequest }) })],
    ] as const;

    it.each(desk)("the desk's %s refuses the other shop's manager and opens for the shop's own", async (_name, render) => {
      await actAs(B.manager.email);
      expect(await pageAnswer(() => render(A.slug))).toBe("403");
      await actAs(A.manager.email);
      expect(await pageAnswer(() => render(A.slug))).toBe("ok");
    });

    it("a customer's quote pages refuse another shop's customer; another customer's quote is not found", async () => {
      await actAs(B.customers[0].email);
      expect(await pageAnswer(() => MyQuotesPage({ params: Promise.resolve({ shop: A.slug }), searchParams: Promise.resolve({}) }))).toBe("403");
      expect(await pageAnswer(() => StorefrontQuotePage({ params: Promise.resolve({ shop: A.slug, number: aQuote }) }))).toBe("403");
      await actAs(A.customers[1].email);
      expect(await pageAnswer(() => StorefrontQuotePage({ params: Promise.resolve({ shop: A.slug, number: aQuote }) }))).toBe("404");
      await actAs(A.customers[0].email);
      expect(await pageAnswer(() => StorefrontQuotePage({ params: Promise.resolve({ shop: A.slug, number: aQuote }) }))).toBe("ok");
    });
  });

  describe("scoped queries", () => {
    it("reads and updates by id do not reach another shop's rows", async () => {
      const target = await getMemberIdOf(B, B.estimator.id);
      expect(await getMember(A.id, target)).toBeNull();
      expect(await updateMemberRole(A.id, target, "customer")).toBeNull();
      expect(await getMemberRole(B.id, B.estimator.id)).toBe("estimator");
      const bQuoteRow = await getQuoteByNumber(B.id, bQuote);
      expect(bQuoteRow).not.toBeNull();
      expect((await getQuoteByNumber(A.id, bQuote))?.id).not.toBe(bQuoteRow?.id);
      const [bRequest] = (await listRequests(B.id, requestList.defaults)).rows;
      expect(bRequest).toBeDefined();
      expect(await getRequest(A.id, bRequest?.id ?? "")).toBeNull();
    });

    it("every list query returns only the shop's own rows", async () => {
      const all = { ...quoteList.defaults, size: 100 };
      const [aq, bq] = await Promise.all([listQuotes(A.id, { all: true }, all), listQuotes(B.id, { all: true }, all)]);
      expect(aq.rows.map((r) => r.number)).toContain(aQuote);
      expect(aq.total).toBe(2);
      expect(bq.rows.map((r) => r.number)).toEqual([bQuote]);
      expect(aq.rows.some((r) => r.id === bq.rows[0]?.id)).toBe(false);
      const ar = await listRequests(A.id, { ...requestList.defaults, size: 100 });
      expect(ar.rows.map((r) => r.customerEmail)).toEqual([A.customers[0].email, A.customers[0].email]);
      const am = await listMembers(A.id, { ...memberList.defaults, size: 100 });
      expect(am.total).toBe(4);
      const ao = await listOutbox(A.id, { ...outboxList.defaults, size: 100 });
      expect(ao.rows.map((r) => r.toEmail)).toEqual([A.customers[0].email, A.customers[0].email]);
      const own = new Set((await listActiveCells(A.id)).map((c) => c.id));
      const cells = await listCatalogCells(A.id, { ...catalogList.defaults, size: 100 });
      expect(cells.rows.every((c) => c.shopId === A.id)).toBe(true);
      expect(cells.rows.filter((c) => c.isActive).every((c) => own.has(c.id))).toBe(true);
      expect((await getShopSettings(A.id))?.currency).toBe("EUR");
      expect((await getShopSettings(B.id))?.currency).toBe("GBP");
    });
  });
});

async function getMemberIdOf(shop: TestShop, userId: string): Promise<string> {
  const page = await listMembers(shop.id, { ...memberList.defaults, size: 100 });
  const row = page.rows.find((r) => r.userId === userId);
  if (!row) throw new Error(`no member ${userId} in ${shop.slug}`);
  return row.id;
}
