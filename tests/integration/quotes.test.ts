/**
 * Choosing an arrangement: one quote per choice (a double submit makes one), numbers per shop and
 * year, frozen revisions, the review path beyond the auto-quote limits, the quote PDF read back by
 * pdftotext, and the quote list route. Every test works in shops of its own.
 */
import { randomUUID } from "node:crypto";
import { and, count, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { GET as pdfRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/pdf/route";
import { GET as quotesRoute } from "@/app/api/v1/shops/[shop]/quotes/route";
import { chooseArrangement } from "@/app/s/[shop]/actions";
import { ownerDb as db } from "./owner-db";
import { getQuoteByNumber, getRevision } from "@/db/queries/quotes";
import { listRequests } from "@/db/queries/requests";
import { bankRequests, catalogCells, emailOutbox, quotes, shopSettings } from "@/db/schema";
import { formatMoney } from "@/lib/pricing";
import { createQuoteFromChoice } from "@/lib/quoting/create-quote";
import { loadQuotePdf } from "@/lib/quoting/quote-pdf-loader";
import { requestList } from "@/lib/validation/lists";
import { cheapestOption, choiceOf, contextOf, createQuote, createShop, KESTREL_REQUIREMENT, MARLOW_REQUIREMENT, searchOptions } from "./fixtures";
import { actAs, pdfToText, request, sessionCookie } from "./helpers";

const params = <T extends Record<string, string>>(p: T) => ({ params: Promise.resolve(p) });

describe("quotes from a chosen arrangement", () => {
  it("a double submit (two concurrent calls, one key) makes exactly one quote, one revision and one e-mail", async () => {
    const shop = await createShop("kestrel");
    const option = await cheapestOption(shop.id, KESTREL_REQUIREMENT);
    const input = choiceOf(KESTREL_REQUIREMENT, option);
    await actAs(shop.customers[0].email);
    const [a, b] = await Promise.all([chooseArrangement(shop.slug, input), chooseArrangement(shop.slug, input)]);
    expect(a).toMatchObject({ ok: true, data: { kind: "quote" } });
    expect(b).toEqual(a);
    expect(await chooseArrangement(shop.slug, input)).toEqual(a);
    const [n] = await db.select({ n: count() }).from(quotes).where(eq(quotes.shopId, shop.id));
    expect(n?.n).toBe(1);
    const [r] = await db.select({ n: count() }).from(bankRequests).where(eq(bankRequests.shopId, shop.id));
    expect(r?.n).toBe(1);
    if (!a.ok || a.data.kind !== "quote") throw new Error("expected a quote");
    const quote = await getQuoteByNumber(shop.id, a.data.quoteNumber);
    const mails = await db.select().from(emailOutbox).where(eq(emailOutbox.shopId, shop.id));
    expect(mails.map((m) => [m.toEmail, m.quoteRevisionId])).toEqual([[shop.customers[0].email, quote?.revisionId]]);
    // the frozen total is the one the customer was shown for this option
    const rev = await getRevision(shop.id, quote!.revisionId);
    expect(rev?.revision.total).toBe(Number(option.price!.amount).toFixed(4));
  });

  it("numbers quotes per shop and year: Q-YYYY-0001, 0002 in one shop, 0001 again in the other, and 0001 in a new year", async () => {
    const [k, m] = await Promise.all([createShop("kestrel"), createShop("marlow")]);
    const may = new Date("2031-05-01T09:00:00Z");
    expect(await createQuote(k, k.customers[0], KESTREL_REQUIREMENT, may)).toBe("Q-2031-0001");
    expect(await createQuote(k, k.customers[1], KESTREL_REQUIREMENT, may)).toBe("Q-2031-0002");
    expect(await createQuote(m, m.customers[0], MARLOW_REQUIREMENT, may)).toBe("Q-2031-0001");
    expect(await createQuote(k, k.customers[0], KESTREL_REQUIREMENT, new Date("2032-01-02T09:00:00Z"))).toBe("Q-2032-0001");
    const q = await getQuoteByNumber(k.id, "Q-2031-0001");
    const rev = await getRevision(k.id, q!.revisionId);
    // validity: 2031-05-01 plus the shop's validity days (30 in the default rules) = 2031-05-31
    expect(rev?.revision.validUntil).toBe("2031-05-31");
  });

  it("a revision and its lines are unchanged after the cell's catalog price changes", async () => {
    const shop = await createShop("kestrel");
    const option = await cheapestOption(shop.id, KESTREL_REQUIREMENT);
    const number = await createQuote(shop, shop.customers[0]);
    const quote = await getQuoteByNumber(shop.id, number);
    const before = await getRevision(shop.id, quote!.revisionId);
    const [cell] = await db
      .select()
      .from(catalogCells)
      .where(and(eq(catalogCells.shopId, shop.id), eq(catalogCells.sku, option.cell.sku)));
    await db
      .update(catalogCells)
      .set({ unitCost: "999.0000", capacitanceF: cell!.capacitanceF * 2 })
      .where(eq(catalogCells.id, cell!.id));
    expect(await getRevision(shop.id, quote!.revisionId)).toEqual(before);
    // and a new search does see the new price, so the change was real
    const now = await searchOptions(shop.id, KESTREL_REQUIREMENT);
    expect(now.options.find((o) => o.cell.sku === option.cell.sku && o.seriesCount === option.seriesCount)?.price?.amount).not.toBe(option.price?.amount);
  });

  it("beyond the auto-quote limits the request goes to the estimators as needs-review with the reason, and makes no quote", async () => {
    const shop = await createShop("kestrel");
    await db
      .update(shopSettings)
      .set({ autoQuoteLimits: { maxVoltage: 40, maxStoredEnergy: 2_000_000, maxCellCount: 400 } })
      .where(eq(shopSettings.shopId, shop.id));
    const input = choiceOf(KESTREL_REQUIREMENT, await cheapestOption(shop.id, KESTREL_REQUIREMENT));
    await actAs(shop.customers[0].email);
    const r = await chooseArrangement(shop.slug, input);
    if (!r.ok || r.data.kind !== "review") throw new Error(`expected review: ${JSON.stringify(r)}`);
    expect(await chooseArrangement(shop.slug, input)).toEqual(r);
    const [row] = await db
      .select()
      .from(bankRequests)
      .where(and(eq(bankRequests.shopId, shop.id), eq(bankRequests.id, r.data.requestId)));
    expect(row?.status).toBe("needs-review");
    expect(row?.reviewReasons.join(" ")).toMatch(/Voltage 48 V is above the 40 V/);
    expect((await db.select({ n: count() }).from(quotes).where(eq(quotes.shopId, shop.id)))[0]?.n).toBe(0);
    const list = await listRequests(shop.id, requestList.parse({ status: "needs-review" }).query);
    expect(list.rows.map((x) => x.id)).toEqual([r.data.requestId]);
  });

  it("goes to review when no option was chosen or the chosen one is not offered", async () => {
    const shop = await createShop("kestrel");
    await actAs(shop.customers[0].email);
    const none = await chooseArrangement(shop.slug, { idempotencyKey: randomUUID(), requirement: KESTREL_REQUIREMENT });
    expect(none).toMatchObject({ ok: true, data: { kind: "review" } });
    const bogus = await chooseArrangement(shop.slug, {
      idempotencyKey: randomUUID(),
      requirement: KESTREL_REQUIREMENT,
      option: { cellSku: "NO-SUCH-CELL", topology: "series-of-parallel-groups", seriesCount: 19, parallelCount: 1 },
    });
    expect(bogus).toMatchObject({ ok: true, data: { kind: "review" } });
  });

  it("refuses a signed-out caller, staff and another shop's customer, and a bad input at its field", async () => {
    const [shop, other] = await Promise.all([createShop("kestrel"), createShop("marlow")]);
    const input = { idempotencyKey: randomUUID(), requirement: KESTREL_REQUIREMENT };
    await actAs(null);
    expect(await chooseArrangement(shop.slug, input)).toMatchObject({ ok: false, code: "unauthenticated" });
    await actAs(shop.estimator.email);
    expect(await chooseArrangement(shop.slug, input)).toMatchObject({ ok: false, code: "forbidden" });
    await actAs(other.customers[0].email);
    expect(await chooseArrangement(shop.slug, input)).toMatchObject({ ok: false, code: "forbidden" });
    await actAs(shop.customers[0].email);
    const bad = await chooseArrangement(shop.slug, { ...input, idempotencyKey: "not-a-uuid" });
    expect(bad).toMatchObject({ ok: false, code: "invalid" });
    if (!bad.ok) expect(Object.keys(bad.fieldErrors ?? {})).toContain("idempotencyKey");
  });

  it("the quote PDF holds the quote number and the total, as pdftotext reads it; another shop cannot render it", async () => {
    const [shop, other] = await Promise.all([createShop("kestrel"), createShop("marlow")]);
    const option = await cheapestOption(shop.id, KESTREL_REQUIREMENT);
    const r = await createQuoteFromChoice(contextOf(shop, shop.customers[0], "customer"), choiceOf(KESTREL_REQUIREMENT, option));
    if (!r.ok || r.data.kind !== "quote") throw new Error("expected a quote");
    const quote = await getQuoteByNumber(shop.id, r.data.quoteNumber);
    const { buffer, fileName } = await loadQuotePdf(shop.id, quote!.revisionId);
    expect(fileName).toBe(`${r.data.quoteNumber}-r1.pdf`);
    const text = pdfToText(buffer);
    expect(text).toContain(r.data.quoteNumber);
    expect(text).toContain(formatMoney(option.price!.amount, "EUR"));
    await expect(loadQuotePdf(other.id, quote!.revisionId)).rejects.toThrow();
  });

  it("the PDF route serves the owner and the shop's staff, and answers 404 to another customer", async () => {
    const [shop, other] = await Promise.all([createShop("kestrel"), createShop("marlow")]);
    await createQuote(shop, shop.customers[0]);
    const number = await createQuote(shop, shop.customers[0]);
    const call = async (email: string | null, slug = shop.slug) =>
      pdfRoute(request(`/api/v1/shops/${slug}/quotes/${number}/pdf`, { cookie: email ? await sessionCookie(email) : "" }), params({ shop: slug, number }));
    const own = await call(shop.customers[0].email);
    expect(own.status).toBe(200);
    expect(own.headers.get("content-type")).toBe("application/pdf");
    expect(own.headers.get("content-disposition")).toContain(`filename="${number}-r1.pdf"`);
    expect((await call(shop.estimator.email)).status).toBe(200);
    expect((await call(shop.customers[1].email)).status).toBe(404);
    expect((await call(other.estimator.email)).status).toBe(403);
    // another shop's staff asking through their own shop, which has no such number: not found
    expect((await call(other.estimator.email, other.slug)).status).toBe(404);
    expect((await call(null)).status).toBe(401);
  });

  it("the quotes route lists a customer's own quotes only, all of them to staff, sorted as asked; a bad query is a 400", async () => {
    const shop = await createShop("kestrel");
    const mine = [await createQuote(shop, shop.customers[0]), await createQuote(shop, shop.customers[0])];
    const theirs = [await createQuote(shop, shop.customers[1])];
    const get = async (email: string, query = "") =>
      quotesRoute(request(`/api/v1/shops/${shop.slug}/quotes${query}`, { cookie: await sessionCookie(email) }), params({ shop: shop.slug }));
    const numbers = async (res: Response) => ((await res.json()) as { rows: { number: string }[] }).rows.map((r) => r.number);
    expect(await numbers(await get(shop.customers[0].email, "?sort=number&dir=asc"))).toEqual(mine);
    expect(await numbers(await get(shop.customers[1].email))).toEqual(theirs);
    expect(await numbers(await get(shop.estimator.email, "?sort=number&dir=asc"))).toEqual([...mine, ...theirs]);
    // a number's first click sorts newest first
    expect(await numbers(await get(shop.estimator.email, "?sort=number"))).toEqual([...mine, ...theirs].reverse());
    const bad = await get(shop.estimator.email, "?sort=password&page=-1");
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { issues: { path: string }[] }).issues.map((i) => i.path).sort()).toEqual(["page", "sort"]);
  });
});
