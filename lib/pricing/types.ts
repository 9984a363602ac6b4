/**
 * Pricing types. Money is always a decimal string (never a float); physics is SI numbers.
 * See DESIGN.md §4.
 */

/** A shop's pricing rules. Every money value is a decimal string in `currency`. */
export interface PricingRules {
  /** ISO 4217 alphabetic code, upper case, e.g. "EUR". */
  currency: string;
  labourRatePerHour: string;
  setupMinutes: number;
  minutesPerCell: number;
  testMinutes: number;
  /** Overhead, in %, charged on materials only. */
  overheadPct: string;
  /** Margin ON PRICE, in %: price = cost / (1 − margin). Must be below 100. */
  marginPct: string;
  taxRatePct: string;
  interconnectCostPerCell: string;
  /**
   * No longer read: balancing and bleeder resistors are priced from the catalog by their power
   * class (lib/quoting/bill.ts). Kept optional so rules saved before that still read.
   */
  balancingResistorCost?: string;
  /** No longer read (see balancingResistorCost). */
  bleederCostPerWatt?: string;
  /** Used when an active balancing board in the bill has no unit cost of its own. */
  balancingBoardCost?: string;
  /** Per bank. */
  terminalSetCost: string;
  /** The smallest enclosure that holds the bank volume × packing factor is chosen. */
  enclosures: { name: string; maxVolumeM3: number; cost: string }[];
  /** Bank cell volume × this must fit the enclosure (common practice ~1.6). */
  enclosurePackingFactor: number;
  /** The largest break whose minQuantity ≤ ordered quantity applies. */
  quantityBreaks: { minQuantity: number; discountPct: string }[];
  quoteValidityDays: number;
  /**
   * The share of the total a customer pays up front when accepting, in % (0–100): 0 = the full
   * total at once (no deposit). Rules saved before it existed read as 0 (readPricingRules).
   */
  depositPercent: number;
}

/** What one bank is built from, as chosen by the engine (lib/bank). */
export interface BankBill {
  cell: { sku: string; description: string; unitCost: string };
  cellCount: number;
  /**
   * A bank of mixed cells (an estimator's custom bank): one cell line per part, whose counts add up
   * to cellCount. When given, `cell` is not priced on its own (it names the bank's first part).
   */
  mixedCells?: { sku: string; description: string; unitCost: string; count: number }[];
  /**
   * Resistance in Ω, power rating in W; the catalog part of that power class (its SKU, when it has
   * one) and its unit cost.
   */
  balancingResistors: { count: number; resistance: number; powerRating: number; sku?: string; unitCost: string } | null;
  /** Resistance in Ω, power (rating) in W, with the catalog part's SKU and unit cost. */
  bleeder: { resistance: number; power: number; sku?: string; unitCost: string } | null;
  /** An empty unitCost ("") means "no unit cost": rules.balancingBoardCost is used. */
  activeBoards: { sku: string; count: number; unitCost: string } | null;
  /** Total cell volume of one bank, m³. */
  volumeM3: number;
  /** Banks ordered. */
  quantity: number;
}

export type PriceLineKind = "material" | "labour" | "overhead";

export type PriceLineCode =
  | "cells"
  | "balancing-resistors"
  | "bleeder"
  | "interconnects"
  | "balancing-boards"
  | "enclosure"
  | "terminals"
  | "labour-setup"
  | "labour-assembly"
  | "labour-test"
  | "overhead";

/**
 * A line the estimator adds to a quote beside the bank (a spare-cell kit, a site visit, a custom
 * enclosure): already a sell price, so it carries no overhead or margin; not discounted by the
 * quantity breaks; taxed with the rest.
 */
export interface ExtraLineInput {
  description: string;
  quantity: number;
  /** 'pc', 'set', 'h', 'lot' … */
  unit: string;
  unitPrice: string;
}

/** An extra line as priced: its amount is unitPrice × quantity in the currency's minor unit. */
export interface ExtraLine extends ExtraLineInput {
  amount: string;
}

/** One line of the per-bank price build-up. */
export interface PriceLine {
  code: PriceLineCode;
  kind: PriceLineKind;
  description: string;
  /** Pieces for materials, hours (to 4 decimals, for display) for labour, 1 for overhead. */
  quantity: number;
  /** 'pc', 'set', 'h' or 'lot'. */
  unit: string;
  unitPrice: string;
  amount: string;
}

export interface BankPrice {
  currency: string;
  /** Lines for ONE bank. */
  lines: PriceLine[];
  /** Per bank. */
  materials: string;
  labour: string;
  overhead: string;
  cost: string;
  marginPct: string;
  /** Per bank, before any quantity discount. */
  unitPrice: string;
  quantity: number;
  discountPct: string;
  /** For the whole order. */
  discount: string;
  /**
   * Lines added beside the bank, at sell prices (absent on revisions priced before they existed,
   * which read as none): subtotal = unitPrice × quantity − discount + Σ extras.
   */
  extras?: ExtraLine[];
  subtotal: string;
  taxPct: string;
  tax: string;
  total: string;
}

/** One problem found in rules or a bill; path is dotted/bracketed, e.g. "enclosures[1].cost". */
export interface PricingIssue {
  path: string;
  message: string;
}

export type PricingErrorCode = "invalid-rules" | "invalid-bill" | "invalid-extras" | "no-enclosure-fits" | "missing-board-cost";

export type PriceBankResult = { ok: true; data: BankPrice } | { ok: false; code: PricingErrorCode; message: string; issues: PricingIssue[] };
