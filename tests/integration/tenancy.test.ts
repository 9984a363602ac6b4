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
import { requeueMessage } from "@/app/desk/[shop]/outbox/actions";
import { cancelOrder, moveOrder, recordTest, refundOrder } from "@/app/desk/[shop]/orders/actions";
import DeskDashboardPage from "@/app/desk/[shop]/dashboard/page";
import DeskOrderPage from "@/app/desk/[shop]/orders/[number]/page";
import DeskOrdersListPage from "@/app/desk/[shop]/orders/list/page";
import DeskOrdersPage from "@/app/desk/[shop]/orders/page";
import { GET as orderCertificateRoute } from "@/app/api/v1/shops/[shop]/orders/[number]/certificate/route";
import { GET as orderTravelerRoute } from "@/app/api/v1/shops/[shop]/orders/[number]/traveler/route";
import { GET as listOrdersRoute } from "@/app/api/v1/shops/[shop]/orders/route";
import { GET as checkoutStateRoute, POST as checkoutRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/checkout/route";
import { startCheckout } from "@/app/s/[shop]/quotes/[number]/actions";
import CustomerOrderPage from "@/app/s/[shop]/orders/[number]/page";
import MyOrdersPage from "@/app/s/[shop]/orders/page";
import PaidPage from "@/app/s/[shop]/quotes/[number]/paid/page";
import {
  createWebhookEndpoint,
  deleteWebhookEndpoint,
  replayWebhookDelivery,
  rollWebhookSecret,
  setWebhookEndpointState,
  updateWebhookEndpoint,
} from "@/app/desk/[shop]/webhooks/actions";
import DeskWebhookPage from "@/app/desk/[shop]/webhooks/[id]/page";
import DeskWebhooksPage from "@/app/desk/[shop]/webhooks/page";
import { GET as openApiRoute } from "@/app/api/v1/openapi.json/route";
import { createApiKey, revokeApiKey } from "@/app/desk/[shop]/api-keys/actions";
import { createCell, importCells, previewCellImport, saveComponent, updateCell } from "@/app/desk/[shop]/catalog/actions";
import { previewPricingRules, savePricingRules } from "@/app/desk/[shop]/pricing/actions";
import { previewDesignSettings, saveDesignSettings } from "@/app/desk/[shop]/settings/actions";
import { GET as listCellsRoute, POST as createCellRoute } from "@/app/api/v1/shops/[shop]/cells/route";
import { GET as cellRoute, PATCH as patchCellRoute } from "@/app/api/v1/shops/[shop]/cells/[sku]/route";
import { DELETE as deleteDatasheetRoute, GET as datasheetRoute, POST as uploadDatasheetRoute } from "@/app/api/v1/shops/[shop]/cells/[sku]/datasheet/route";
import { GET as exportCsvRoute, POST as importCsvRoute } from "@/app/api/v1/shops/[shop]/cells.csv/route";
import { GET as rulesRoute, PUT as putRulesRoute } from "@/app/api/v1/shops/[shop]/pricing-rules/route";
import ApiKeysPage from "@/app/desk/[shop]/api-keys/page";
import CellPage from "@/app/desk/[shop]/catalog/cells/[sku]/page";
import NewCellPage from "@/app/desk/[shop]/catalog/cells/new/page";
import ComponentsPage from "@/app/desk/[shop]/catalog/components/page";
import ComponentPage from "@/app/desk/[shop]/catalog/components/[sku]/page";
import NewComponentPage from "@/app/desk/[shop]/catalog/components/new/page";
import CatalogCsvPage from "@/app/desk/[shop]/catalog/import/page";
import PricingPage from "@/app/desk/[shop]/pricing/page";
import SettingsPage from "@/app/desk/[shop]/settings/page";
import { demoPricingRules } from "@/db/seed";
import { auditEvents } from "@/db/schema";
import { getCellBySku } from "@/db/queries/catalog-edit";
import { getRulesInForce } from "@/db/queries/pricing-rules";
import { cellFormText, toCellRecord } from "@/lib/catalog/cell-fields";
import { formFromRules } from "@/lib/validation/pricing";
import { settingsFormText } from "@/lib/validation/design-settings";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { DEFAULT_RELIABILITY_SETTINGS } from "@/lib/bank/reliability-settings";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
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
import DeskAuditPage from "@/app/desk/[shop]/audit/page";
import DeskQuotePage from "@/app/desk/[shop]/quotes/[number]/page";
import DeskQuotesPage from "@/app/desk/[shop]/quotes/page";
import DeskRequestsPage from "@/app/desk/[shop]/requests/page";
import DeskTeamPage from "@/app/desk/[shop]/team/page";
import { chooseArrangement, exploreArrangements } from "@/app/s/[shop]/actions";
import { joinShop } from "@/app/s/[shop]/join/actions";
import MyQuotesPage from "@/app/s/[shop]/quotes/(list)/page";
import StorefrontQuotePage from "@/app/s/[shop]/quotes/[number]/page";
import { withShop } from "@/db/tx";
import { ownerDb as db, ownerDb } from "./owner-db";
import { listActiveCells, listCatalogCells } from "@/db/queries/catalog";
import { getMember, getMemberRole, listMembers, updateMemberRole } from "@/db/queries/members";
import { getOutboxRow, listOutbox } from "@/db/queries/outbox";
import { getOrderDetail, listOrders } from "@/db/queries/orders";
import { getQuoteByNumber, listQuotes } from "@/db/queries/quotes";
import { getRequest, listRequests } from "@/db/queries/requests";
import { getShopSettings, isSlugTaken } from "@/db/queries/shops";
import { bankRequests, emailOutbox, quoteDrafts, quoteMessages, quoteRevisions, quotes, shops, webhookDeliveries, webhookEndpoints } from "@/db/schema";
import { recordShopEvent } from "@/db/queries/shop-events";
import { listWebhookEndpoints } from "@/db/queries/webhooks";
import { applyOrderMove, saveBankTest } from "@/lib/orders/moves";
import { testLimitsOf } from "@/lib/orders/test-limits";
import { NO_OVERRIDES } from "@/lib/quoting/review-search";
import { catalogList, memberList, orderList, outboxList, quoteList, requestList, webhookEndpointList } from "@/lib/validation/lists";
import { EMPTY_REQUEST_FORM } from "@/lib/validation/request-form";
import { cheapestOption, contextOf, createQuote, createShop, KESTREL_REQUIREMENT, MARLOW_REQUIREMENT, type TestShop } from "./fixtures";
import { actAs, pageAnswer, request, sessionCookie } from "./helpers";
import { acceptedQuote, checkoutFor, ordersOfQuote, payAndSettle, usePaymentRig } from "./payments-support";

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
/** each shop's accepted quote with an open checkout (payable), and its paid, tested order */
const pay = { aQuote: "", bQuote: "", aSession: "", bSession: "", aOrder: "", bOrder: "" };

const rig = usePaymentRig();

/** A paid order of the shop's first customer. */
async function paidOrder(shop: TestShop, requirement: typeof KESTREL_REQUIREMENT | typeof MARLOW_REQUIREMENT) {
  const number = await acceptedQuote(shop, shop.customers[0], requirement);
  await payAndSettle(rig, (await checkoutFor(shop, number)).sessionId);
  const [order] = await ordersOfQuote(shop, number);
  if (!order) throw new Error("no order");
  return order;
}

/** A paid order of the shop's first customer, moved to testing with a passing test (so every order route answers 200). */
async function testedOrder(shop: TestShop, requirement: typeof KESTREL_REQUIREMENT | typeof MARLOW_REQUIREMENT) {
  const order = await paidOrder(shop, requirement);
  const manager = contextOf(shop, shop.manager, "manager");
  for (const [from, to] of [
    ["paid", "kitting"],
    ["kitting", "assembling"],
    ["assembling", "testing"],
  ] as const)
    await applyOrderMove(manager, { number: order.number, from, to, note: "", carrier: "", trackingReference: "" });
  const d = await getOrderDetail(shop.id, order.number);
  if (!d) throw new Error("no order detail");
  const l = testLimitsOf(d.arrangement, d.requirement);
  await saveBankTest(manager, {
    number: order.number,
    bank: 1,
    note: "",
    measured: {
      capacitance: l.capacitance.nominal,
      esr: l.esr.new,
      leakageCurrent: 0,
      holdMinutes: l.minHoldMinutes,
      positionVoltages: l.positions.map(() => l.positionVoltage.nominal),
    },
  });
  return order.number;
}

/** B's webhook endpoint (on an address nothing listens on) and a delivery of one of B's events to it */
let bEndpoint = "";
let bDelivery = "";

async function upload(shop: string, cookie: string) {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(PDF_BYTES)], "spec.pdf"));
  return uploadAttachmentRoute(request(`/api/v1/shops/${shop}/attachments`, { method: "POST", body: form, cookie }), shopParams(shop));
}

/**
 * Each shop-scoped route handler, called for a shop (through that shop's URL) by the holder of a
 * cookie, with what it answers the shop's own member who may use it.
 */
/** A cell the API can create: a new part number each call. */
const newCellBody = () =>
  JSON.stringify({
    sku: `T-${crypto.randomUUID().slice(0, 8)}`,
    manufacturer: "Quillfen",
    series: "Fenwall",
    technology: "edlc",
    capacitance: 500,
    toleranceMinus: 0.1,
    tolerancePlus: 0.2,
    ratedVoltage: 2.7,
    surgeVoltage: 2.85,
    esr: 0.0012,
    leakageCurrent: 0.001,
    continuousCurrent: 40,
    peakCurrent: 400,
    mass: 0.15,
    shape: "cylinder",
    diameter: 0.035,
    height: 0.06,
    unitCost: { amount: "9.80", currency: "EUR" },
  });
const CELL = "QFS-1200R27";
const cellParams = (shop: string) => ({ params: Promise.resolve({ shop, sku: CELL }) });

const ROUTES: {
  name: string;
  call: (shop: TestShop, cookie: string) => Promise<Response>;
  own: (shop: TestShop) => TestShop["manager"];
  ok: number;
  /** what a member of another shop gets: 403 by default; 404 where the shop's staff routes hide that the shop exists */
  foreign?: 403 | 404;
}[] = [
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
    name: "GET /api/v1/shops/[shop]/cells",
    call: (s, cookie) => listCellsRoute(request(`/api/v1/shops/${s.slug}/cells`, { cookie }), shopParams(s.slug)),
    own: (s) => s.estimator,
    ok: 200,
    foreign: 404,
  },
  {
    name: "POST /api/v1/shops/[shop]/cells",
    call: (s, cookie) => createCellRoute(request(`/api/v1/shops/${s.slug}/cells`, { method: "POST", cookie, body: newCellBody() }), shopParams(s.slug)),
    own: (s) => s.estimator,
    ok: 201,
    foreign: 404,
  },
  {
    name: "GET /api/v1/shops/[shop]/cells/[sku]",
    call: (s, cookie) => cellRoute(request(`/api/v1/shops/${s.slug}/cells/${CELL}`, { cookie }), cellParams(s.slug)),
    own: (s) => s.manager,
    ok: 200,
    foreign: 404,
  },
  {
    name: "PATCH /api/v1/shops/[shop]/cells/[sku]",
    call: (s, cookie) =>
      patchCellRoute(request(`/api/v1/shops/${s.slug}/cells/${CELL}`, { method: "PATCH", cookie, body: JSON.stringify({ stock: 77 }) }), cellParams(s.slug)),
    own: (s) => s.estimator,
    ok: 200,
    foreign: 404,
  },
  {
    name: "POST /api/v1/shops/[shop]/cells/[sku]/datasheet",
    call: (s, cookie) => {
      const form = new FormData();
      form.set("file", new File([new Uint8Array(PDF_BYTES)], "sheet.pdf"));
      return uploadDatasheetRoute(request(`/api/v1/shops/${s.slug}/cells/${CELL}/datasheet`, { method: "POST", body: form, cookie }), cellParams(s.slug));
    },
    own: (s) => s.estimator,
    ok: 201,
    foreign: 404,
  },
  {
    name: "DELETE /api/v1/shops/[shop]/cells/[sku]/datasheet",
    call: (s, cookie) => deleteDatasheetRoute(request(`/api/v1/shops/${s.slug}/cells/${CELL}/datasheet`, { method: "DELETE", cookie }), cellParams(s.slug)),
    own: (s) => s.estimator,
    ok: 204,
    foreign: 404,
  },
  {
    name: "GET /api/v1/shops/[shop]/cells.csv",
    call: (s, cookie) => exportCsvRoute(request(`/api/v1/shops/${s.slug}/cells.csv`, { cookie }), shopParams(s.slug)),
    own: (s) => s.estimator,
    ok: 200,
    foreign: 404,
  },
  {
    name: "POST /api/v1/shops/[shop]/cells.csv",
    call: (s, cookie) =>
      importCsvRoute(
        request(`/api/v1/shops/${s.slug}/cells.csv?dryRun=1`, {
          method: "POST",
          cookie,
          body: `sku,stock\r\n${CELL},5\r\n`,
          headers: { "content-type": "text/csv" },
        }),
        shopParams(s.slug),
      ),
    own: (s) => s.estimator,
    ok: 200,
    foreign: 404,
  },
  {
    name: "GET /api/v1/shops/[shop]/pricing-rules",
    call: (s, cookie) => rulesRoute(request(`/api/v1/shops/${s.slug}/pricing-rules`, { cookie }), shopParams(s.slug)),
    own: (s) => s.estimator,
    ok: 200,
    foreign: 404,
  },
  {
    name: "PUT /api/v1/shops/[shop]/pricing-rules",
    call: (s, cookie) =>
      putRulesRoute(
        request(`/api/v1/shops/${s.slug}/pricing-rules`, {
          method: "PUT",
          cookie,
          body: JSON.stringify({ rules: { ...demoPricingRules["kestrel-bank-works"], marginPct: "27" }, reason: "Tenancy check" }),
        }),
        shopParams(s.slug),
      ),
    own: (s) => s.estimator,
    ok: 200,
    foreign: 404,
  },
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
  {
    name: "POST /api/v1/shops/[shop]/quotes/[number]/checkout",
    call: (s, cookie) => {
      const number = s === A ? pay.aQuote : pay.bQuote;
      return checkoutRoute(
        request(`/api/v1/shops/${s.slug}/quotes/${number}/checkout`, { method: "POST", cookie, body: JSON.stringify({ revision: 1, kind: "full" }) }),
        {
          params: Promise.resolve({ shop: s.slug, number }),
        },
      );
    },
    own: (s) => s.customers[0],
    ok: 200,
  },
  {
    name: "GET /api/v1/shops/[shop]/quotes/[number]/checkout",
    call: (s, cookie) => {
      const [number, session] = s === A ? [pay.aQuote, pay.aSession] : [pay.bQuote, pay.bSession];
      return checkoutStateRoute(request(`/api/v1/shops/${s.slug}/quotes/${number}/checkout?session=${session}`, { cookie }), {
        params: Promise.resolve({ shop: s.slug, number }),
      });
    },
    own: (s) => s.customers[0],
    ok: 200,
  },
  {
    name: "GET /api/v1/shops/[shop]/orders",
    call: (s, cookie) => listOrdersRoute(request(`/api/v1/shops/${s.slug}/orders`, { cookie }), shopParams(s.slug)),
    own: (s) => s.estimator,
    ok: 200,
  },
  {
    name: "GET /api/v1/shops/[shop]/orders/[number]/traveler",
    call: (s, cookie) => {
      const number = s === A ? pay.aOrder : pay.bOrder;
      return orderTravelerRoute(request(`/api/v1/shops/${s.slug}/orders/${number}/traveler`, { cookie }), {
        params: Promise.resolve({ shop: s.slug, number }),
      });
    },
    own: (s) => s.estimator,
    ok: 200,
  },
  {
    name: "GET /api/v1/shops/[shop]/orders/[number]/certificate",
    call: (s, cookie) => {
      const number = s === A ? pay.aOrder : pay.bOrder;
      return orderCertificateRoute(request(`/api/v1/shops/${s.slug}/orders/${number}/certificate`, { cookie }), {
        params: Promise.resolve({ shop: s.slug, number }),
      });
    },
    own: (s) => s.customers[0],
    ok: 200,
  },
];

/** Route handlers that hold no shop's data, or whose shop rules are checked elsewhere. */
const NOT_SHOP_SCOPED = new Set([
  "GET /api/health", // liveness only
  "POST /api/v1/networks/evaluate", // pure engine, no shop
  "POST /api/v1/networks/failures", // pure engine, no shop: answered alike below
  "POST /api/v1/networks/tolerance", // pure engine, no shop: answered alike below
  "GET /api/v1/openapi.json", // the API description: the same for everyone
  "GET /api/auth/[...all]", // better-auth's own endpoints: its organization plugin checks membership
  "POST /api/auth/[...all]",
  // the payment service's signed events: no session and no cross-site check (the signature is the
  // credential); each event names its shop and payment, which must match a payment of that shop
  // (lib/payments/events.ts; tests/integration/payments.test.ts)
  "POST /api/webhooks/stripe",
]);
/** Public, but reads only the shop its URL names: tested below. */
const PUBLIC_SHOP_ROUTES = new Set(["POST /api/v1/shops/[shop]/arrangements", "GET /api/v1/shops/[shop]/cells/[sku]/datasheet"]);
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
  "startCheckout",
  "moveOrder",
  "cancelOrder",
  "recordTest",
  "refundOrder",
  "createWebhookEndpoint",
  "updateWebhookEndpoint",
  "rollWebhookSecret",
  "setWebhookEndpointState",
  "deleteWebhookEndpoint",
  "replayWebhookDelivery",
  "createCell",
  "updateCell",
  "previewCellImport",
  "importCells",
  "saveComponent",
  "savePricingRules",
  "previewPricingRules",
  "saveDesignSettings",
  "previewDesignSettings",
  "createApiKey",
  "revokeApiKey",
  "requeueMessage",
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
  // B: Q-…-0001, a tested order (quote 0002, order 0001) and a payable quote (0003)
  bQuote = await createQuote(B, B.customers[0], MARLOW_REQUIREMENT);
  pay.bOrder = await testedOrder(B, MARLOW_REQUIREMENT);
  pay.bQuote = await acceptedQuote(B, B.customers[0], MARLOW_REQUIREMENT);
  // A has more of each, so its last quote (0005) and its tested order (0002) have numbers B does not have
  await paidOrder(A, KESTREL_REQUIREMENT);
  pay.aOrder = await testedOrder(A, KESTREL_REQUIREMENT);
  pay.aQuote = await acceptedQuote(A, A.customers[0], KESTREL_REQUIREMENT);
  await createQuote(A, A.customers[0], KESTREL_REQUIREMENT);
  aQuote = await createQuote(A, A.customers[0], KESTREL_REQUIREMENT);
  aRequest = (await getQuoteByNumber(A.id, aQuote))?.requestId ?? "";
  aQuoteKey = (await getRequest(A.id, aRequest))?.idempotencyKey ?? "";
  const option = await cheapestOption(A.id, KESTREL_REQUIREMENT);
  aChoice = { sku: option.cell.sku, topology: option.topology, seriesCount: option.seriesCount, parallelCount: option.parallelCount };
  pay.aSession = (await checkoutFor(A, pay.aQuote)).sessionId;
  pay.bSession = (await checkoutFor(B, pay.bQuote)).sessionId;
  const up = await upload(A.slug, await sessionCookie(A.customers[0].email));
  aAttachment = ((await up.json()) as { id: string }).id;
  await actAs(B.manager.email);
  const created = await createWebhookEndpoint(B.slug, { url: "http://127.0.0.1:9/b-hooks", description: "B's", events: ["quote.accepted"] });
  if (!created.ok) throw new Error(JSON.stringify(created));
  bEndpoint = created.data.id;
  await withShop(B.id, (tx) => recordShopEvent(tx, B.id, "quote.accepted", { quoteNumber: bQuote }));
  const [d] = await db.select({ id: webhookDeliveries.id }).from(webhookDeliveries).where(eq(webhookDeliveries.endpointId, bEndpoint));
  bDelivery = d?.id ?? "";
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

  describe.each(ROUTES)("$name", ({ call, own, ok, foreign: foreignStatus = 403 }) => {
    it("answers 401 signed out, 403 (or 404) to the other shop's manager, 404 for no such shop, and serves the shop's own member", async () => {
      expect((await call(A, "")).status).toBe(401);
      const foreign = await call(A, await sessionCookie(B.manager.email));
      expect(foreign.status).toBe(foreignStatus);
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
    // two plain quotes, two paid ones and a payable one: all the first customer's
    expect(quotes.rows.map((r) => r.customerEmail)).toEqual(Array.from({ length: 5 }, () => A.customers[0].email));
  });

  it("the catalog's staff routes answer a shop's customer 403", async () => {
    const cookie = await sessionCookie(A.customers[0].email);
    for (const r of ROUTES.filter((x) => x.foreign === 404)) expect((await r.call(A, cookie)).status, r.name).toBe(403);
  });

  it("a datasheet is read through its own shop only: an offered cell's by anyone, a retired cell's by staff and the customers it was quoted to", async () => {
    const form = new FormData();
    form.set("file", new File([new Uint8Array(PDF_BYTES)], "sheet.pdf"));
    const aManager = await sessionCookie(A.manager.email);
    expect(
      (
        await uploadDatasheetRoute(
          request(`/api/v1/shops/${A.slug}/cells/${CELL}/datasheet`, { method: "POST", body: form, cookie: aManager }),
          cellParams(A.slug),
        )
      ).status,
    ).toBe(201);
    const read = (shop: string, cookie = "") => datasheetRoute(request(`/api/v1/shops/${shop}/cells/${CELL}/datasheet`, { cookie }), cellParams(shop));
    expect((await read(A.slug)).status).toBe(200);
    // B's catalog has no such cell: A's datasheet is not reachable through B's URL
    expect((await read(B.slug, await sessionCookie(B.manager.email))).status).toBe(404);
    expect((await read("no-such-shop")).status).toBe(404);
    // retired: visitors and other shops' people no longer get it; A's staff do
    await updateCellAs(A, { active: "false" });
    expect((await read(A.slug)).status).toBe(404);
    expect((await read(A.slug, await sessionCookie(B.manager.email))).status).toBe(404);
    expect((await read(A.slug, aManager)).status).toBe(200);
    await updateCellAs(A, { active: "true" });
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
    it("the catalog, pricing, settings and key actions refuse the other shop's manager and change nothing there", async () => {
      const row = (await getCellBySku(A.id, CELL))!;
      const rules = (await getRulesInForce(A.id)).rules;
      const settings = settingsFormText({
        designFactors: DEFAULT_DESIGN_FACTORS,
        autoQuoteLimits: DEFAULT_AUTO_QUOTE_LIMITS,
        reliabilitySettings: DEFAULT_RELIABILITY_SETTINGS,
      });
      const sample = { maxVoltage: "48 V", minVoltage: "24 V", sizeFor: "energy" as const, amount: "20 kJ" };
      const calls: [string, (slug: string) => Promise<{ ok: boolean; code?: string }>][] = [
        ["createCell", (slug) => createCell(slug, { values: { ...cellFormText(toCellRecord(row)), sku: "TENANCY-NEW" } })],
        ["updateCell", (slug) => updateCell(slug, { sku: CELL, version: row.version, changes: { unitCost: "1.00" } })],
        ["previewCellImport", (slug) => previewCellImport(slug, { csv: `sku,stock\r\n${CELL},1\r\n`, applyValid: false })],
        ["importCells", (slug) => importCells(slug, { csv: `sku,stock\r\n${CELL},1\r\n`, applyValid: false })],
        [
          "saveComponent",
          (slug) =>
            saveComponent(slug, {
              values: { kind: "resistor", sku: "TENANCY-RES", name: "R", unitCost: "1", stock: "1", leadTimeDays: "1", active: "true", powerRatingW: "1 W" },
            }),
        ],
        ["savePricingRules", (slug) => savePricingRules(slug, { values: { ...formFromRules(rules), marginPct: "50", reason: "Not mine" }, version: 0 })],
        ["previewPricingRules", (slug) => previewPricingRules(slug, { values: formFromRules(rules) })],
        ["saveDesignSettings", (slug) => saveDesignSettings(slug, { values: settings })],
        ["previewDesignSettings", (slug) => previewDesignSettings(slug, { values: settings, sample })],
        ["createApiKey", (slug) => createApiKey(slug, { name: "Not mine", scopes: ["catalog:write"] })],
        ["revokeApiKey", (slug) => revokeApiKey(slug, { id: crypto.randomUUID() })],
      ];
      const auditBefore = await db.select({ id: auditEvents.id }).from(auditEvents).where(eq(auditEvents.shopId, A.id));
      await actAs(B.manager.email);
      for (const [name, call] of calls) expect(await call(A.slug), name).toMatchObject({ ok: false, code: "forbidden" });
      // A's customer may not either
      await actAs(A.customers[0].email);
      for (const [name, call] of calls) expect(await call(A.slug), name).toMatchObject({ ok: false, code: "forbidden" });
      const auditAfter = await db.select({ id: auditEvents.id }).from(auditEvents).where(eq(auditEvents.shopId, A.id));
      expect(auditAfter).toHaveLength(auditBefore.length);
      expect((await getCellBySku(A.id, CELL))?.version).toBe(row.version);
      expect((await getRulesInForce(A.id)).rules.marginPct).toBe(rules.marginPct);
      // the shop's own manager may
      await actAs(A.manager.email);
      expect(await previewPricingRules(A.slug, { values: formFromRules(rules) })).toMatchObject({ ok: true });
      expect(await revokeApiKey(A.slug, { id: crypto.randomUUID() })).toMatchObject({ ok: false, code: "not-found" });
    });

    it("changeMemberRole refuses the other shop's manager and leaves the row alone", async () => {
      const target = await getMemberIdOf(B, B.estimator.id);
      await actAs(A.manager.email);
      expect(await changeMemberRole(B.slug, { memberId: target, role: "customer" })).toMatchObject({ ok: false, code: "forbidden" });
      // the other shop's member id, sent through one's own shop: not found
      expect(await changeMemberRole(A.slug, { memberId: target, role: "customer" })).toMatchObject({ ok: false, code: "not-found" });
      expect(await getMemberRole(B.id, B.estimator.id)).toBe("estimator");
    });

    it("requeueMessage refuses the other shop's manager; the other shop's message is not found through one's own", async () => {
      const [bMessage] = (await listOutbox(B.id, { ...outboxList.defaults, size: 1 })).rows;
      expect(bMessage).toBeDefined();
      await ownerDb.update(emailOutbox).set({ status: "failed" }).where(eq(emailOutbox.id, bMessage!.id));
      await actAs(A.manager.email);
      expect(await requeueMessage(B.slug, { outboxId: bMessage!.id })).toMatchObject({ ok: false, code: "forbidden" });
      expect(await requeueMessage(A.slug, { outboxId: bMessage!.id })).toMatchObject({ ok: false, code: "not-found" });
      await actAs(B.estimator.email);
      expect(await requeueMessage(B.slug, { outboxId: bMessage!.id })).toMatchObject({ ok: false, code: "forbidden" });
      expect((await getOutboxRow(B.id, bMessage!.id))?.status).toBe("failed");
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

    it("startCheckout refuses another shop's customer, and another customer of the shop finds no such quote", async () => {
      // a number A has and B does not, asked through B's shop by B's customer: not found
      await actAs(B.customers[0].email);
      expect(await startCheckout(B.slug, { number: aQuote, revision: 1, kind: "full" })).toMatchObject({ ok: false, code: "not-found" });
      await actAs(B.customers[0].email);
      expect(await startCheckout(A.slug, { number: pay.aQuote, revision: 1, kind: "full" })).toMatchObject({ ok: false, code: "forbidden" });
      await actAs(A.customers[1].email);
      expect(await startCheckout(A.slug, { number: pay.aQuote, revision: 1, kind: "full" })).toMatchObject({ ok: false, code: "not-found" });
    });

    it("the order actions refuse the other shop's manager and do not reach the other shop's orders", async () => {
      const key = () => crypto.randomUUID();
      const before = await getOrderDetail(A.id, pay.aOrder);
      await actAs(B.manager.email);
      const acts = (shop: string, number: string) => [
        moveOrder(shop, { number, from: "testing", to: "on-hold", note: "" }),
        recordTest(shop, { number, bank: 1, capacitance: "1 F", esr: "1 mΩ", leakageCurrent: "0 A", holdMinutes: 60, positionVoltages: "1 V", note: "" }),
        refundOrder(shop, { number, amount: "1.00", reason: "probe", idempotencyKey: key() }),
        cancelOrder(shop, { number, from: "testing", note: "probe", refund: true, idempotencyKey: key() }),
      ];
      for (const r of await Promise.all(acts(A.slug, pay.aOrder))) expect(r).toMatchObject({ ok: false, code: "forbidden" });
      // A's order number through B's own shop: not found
      for (const r of await Promise.all(acts(B.slug, pay.aOrder)))
        expect(r).toMatchObject({ ok: false, code: expect.stringMatching(/not-found|invalid|conflict/) });
      const after = await getOrderDetail(A.id, pay.aOrder);
      expect(after?.order).toEqual(before?.order);
    });

    it("the webhook actions refuse another shop's manager, find nothing of another shop through one's own, and refuse other roles", async () => {
      const endpointInput = { url: "http://127.0.0.1:9/a-hooks", description: "", events: ["quote.issued" as const] };
      // A's manager through B's shop: not a member
      await actAs(A.manager.email);
      for (const r of [
        await createWebhookEndpoint(B.slug, endpointInput),
        await updateWebhookEndpoint(B.slug, { ...endpointInput, id: bEndpoint }),
        await rollWebhookSecret(B.slug, { id: bEndpoint }),
        await setWebhookEndpointState(B.slug, { id: bEndpoint, state: "disabled" }),
        await deleteWebhookEndpoint(B.slug, { id: bEndpoint }),
        await replayWebhookDelivery(B.slug, { deliveryId: bDelivery }),
      ])
        expect(r).toMatchObject({ ok: false, code: "forbidden" });
      // B's ids through A's own shop: not found
      for (const r of [
        await updateWebhookEndpoint(A.slug, { ...endpointInput, id: bEndpoint }),
        await rollWebhookSecret(A.slug, { id: bEndpoint }),
        await setWebhookEndpointState(A.slug, { id: bEndpoint, state: "disabled" }),
        await deleteWebhookEndpoint(A.slug, { id: bEndpoint }),
        await replayWebhookDelivery(A.slug, { deliveryId: bDelivery }),
      ])
        expect(r).toMatchObject({ ok: false, code: "not-found" });
      // only managers manage webhooks
      for (const person of [B.estimator, B.customers[0]]) {
        await actAs(person.email);
        expect(await createWebhookEndpoint(B.slug, endpointInput)).toMatchObject({ ok: false, code: "forbidden" });
        expect(await rollWebhookSecret(B.slug, { id: bEndpoint })).toMatchObject({ ok: false, code: "forbidden" });
      }
      const [row] = await db.select().from(webhookEndpoints).where(eq(webhookEndpoints.id, bEndpoint));
      expect(row).toMatchObject({ state: "active", url: "http://127.0.0.1:9/b-hooks", description: "B's" });
      expect((await listWebhookEndpoints(A.id, { ...webhookEndpointList.defaults, size: 100 })).rows).toEqual([]);
      expect((await listWebhookEndpoints(B.id, { ...webhookEndpointList.defaults, size: 100 })).rows.map((e) => e.id)).toEqual([bEndpoint]);
    });

    it("a shop's event reaches only its own endpoints", async () => {
      await withShop(A.id, (tx) => recordShopEvent(tx, A.id, "quote.accepted", { quoteNumber: aQuote }));
      const rows = await db.select({ shopId: webhookDeliveries.shopId }).from(webhookDeliveries).where(eq(webhookDeliveries.endpointId, bEndpoint));
      expect(rows.map((r) => r.shopId)).toEqual([B.id]);
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
      ["audit log", (s: string) => DeskAuditPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
      ["workbench", (s: string) => WorkbenchPage({ params: Promise.resolve({ shop: s, id: aRequest }) })],
      ["orders board", (s: string) => DeskOrdersPage({ params: Promise.resolve({ shop: s }) })],
      ["orders list", (s: string) => DeskOrdersListPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
      ["order", (s: string) => DeskOrderPage({ params: Promise.resolve({ shop: s, number: pay.aOrder }) })],
      ["dashboard", (s: string) => DeskDashboardPage({ params: Promise.resolve({ shop: s }) })],
      ["webhooks", (s: string) => DeskWebhooksPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
      ["cell", (s: string) => CellPage({ params: Promise.resolve({ shop: s, sku: CELL }) })],
      ["new cell", (s: string) => NewCellPage({ params: Promise.resolve({ shop: s }) })],
      ["components", (s: string) => ComponentsPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
      ["component", (s: string) => ComponentPage({ params: Promise.resolve({ shop: s, sku: "KBW-RES-1W" }) })],
      ["new component", (s: string) => NewComponentPage({ params: Promise.resolve({ shop: s }) })],
      ["catalog CSV", (s: string) => CatalogCsvPage({ params: Promise.resolve({ shop: s }) })],
      ["pricing", (s: string) => PricingPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
      ["settings", (s: string) => SettingsPage({ params: Promise.resolve({ shop: s }) })],
      ["API keys", (s: string) => ApiKeysPage({ params: Promise.resolve({ shop: s }), searchParams: Promise.resolve({}) })],
    ] as const;

    it.each(desk)("the desk's %s refuses the other shop's manager and opens for the shop's own", async (_name, render) => {
      await actAs(B.manager.email);
      expect(await pageAnswer(() => render(A.slug))).toBe("403");
      await actAs(A.manager.email);
      expect(await pageAnswer(() => render(A.slug))).toBe("ok");
    });

    it("a webhook endpoint's page refuses the other shop's manager, and another shop's endpoint is not found through one's own", async () => {
      const render = (s: string) => DeskWebhookPage({ params: Promise.resolve({ shop: s, id: bEndpoint }), searchParams: Promise.resolve({}) });
      await actAs(A.manager.email);
      expect(await pageAnswer(() => render(B.slug))).toBe("403");
      expect(await pageAnswer(() => render(A.slug))).toBe("404");
      await actAs(B.estimator.email);
      expect(await pageAnswer(() => render(B.slug))).toBe("403");
      await actAs(B.manager.email);
      expect(await pageAnswer(() => render(B.slug))).toBe("ok");
    });

    it("the API description answers a visitor and members of either shop alike", async () => {
      const anonymous = await (await openApiRoute(request("/api/v1/openapi.json"))).json();
      expect(Object.keys(anonymous.paths)).toContain("/api/v1/shops/{shop}/quotes");
      for (const person of [A.manager, B.customers[0]]) {
        expect(await (await openApiRoute(request("/api/v1/openapi.json", { cookie: await sessionCookie(person.email) }))).json()).toEqual(anonymous);
      }
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

    it("a customer's order pages and the payment page refuse another shop's customer; another customer's order is not found", async () => {
      const orderPage = () => CustomerOrderPage({ params: Promise.resolve({ shop: A.slug, number: pay.aOrder }) });
      const paidPage = () =>
        PaidPage({ params: Promise.resolve({ shop: A.slug, number: pay.aQuote }), searchParams: Promise.resolve({ session: pay.aSession }) });
      await actAs(B.customers[0].email);
      expect(await pageAnswer(() => MyOrdersPage({ params: Promise.resolve({ shop: A.slug }), searchParams: Promise.resolve({}) }))).toBe("403");
      expect(await pageAnswer(orderPage)).toBe("403");
      expect(await pageAnswer(paidPage)).toBe("403");
      await actAs(A.customers[1].email);
      expect(await pageAnswer(orderPage)).toBe("404");
      expect(await pageAnswer(paidPage)).toBe("404");
      expect(await pageAnswer(() => CustomerOrderPage({ params: Promise.resolve({ shop: A.slug, number: pay.bOrder }) }))).toBe("404");
      await actAs(A.customers[0].email);
      expect(await pageAnswer(orderPage)).toBe("ok");
      expect(await pageAnswer(paidPage)).toBe("ok");
    });
  });

  describe("scoped queries", () => {
    it("reads and updates by id do not reach another shop's rows", async () => {
      const target = await getMemberIdOf(B, B.estimator.id);
      expect(await getMember(A.id, target)).toBeNull();
      expect(await withShop(A.id, (tx) => updateMemberRole(tx, A.id, target, "customer"))).toBeNull();
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
      expect(aq.total).toBe(5);
      expect(bq.rows.map((r) => r.number)).toContain(bQuote);
      expect(bq.total).toBe(3);
      expect(aq.rows.some((r) => r.id === bq.rows[0]?.id)).toBe(false);
      const ar = await listRequests(A.id, { ...requestList.defaults, size: 100 });
      expect(ar.rows.map((r) => r.customerEmail)).toEqual(Array.from({ length: 5 }, () => A.customers[0].email));
      const am = await listMembers(A.id, { ...memberList.defaults, size: 100 });
      expect(am.total).toBe(4);
      const ao = await listOutbox(A.id, { ...outboxList.defaults, size: 100 });
      // five "quote ready" and two "order confirmed", all to the first customer
      expect(ao.rows.map((r) => r.toEmail)).toEqual(Array.from({ length: 7 }, () => A.customers[0].email));
      const [ao2, bo2] = await Promise.all([
        listOrders(A.id, { all: true }, orderList.defaults, "2026-01-01"),
        listOrders(B.id, { all: true }, orderList.defaults, "2026-01-01"),
      ]);
      expect(ao2.rows.map((r) => r.number).sort()).toEqual([pay.aOrder.replace(/0002$/, "0001"), pay.aOrder]);
      expect(bo2.rows.map((r) => r.number)).toEqual([pay.bOrder]);
      const own = new Set((await listActiveCells(A.id)).map((c) => c.id));
      const cells = await listCatalogCells(A.id, { ...catalogList.defaults, size: 100 });
      expect(cells.rows.every((c) => c.shopId === A.id)).toBe(true);
      expect(cells.rows.filter((c) => c.isActive).every((c) => own.has(c.id))).toBe(true);
      expect((await getShopSettings(A.id))?.currency).toBe("EUR");
      expect((await getShopSettings(B.id))?.currency).toBe("GBP");
    });
  });
});

/** Changes A's test cell as A's manager would on the desk. */
async function updateCellAs(shop: TestShop, changes: Record<string, string>) {
  const row = (await getCellBySku(shop.id, CELL))!;
  await actAs(shop.manager.email);
  const r = await updateCell(shop.slug, { sku: CELL, version: row.version, changes });
  if (!r.ok) throw new Error(JSON.stringify(r));
}

async function getMemberIdOf(shop: TestShop, userId: string): Promise<string> {
  const page = await listMembers(shop.id, { ...memberList.defaults, size: 100 });
  const row = page.rows.find((r) => r.userId === userId);
  if (!row) throw new Error(`no member ${userId} in ${shop.slug}`);
  return row.id;
}
