/**
 * A quote's sell prices as the customer reads them: the bank as one line, any lines the estimator
 * added (an enclosure, a switched discharge circuit, engineering hours, freight), the shop's
 * quantity break on the bank line, a discount with its reason, tax and the total (DESIGN.md §4).
 *
 * Order of rounding (half-up to the currency's minor unit, each amount once):
 *  1. each unit price is rounded; a line's amount = unit price × quantity, rounded (quantities may
 *     be fractional, e.g. 2.5 h);
 *  2. a line's break discount = amount × its break %, rounded (the bank line carries the shop's
 *     quantity break, as priceBank computes it);
 *  3. net = Σ amounts − Σ break discounts (exact);
 *  4. discount: a percentage of net, rounded, or a fixed amount no larger than net;
 *  5. subtotal = net − discount (exact); tax = subtotal × tax %, rounded; total = subtotal + tax.
 * A sheet with only the bank line and no discount adds up to exactly priceBank's subtotal, tax and
 * total for the same bank (a unit test checks it). Pure: decimal.js only.
 */
import { minorUnits, roundMoney } from "./currency";
import { Dec, Decimal, isDecimalString } from "./decimal";
import { PricingError } from "./price-bank";
import type { PricingIssue } from "./types";

/** Most lines one quote may carry. */
export const MAX_SHEET_LINES = 40;
/** Largest quantity on one line (hours, pieces, banks). */
export const MAX_LINE_QUANTITY = 1_000_000;
/** Decimal places a line quantity may have (2.125 h). */
export const LINE_QUANTITY_DECIMALS = 3;

export interface SheetLineInput {
  /** "bank" for the bank itself; otherwise what the estimator added (lib/vocabulary EXTRA_LINE_KINDS) */
  code: string;
  description: string;
  /** decimal string, > 0 */
  quantity: string;
  unit: string;
  /** the sell price per unit, decimal string in the sheet's currency */
  unitPrice: string;
  /** the unit price the shop's rules gave, kept when the estimator overrode it */
  listUnitPrice?: string;
  /** why the estimator overrode it, when they said */
  overrideReason?: string;
  /** quantity-break discount on this line, in % (the bank line) */
  breakPct?: string;
}

export interface SheetLine extends SheetLineInput {
  amount: string;
  /** the break discount on this line ("0.00" when none) */
  breakDiscount: string;
}

export interface SheetDiscountInput {
  kind: "percent" | "amount";
  /** a percentage (0 < p ≤ 100) or an amount in the sheet's currency */
  value: string;
  /** why: required, shown to staff and kept on the quote */
  reason: string;
}

export interface PriceSheet {
  currency: string;
  lines: SheetLine[];
  /** Σ line amounts */
  lineTotal: string;
  /** Σ break discounts */
  breakDiscount: string;
  discount: (SheetDiscountInput & { amount: string }) | null;
  subtotal: string;
  taxPct: string;
  tax: string;
  total: string;
}

export interface PriceSheetInput {
  currency: string;
  taxPct: string;
  lines: readonly SheetLineInput[];
  discount: SheetDiscountInput | null;
}

function checkDecimal(
  issues: PricingIssue[],
  path: string,
  value: unknown,
  { digits, max, positive = false }: { digits: number; max?: number; positive?: boolean },
) {
  if (!isDecimalString(value)) {
    issues.push({ path, message: 'must be a decimal number like "12.50"' });
    return;
  }
  const d = new Dec(value);
  if (d.isNegative() && !d.isZero()) issues.push({ path, message: "must not be negative" });
  else if (positive && d.isZero()) issues.push({ path, message: "must be greater than zero" });
  if (d.decimalPlaces() > digits) issues.push({ path, message: `must have at most ${digits} decimal places` });
  if (max !== undefined && d.greaterThan(max)) issues.push({ path, message: `must be at most ${max.toLocaleString("en-GB")}` });
}

/** Every problem with a sheet's input (empty when it can be priced). */
export function validatePriceSheet(input: PriceSheetInput): PricingIssue[] {
  const issues: PricingIssue[] = [];
  let digits = 2;
  try {
    digits = minorUnits(input.currency);
  } catch {
    issues.push({ path: "currency", message: "must be an ISO 4217 code" });
  }
  checkDecimal(issues, "taxPct", input.taxPct, { digits: 4, max: 100 });
  if (input.lines.length === 0) issues.push({ path: "lines", message: "a quote needs at least one line" });
  if (input.lines.length > MAX_SHEET_LINES) issues.push({ path: "lines", message: `at most ${MAX_SHEET_LINES} lines` });
  input.lines.slice(0, MAX_SHEET_LINES).forEach((line, i) => {
    if (line.description.trim() === "") issues.push({ path: `lines[${i}].description`, message: "must not be empty" });
    checkDecimal(issues, `lines[${i}].quantity`, line.quantity, { digits: LINE_QUANTITY_DECIMALS, max: MAX_LINE_QUANTITY, positive: true });
    checkDecimal(issues, `lines[${i}].unitPrice`, line.unitPrice, { digits });
    if (line.breakPct !== undefined) checkDecimal(issues, `lines[${i}].breakPct`, line.breakPct, { digits: 4, max: 100 });
  });
  const d = input.discount;
  if (d) {
    if (d.reason.trim() === "") issues.push({ path: "discount.reason", message: "Say why the discount is given" });
    if (d.kind === "percent") checkDecimal(issues, "discount.value", d.value, { digits: 4, max: 100, positive: true });
    else checkDecimal(issues, "discount.value", d.value, { digits, positive: true });
  }
  return issues;
}

/** Prices a sheet (see the file header for the order of rounding); throws PricingError on invalid input or a discount larger than the lines. */
export function priceSheet(input: PriceSheetInput): PriceSheet {
  const issues = validatePriceSheet(input);
  if (issues.length > 0) throw new PricingError("invalid-bill", "The quote's lines are not valid", issues);
  const { currency } = input;
  const digits = minorUnits(currency);
  const round = (v: Decimal) => roundMoney(v, currency);
  const str = (v: Decimal) => v.toFixed(digits);

  let lineTotal = new Dec(0);
  let breaks = new Dec(0);
  const lines: SheetLine[] = input.lines.map((line) => {
    const unitPrice = round(new Dec(line.unitPrice));
    const amount = round(unitPrice.times(line.quantity));
    const breakDiscount = line.breakPct ? round(amount.times(new Dec(line.breakPct).div(100))) : new Dec(0);
    lineTotal = lineTotal.plus(amount);
    breaks = breaks.plus(breakDiscount);
    return { ...line, unitPrice: str(unitPrice), amount: str(amount), breakDiscount: str(breakDiscount) };
  });
  const net = lineTotal.minus(breaks);

  let discount: PriceSheet["discount"] = null;
  let discountAmount = new Dec(0);
  if (input.discount) {
    const d = input.discount;
    discountAmount = d.kind === "percent" ? round(net.times(new Dec(d.value).div(100))) : round(new Dec(d.value));
    if (discountAmount.greaterThan(net)) {
      throw new PricingError("invalid-bill", "The discount is larger than the quote", [
        { path: "discount.value", message: `must be at most ${str(net)} ${currency}, the quote before the discount` },
      ]);
    }
    discount = { kind: d.kind, value: d.value, reason: d.reason.trim(), amount: str(discountAmount) };
  }
  const subtotal = net.minus(discountAmount);
  const taxPct = new Dec(input.taxPct);
  const tax = round(subtotal.times(taxPct.div(100)));
  return {
    currency,
    lines,
    lineTotal: str(lineTotal),
    breakDiscount: str(breaks),
    discount,
    subtotal: str(subtotal),
    taxPct: taxPct.toString(),
    tax: str(tax),
    total: str(subtotal.plus(tax)),
  };
}

/** priceSheet as a result: invalid input comes back as the issues, for forms. */
export function tryPriceSheet(input: PriceSheetInput): { ok: true; data: PriceSheet } | { ok: false; message: string; issues: PricingIssue[] } {
  try {
    return { ok: true, data: priceSheet(input) };
  } catch (error) {
    if (error instanceof PricingError) return { ok: false, message: error.message, issues: error.issues };
    throw error;
  }
}
