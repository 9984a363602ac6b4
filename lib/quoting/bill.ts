/**
 * Pure mapping between the shop's catalog and the engine and pricing (no database, no framework):
 * catalog row → engine cell, component row → balancing board, option → bill of materials, the
 * float cost model the search orders by, and the cell snapshot a quote freezes.
 */
import { cellVolume, type ArrangementOption, type BalancingBoard, type CostModel, type EngineCell } from "@/lib/bank";
import { minorUnits, type BankBill, type PricingRules } from "@/lib/pricing";
import type { CatalogCell, CatalogComponent, FrozenCell } from "./types";

/** A catalog row's cell volume (m³) from its shape and millimetre dimensions. */
export function cellVolumeOf(row: Pick<CatalogCell, "shape" | "diameterMm" | "lengthMm" | "widthMm" | "heightMm">): number {
  return cellVolume({
    shape: row.shape,
    diameterMm: row.diameterMm ?? undefined,
    lengthMm: row.lengthMm ?? undefined,
    widthMm: row.widthMm ?? undefined,
    heightMm: row.heightMm,
  });
}

/** A catalog cell as the engine sees it: SI numbers, tolerances as fractions, volume from the shape. */
export function toEngineCell(row: CatalogCell): EngineCell {
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
    volume: cellVolumeOf(row),
    unitCost: Number(row.unitCost),
    stock: row.stock,
    leadTimeDays: row.leadTimeDays,
    minVoltage: row.minVoltageV,
    thermal: {
      ratedLifeHours: row.ratedLifeHours,
      ratedTemperature: row.ratedLifeTemperatureC,
      minTemperature: row.minTemperatureC,
      maxTemperature: row.maxTemperatureC,
      thermalResistance: row.thermalResistanceKPerW,
      coldCapacitanceFactor: row.coldCapacitanceFactor,
      coldEsrFactor: row.coldEsrFactor,
    },
  };
}

/** An active balancing board from its component row, or null when the row is not one (or lacks its figures). */
export function toBalancingBoard(row: CatalogComponent): BalancingBoard | null {
  const channels = Number(row.specs.channels);
  const maxCellVoltage = Number(row.specs.maxCellVoltage);
  if (row.kind !== "balancing-board" || !(channels > 0) || !(maxCellVoltage > 0)) return null;
  return { id: row.id, sku: row.sku, channels, maxCellVoltage, unitCost: Number(row.unitCost), leadTimeDays: row.leadTimeDays };
}

/** The balancing boards among a shop's components, for the engine. */
export function balancingBoardsOf(components: readonly CatalogComponent[]): BalancingBoard[] {
  return components.map(toBalancingBoard).filter((b): b is BalancingBoard => b !== null);
}

/** A resistor the shop stocks, by its power class (a catalog component of kind "resistor"). */
export interface CatalogResistor {
  sku: string;
  powerRatingW: number;
  unitCost: string;
}

/** The shop's resistors (components of kind "resistor" with a power rating), smallest class first. */
export function resistorsOf(components: readonly CatalogComponent[]): CatalogResistor[] {
  return components
    .filter((c) => c.kind === "resistor" && Number(c.specs.powerRatingW) > 0)
    .map((c) => ({ sku: c.sku, powerRatingW: Number(c.specs.powerRatingW), unitCost: c.unitCost }))
    .sort((a, b) => a.powerRatingW - b.powerRatingW || Number(a.unitCost) - Number(b.unitCost));
}

/**
 * The smallest catalog resistor whose rating covers `watts` (equal ratings: the cheaper one), or
 * null when the catalog holds none that large. A resistor is rated at least twice what it
 * dissipates (DESIGN.md §3.4, common practice), so callers pass 2 × the dissipation.
 */
export function resistorFor(resistors: readonly CatalogResistor[], watts: number): CatalogResistor | null {
  let best: CatalogResistor | null = null;
  for (const r of resistors) {
    if (r.powerRatingW < watts) continue;
    if (best === null || r.powerRatingW < best.powerRatingW || (r.powerRatingW === best.powerRatingW && Number(r.unitCost) < Number(best.unitCost))) best = r;
  }
  return best;
}

/** What billFor needs of an option: its counts, balancing, discharge and volume (a shown or frozen option has them too). */
export type BillableOption = Pick<ArrangementOption, "cellCount" | "balancing" | "discharge" | "volume">;

export type BillResult = { ok: true; bill: BankBill } | { ok: false; message: string };

const watts = (w: number) => `${Number(w.toPrecision(3))} W`;

/**
 * The bill of materials the pricing rules turn into lines (DESIGN.md §4). Resistors are the
 * catalog's parts of the power class each position needs; when the catalog holds no part large
 * enough the bank is not priced (it goes to the estimators) rather than priced with a made-up part.
 */
export function billFor(option: BillableOption, cell: CatalogCell, components: readonly CatalogComponent[], quantity: number): BillResult {
  const active = option.balancing.activeBoard;
  const board = active ? components.find((c) => c.kind === "balancing-board" && c.sku === active.sku) : undefined;
  const resistors = resistorsOf(components);
  let balancingResistors: BankBill["balancingResistors"] = null;
  if (option.balancing.resistance !== null && option.balancing.count > 0) {
    const need = 2 * option.balancing.power;
    const part = resistorFor(resistors, need);
    if (!part)
      return { ok: false, message: `The catalog holds no resistor rated for ${watts(need)} (twice a balancing resistor's ${watts(option.balancing.power)}).` };
    balancingResistors = {
      count: option.balancing.count,
      resistance: option.balancing.resistance,
      powerRating: part.powerRatingW,
      sku: part.sku,
      unitCost: part.unitCost,
    };
  }
  // A switched discharge circuit is engineered and priced by the shop, not from the catalog (see SWITCHED_DISCHARGE_NOTE).
  let bleeder: BankBill["bleeder"] = null;
  const b = option.discharge.bleeder;
  if (b && !b.switched) {
    const need = 2 * b.power;
    const part = resistorFor(resistors, need);
    if (!part) return { ok: false, message: `The catalog holds no resistor rated for ${watts(need)} (twice the bleeder's ${watts(b.power)}).` };
    bleeder = { resistance: b.resistance, power: part.powerRatingW, sku: part.sku, unitCost: part.unitCost };
  }
  return {
    ok: true,
    bill: {
      cell: { sku: cell.sku, description: `${cell.manufacturer} ${cell.series}`, unitCost: cell.unitCost },
      cellCount: option.cellCount,
      balancingResistors,
      bleeder,
      activeBoards: active ? { sku: active.sku, count: active.count, unitCost: board?.unitCost ?? "" } : null,
      volumeM3: option.volume,
      quantity,
    },
  };
}

export const SWITCHED_DISCHARGE_NOTE = "The switched discharge circuit this bank needs is not in this price; the shop prices it separately.";

/**
 * The float cost model the search orders candidates by, kept a LOWER BOUND of the exact cost
 * lib/pricing computes (materials + overhead + labour), so that the exact price of an option is
 * never below priceLowerBound(its costEstimate). Term by term, against price-bank.ts:
 * - cells: each unit price is rounded to the currency's minor unit u, so it is at least cost − u/2;
 * - boards: the same, per board;
 * - balancing resistors: the cheapest resistor in the catalog, rounded, is at least its cost − u/2;
 * - interconnects, terminals, the labour rate: money strings already in u;
 * - overhead: materials × overhead %, rounded once, so at least that − u/2;
 * - labour: setup, assembly and test are each rounded once, so together at least exact − 3u/2;
 * - bleeder and enclosure are never negative, so leaving them out keeps the bound.
 */
export function costModelOf(rules: PricingRules, components: readonly CatalogComponent[] = []): CostModel {
  const u = minorUnit(rules);
  const hourly = Number(rules.labourRatePerHour);
  const cheapestResistor = Math.min(...resistorsOf(components).map((r) => Number(r.unitCost)));
  return {
    perCell: Number(rules.interconnectCostPerCell) - u / 2,
    perBank: Number(rules.terminalSetCost),
    // none in the catalog: a bank with balancing resistors is not priced at all, so 0 bounds it
    perBalancingResistor: Number.isFinite(cheapestResistor) ? cheapestResistor - u / 2 : 0,
    perBalancingBoard: -u / 2,
    materialsFactor: 1 + Number(rules.overheadPct) / 100,
    labourPerCell: (hourly * rules.minutesPerCell) / 60,
    labourPerBank: (hourly * (rules.setupMinutes + rules.testMinutes)) / 60 - 2 * u,
  };
}

/**
 * The least exact price per bank an option with this float cost estimate can have: the price is
 * cost / (1 − margin) rounded once to u, so at least estimate / (1 − margin) − u/2; a relative
 * 1e-9 and one more u absorb float error many times over.
 */
export function priceLowerBound(costEstimate: number, rules: PricingRules): number {
  const u = minorUnit(rules);
  const margin = Number(rules.marginPct) / 100;
  return (costEstimate - 1e-9 * Math.max(1, Math.abs(costEstimate))) / (1 - margin) - 1.5 * u;
}

function minorUnit(rules: PricingRules): number {
  try {
    return 10 ** -minorUnits(rules.currency);
  } catch {
    return 1; // unknown currency: the rules will not price anything; any bound holds
  }
}

/** The cell's catalog data as a quote revision freezes it. */
export function freezeCell(row: CatalogCell): FrozenCell {
  return {
    id: row.id,
    sku: row.sku,
    manufacturer: row.manufacturer,
    series: row.series,
    technology: row.technology,
    capacitanceF: row.capacitanceF,
    toleranceMinusPct: row.toleranceMinusPct,
    tolerancePlusPct: row.tolerancePlusPct,
    ratedVoltageV: row.ratedVoltageV,
    surgeVoltageV: row.surgeVoltageV,
    esrOhm: row.esrOhm,
    leakageCurrentA: row.leakageCurrentA,
    continuousCurrentA: row.continuousCurrentA,
    peakCurrentA: row.peakCurrentA,
    massKg: row.massKg,
    shape: row.shape,
    diameterMm: row.diameterMm,
    lengthMm: row.lengthMm,
    widthMm: row.widthMm,
    heightMm: row.heightMm,
    unitCost: row.unitCost,
    leadTimeDays: row.leadTimeDays,
    minVoltageV: row.minVoltageV,
    ratedLifeHours: row.ratedLifeHours,
    ratedLifeTemperatureC: row.ratedLifeTemperatureC,
    minTemperatureC: row.minTemperatureC,
    maxTemperatureC: row.maxTemperatureC,
    thermalResistanceKPerW: row.thermalResistanceKPerW,
    coldCapacitanceFactor: row.coldCapacitanceFactor,
    coldEsrFactor: row.coldEsrFactor,
  };
}
