import "server-only";
import { listActiveCells, listActiveComponents } from "@/db/queries/catalog";
import { getShopSettings } from "@/db/queries/shops";
import type { CatalogCellRow, CatalogComponentRow } from "@/db/schema";
import { cellVolume, DEFAULT_DESIGN_FACTORS, searchArrangements, type ArrangementOption, type BalancingBoard, type EngineCell, type Requirement } from "@/lib/bank";
import { DEFAULT_PRICING_RULES, tryPriceBank, type BankBill, type PricingRules } from "@/lib/pricing";

export function toEngineCell(row: CatalogCellRow): EngineCell {
  return {
    id: row.id,
    sku: row.sku,
    technology: row.technology,
    capacitance: row.capacitanceF,
    toleranceMinus: row.toleranceMinusPct / 100,
    tolerancePlus: row.tolerancePlusPct / 100,
    ratedVoltage: row.ratedVoltageV,
    surgeVoltage: row.surgeVoltageV,
    esr: row.esrOhm,
    leakageCurrent: row.leakageCurrentA,
    continuousCurrent: row.continuousCurrentA,
    peakCurrent: row.peakCurrentA,
    mass: row.massKg,
    volume: cellVolume({
      shape: row.shape,
      diameterMm: row.diameterMm ?? undefined,
      lengthMm: row.lengthMm ?? undefined,
      widthMm: row.widthMm ?? undefined,
      heightMm: row.heightMm,
    }),
    unitCost: Number(row.unitCost),
    stock: row.stock,
    leadTimeDays: row.leadTimeDays,
  };
}

export function toBalancingBoard(row: CatalogComponentRow): BalancingBoard | null {
  const channels = Number(row.specs.channels);
  const maxCellVoltage = Number(row.specs.maxCellVoltage);
  if (row.kind !== "balancing-board" || !(channels > 0) || !(maxCellVoltage > 0)) return null;
  return { id: row.id, sku: row.sku, channels, maxCellVoltage, unitCost: Number(row.unitCost), leadTimeDays: row.leadTimeDays };
}

/** The bill of materials the pricing rules turn into lines (DESIGN.md §4). */
export function billFor(option: ArrangementOption, cell: CatalogCellRow, boards: CatalogComponentRow[], quantity: number): BankBill {
  const board = option.balancing.activeBoard ? boards.find((b) => b.sku === option.balancing.activeBoard?.sku) : undefined;
  return {
    cell: { sku: cell.sku, description: `${cell.manufacturer} ${cell.series}`, unitCost: cell.unitCost },
    cellCount: option.cellCount,
    balancingResistors:
      option.balancing.resistance !== null && option.balancing.count > 0
        ? { count: option.balancing.count, resistance: option.balancing.resistance, powerRating: option.balancing.powerRating ?? 0.25 }
        : null,
    // A switched discharge circuit is engineered and priced by the shop, not by the watt (see SWITCHED_DISCHARGE_NOTE).
    bleeder:
      option.discharge.bleeder && !option.discharge.bleeder.switched
        ? { resistance: option.discharge.bleeder.resistance, power: option.discharge.bleeder.powerRating ?? option.discharge.bleeder.power }
        : null,
    activeBoards: option.balancing.activeBoard ? { sku: option.balancing.activeBoard.sku, count: option.balancing.activeBoard.count, unitCost: board?.unitCost ?? "" } : null,
    volumeM3: option.volume,
    quantity,
  };
}

/** Options shown for one requirement (DESIGN.md §3.2: "the best dozen"). */
export const SHOWN = 12;

/** Float per-cell, per-bank and per-resistor costs from the pricing rules, for ranking inside the engine. */
export function costModelOf(rules: PricingRules) {
  const hourly = Number(rules.labourRatePerHour);
  return {
    perCell: Number(rules.interconnectCostPerCell) + (hourly * rules.minutesPerCell) / 60,
    perBank: Number(rules.terminalSetCost) + (hourly * (rules.setupMinutes + rules.testMinutes)) / 60,
    perBalancingResistor: Number(rules.balancingResistorCost),
  };
}

export const SWITCHED_DISCHARGE_NOTE = "The switched discharge circuit this bank needs is not in this price; the shop prices it separately.";

export interface PricedOption extends Omit<ArrangementOption, "cellId"> {
  price: null | { amount: string; currency: string; perBank: string; quantity: number; tax: string; subtotal: string };
}

/** Searches a shop's active catalog for a requirement and prices each option by the shop's rules. */
export async function findArrangements(shopId: string, requirement: Requirement) {
  const [settings, rows, components] = await Promise.all([getShopSettings(shopId), listActiveCells(shopId), listActiveComponents(shopId)]);
  const factors = settings?.designFactors ?? DEFAULT_DESIGN_FACTORS;
  const rules: PricingRules = settings?.pricingRules ?? DEFAULT_PRICING_RULES;
  const byId = new Map(rows.map((r) => [r.id, r]));
  const boardRows = components.filter((c) => c.kind === "balancing-board");
  const result = searchArrangements({
    requirement,
    cells: rows.map(toEngineCell),
    factors,
    balancingBoards: boardRows.map(toBalancingBoard).filter((b): b is BalancingBoard => b !== null),
    costModel: costModelOf(rules),
    limit: SHOWN * 2,
  });
  const quantity = requirement.quantity ?? 1;
  const options: PricedOption[] = result.options.map(({ cellId, ...option }) => {
    const cell = byId.get(cellId)!;
    const priced = tryPriceBank(billFor({ cellId, ...option }, cell, boardRows, quantity), rules);
    if (!priced.ok) {
      return { ...option, price: null, warnings: [...option.warnings, `Not priced automatically: ${priced.message}`] };
    }
    const p = priced.data;
    if (option.discharge.bleeder?.switched) option = { ...option, warnings: [...option.warnings, SWITCHED_DISCHARGE_NOTE] };
    return { ...option, price: { amount: p.total, currency: p.currency, perBank: p.unitPrice, quantity: p.quantity, tax: p.tax, subtotal: p.subtotal } };
  });
  // Exact prices decide the order; the Pareto mark is over (price, mass, volume) of the options priced.
  const priceOf = (o: PricedOption) => (o.price ? Number(o.price.perBank) : Number.POSITIVE_INFINITY);
  const ranked = options.map((o, i) => ({ o, i })).sort((a, b) => priceOf(a.o) - priceOf(b.o) || a.i - b.i).map((x) => x.o);
  const dominated = (a: PricedOption) =>
    ranked.some((b) => b !== a && priceOf(b) <= priceOf(a) && b.mass <= a.mass && b.volume <= a.volume && (priceOf(b) < priceOf(a) || b.mass < a.mass || b.volume < a.volume));
  const shown = ranked.slice(0, SHOWN).map((o) => ({ ...o, pareto: o.price !== null && !dominated(o) }));
  return { designFactors: factors, currency: rules.currency, options: shown, reasons: result.reasons };
}
