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

/** A custom bank as the estimator's network editor builds it: series and parallel groups of catalog cells named by part number. */
export type CustomNode = { kind: "cell"; sku: string } | { kind: "series" | "parallel"; children: CustomNode[] };

/** The design factors an estimator may change for one request. */
export const OVERRIDABLE_FACTORS = ["voltageDerating", "capacitanceFade", "esrGrowth", "matchingTolerance", "balancingFactor"] as const;
export type OverridableFactor = (typeof OVERRIDABLE_FACTORS)[number];

/** What an estimator changed, for one request, against the shop's factors and the engine's search. */
export interface DesignOverrides {
  factors: Partial<Record<OverridableFactor, number>>;
  /** retired catalog cells are offered too */
  includeRetiredCells: boolean;
  /** strings longer than the shortest safe one the search considers (the shop's default is 1) */
  longerStrings: number;
}

/** One override as the quote records it: "Voltage derating: 1 → 0.9". */
export interface OverrideNote {
  label: string;
  from: string;
  to: string;
}

/** One cell of a custom bank at the requirement's maximum voltage. */
export interface CustomCellState {
  /** its place in the tree, counted from 1: "2.1" is the first child of the root's second child */
  id: string;
  sku: string;
  /** with every cell at its nominal capacitance (V) */
  voltage: number;
  /** with this cell at the low end of the shop's matching tolerance and every other at the high end (V) */
  worstVoltage: number;
  ratedVoltage: number;
  surgeVoltage: number;
}

/** A custom bank's figures as the engine evaluated them (lib/quoting/custom-bank.ts). */
export interface CustomBankFigures {
  /** the requirement's maximum voltage, where the cells are evaluated (V) */
  appliedVoltage: number;
  /** equivalent capacitance (F) */
  capacitance: number;
  /** equivalent ESR (Ω) */
  esr: number;
  /** the largest voltage at which no cell passes its rating: the weakest cell limits it (V) */
  maxVoltage: number;
  /** ½·C·V² at the applied voltage (J) */
  energy: number;
  cellCount: number;
  /** kg, m³ */
  mass: number;
  volume: number;
  cells: CustomCellState[];
  /** the cell nearest its rating (highest worst-case voltage over rated voltage) */
  weakest: CustomCellState;
}

/**
 * How a revision's bank was arrived at, recorded on it: the customer's own choice, one of the
 * engine's options under the estimator's overrides, or a custom bank from the network editor (its
 * tree, each part's catalog data as it was, and the figures the engine gave).
 */
export type RevisionDesign =
  | { source: "customer-choice" }
  | { source: "engine"; overrides: DesignOverrides; notes: OverrideNote[] }
  | { source: "custom"; network: CustomNode; cells: FrozenCell[]; figures: CustomBankFigures; notes: OverrideNote[] };
