/**
 * The sell prices a quote revision freezes (lib/pricing/price-sheet.ts): the bank as one line —
 * what it is, assembled and tested, at the price the shop's rules give or the estimator's
 * override — with the shop's quantity break, the lines the estimator added, and a discount with
 * its reason. Pure.
 */
import type { BankPrice, PriceSheet, SheetDiscountInput, SheetLineInput } from "@/lib/pricing";
import { priceSheet } from "@/lib/pricing";
import { arrangementLabel, EXTRA_LINE_LABELS, type ExtraLineKind } from "@/lib/vocabulary";
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

/** The bank line's words: "Capacitor bank, 18 S × 4 P of KBW-3000 (72 cells), assembled and tested". */
export function bankLineDescription(option: Pick<PricedOption, "seriesCount" | "parallelCount" | "cellCount" | "cell">, design: RevisionDesign): string {
  if (design.source === "custom") {
    const parts = partsOf(design.network)
      .map((p) => `${p.count} × ${p.sku}`)
      .join(", ");
    return `Custom capacitor bank of ${option.cellCount} cells (${parts}), assembled and tested`;
  }
  return `Capacitor bank, ${arrangementLabel(option)} of ${option.cell.sku} (${option.cellCount} cells), assembled and tested`;
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
 * A revision's sheet: as frozen, or — for revisions frozen before sheets were kept — the one bank
 * line its price build-up gives, which adds up to exactly the same totals.
 */
export function revisionSheet(rev: { sheet: PriceSheet | null; pricing: BankPrice; arrangement: PricedOption; design: RevisionDesign | null }): PriceSheet {
  if (rev.sheet) return rev.sheet;
  const p = rev.pricing;
  return buildSheet({
    currency: p.currency,
    taxPct: p.taxPct,
    quantity: p.quantity,
    bankDescription: bankLineDescription(rev.arrangement, rev.design ?? { source: "customer-choice" }),
    bankUnitPrice: p.unitPrice,
    bankBreakPct: p.discountPct || "0",
    bankOverride: null,
    extras: [],
    discount: null,
  });
}
