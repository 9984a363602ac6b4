/**
 * What the estimator's workbench turns into a revision, in two pure steps the browser runs for the
 * live figures and the server runs again when the revision is issued (it never takes the client's
 * figures): the bank (one of the engine's options under the overrides, or a custom tree) with its
 * cost build-up, then the sell sheet (the bank line or its override, the added lines, the discount
 * with its reason, tax). No database, no framework.
 */
import type { DesignFactors, Requirement } from "@/lib/bank";
import { tryPriceBank, tryPriceSheet, type BankBill, type BankPrice, type PriceSheet, type PricingIssue, type PricingRules } from "@/lib/pricing";
import { billFor, freezeCell } from "./bill";
import { customBankBill, customBankOption, evaluateCustomBank, type CustomTreeIssue } from "./custom-bank";
import { indexOfChosen, type PricedSearch } from "./priced-search";
import { overrideNotes } from "./review-search";
import { bankLineDescription, sheetLines, type ExtraLineInput } from "./revision-sheet";
import type { CatalogCell, CatalogComponent, CustomBankFigures, CustomNode, DesignOverrides, FrozenCell, PricedOption, RevisionDesign } from "./types";

/** A bank ready to price: its option summary, its cost build-up, its (first or weakest) cell and how it was arrived at. */
export interface ResolvedBank {
  option: Omit<PricedOption, "price" | "pareto">;
  cost: BankPrice;
  cell: FrozenCell;
  design: RevisionDesign;
  /** for the estimator: what to check or add as a line */
  warnings: string[];
}

export type ResolveResult = { ok: true; bank: ResolvedBank } | { ok: false; message: string; issues?: CustomTreeIssue[] };

/**
 * Prices a bill for a review: a bank no enclosure in the rules holds is priced without one, and a
 * balancing board with no cost anywhere at nothing, each with a warning to add it as a line —
 * the estimator prices what the rules cannot. Only broken rules stop it.
 */
export function priceForReview(bill: BankBill, rules: PricingRules): { ok: true; cost: BankPrice; warnings: string[] } | { ok: false; message: string } {
  const warnings: string[] = [];
  let r = rules;
  for (let attempt = 0; attempt < 3; attempt++) {
    const priced = tryPriceBank(bill, r);
    if (priced.ok) return { ok: true, cost: priced.data, warnings };
    if (priced.code === "no-enclosure-fits") {
      warnings.push("No enclosure in the shop's rules holds this bank: it is priced without one; add an enclosure line.");
      r = { ...r, enclosures: [] };
    } else if (priced.code === "missing-board-cost") {
      warnings.push("The balancing boards have no cost in the catalog or the rules: they are priced at nothing; add them as a line.");
      r = { ...r, balancingBoardCost: "0" };
    } else return { ok: false, message: priced.message };
  }
  return { ok: false, message: "The rules could not price this bank." };
}

/** One of the engine's options (from a search under the overrides), found again by its identity. */
export function resolveEngineOption(
  found: PricedSearch,
  choice: { sku: string; topology: string; seriesCount: number; parallelCount: number },
  ctx: {
    cells: readonly CatalogCell[];
    retiredSkus: ReadonlySet<string>;
    components: readonly CatalogComponent[];
    rules: PricingRules;
    shopFactors: DesignFactors;
    overrides: DesignOverrides;
    quantity: number;
  },
): ResolveResult {
  const i = indexOfChosen(found.options, {
    cellSku: choice.sku,
    topology: choice.topology,
    seriesCount: choice.seriesCount,
    parallelCount: choice.parallelCount,
  });
  const option = found.options[i];
  const record = found.records[i];
  const cell = ctx.cells.find((c) => c.sku === choice.sku);
  if (!option || !record || !cell) return { ok: false, message: "That option is no longer among the engine's options for these settings: choose again." };
  const { price: _price, pareto: _pareto, ...figures } = option;
  let cost = record.price;
  const warnings: string[] = [];
  if (!cost) {
    const bill = billFor(figures, cell, ctx.components, ctx.quantity);
    if (!bill.ok) return { ok: false, message: bill.message };
    const priced = priceForReview(bill.bill, ctx.rules);
    if (!priced.ok) return { ok: false, message: priced.message };
    cost = priced.cost;
    warnings.push(...priced.warnings);
  }
  const notes = overrideNotes(ctx.shopFactors, ctx.overrides, { sku: cell.sku, retired: ctx.retiredSkus.has(cell.sku) });
  return {
    ok: true,
    bank: {
      option: { ...figures, warnings: figures.warnings.filter((w) => !w.startsWith("Not priced automatically")) },
      cost,
      cell: record.cell,
      design: { source: "engine", overrides: ctx.overrides, notes },
      warnings,
    },
  };
}

/** A custom bank from the network editor: evaluated, summarised and priced. */
export function resolveCustomBank(
  tree: CustomNode,
  ctx: {
    cells: readonly CatalogCell[];
    retiredSkus: ReadonlySet<string>;
    components: readonly CatalogComponent[];
    rules: PricingRules;
    factors: DesignFactors;
    shopFactors: DesignFactors;
    overrides: DesignOverrides;
    requirement: Requirement;
  },
): ResolveResult & { figures?: CustomBankFigures } {
  const evaluated = evaluateCustomBank(tree, ctx.cells, ctx.requirement, ctx.factors);
  if (!evaluated.ok) return { ok: false, message: "The bank is not complete yet.", issues: evaluated.issues };
  if (evaluated.problems.length > 0) return { ok: false, message: evaluated.problems.join(" "), figures: evaluated.figures };
  const quantity = ctx.requirement.quantity ?? 1;
  const option = customBankOption(tree, evaluated.figures, ctx.cells, ctx.requirement, ctx.factors, { warnings: evaluated.warnings });
  const bill = customBankBill(tree, option, ctx.cells, ctx.components, quantity);
  if (!bill.ok) return { ok: false, message: bill.message, figures: evaluated.figures };
  const priced = priceForReview(bill.bill, ctx.rules);
  if (!priced.ok) return { ok: false, message: priced.message, figures: evaluated.figures };
  const skus = new Set(evaluated.figures.cells.map((c) => c.sku));
  const frozenCells = ctx.cells.filter((c) => skus.has(c.sku)).map(freezeCell);
  const weakest = frozenCells.find((c) => c.sku === evaluated.figures.weakest.sku) as FrozenCell;
  const notes = overrideNotes(ctx.shopFactors, { ...ctx.overrides, longerStrings: 1 }, undefined);
  for (const sku of skus) if (ctx.retiredSkus.has(sku)) notes.push({ label: "Retired cell offered", from: "not offered", to: sku });
  return {
    ok: true,
    figures: evaluated.figures,
    bank: {
      option,
      cost: priced.cost,
      cell: weakest,
      design: { source: "custom", network: tree, cells: frozenCells, figures: evaluated.figures, notes },
      warnings: priced.warnings,
    },
  };
}

/** The estimator's lines, price and discount, as the workbench holds them. */
export interface SheetChoices {
  bankPrice: { unitPrice: string; reason: string } | null;
  lines: readonly ExtraLineInput[];
  discount: { kind: "percent" | "amount"; value: string; reason: string } | null;
}

export type ComposeResult = { ok: true; sheet: PriceSheet; option: PricedOption } | { ok: false; message: string; fieldErrors: Record<string, string[]> };

/** Where a sheet's issue belongs on the workbench form ("lines[0].unitPrice" → the first added line's price). */
function fieldOf(issue: PricingIssue): string {
  const m = /^lines\[(\d+)\]\.(\w+)$/.exec(issue.path);
  if (m) return Number(m[1]) === 0 ? `bankPrice.${m[2]}` : `lines.${Number(m[1]) - 1}.${m[2]}`;
  return issue.path;
}

/** The sell sheet of a resolved bank with the estimator's choices; the option carries the price the customer pays. */
export function composeRevision(bank: ResolvedBank, choices: SheetChoices, rules: PricingRules, quantity: number): ComposeResult {
  const lines = sheetLines({
    currency: bank.cost.currency,
    taxPct: rules.taxRatePct,
    quantity,
    bankDescription: bankLineDescription(bank.option, bank.design),
    bankUnitPrice: bank.cost.unitPrice,
    bankBreakPct: bank.cost.discountPct || "0",
    bankOverride: choices.bankPrice && choices.bankPrice.unitPrice.trim() !== "" ? choices.bankPrice : null,
    extras: choices.lines,
    discount: null,
  });
  const priced = tryPriceSheet({ currency: bank.cost.currency, taxPct: rules.taxRatePct, lines, discount: choices.discount });
  if (!priced.ok) {
    const fieldErrors: Record<string, string[]> = {};
    for (const issue of priced.issues) (fieldErrors[fieldOf(issue)] ??= []).push(issue.message);
    return { ok: false, message: priced.message, fieldErrors };
  }
  const sheet = priced.data;
  const bankLine = sheet.lines[0];
  return {
    ok: true,
    sheet,
    option: {
      ...bank.option,
      price: {
        amount: sheet.total,
        currency: sheet.currency,
        perBank: bankLine?.unitPrice ?? bank.cost.unitPrice,
        quantity,
        tax: sheet.tax,
        subtotal: sheet.subtotal,
      },
      pareto: false,
    },
  };
}
