import { describe, expect, it } from "vitest";
import { amountFor, balanceOf, checkoutLines, depositOf, linesTotal, payableKinds } from "@/lib/payments/amounts";

// Minor units from ISO 4217 list one: EUR 2, JPY 0, KWD 3 digits. Deposits are rounded half-up to
// the minor unit (common commercial practice).
describe("what a checkout asks for", () => {
  it.each([
    ["1208.30", 30, "EUR", "362.49"], // 362.490
    ["1000.05", 30, "EUR", "300.02"], // 300.015 → half-up
    ["1000.15", 30, "EUR", "300.05"], // 300.045 → half-up
    ["123457", 25, "JPY", "30864"], // 30864.25
    ["123457", 50, "JPY", "61729"], // 61728.5 → half-up
    ["10.005", 10, "KWD", "1.001"], // 1.0005 → half-up
    ["99.99", 100, "EUR", "99.99"],
    ["99.99", 0, "EUR", "0.00"],
  ] as const)("deposit of %s at %i %% in %s is %s", (total, pct, currency, deposit) => {
    expect(depositOf(total, pct, currency)).toBe(deposit);
  });

  it("offers the deposit only for a share strictly between 0 and 100, then the balance, then nothing", () => {
    const base = { total: "1208.30", currency: "EUR" };
    expect(payableKinds({ ...base, depositPercent: 30, paid: "0" })).toEqual(["full", "deposit"]);
    expect(payableKinds({ ...base, depositPercent: 0, paid: "0" })).toEqual(["full"]);
    expect(payableKinds({ ...base, depositPercent: 100, paid: "0" })).toEqual(["full"]);
    expect(payableKinds({ ...base, depositPercent: 30, paid: "362.49" })).toEqual(["balance"]);
    expect(payableKinds({ ...base, depositPercent: 30, paid: "1208.30" })).toEqual([]);
    expect(amountFor("balance", { ...base, depositPercent: 30, paid: "362.49" })).toBe("845.81");
    expect(balanceOf("10.00", "12.00", "EUR")).toBe("0.00");
  });

  const quote = { currency: "EUR", quoteNumber: "Q-2026-0042", revision: 2, bankName: "Capacitor bank 18 S × 4 P, KBW-3000 cells", taxPct: "20" };

  it("lists the banks at their unit price and the tax, adding up to the total in cents", () => {
    const lines = checkoutLines({
      ...quote,
      kind: "full",
      quantity: 3,
      unitPrice: "402.50",
      discountPct: "0",
      subtotal: "1207.50",
      tax: "241.50",
      total: "1449.00",
      amount: "1449.00",
    });
    expect(lines).toEqual([
      { name: "Capacitor bank 18 S × 4 P, KBW-3000 cells (quote Q-2026-0042, revision 2)", quantity: 3, unitAmount: 40250 },
      { name: "Tax (20 %)", quantity: 1, unitAmount: 24150 },
    ]);
    expect(linesTotal(lines)).toBe(144900);
  });

  it("shows a quantity discount as one line after the discount, still adding up exactly", () => {
    const lines = checkoutLines({
      ...quote,
      kind: "full",
      quantity: 7,
      unitPrice: "402.53",
      discountPct: "4",
      subtotal: "2705.00",
      tax: "541.00",
      total: "3246.00",
      amount: "3246.00",
    });
    expect(lines[0]).toMatchObject({ quantity: 1, unitAmount: 270500 });
    expect(lines[0]?.name).toMatch(/^7 × .* less 4 % quantity discount/);
    expect(linesTotal(lines)).toBe(324600);
  });

  it("asks a deposit or a balance as one line naming the quote", () => {
    const deposit = checkoutLines({
      ...quote,
      kind: "deposit",
      quantity: 1,
      unitPrice: "1208.30",
      discountPct: "0",
      subtotal: "1006.92",
      tax: "201.38",
      total: "1208.30",
      amount: "362.49",
    });
    expect(deposit).toEqual([
      { name: "Deposit on quote Q-2026-0042, revision 2: 1 × Capacitor bank 18 S × 4 P, KBW-3000 cells", quantity: 1, unitAmount: 36249 },
    ]);
    const yen = checkoutLines({
      ...quote,
      currency: "JPY",
      kind: "balance",
      quantity: 1,
      unitPrice: "123457",
      discountPct: "0",
      subtotal: "102881",
      tax: "20576",
      total: "123457",
      amount: "92593",
    });
    expect(yen[0]?.unitAmount).toBe(92593);
  });
});
