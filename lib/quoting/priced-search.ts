/**
 * A requirement searched against a shop's catalog and priced by its rules: the one search behind
 * the public arrangements endpoint, the storefront and quote creation. Pure: the catalog comes in
 * already loaded (db/queries/catalog.ts loadShopCatalog), so a quote freezes exactly what the
 * search computed.
 */
import { Decimal } from "decimal.js";
import { searchArrangements, type ArrangementOption, type DesignFactors, type Requirement } from "@/lib/bank";
import { tryPriceBank, type BankPrice } from "@/lib/pricing";
import { balancingBoardsOf, billFor, costModelOf, freezeCell, priceLowerBound, SWITCHED_DISCHARGE_NOTE, toEngineCell } from "./bill";
import { compareByLife, rankPriced, SHOWN } from "./rank";
import type { CatalogCell, FrozenCell, PricedOption, ShopCatalog } from "./types";

/** What stands behind one shown option: the shop's full price build-up and the cell as it is now. */
export interface OptionRecord {
  /** null when the rules could not price the option automatically */
  price: BankPrice | null;
  cell: FrozenCell;
}

export interface PricedSearch {
  designFactors: DesignFactors;
  currency: string;
  /** the best dozen, in exact price order, Pareto-marked: what customers see */
  options: PricedOption[];
  /** records[i] stands behind options[i]; staff-only figures, never sent to a customer */
  records: OptionRecord[];
  /** when no option fits: what ruled each technology family out */
  reasons: string[];
}

/** How many options the first engine pass returns; each further pass doubles it. */
export const FIRST_CUT = SHOWN * 2;

interface Candidate extends PricedOption {
  record: OptionRecord;
}

/**
 * Searches and prices. Ranked by life (requirement.rankBy), the engine's longest-lived dozen is
 * priced and shown. Ranked by price (the default): the engine returns options in the order of a float cost estimate that the
 * cost model keeps below the exact cost (bill.ts costModelOf), so priceLowerBound(estimate) is a
 * floor under the exact price. The options are priced exactly in that order, one at a time,
 * widening the engine's cut (24, 48, 96 …) as needed, until either every feasible option is priced
 * or the floor of the next unpriced one is above the 12th best exact price so far. Then no unpriced option can enter the best dozen
 * or tie with it, nor dominate a shown one (its price would be higher): the dozen and their Pareto
 * marks are exactly what pricing every option would give (a property test checks this).
 */
export function searchPricedOptions(catalog: ShopCatalog, requirement: Requirement, opts: { longerStrings?: number } = {}): PricedSearch {
  const { factors, rules } = catalog;
  const cells = catalog.cells.map(toEngineCell);
  const byId = new Map(catalog.cells.map((c) => [c.id, c]));
  const quantity = requirement.quantity ?? 1;
  const search = (limit: number) =>
    searchArrangements({
      requirement,
      cells,
      factors,
      balancingBoards: balancingBoardsOf(catalog.components),
      costModel: costModelOf(rules, catalog.components),
      reliability: catalog.reliability,
      limit,
      longerStrings: opts.longerStrings,
    });

  if (requirement.rankBy === "life") {
    // The engine already returns the longest-lived dozen (ties by cost estimate): price them and
    // rank them by life, then exact price. Pareto marks are over the dozen shown.
    const result = search(SHOWN);
    const priced = result.options.map((option) => priceOption(option, byId.get(option.cellId) as CatalogCell, catalog, quantity));
    return shownOf(catalog, rankPriced(priced, SHOWN, compareByLife), result.reasons);
  }

  const priced: Candidate[] = [];
  // the floor under an option's exact price is above the dozenth best found: so is every later one
  const beyondTheDozen = (option: ArrangementOption) => {
    const dozenth = priced.length >= SHOWN ? nthLowestPrice(priced, SHOWN) : null;
    return dozenth !== null && new Decimal(priceLowerBound(option.costEstimate, rules)).greaterThan(dozenth);
  };
  let width = FIRST_CUT;
  let result = search(width);
  let done = false;
  while (!done) {
    // priced one at a time, in the order of the floor: usually a little over a dozen are needed
    for (const option of result.options.slice(priced.length)) {
      if (beyondTheDozen(option)) {
        done = true;
        break;
      }
      priced.push(priceOption(option, byId.get(option.cellId) as CatalogCell, catalog, quantity));
    }
    if (done || result.options.length < width) break; // decided, or every feasible option is priced
    width *= 2;
    result = search(width);
  }

  return shownOf(catalog, rankPriced(priced, SHOWN), result.reasons);
}

/** The ranked dozen as the search answers it: options for customers, records behind them. */
function shownOf(catalog: ShopCatalog, shown: (Candidate & { pareto: boolean })[], reasons: string[]): PricedSearch {
  return {
    designFactors: catalog.factors,
    currency: catalog.rules.currency,
    options: shown.map(({ record: _record, ...option }) => option),
    records: shown.map((c) => c.record),
    reasons,
  };
}

function priceOption(found: ArrangementOption, cell: CatalogCell, catalog: ShopCatalog, quantity: number): Candidate {
  const { cellId: _cellId, costEstimate: _costEstimate, ...figures } = found;
  const record = (price: BankPrice | null): OptionRecord => ({ price, cell: freezeCell(cell) });
  const bill = billFor(found, cell, catalog.components, quantity);
  const priced = bill.ok ? tryPriceBank(bill.bill, catalog.rules) : ({ ok: false, message: bill.message } as const);
  if (!priced.ok) {
    return { ...figures, price: null, pareto: false, warnings: [...figures.warnings, `Not priced automatically: ${priced.message}`], record: record(null) };
  }
  const p = priced.data;
  const warnings = figures.discharge.bleeder?.switched ? [...figures.warnings, SWITCHED_DISCHARGE_NOTE] : figures.warnings;
  return {
    ...figures,
    warnings,
    price: { amount: p.total, currency: p.currency, perBank: p.unitPrice, quantity: p.quantity, tax: p.tax, subtotal: p.subtotal },
    pareto: false,
    record: record(p),
  };
}

/** The n-th lowest per-bank price among the priced candidates, or null when fewer are priced. */
function nthLowestPrice(candidates: readonly Candidate[], n: number): Decimal | null {
  const prices = candidates.flatMap((c) => (c.price ? [new Decimal(c.price.perBank)] : []));
  if (prices.length < n) return null;
  prices.sort((a, b) => a.comparedTo(b));
  return prices[n - 1] as Decimal;
}

/** The option the customer chose, found again among the options the server computes now; -1 when gone. */
export function indexOfChosen(
  options: readonly PricedOption[],
  chosen: { cellSku: string; topology: string; seriesCount: number; parallelCount: number },
): number {
  return options.findIndex(
    (o) => o.cell.sku === chosen.cellSku && o.topology === chosen.topology && o.seriesCount === chosen.seriesCount && o.parallelCount === chosen.parallelCount,
  );
}
