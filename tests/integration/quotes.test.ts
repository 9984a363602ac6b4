/**
 * Choosing an arrangement: one quote per choice (a double submit makes one), numbers per shop and
 * year, frozen revisions, the review path beyond the auto-quote limits, the quote PDF read back by
 * pdftotext, and the quote list route.
 */
import { execFileSync } from "node:child_process";
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { and, count, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as pdfRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/pdf/route";
import { GET as quotesRoute } from "@/app/api/v1/shops/[shop]/quotes/route";
import { chooseArrangement } from "@/app/s/[shop]/actions";
import { db } from "@/db";
import { getQuoteByNumber, getRevision, listQuotes } from "@/db/queries/quotes";
import { listRequests } from "@/db/queries/requests";
import { bankRequests, catalogCells, emailOutbox, quoteRevisions, quotes, shopSettings, users } from "@/db/schema";
import { demoPeople } from "@/db/seed/people";
import type { ShopContext } from "@/lib/auth/context";
import type { Requirement } from "@/lib/bank";
import { formatMoney } from "@/lib/pricing";
import { findArrangements } from "@/lib/quoting/arrangements";
import { createQuoteFromChoice } from "@/lib/quoting/create-quote";
import { renderQuotePdf } from "@/lib/quoting/quote-pdf";
import { quoteList, requestList } from "@/lib/validation/lists";
import { chooseArrangementSchema } from "@/lib/validation/quote";
import { actAs, request, sessionCookie, shopBySlug } from "./helpers";

const K = "kestrel-bank-works";
const M = "marlow-pulse";
const kCustomer = demoPeople[K].customers[0].email;
const kOtherCustomer = demoPeople[K].customers[1].email;
const kEstimator = demoPeople[K].estimator.email;
const mCustomer = demoPeople[M].customers[0].email;
const mEstimator = demoPeople[M].estimator.email;

/** The journey's requirement: a 48 V bank with 20 kJ usable down to 24 V. */
const KESTREL_REQ = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 1 };
/** A small film bank for Marlow: 800 V, 10 µF. */
const MARLOW_REQ = { maxVoltage: 800, capacitance: 10e-6, quantity: 1 };

const params = <T extends Record<string, string>>(p: T) => ({ params: Promise.resolve(p) });

async function ctxOf(slug: string, email: string): Promise<ShopContext> {
  const shop = await shopBySlug(slug);
  const [user] = await db.select().from(users).where(eq(users.email, email));
  if (!user) throw new Error(`no user ${email}`);
  return { user: { id: user.id, name: user.name, email: user.email }, shop: { id: shop.id, slug: shop.slug, name: shop.name }, role: "customer" };
}

async function firstPricedOption(shopId: string, requirement: Requirement) {
  const found = await findArrangements(shopId, requirement);
  const option = found.options.find((o) => o.price !== null);
  if (!option) throw new Error(`no priced option: ${found.reasons.join("; ")}`);
  return option;
}

function choiceOf(requirement: Requirement, option: { cell: { sku: string }; topology: "series-of-parallel-groups" | "parallel-of-series-strings"; seriesCount: number; parallelCount: number }, key = randomUUID()) {
  return chooseArrangementSchema.parse({
    idempotencyKey: key,
    requirement,
    option: { cellSku: option.cell.sku, topology: option.topology, seriesCount: option.seriesCount, parallelCount: option.parallelCount },
  });
}

function pdfToText(buffer: Buffer): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "quote-pdf-"));
  try {
    fs.writeFileSync(path.join(dir, "q.pdf"), buffer);
    return execFileSync("pdftotext", ["-layout", path.join(dir, "q.pdf"), "-"], { encoding: "utf8" });
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

describe("quotes from a chosen arrangement", () => {
  let kShopId = "";
  let mShopId = "";
  beforeAll(async () => {
    kShopId = (await shopBySlug(K)).id;
    mShopId = (await shopBySlug(M)).id;
  });

  it("a double submit (two concurrent calls, one key) makes exactly one quote, one revision and one e-mail", async () => {
    const option = await firstPricedOption(kShopId, KESTREL_REQ);
    const input = choiceOf(KESTREL_REQ, option);
    await actAs(kCustomer);
    const [a, b] = await Promise.all([chooseArrangement(K, input), chooseArrangement(K, input)]);
    expect(a).toMatchObject({ ok: true, data: { kind: "quote" } });
    expect(b).toEqual(a);
    const again = await chooseArrangement(K, input);
    expect(again).toEqual(a);
    const [n] = await db.select({ n: count() }).from(quotes).where(and(eq(quotes.shopId, kShopId), eq(quotes.idempotencyKey, input.idempotencyKey)));
    expect(n?.n).toBe(1);
    const [r] = await db.select({ n: count() }).from(bankRequests).where(and(eq(bankRequests.shopId, kShopId), eq(bankRequests.idempotencyKey, input.idempotencyKey)));
    expect(r?.n).toBe(1);
    if (!a.ok || a.data.kind !== "quote") throw new Error("expected a quote");
    const quote = await getQuoteByNumber(kShopId, a.data.quoteNumber);
    expect(quote).not.toBeNull();
    const mails = await db.select().from(emailOutbox).where(and(eq(emailOutbox.shopId, kShopId), eq(emailOutbox.quoteRevisionId, quote!.revisionId)));
    expect(mails).toHaveLength(1);
    expect(mails[0]?.toEmail).toBe(kCustomer);
    // the frozen total is the one the customer was shown for this option
    const rev = await getRevision(kShopId, quote!.revisionId);
    expect(rev?.revision.total).toBe(Number(option.price!.amount).toFixed(4));
  });

  it("numbers quotes per shop and year: Q-YYYY-0001, 0002 in one shop, 0001 again in the other", async () => {
    // a year no other test uses, so the sequence starts from one
    const now = new Date("2031-05-01T09:00:00Z");
    const k = await ctxOf(K, kCustomer);
    const m = await ctxOf(M, mCustomer);
    const kOption = await firstPricedOption(kShopId, KESTREL_REQ);
    const mOption = await firstPricedOption(mShopId, MARLOW_REQ);
    const first = await createQuoteFromChoice(k, choiceOf(KESTREL_REQ, kOption), now);
    const second = await createQuoteFromChoice(k, choiceOf(KESTREL_REQ, kOption), now);
    const other = await createQuoteFromChoice(m, choiceOf(MARLOW_REQ, mOption), now);
    expect(first).toEqual({ ok: true, data: { kind: "quote", quoteNumber: "Q-2031-0001" } });
    expect(second).toEqual({ ok: true, data: { kind: "quote", quoteNumber: "Q-2031-0002" } });
    expect(other).toEqual({ ok: true, data: { kind: "quote", quoteNumber: "Q-2031-0001" } });
    const q = await getQuoteByNumber(kShopId, "Q-2031-0001");
    const rev = await getRevision(kShopId, q!.revisionId);
    // validity: 2031-05-01 plus the shop's validity days (30 in the demo rules) = 2031-05-31
    expect(rev?.revision.validUntil).toBe("2031-05-31");
  });

  it("a revision and its lines are unchanged after the cell's catalog price changes", async () => {
    const option = await firstPricedOption(kShopId, KESTREL_REQ);
    await actAs(kCustomer);
    const r = await chooseArrangement(K, choiceOf(KESTREL_REQ, option));
    if (!r.ok || r.data.kind !== "quote") throw new Error(`expected a quote: ${JSON.stringify(r)}`);
    const quote = await getQuoteByNumber(kShopId, r.data.quoteNumber);
    const before = await getRevision(kShopId, quote!.revisionId);
    const [cell] = await db.select().from(catalogCells).where(and(eq(catalogCells.shopId, kShopId), eq(catalogCells.sku, option.cell.sku)));
    if (!cell) throw new Error("cell not found");
    try {
      await db.update(catalogCells).set({ unitCost: "999.0000", capacitanceF: cell.capacitanceF * 2 }).where(eq(catalogCells.id, cell.id));
      const after = await getRevision(kShopId, quote!.revisionId);
      expect(after).toEqual(before);
      // and a new search does see the new price, so the change was real
      const now = await findArrangements(kShopId, KESTREL_REQ);
      expect(now.options.find((o) => o.cell.sku === option.cell.sku && o.seriesCount === option.seriesCount)?.price?.amount).not.toBe(option.price?.amount);
    } finally {
      await db.update(catalogCells).set({ unitCost: cell.unitCost, capacitanceF: cell.capacitanceF }).where(eq(catalogCells.id, cell.id));
    }
  });

  describe("beyond the auto-quote limits", () => {
    let saved: unknown = null;
    beforeAll(async () => {
      const [row] = await db.select({ limits: shopSettings.autoQuoteLimits }).from(shopSettings).where(eq(shopSettings.shopId, kShopId));
      saved = row?.limits;
      await db.update(shopSettings).set({ autoQuoteLimits: { maxVoltage: 40, maxStoredEnergy: 2_000_000, maxCellCount: 400 } }).where(eq(shopSettings.shopId, kShopId));
    });
    afterAll(async () => {
      if (saved) await db.update(shopSettings).set({ autoQuoteLimits: saved as never }).where(eq(shopSettings.shopId, kShopId));
    });

    it("goes to the estimators as needs-review with the reason, and makes no quote", async () => {
      const option = await firstPricedOption(kShopId, KESTREL_REQ);
      const input = choiceOf(KESTREL_REQ, option);
      await actAs(kCustomer);
      const r = await chooseArrangement(K, input);
      expect(r).toMatchObject({ ok: true, data: { kind: "review" } });
      if (!r.ok || r.data.kind !== "review") throw new Error("expected review");
      expect(await chooseArrangement(K, input)).toEqual(r);
      const [row] = await db.select().from(bankRequests).where(and(eq(bankRequests.shopId, kShopId), eq(bankRequests.id, r.data.requestId)));
      expect(row?.status).toBe("needs-review");
      expect(row?.reviewReasons.join(" ")).toMatch(/Voltage 48 V is above the 40 V/);
      const [n] = await db.select({ n: count() }).from(quotes).where(and(eq(quotes.shopId, kShopId), eq(quotes.idempotencyKey, input.idempotencyKey)));
      expect(n?.n).toBe(0);
      const list = await listRequests(kShopId, requestList.parse({ status: "needs-review", size: "100" }).query);
      expect(list.rows.map((x) => x.id)).toContain(r.data.requestId);
      expect(list.rows.every((x) => x.status === "needs-review")).toBe(true);
    });
  });

  it("goes to review when no option was chosen or the chosen one is not offered", async () => {
    await actAs(kCustomer);
    const none = await chooseArrangement(K, { idempotencyKey: randomUUID(), requirement: KESTREL_REQ });
    expect(none).toMatchObject({ ok: true, data: { kind: "review" } });
    const bogus = await chooseArrangement(K, { idempotencyKey: randomUUID(), requirement: KESTREL_REQ, option: { cellSku: "NO-SUCH-CELL", topology: "series-of-parallel-groups", seriesCount: 19, parallelCount: 1 } });
    expect(bogus).toMatchObject({ ok: true, data: { kind: "review" } });
  });

  it("refuses a signed-out caller, staff and another shop's customer, and a bad input at its field", async () => {
    const input = { idempotencyKey: randomUUID(), requirement: KESTREL_REQ };
    await actAs(null);
    expect(await chooseArrangement(K, input)).toMatchObject({ ok: false, code: "unauthenticated" });
    await actAs(kEstimator);
    expect(await chooseArrangement(K, input)).toMatchObject({ ok: false, code: "forbidden" });
    await actAs(mCustomer);
    expect(await chooseArrangement(K, input)).toMatchObject({ ok: false, code: "forbidden" });
    await actAs(kCustomer);
    const bad = await chooseArrangement(K, { ...input, idempotencyKey: "not-a-uuid" });
    expect(bad).toMatchObject({ ok: false, code: "invalid" });
    if (!bad.ok) expect(Object.keys(bad.fieldErrors ?? {})).toContain("idempotencyKey");
  });

  it("the quote PDF holds the quote number and the total, as pdftotext reads it", async () => {
    const option = await firstPricedOption(kShopId, KESTREL_REQ);
    const r = await createQuoteFromChoice(await ctxOf(K, kCustomer), choiceOf(KESTREL_REQ, option));
    if (!r.ok || r.data.kind !== "quote") throw new Error("expected a quote");
    const quote = await getQuoteByNumber(kShopId, r.data.quoteNumber);
    const { buffer, fileName } = await renderQuotePdf(kShopId, quote!.revisionId);
    expect(fileName).toBe(`${r.data.quoteNumber}-r1.pdf`);
    const text = pdfToText(buffer);
    expect(text).toContain(r.data.quoteNumber);
    expect(text).toContain(formatMoney(option.price!.amount, "EUR"));
    // another shop cannot render it
    await expect(renderQuotePdf(mShopId, quote!.revisionId)).rejects.toThrow();
  });

  it("the PDF route serves the owner and the shop's staff, and answers 404 to another customer", async () => {
    const [mine] = (await listQuotes(kShopId, { all: false, userId: (await ctxOf(K, kCustomer)).user.id }, quoteList.parse({ size: "1" }).query)).rows;
    if (!mine) throw new Error("no quote yet");
    const call = async (email: string | null, slug = K) => pdfRoute(request(`/api/v1/shops/${slug}/quotes/${mine.number}/pdf`, { cookie: email ? await sessionCookie(email) : "" }), params({ shop: slug, number: mine.number }));
    const own = await call(kCustomer);
    expect(own.status).toBe(200);
    expect(own.headers.get("content-type")).toBe("application/pdf");
    expect(own.headers.get("content-disposition")).toContain(`filename="${mine.number}-r${mine.revision}.pdf"`);
    expect((await call(kEstimator)).status).toBe(200);
    expect((await call(kOtherCustomer)).status).toBe(404);
    expect((await call(mEstimator)).status).toBe(403);
    // another shop's staff asking through their own shop: not found
    expect((await call(mEstimator, M)).status).toBe(404);
    expect((await call(null)).status).toBe(401);
  });

  it("the quotes route lists a customer's own quotes only, and all of them to staff", async () => {
    const mineRes = await quotesRoute(request(`/api/v1/shops/${K}/quotes?size=100`, { cookie: await sessionCookie(kCustomer) }), params({ shop: K }));
    expect(mineRes.status).toBe(200);
    const mine = (await mineRes.json()) as { rows: { number: string; customerEmail: string }[]; total: number };
    expect(mine.total).toBeGreaterThan(0);
    expect(mine.rows.every((r) => r.customerEmail === kCustomer)).toBe(true);
    const other = (await (await quotesRoute(request(`/api/v1/shops/${K}/quotes?size=100`, { cookie: await sessionCookie(kOtherCustomer) }), params({ shop: K }))).json()) as { rows: { number: string; customerEmail: string }[] };
    expect(other.rows.every((r) => r.customerEmail === kOtherCustomer)).toBe(true);
    expect(other.rows.some((r) => mine.rows.some((m) => m.number === r.number))).toBe(false);
    const staff = (await (await quotesRoute(request(`/api/v1/shops/${K}/quotes?size=100&sort=number&dir=asc`, { cookie: await sessionCookie(kEstimator) }), params({ shop: K }))).json()) as { rows: { number: string }[]; total: number };
    expect(staff.total).toBeGreaterThanOrEqual(mine.total);
    const numbers = staff.rows.map((r) => r.number);
    expect([...numbers].sort()).toEqual(numbers);
    // only this shop's quotes: Marlow's Q-2031-0001 is not among Kestrel's rows twice
    const [mQuote] = await db.select({ id: quotes.id }).from(quotes).where(and(eq(quotes.shopId, mShopId), eq(quotes.number, "Q-2031-0001")));
    const kRevisionIds = await db.select({ quoteId: quoteRevisions.quoteId }).from(quoteRevisions).where(eq(quoteRevisions.shopId, kShopId));
    expect(kRevisionIds.some((r) => r.quoteId === mQuote?.id)).toBe(false);
  });
});
