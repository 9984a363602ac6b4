/**
 * The shop's side of a frozen quote, for its staff only (the desk's quote page): each cost line
 * (parts at unit cost, labour hours at the labour rate, overhead), the cost per bank, the margin
 * on price and what it leaves in money, per bank and for the order. Never on a customer document
 * (quote-document.ts holds what customers see). Pure.
 */
import { formatMoney, type BankPrice } from "@/lib/pricing";
import { Dec, type Decimal } from "@/lib/pricing/decimal";

export interface CostBuildUpLine {
  kind: "material" | "labour" | "overhead";
  description: string;
  quantity: string;
  unit: string;
  unitPrice: string;
  amount: string;
}

export interface CostBuildUp {
  currency: string;
  lines: CostBuildUpLine[];
  materials: string;
  overhead: string;
  labour: string;
  /** cost of one bank */
  cost: string;
  marginPct: string;
  /** sell price of one bank */
  unitPrice: string;
  /** unitPrice − cost */
  marginPerBank: string;
  quantity: number;
  /** (unitPrice × quantity − discount) − cost × quantity: what the order leaves over its cost */
  orderMargin: string;
}

export function toCostBuildUp(p: BankPrice): CostBuildUp {
  const m = (a: Decimal | string) => formatMoney(typeof a === "string" ? a : a.toString(), p.currency);
  const perBank = new Dec(p.unitPrice).minus(p.cost);
  const order = new Dec(p.unitPrice).times(p.quantity).minus(p.discount).minus(new Dec(p.cost).times(p.quantity));
  return {
    currency: p.currency,
    lines: p.lines.map((l) => ({
      kind: l.kind,
      description: l.description,
      quantity: String(l.quantity),
      unit: l.unit,
      unitPrice: m(l.unitPrice),
      amount: m(l.amount),
    })),
    materials: m(p.materials),
    overhead: m(p.overhead),
    labour: m(p.labour),
    cost: m(p.cost),
    marginPct: `${new Dec(p.marginPct).toString()} %`,
    unitPrice: m(p.unitPrice),
    marginPerBank: m(perBank),
    quantity: p.quantity,
    orderMargin: m(order),
  };
}
