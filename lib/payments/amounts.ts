/**
 * What a checkout asks for, in exact money (pure: decimal.js through lib/pricing, no database,
 * no framework): the whole quote, the shop's deposit, or the balance left after a deposit; and the
 * lines the payment page shows, in integer minor units (ISO 4217) that add up to exactly that.
 */
import { Dec } from "@/lib/pricing/decimal";
import { minorUnits, moneyString, toMinorUnits } from "@/lib/pricing";
import type { PaymentKind } from "@/lib/vocabulary";

/** The deposit share a shop may ask, in whole percent: 0 (no deposit: full payment only) to 100. */
export const MAX_DEPOSIT_PERCENT = 100;

/** The deposit on a total: `depositPercent` % of it, rounded half-up to the currency's minor unit. */
export function depositOf(total: string, depositPercent: number, currency: string): string {
  return moneyString(new Dec(total).times(depositPercent).dividedBy(100), currency);
}

/** What is still owed: the total less what has been paid, never below zero. */
export function balanceOf(total: string, paid: string, currency: string): string {
  const left = new Dec(total).minus(paid);
  return moneyString(left.isNegative() ? new Dec(0) : left, currency);
}

/**
 * The kinds of payment a customer may make on a quote now: before any payment the whole quote, or
 * the deposit when the shop asks one (0 < deposit < 100 %); after a deposit, the balance.
 */
export function payableKinds(input: { depositPercent: number; paid: string; total: string; currency: string }): PaymentKind[] {
  const paid = new Dec(input.paid);
  if (paid.isZero()) return input.depositPercent > 0 && input.depositPercent < MAX_DEPOSIT_PERCENT ? ["full", "deposit"] : ["full"];
  return new Dec(balanceOf(input.total, input.paid, input.currency)).isZero() ? [] : ["balance"];
}

/** The amount a payment of `kind` asks for. */
export function amountFor(kind: PaymentKind, input: { depositPercent: number; paid: string; total: string; currency: string }): string {
  if (kind === "deposit") return depositOf(input.total, input.depositPercent, input.currency);
  if (kind === "balance") return balanceOf(input.total, input.paid, input.currency);
  return moneyString(input.total, input.currency);
}

/** One line of the payment page, as the payment service takes it (integer minor units). */
export interface CheckoutLine {
  name: string;
  quantity: number;
  unitAmount: number;
}

export interface CheckoutLinesInput {
  kind: PaymentKind;
  currency: string;
  quoteNumber: string;
  revision: number;
  /** "Capacitor bank 18 S × 4 P, KBW-3000 cells" */
  bankName: string;
  quantity: number;
  /** per bank, before any quantity discount */
  unitPrice: string;
  discountPct: string;
  subtotal: string;
  taxPct: string;
  tax: string;
  total: string;
  /** what this payment asks for (amountFor) */
  amount: string;
}

/**
 * The lines of a checkout, adding up to exactly `amount` in minor units. The whole quote shows its
 * banks (at the price per bank when no quantity discount applies, else as one line after the
 * discount) and its tax; a deposit or a balance is one line naming the quote and its total.
 */
export function checkoutLines(i: CheckoutLinesInput): CheckoutLine[] {
  const ref = `quote ${i.quoteNumber}, revision ${i.revision}`;
  const minor = (amount: string) => toMinorUnits(moneyString(amount, i.currency), i.currency);
  if (i.kind !== "full") {
    const what = i.kind === "deposit" ? `Deposit on ${ref}` : `Balance of ${ref}`;
    return [{ name: `${what}: ${i.quantity} × ${i.bankName}`, quantity: 1, unitAmount: minor(i.amount) }];
  }
  const lines: CheckoutLine[] = [];
  const unit = new Dec(i.unitPrice);
  const undiscounted = unit.decimalPlaces() <= minorUnits(i.currency) && unit.times(i.quantity).equals(new Dec(i.subtotal));
  if (undiscounted) lines.push({ name: `${i.bankName} (${ref})`, quantity: i.quantity, unitAmount: minor(i.unitPrice) });
  else lines.push({ name: `${i.quantity} × ${i.bankName}, less ${i.discountPct} % quantity discount (${ref})`, quantity: 1, unitAmount: minor(i.subtotal) });
  if (!new Dec(i.tax).isZero()) lines.push({ name: `Tax (${i.taxPct} %)`, quantity: 1, unitAmount: minor(i.tax) });
  return lines;
}

/** The sum of the lines in minor units. */
export function linesTotal(lines: readonly CheckoutLine[]): number {
  return lines.reduce((sum, l) => sum + l.quantity * l.unitAmount, 0);
}
