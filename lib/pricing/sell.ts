/**
 * What a customer is shown of a price: sell prices only. The bank is one line (described by the
 * caller: what it is, assembled and tested) at its price per bank, then any extra lines the
 * estimator added, the quantity discount, the subtotal, tax and the total. Never a unit cost, the
 * overhead, labour hours or the margin: those stay in the build-up on the staff's desk. Reads every
 * frozen price, including those frozen before extra lines existed. Pure.
 */
import { Dec } from "./decimal";
import type { BankPrice } from "./types";

export interface SellLine {
  description: string;
  quantity: number;
  unit: string;
  unitPrice: string;
  amount: string;
}

export interface SellPresentation {
  currency: string;
  lines: SellLine[];
  /** the quantity break on the banks, when one applies */
  discount: { pct: string; amount: string } | null;
  subtotal: string;
  taxPct: string;
  tax: string;
  total: string;
}

export function sellPresentation(price: BankPrice, bankDescription: string): SellPresentation {
  const digits = new Dec(price.total).decimalPlaces();
  const bank: SellLine = {
    description: bankDescription,
    quantity: price.quantity,
    unit: price.quantity === 1 ? "bank" : "banks",
    unitPrice: price.unitPrice,
    amount: new Dec(price.unitPrice).times(price.quantity).toFixed(Math.max(digits, new Dec(price.unitPrice).decimalPlaces())),
  };
  const extras: SellLine[] = (price.extras ?? []).map((e) => ({
    description: e.description,
    quantity: e.quantity,
    unit: e.unit,
    unitPrice: e.unitPrice,
    amount: e.amount,
  }));
  const discounted = new Dec(price.discountPct).greaterThan(0) && !new Dec(price.discount).isZero();
  return {
    currency: price.currency,
    lines: [bank, ...extras],
    discount: discounted ? { pct: new Dec(price.discountPct).toString(), amount: price.discount } : null,
    subtotal: price.subtotal,
    taxPct: new Dec(price.taxPct).toString(),
    tax: price.tax,
    total: price.total,
  };
}
