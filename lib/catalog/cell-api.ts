/**
 * A catalog cell as the cells API answers it: the fields named as in the arrangements answer's
 * `cell` object (SI units, tolerances as fractions, the volume from the shape), plus what only the
 * shop sees (unit cost in its currency, stock, lead time, whether it is offered, its version).
 * Pure: no database, no framework.
 */
import { cellVolumeOf } from "../quoting/bill";
import { toCellRecord, type CellValues } from "./cell-fields";
import type { CellResponse } from "../validation/catalog";

export function toCellResponse(
  row: CellValues & { version: number; updatedAt: Date },
  opts: { currency: string; shopSlug: string; hasDatasheet: boolean },
): CellResponse {
  const r = toCellRecord(row);
  return {
    sku: r.sku,
    manufacturer: r.manufacturer,
    series: r.series,
    technology: r.technology,
    capacitance: r.capacitance,
    toleranceMinus: r.toleranceMinus,
    tolerancePlus: r.tolerancePlus,
    ratedVoltage: r.ratedVoltage,
    surgeVoltage: r.surgeVoltage,
    esr: r.esr,
    leakageCurrent: r.leakageCurrent,
    continuousCurrent: r.continuousCurrent,
    peakCurrent: r.peakCurrent,
    mass: r.mass,
    volume: cellVolumeOf(row),
    shape: r.shape,
    diameter: r.diameter,
    length: r.length,
    width: r.width,
    height: r.height,
    unitCost: { amount: r.unitCost, currency: opts.currency },
    stock: r.stock,
    leadTimeDays: r.leadTimeDays,
    active: r.active,
    version: row.version,
    datasheet: opts.hasDatasheet ? `/api/v1/shops/${opts.shopSlug}/cells/${encodeURIComponent(r.sku)}/datasheet` : null,
    updatedAt: row.updatedAt.toISOString(),
  };
}
