/**
 * The desk's Today page counts what needs doing: requests the estimators must review, and issued
 * quotes whose current revision lapses within the week (Kestrel's rules: valid 30 days).
 */
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { chooseArrangement } from "@/app/s/[shop]/actions";
import { ownerDb as db } from "./owner-db";
import { countTodayWork } from "@/db/queries/today";
import { quotes, shopSettings } from "@/db/schema";
import { choiceOf, cheapestOption, createQuote, createShop, KESTREL_REQUIREMENT } from "./fixtures";
import { actAs } from "./helpers";

const DAY = 86_400_000;

describe("what needs doing today", () => {
  it("counts requests awaiting review and the issued quotes lapsing within the week, and only this shop's", async () => {
    const shop = await createShop("kestrel");
    const other = await createShop("kestrel");
    const now = Date.now();
    const today = new Date(now).toISOString().slice(0, 10);
    // valid until today + 5 days: lapsing this week
    const soon = await createQuote(shop, shop.customers[0], KESTREL_REQUIREMENT, new Date(now - 25 * DAY));
    // valid until today + 30 days, and one already lapsed ten days ago: neither counts
    await createQuote(shop, shop.customers[0], KESTREL_REQUIREMENT, new Date(now));
    await createQuote(shop, shop.customers[0], KESTREL_REQUIREMENT, new Date(now - 40 * DAY));
    // another shop's lapsing quote is not this shop's work
    await createQuote(other, other.customers[0], KESTREL_REQUIREMENT, new Date(now - 25 * DAY));
    expect(await countTodayWork(shop.id, today, 7)).toEqual({ needsReview: 0, expiringQuotes: 1 });

    // an accepted quote needs no reminder
    await db
      .update(quotes)
      .set({ status: "accepted" })
      .where(and(eq(quotes.shopId, shop.id), eq(quotes.number, soon)));
    expect((await countTodayWork(shop.id, today, 7)).expiringQuotes).toBe(0);

    // a request beyond the shop's automatic limits waits for review
    await db
      .update(shopSettings)
      .set({ autoQuoteLimits: { maxVoltage: 40, maxStoredEnergy: 2_000_000, maxCellCount: 400 } })
      .where(eq(shopSettings.shopId, shop.id));
    await actAs(shop.customers[0].email);
    const r = await chooseArrangement(shop.slug, choiceOf(KESTREL_REQUIREMENT, await cheapestOption(shop.id, KESTREL_REQUIREMENT)));
    expect(r.ok && r.data.kind).toBe("review");
    expect(await countTodayWork(shop.id, today, 7)).toEqual({ needsReview: 1, expiringQuotes: 0 });
    expect(await countTodayWork(other.id, today, 7)).toEqual({ needsReview: 0, expiringQuotes: 1 });
  });
});
