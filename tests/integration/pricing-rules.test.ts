/**
 * Pricing rules kept as versions: a save needs a reason and makes a new version with who, when and
 * why; the history diffs each version against the one before; an edit from a stale version is a
 * conflict; "what a change does" re-prices the shop's last quotes under both rule sets (the rules
 * in force give back exactly the frozen prices); the API refuses bad rules naming the field.
 */
import { Decimal } from "decimal.js";
import { describe, expect, it } from "vitest";
import { previewPricingRules, savePricingRules } from "@/app/desk/[shop]/pricing/actions";
import { PUT as putRulesRoute } from "@/app/api/v1/shops/[shop]/pricing-rules/route";
import { getQuoteByNumber, getRevision } from "@/db/queries/quotes";
import { getRulesInForce, listRuleVersions } from "@/db/queries/pricing-rules";
import { diffRules } from "@/lib/pricing/rule-versions";
import { ruleVersionList } from "@/lib/validation/lists";
import { formFromRules } from "@/lib/validation/pricing";
import { createQuote, createShop, KESTREL_REQUIREMENT } from "./fixtures";
import { actAs, request, sessionCookie } from "./helpers";

describe("pricing rule versions", () => {
  it("a save needs a reason, makes a version with who and why, and the history shows each change field by field", async () => {
    const shop = await createShop("kestrel");
    const { rules } = await getRulesInForce(shop.id);
    await actAs(shop.estimator.email);
    const noReason = await savePricingRules(shop.slug, { values: { ...formFromRules(rules), marginPct: "30" }, version: 0 });
    expect(noReason).toMatchObject({ ok: false, code: "invalid", fieldErrors: { reason: [expect.stringMatching(/Say why/)] } });
    const badMargin = await savePricingRules(shop.slug, { values: { ...formFromRules(rules), marginPct: "100", reason: "Try" }, version: 0 });
    expect(badMargin).toMatchObject({ ok: false, fieldErrors: { marginPct: [expect.stringMatching(/below 100/)] } });

    const first = await savePricingRules(shop.slug, {
      values: {
        ...formFromRules(rules),
        marginPct: "30",
        quantityBreaks: [...formFromRules(rules).quantityBreaks, { minQuantity: "100", discountPct: "15" }],
        reason: "Larger fleet orders",
      },
      version: 0,
    });
    expect(first).toMatchObject({ ok: true, data: { version: 2 } });
    await actAs(shop.manager.email);
    const second = await savePricingRules(shop.slug, {
      values: { ...formFromRules(rules), depositPercent: "40", reason: "A larger deposit from now on" },
      version: 2,
    });
    expect(second).toMatchObject({ ok: true, data: { version: 3 } });
    // a form opened at version 2 cannot overwrite version 3
    const stale = await savePricingRules(shop.slug, { values: { ...formFromRules(rules), reason: "Late" }, version: 2 });
    expect(stale).toMatchObject({ ok: false, code: "conflict", message: expect.stringMatching(/version 3/) });

    const history = await listRuleVersions(shop.id, ruleVersionList.defaults);
    expect(history.rows.map((v) => [v.version, v.reason, v.savedByName])).toEqual([
      [3, "A larger deposit from now on", shop.manager.name],
      [2, "Larger fleet orders", shop.estimator.name],
      [1, "The rules in force before changes were recorded", null],
    ]);
    const [v3, v2] = history.rows;
    expect(diffRules(v2!.previous!, v2!.rules).map((c) => [c.label, c.from, c.to])).toEqual([
      ["Margin on price", "26 %", "30 %"],
      ["Quantity breaks", "from 5: 3 %; from 10: 6 %; from 25: 9 %; from 50: 12 %", "from 5: 3 %; from 10: 6 %; from 25: 9 %; from 50: 12 %; from 100: 15 %"],
    ]);
    // version 3 came from the form as first opened: it puts the margin and breaks back and raises the
    // demo shop's 30 % deposit (db/seed/pricing-rules.ts)
    expect(diffRules(v3!.previous!, v3!.rules).map((c) => c.label)).toEqual(["Margin on price", "Quantity breaks", "Deposit on acceptance"]);
    expect(diffRules(v3!.previous!, v3!.rules).at(-1)).toMatchObject({ from: "30 %", to: "40 %" });
    expect((await getRulesInForce(shop.id)).rules.depositPercent).toBe(40);
  });

  it("what a change does: the last quotes priced again — the rules in force give exactly the frozen prices — and under the proposed rules", async () => {
    const shop = await createShop("kestrel");
    const numbers = [await createQuote(shop, shop.customers[0]), await createQuote(shop, shop.customers[1], { ...KESTREL_REQUIREMENT, quantity: 10 })];
    const { rules } = await getRulesInForce(shop.id);
    await actAs(shop.estimator.email);
    const r = await previewPricingRules(shop.slug, { values: { ...formFromRules(rules), marginPct: "31" } });
    if (!r.ok) throw new Error(JSON.stringify(r));
    expect(r.data.changes.map((c) => c.key)).toEqual(["marginPct"]);
    expect(r.data.rows.map((x) => x.number).sort()).toEqual([...numbers].sort());
    for (const row of r.data.rows) {
      const quote = await getQuoteByNumber(shop.id, row.number);
      const frozen = (await getRevision(shop.id, quote!.revisionId))!.revision.pricing;
      expect(row.current?.price).toBe(frozen.subtotal);
      // margin in money = banks after the break − cost × quantity (DESIGN.md §4)
      const banks = new Decimal(frozen.unitPrice).times(frozen.quantity).minus(frozen.discount);
      expect(row.current?.margin).toBe(banks.minus(new Decimal(frozen.cost).times(frozen.quantity)).toFixed(2));
      // proposed: price per bank = cost / (1 − 0.31), half-up to cents
      expect(row.proposed?.perBank).toBe(new Decimal(frozen.cost).div("0.69").toDecimalPlaces(2, Decimal.ROUND_HALF_UP).toFixed(2));
      expect(new Decimal(row.change!.amount).greaterThan(0)).toBe(true);
      expect(new Decimal(row.proposed!.margin).greaterThan(row.current!.margin)).toBe(true);
    }
  });

  it("the API takes the whole rule set with a reason, refuses a bad one naming the field, and keeps issued quotes as they were", async () => {
    const shop = await createShop("marlow");
    const number = await createQuote(shop, shop.customers[0], { maxVoltage: 800, capacitance: 10e-6, quantity: 1 });
    const before = (await getRevision(shop.id, (await getQuoteByNumber(shop.id, number))!.revisionId))!;
    const cookie = await sessionCookie(shop.estimator.email);
    const { rules } = await getRulesInForce(shop.id);
    const put = (body: unknown) =>
      putRulesRoute(request(`/api/v1/shops/${shop.slug}/pricing-rules`, { method: "PUT", cookie, body: JSON.stringify(body) }), {
        params: Promise.resolve({ shop: shop.slug }),
      });
    const bad = await put({ rules: { ...rules, depositPercent: 120 }, reason: "Too much" });
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues).toEqual([{ path: "rules.depositPercent", message: expect.stringMatching(/100/) }]);
    expect((await put({ rules, reason: "" })).status).toBe(400);
    expect((await put({ rules: { ...rules, currency: "XYZ" }, reason: "New currency" })).status).toBe(400);
    const ok = await put({ rules: { ...rules, labourRatePerHour: "75.00", taxRatePct: "5" }, reason: "New rates" });
    expect(ok.status).toBe(200);
    const after = (await getRevision(shop.id, (await getQuoteByNumber(shop.id, number))!.revisionId))!;
    expect(after.revision.total).toBe(before.revision.total);
    expect(after.revision.pricing).toEqual(before.revision.pricing);
  });
});
