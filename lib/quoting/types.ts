/**
 * What quoting works with and what a quote revision freezes, as plain TypeScript types (no
 * database, no framework): the shop's catalog as loaded once (db/queries/catalog.ts
 * loadShopCatalog), the priced options a search shows, and the records behind them.
 */
import type { CatalogCellRow, CatalogComponentRow } from "@/db/schema";
import type { ArrangementOption, DesignFactors, ReliabilitySettings, Requirement } from "@/lib/bank";
import type { BankPrice, PricingRules } from "@/lib/pricing";
import type { AutoQuoteLimits } from "./auto-quote-limits";

/** A catalog cell as quoting reads it: its electrical data, part identity, cost and stock. */
export type CatalogCell = Pick<
  CatalogCellRow,
  | "id"
  | "sku"
  | "manufacturer"
  | "series"
  | "technology"
  | "capacitanceF"
  | "toleranceMinusPct"
  | "tolerancePlusPct"
  | "ratedVoltageV"
  | "surgeVoltageV"
  | "esrOhm"
  | "leakageCurrentA"
  | "continuousCurrentA"
  | "peakCurrentA"
  | "massKg"
  | "shape"
  | "diameterMm"
  | "lengthMm"
  | "widthMm"
  | "heightMm"
  | "unitCost"
  | "stock"
  | "leadTimeDays"
  | "minVoltageV"
  | "ratedLifeHours"
  | "ratedLifeTemperatureC"
  | "minTemperatureC"
  | "maxTemperatureC"
  | "thermalResistanceKPerW"
  | "coldCapacitanceFactor"
  | "coldEsrFactor"
>;

/** A catalog component (balancing board, interconnect, terminal, enclosure) as quoting reads it. */
export type CatalogComponent = Pick<CatalogComponentRow, "id" | "kind" | "sku" | "name" | "unitCost" | "specs" | "leadTimeDays">;

/** Everything one search and one quote need from a shop, loaded once. */
export interface ShopCatalog {
  factors: DesignFactors;
  rules: PricingRules;
  autoQuoteLimits: AutoQuoteLimits;
  /** failure, yield and life settings */
  reliability: ReliabilitySettings;
  /** active cells */
  cells: CatalogCell[];
  /** active components */
  components: CatalogComponent[];
}

/** The sell price of an option as the customer sees it (decimal strings in `currency`). */
export interface OptionPrice {
  /** the order total */
  amount: string;
  currency: string;
  /** one bank, before any quantity discount */
  perBank: string;
  quantity: number;
  tax: string;
  subtotal: string;
}

/**
 * An option as shown and as frozen on a quote revision: the engine's figures, the sell price
 * (null when the shop's rules cannot price it automatically) and whether it is Pareto-optimal
 * over price, mass and volume. No cost figures: those are the shop's.
 */
export interface PricedOption extends Omit<ArrangementOption, "cellId" | "costEstimate"> {
  price: OptionPrice | null;
  pareto: boolean;
}

/** The cell's catalog data as it was when the quote was made (stock is left out: it is not a quote fact). */
export type FrozenCell = Omit<CatalogCell, "stock">;

/** What a quote revision freezes beside its numbers: requirement, arrangement, cell and full price build-up. */
export interface FrozenQuote {
  requirement: Requirement;
  arrangement: PricedOption;
  cell: FrozenCell;
  pricing: BankPrice;
}

/** The option a customer picked, as its identity (what the storefront sends). */
export interface ChosenOptionId {
  cellSku: string;
  topology: PricedOption["topology"];
  seriesCount: number;
  parallelCount: number;
}

/** What a request keeps of the customer's choice: the option as the server priced it, or only its identity when it is no longer offered. */
export type ChosenRecord = PricedOption | ChosenOptionId;
