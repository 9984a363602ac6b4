/**
 * The sell prices a quote revision freezes (lib/pricing/price-sheet.ts): the bank as one line —
 * what it is, assembled and tested, at the price the shop's rules give or the estimator's
 * override — with the shop's quantity break, the lines the estimator added, and a discount with
 * its reason. Pure.
 */
import type { BankPrice, PriceSheet, SheetDiscountInput, SheetLineInput } from "@/lib/pricing";
import { priceSheet } from "@/lib/pricing";
import { Dec } from "@/lib/pricing/decimal";
import { sellPresentation, type SellLine } from "@/lib/pricing/sell";
import { formatQuantity } from "@/lib/quantities";
import { EXTRA_LINE_LABELS, TECHNOLOGY_LABELS, type ExtraLineKind } from "@/lib/vocabulary";
import { partsOf } from "./custom-bank";
import type { PricedOption, RevisionDesign } from "./types";

/** A line an estimator adds beside the bank. */
export interface ExtraLineInput {
  kind: ExtraLineKind;
  description: string;
  /** decimal string */
  quantity: string;
  unit: string;
  /** decimal string, the sell price per unit */
  unitPrice: string;
}

/**
 * The bank as the customer's one line: what it is, how it is built, assembled and tested
 * ("Supercapacitor (EDLC) bank rated 48.6 V, 23.1 F: 18 S × 2 P of QFS-1200R27 with balancing resistors,
 * enclosure and terminals, assembled and tested"); a custom bank names the cells it is made of.
 */
export function bankLineDescription(o: Omit<PricedOption, "price" | "pareto">, design: RevisionDesign = { source: "customer-choice" }): string {
  if (design.source === "custom") {
    const parts = partsOf(design.network)
      .map((p) => `${p.count} × ${p.sku}`)
      .join(", ");
    return `Custom capacitor bank of ${o.cellCount} cells (${parts}), assembled and tested`;
  }
  const b = o.balancing;
  const balancing = b.activeBoard ? "active balancing boards" : b.resistance !== null && b.count > 0 ? "balancing resistors" : null;
  const bleeder = o.discharge.bleeder ? (o.discharge.bleeder.switched ? "a switched discharge circuit (priced apart)" : "a bleeder resistor") : null;
  const parts = [balancing, bleeder, "enclosure and terminals"].filter(Boolean).join(", ");
  const tech = TECHNOLOGY_LABELS[o.cell.technology] ?? o.cell.technology;
  return `${tech} bank rated ${formatQuantity(o.maxVoltage, "V")}, ${formatQuantity(o.capacitance.nominal, "F")}: ${o.seriesCount} S × ${o.parallelCount} P of ${o.cell.sku} with ${parts}, assembled and tested`;
}

export interface SheetInput {
  currency: string;
  taxPct: string;
  /** banks ordered */
  quantity: number;
  bankDescription: string;
  /** the price per bank the shop's rules give */
  bankUnitPrice: string;
  /** the shop's quantity break for this quantity, in % */
  bankBreakPct: string;
  /** the estimator's price per bank, when they set one */
  bankOverride: { unitPrice: string; reason: string } | null;
  extras: readonly ExtraLineInput[];
  discount: SheetDiscountInput | null;
}

/** The lines of a revision, before pricing. */
export function sheetLines(input: SheetInput): SheetLineInput[] {
  const override = input.bankOverride && input.bankOverride.unitPrice !== input.bankUnitPrice ? input.bankOverride : null;
  const bank: SheetLineInput = {
    code: "bank",
    description: input.bankDescription,
    quantity: String(input.quantity),
    unit: input.quantity === 1 ? "bank" : "banks",
    unitPrice: override ? override.unitPrice : input.bankUnitPrice,
    breakPct: input.bankBreakPct,
  };
  if (override) {
    bank.listUnitPrice = input.bankUnitPrice;
    if (override.reason.trim() !== "") bank.overrideReason = override.reason.trim();
  }
  const extras = input.extras.map((e): SheetLineInput => ({
    code: e.kind,
    description: e.description.trim() || EXTRA_LINE_LABELS[e.kind],
    quantity: e.quantity,
    unit: e.unit,
    unitPrice: e.unitPrice,
  }));
  return [bank, ...extras];
}

/** Prices a revision's sheet (throws PricingError on invalid input; tryPriceSheet for forms). */
export function buildSheet(input: SheetInput): PriceSheet {
  return priceSheet({ currency: input.currency, taxPct: input.taxPct, lines: sheetLines(input), discount: input.discount });
}

/**
 * A revision's sheet: as frozen, or — for revisions priced by the shop's rules alone (priceBank,
 * with any extra lines) — the customer's lines as sellPresentation gives them, in the sheet's shape.
 * The totals are the frozen price's own.
 */
export function revisionSheet(rev: { sheet: PriceSheet | null; pricing: BankPrice; arrangement: PricedOption; design: RevisionDesign | null }): PriceSheet {
  if (rev.sheet) return rev.sheet;
  const sell = sellPresentation(rev.pricing, bankLineDescription(rev.arrangement, rev.design ?? { source: "customer-choice" }));
  const [bank, ...extras] = sell.lines as [SellLine, ...SellLine[]];
  const breakDiscount = sell.discount?.amount ?? new Dec(0).toFixed(new Dec(sell.total).decimalPlaces());
  return {
    currency: sell.currency,
    lines: [
      { code: "bank", ...bank, quantity: String(bank.quantity), breakPct: sell.discount?.pct ?? "0", breakDiscount },
      ...extras.map((e) => ({ code: "other", ...e, quantity: String(e.quantity), breakDiscount: new Dec(0).toFixed(new Dec(e.amount).decimalPlaces()) })),
    ],
    lineTotal: new Dec(sell.subtotal).plus(breakDiscount).toFixed(new Dec(sell.subtotal).decimalPlaces()),
    breakDiscount,
    discount: null,
    subtotal: sell.subtotal,
    taxPct: sell.taxPct,
    tax: sell.tax,
    total: sell.total,
  };
}
