import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { sixCellBill } from "./six-cell-bill";
import { DEFAULT_PRICING_RULES, PricingError, priceBank, priceSheet, selectDiscountPct, tryPriceSheet, type BankBill } from "@/lib/pricing";

// Parts and figures are invented.
const bank = { code: "bank", description: "Capacitor bank, 18 S × 1 P, assembled and tested", unit: "bank" };

describe("priceSheet — hand-worked example, EUR", () => {
  // By hand (EUR has 2 minor digits, ISO 4217; half-up rounding, common practice):
  //   bank          3 × 1,204.57            = 3,613.71; break 4 % of 3,613.71 = 144.5484 → 144.55
  //   enclosure     1 × 212.40              =   212.40
  //   engineering   2.5 h × 85.00           =   212.50
  //   freight       1 × 64.00               =    64.00
  //   line total                            = 4,102.61
  //   net           4,102.61 − 144.55       = 3,958.06
  //   discount      5 % of 3,958.06 = 197.903 → 197.90
  //   subtotal      3,958.06 − 197.90       = 3,760.16
  //   tax           20 % × 3,760.16 = 752.032 → 752.03
  //   total         3,760.16 + 752.03       = 4,512.19
  const sheet = priceSheet({
    currency: "EUR",
    taxPct: "20",
    lines: [
      { ...bank, quantity: "3", unitPrice: "1204.57", breakPct: "4" },
      { code: "enclosure", description: "Steel cabinet, 40 L", quantity: "1", unit: "pc", unitPrice: "212.40" },
      { code: "engineering", description: "Engineering", quantity: "2.5", unit: "h", unitPrice: "85" },
      { code: "freight", description: "Freight, pallet", quantity: "1", unit: "lot", unitPrice: "64.00" },
    ],
    discount: { kind: "percent", value: "5", reason: "Repeat customer" },
  });

  it("prices each line and the totals as worked by hand", () => {
    expect(sheet.lines.map((l) => [l.amount, l.breakDiscount])).toEqual([
      ["3613.71", "144.55"],
      ["212.40", "0.00"],
      ["212.50", "0.00"],
      ["64.00", "0.00"],
    ]);
    expect(sheet).toMatchObject({
      lineTotal: "4102.61",
      breakDiscount: "144.55",
      discount: { kind: "percent", value: "5", reason: "Repeat customer", amount: "197.90" },
      subtotal: "3760.16",
      tax: "752.03",
      total: "4512.19",
    });
  });

  it("rounds to each currency's minor unit (ISO 4217: JPY 0, KWD 3)", () => {
    const jpy = priceSheet({ currency: "JPY", taxPct: "10", lines: [{ ...bank, quantity: "1.5", unitPrice: "1001" }], discount: null });
    // 1.5 × 1001 = 1501.5 → 1502; tax 150.2 → 150; total 1652
    expect([jpy.lines[0]?.amount, jpy.tax, jpy.total]).toEqual(["1502", "150", "1652"]);
    const kwd = priceSheet({
      currency: "KWD",
      taxPct: "0",
      lines: [{ ...bank, quantity: "3", unitPrice: "0.335" }],
      discount: { kind: "amount", value: "0.005", reason: "r" },
    });
    expect([kwd.lines[0]?.amount, kwd.subtotal, kwd.total]).toEqual(["1.005", "1.000", "1.000"]);
  });

  it("refuses a discount without a reason, larger than the quote, or lines that are not money", () => {
    const base = { currency: "EUR", taxPct: "20", lines: [{ ...bank, quantity: "1", unitPrice: "100.00" }] };
    expect(tryPriceSheet({ ...base, discount: { kind: "percent", value: "10", reason: "  " } })).toMatchObject({
      ok: false,
      issues: [{ path: "discount.reason" }],
    });
    expect(tryPriceSheet({ ...base, discount: { kind: "amount", value: "100.01", reason: "goodwill" } })).toMatchObject({
      ok: false,
      issues: [{ path: "discount.value" }],
    });
    // a whole 100 % discount is allowed (a free replacement bank, say)
    expect(priceSheet({ ...base, discount: { kind: "percent", value: "100", reason: "warranty replacement" } }).total).toBe("0.00");
    const bad = tryPriceSheet({ ...base, lines: [{ ...bank, quantity: "0", unitPrice: "1.234" }], discount: null });
    expect(bad.ok ? [] : bad.issues.map((i) => i.path)).toEqual(["lines[0].quantity", "lines[0].unitPrice"]);
    expect(() => priceSheet({ ...base, lines: [], discount: null })).toThrow(PricingError);
  });
});

describe("a bank-only sheet says exactly what priceBank says", () => {
  const bill: BankBill = { ...sixCellBill, quantity: 1 };
  it("for any quantity, margin and tax rate", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 5000 }),
        fc.integer({ min: 0, max: 95 }),
        fc.integer({ min: 0, max: 2500 }).map((n) => String(n / 100)),
        fc.constantFrom("EUR", "JPY", "KWD"),
        (quantity, margin, tax, currency) => {
          const rules = {
            ...DEFAULT_PRICING_RULES,
            currency,
            marginPct: String(margin),
            taxRatePct: tax,
            labourRatePerHour: "68",
            interconnectCostPerCell: "2",
            balancingResistorCost: "1",
            bleederCostPerWatt: "1",
            balancingBoardCost: "18",
            terminalSetCost: "24",
            enclosures: DEFAULT_PRICING_RULES.enclosures.map((e) => ({ ...e, cost: "40" })),
          };
          const p = priceBank({ ...bill, quantity }, rules);
          const sheet = priceSheet({
            currency,
            taxPct: rules.taxRatePct,
            lines: [{ ...bank, quantity: String(quantity), unitPrice: p.unitPrice, breakPct: selectDiscountPct(quantity, rules.quantityBreaks) }],
            discount: null,
          });
          expect([sheet.breakDiscount, sheet.subtotal, sheet.tax, sheet.total]).toEqual([p.discount, p.subtotal, p.tax, p.total]);
        },
      ),
    );
  });
});
