/**
 * Pure mapping between the shop's catalog and the engine and pricing (no database, no framework):
 * catalog row → engine cell, component row → balancing board, option → bill of materials, the
 * float cost model the search orders by, and the cell snapshot a quote freezes.
 */
import { cellVolume, type ArrangementOption, type BalancingBoard, type CostModel, type EngineCell } from "@/lib/bank";
import { minorUnits, type BankBill, type PricingRules } from "@/lib/pricing";
import type { CatalogCell, CatalogComponent, FrozenCell } from "./types";

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

/** The bill of materials the pricing rules turn into lines (DESIGN.md §4). */
export function billFor(option: ArrangementOption, cell: CatalogCell, components: readonly CatalogComponent[], quantity: number): BankBill {
  const active = option.balancing.activeBoard;
  const board = active ? components.find((c) => c.kind === "balancing-board" && c.sku === active.sku) : undefined;
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
    activeBoards: active ? { sku: active.sku, count: active.count, unitCost: board?.unitCost ?? "" } : null,
    volumeM3: option.volume,
    quantity,
  };
}

export const SWITCHED_DISCHARGE_NOTE = "The switched discharge circuit this bank needs is not in this price; the shop prices it separately.";

/**
 * The float cost model the search orders candidates by, kept a LOWER BOUND of the exact cost
 * lib/pricing computes (materials + overhead + labour), so that the exact price of an option is
 * never below priceLowerBound(its costEstimate). Term by term, against price-bank.ts:
 * - cells: each unit price is rounded to the currency's minor unit u, so it is at least cost − u/2;
 * - boards: the same, per board;
 * - interconnects, balancing resistors, terminals, the labour rate: money strings already in u;
 * - overhead: materials × overhead %, rounded once, so at least that − u/2;
 * - labour: setup, assembly and test are each rounded once, so together at least exact − 3u/2;
 * - bleeder and enclosure are never negative, so leaving them out keeps the bound.
 */
export function costModelOf(rules: PricingRules): CostModel {
  const u = minorUnit(rules);
  const hourly = Number(rules.labourRatePerHour);
  return {
    perCell: Number(rules.interconnectCostPerCell) - u / 2,
    perBank: Number(rules.terminalSetCost),
    perBalancingResistor: Number(rules.balancingResistorCost),
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
