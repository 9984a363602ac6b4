/**
 * Every list reads its URL through one forgiving parser (lib/validation/list-query.ts) and pages
 * through the shared helpers (db/queries/paging.ts): a bad or hostile URL never throws, a page past
 * the end shows the last page, the first click sorts the useful way, and ties keep a stable order.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { chooseArrangement } from "@/app/s/[shop]/actions";
import { ownerDb as db } from "./owner-db";
import { listCatalogCells } from "@/db/queries/catalog";
import { listMembers } from "@/db/queries/members";
import { listOutbox } from "@/db/queries/outbox";
import { listQuotes } from "@/db/queries/quotes";
import { listRequests } from "@/db/queries/requests";
import { shopSettings } from "@/db/schema";
import { catalogList, memberList, outboxList, quoteList, requestList } from "@/lib/validation/lists";
import { choiceOf, cheapestOption, createQuote, createShop, KESTREL_REQUIREMENT, type TestShop } from "./fixtures";
import { actAs } from "./helpers";

/** A bank Kestrel's catalog builds for less than the 48 V one. */
const SMALL = { maxVoltage: 24, energy: 5_000, quantity: 1 };

let shop: TestShop;

beforeAll(async () => {
  shop = await createShop("kestrel");
});

describe("a hostile or malformed URL", () => {
  const hostile: Record<string, unknown>[] = [
    { q: "\u0000", sort: "sku; drop table catalog_cells", dir: "sideways" },
    { q: "x".repeat(100_000), page: "1e309", size: "0" },
    { q: ["%", "_"], page: ["-3", "2"], size: "10000", technology: "plasma" },
    { q: "\\", page: "9007199254740993", size: "2.5", sort: ["__proto__"], dir: "" },
    { q: "' OR 1=1 --", technology: ["film", "edlc"] },
  ];

  it.each(hostile)("never throws, and every list answers with a page: %#", async (input) => {
    await expect(listCatalogCells(shop.id, catalogList.parse(input).query)).resolves.toHaveProperty("rows");
    await expect(listMembers(shop.id, memberList.parse(input).query)).resolves.toHaveProperty("rows");
    await expect(listQuotes(shop.id, { all: true }, quoteList.parse(input).query)).resolves.toHaveProperty("rows");
    await expect(listRequests(shop.id, requestList.parse(input).query)).resolves.toHaveProperty("rows");
    await expect(listOutbox(shop.id, outboxList.parse(input).query)).resolves.toHaveProperty("rows");
  });

  it("searches for % and _ as themselves, not as patterns", async () => {
    expect((await listCatalogCells(shop.id, catalogList.parse({ q: "%" }).query)).total).toBe(0);
    expect((await listCatalogCells(shop.id, catalogList.parse({ q: "_" }).query)).total).toBe(0);
  });
});

describe("paging", () => {
  it("counts the filtered set, and a page past the end shows the last page", async () => {
    const everyone = await listMembers(shop.id, memberList.defaults);
    expect(everyone.total).toBe(4);
    const last = await listMembers(shop.id, memberList.parse({ size: "3", page: "99" }).query);
    expect(last).toMatchObject({ page: 2, size: 3, total: 4 });
    expect(last.rows).toHaveLength(1);
    const customers = await listMembers(shop.id, memberList.parse({ role: "customer" }).query);
    expect(customers.total).toBe(2);
    expect(customers.rows.every((r) => r.role === "customer")).toBe(true);
  });

  it("pages through a list without repeating or skipping a row", async () => {
    const all = (await listCatalogCells(shop.id, { ...catalogList.defaults, size: 100 })).rows.map((r) => r.id);
    const paged: string[] = [];
    for (let page = 1; page <= Math.ceil(all.length / 7); page++)
      paged.push(...(await listCatalogCells(shop.id, { ...catalogList.defaults, size: 7, page })).rows.map((r) => r.id));
    expect(paged).toEqual(all);
  });
});

describe("sorting", () => {
  it("quotes: the first click on total puts the largest first; equal totals keep number order, newest first", async () => {
    const s = await createShop("kestrel");
    const q1 = await createQuote(s, s.customers[0], KESTREL_REQUIREMENT);
    const q2 = await createQuote(s, s.customers[0], SMALL);
    const q3 = await createQuote(s, s.customers[1], KESTREL_REQUIREMENT);
    const numbers = async (query: Record<string, string>) => (await listQuotes(s.id, { all: true }, quoteList.parse(query).query)).rows.map((r) => r.number);
    expect(await numbers({ sort: "total" })).toEqual([q3, q1, q2]);
    expect(await numbers({ sort: "total", dir: "asc" })).toEqual([q2, q3, q1]);
    expect(await numbers({ sort: "customer" })).toEqual(s.customers[0].name < s.customers[1].name ? [q2, q1, q3] : [q3, q2, q1]);
  });

  it("requests: the first click on status puts those needing review first", async () => {
    const s = await createShop("kestrel");
    await createQuote(s, s.customers[0], SMALL);
    // above 40 V goes to the estimators
    await db
      .update(shopSettings)
      .set({ autoQuoteLimits: { maxVoltage: 40, maxStoredEnergy: 2_000_000, maxCellCount: 400 } })
      .where(eq(shopSettings.shopId, s.id));
    await actAs(s.customers[1].email);
    const r = await chooseArrangement(s.slug, choiceOf(KESTREL_REQUIREMENT, await cheapestOption(s.id, KESTREL_REQUIREMENT)));
    expect(r).toMatchObject({ ok: true, data: { kind: "review" } });
    await createQuote(s, s.customers[0], SMALL);
    const statuses = (await listRequests(s.id, requestList.parse({ sort: "status" }).query)).rows.map((x) => x.status);
    expect(statuses).toEqual(["needs-review", "quoted", "quoted"]);
  });

  it("team: the first click on role lists the manager first, then estimators, then customers; joined newest first", async () => {
    const roles = (await listMembers(shop.id, memberList.parse({ sort: "role" }).query)).rows.map((r) => r.role);
    expect(roles).toEqual(["manager", "estimator", "customer", "customer"]);
    // the four joined one after another when the shop opened: the last to join comes first
    const joined = (await listMembers(shop.id, memberList.parse({ sort: "joined" }).query)).rows.map((r) => r.email);
    expect(joined).toEqual([shop.customers[1], shop.customers[0], shop.estimator, shop.manager].map((p) => p.email));
  });
});
