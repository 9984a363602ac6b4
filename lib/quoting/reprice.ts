/**
 * "What a change does": the arrangements of a shop's recent quotes priced again under the rules in
 * force and under proposed rules, with today's catalog costs, so an estimator sees each price, the
 * change and the margin in money before saving. Issued revisions are not touched: this only
 * computes. Pure: no database, no framework.
 */
import { tryPriceBank, type BankPrice, type PricingRules } from "@/lib/pricing";
import { Dec } from "@/lib/pricing/decimal";
import { billFor } from "./bill";
import type { CatalogCell, CatalogComponent, FrozenCell, PricedOption } from "./types";

/** One recent quote as frozen: its arrangement, cell and price (extra lines are priced again as they were). */
export interface QuotedArrangement {
  number: string;
  customerName: string;
  arrangement: PricedOption;
  cell: FrozenCell;
  pricing: BankPrice;
  quantity: number;
}

/** One bank's figures under one rule set: the price before tax and the margin in money, for the whole order. */
export interface RepricedFigures {
  /** subtotal before tax (banks after the quantity break, plus extra lines) */
  price: string;
  /** price per bank */
  perBank: string;
  /** (bank price after the break) − cost × quantity: what the shop keeps over its cost */
  margin: string;
}

export interface RepricedQuote {
  number: string;
  customerName: string;
  description: string;
  quantity: number;
  currency: string;
  /** null when the rules cannot price the bank (with the reason) */
  current: RepricedFigures | null;
  proposed: RepricedFigures | null;
  /** proposed − current price, and in % of the current; null when either is missing */
  change: { amount: string; pct: string } | null;
  problem: string | null;
}

function figures(p: BankPrice): RepricedFigures {
  const banks = new Dec(p.unitPrice).times(p.quantity).minus(p.discount);
  return { price: p.subtotal, perBank: p.unitPrice, margin: banks.minus(new Dec(p.cost).times(p.quantity)).toFixed(new Dec(p.cost).decimalPlaces()) };
}

/**
 * Prices each quoted arrangement under both rule sets. The cell's cost is today's when the catalog
 * still holds the part (else the frozen one); resistors and boards are today's catalog parts.
 */
export function repriceQuotes(
  quoted: readonly QuotedArrangement[],
  catalog: { cells: readonly CatalogCell[]; components: readonly CatalogComponent[] },
  current: PricingRules,
  proposed: PricingRules,
): RepricedQuote[] {
  const bySku = new Map(catalog.cells.map((c) => [c.sku, c]));
  return quoted.map((q) => {
    const cell: CatalogCell = bySku.get(q.cell.sku) ?? { ...q.cell, stock: 0 };
    const o = q.arrangement;
    const description = `${o.cell.sku}, ${o.seriesCount} S × ${o.parallelCount} P`;
    const bill = billFor(o, cell, catalog.components, q.quantity);
    const base = { number: q.number, customerName: q.customerName, description, quantity: q.quantity };
    if (!bill.ok) return { ...base, currency: current.currency, current: null, proposed: null, change: null, problem: bill.message };
    const extras = q.pricing.extras ?? [];
    const a = tryPriceBank(bill.bill, current, extras);
    const b = tryPriceBank(bill.bill, proposed, extras);
    const cur = a.ok ? figures(a.data) : null;
    const pro = b.ok ? figures(b.data) : null;
    const change =
      cur && pro && proposed.currency === current.currency
        ? {
            amount: new Dec(pro.price).minus(cur.price).toString(),
            pct: new Dec(cur.price).isZero() ? "0" : new Dec(pro.price).minus(cur.price).div(cur.price).times(100).toDecimalPlaces(1).toString(),
          }
        : null;
    const problem = !a.ok ? a.message : !b.ok ? b.message : null;
    return { ...base, currency: proposed.currency, current: cur, proposed: pro, change, problem };
  });
}
