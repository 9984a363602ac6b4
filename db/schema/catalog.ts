import { boolean, doublePrecision, index, integer, jsonb, numeric, pgEnum, pgTable, text, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { TECHNOLOGIES } from "../../lib/bank/types";
import { COMPONENT_KIND_VALUES } from "../../lib/catalog/component-fields";
import { users } from "./auth";
import { shopColumn, createdAtColumn, updatedAtColumn } from "./columns";

export const technologyEnum = pgEnum("technology", TECHNOLOGIES);
export const cellShapeEnum = pgEnum("cell_shape", ["cylinder", "box"]);
/** `resistor`: balancing and bleeder resistors, priced by their power class (specs.powerRatingW). */
export const componentKindEnum = pgEnum("component_kind", COMPONENT_KIND_VALUES);

/** Cells a shop can build banks from. Physics in SI units; money as numeric, read as strings. */
export const catalogCells = pgTable(
  "catalog_cells",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    sku: text().notNull(),
    manufacturer: text().notNull(),
    series: text().notNull(),
    technology: technologyEnum().notNull(),
    capacitanceF: doublePrecision().notNull(),
    toleranceMinusPct: doublePrecision().notNull(),
    tolerancePlusPct: doublePrecision().notNull(),
    ratedVoltageV: doublePrecision().notNull(),
    surgeVoltageV: doublePrecision().notNull(),
    esrOhm: doublePrecision().notNull(),
    leakageCurrentA: doublePrecision().notNull(),
    continuousCurrentA: doublePrecision().notNull(),
    peakCurrentA: doublePrecision().notNull(),
    massKg: doublePrecision().notNull(),
    shape: cellShapeEnum().notNull(),
    /** cylinder: diameter; box: length */
    diameterMm: doublePrecision(),
    lengthMm: doublePrecision(),
    widthMm: doublePrecision(),
    heightMm: doublePrecision().notNull(),
    unitCost: numeric({ precision: 14, scale: 4 }).notNull(),
    stock: integer().notNull().default(0),
    leadTimeDays: integer().notNull().default(0),
    /** lowest voltage the cell may be taken to; required for hybrid cells (a check constraint, custom migration) */
    minVoltageV: doublePrecision(),
    /** life at the rated temperature and rated voltage (h) and that temperature (°C; missing: the top of the range) */
    ratedLifeHours: doublePrecision(),
    ratedLifeTemperatureC: doublePrecision(),
    /** operating range (°C) */
    minTemperatureC: doublePrecision(),
    maxTemperatureC: doublePrecision(),
    thermalResistanceKPerW: doublePrecision(),
    /** capacitance and ESR at the bottom of the range, as factors of their 25 °C values */
    coldCapacitanceFactor: doublePrecision(),
    coldEsrFactor: doublePrecision(),
    isActive: boolean().notNull().default(true),
    /** raised by one on every change: an edit made from an older version is refused (409), never lost */
    version: integer().notNull().default(1),
    createdAt: createdAtColumn(),
    updatedAt: updatedAtColumn(),
  },
  (t) => [uniqueIndex("catalog_cells_shop_sku_uq").on(t.shopId, t.sku), index("catalog_cells_shop_active_idx").on(t.shopId, t.isActive, t.technology)],
);

/** Parts other than cells: active balancing boards, interconnects, terminals, enclosures. */
export const catalogComponents = pgTable(
  "catalog_components",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    kind: componentKindEnum().notNull(),
    sku: text().notNull(),
    name: text().notNull(),
    unitCost: numeric({ precision: 14, scale: 4 }).notNull(),
    /**
     * kind-specific figures: a balancing board has { channels, maxCellVoltage } (read by
     * lib/quoting/bill.ts toBalancingBoard), a resistor { powerRatingW } (its power class)
     */
    specs: jsonb().$type<Record<string, number | string>>().notNull().default({}),
    stock: integer().notNull().default(0),
    leadTimeDays: integer().notNull().default(0),
    isActive: boolean().notNull().default(true),
    /** raised by one on every change, as for cells */
    version: integer().notNull().default(1),
    createdAt: createdAtColumn(),
    updatedAt: updatedAtColumn(),
  },
  (t) => [uniqueIndex("catalog_components_shop_sku_uq").on(t.shopId, t.sku), index("catalog_components_shop_kind_idx").on(t.shopId, t.kind)],
);

/**
 * A cell's datasheet (PDF, judged by its content): one per cell, replaced by a new upload. The bytes
 * live under UPLOAD_DIR outside public/ and are served by the datasheet route to whoever may see
 * the cell's options.
 */
export const cellDatasheets = pgTable(
  "cell_datasheets",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    cellId: uuid()
      .notNull()
      .references(() => catalogCells.id, { onDelete: "cascade" }),
    fileName: text().notNull(),
    sizeBytes: integer().notNull(),
    sha256: text().notNull(),
    storageKey: text().notNull(),
    uploadedByUserId: text().references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAtColumn(),
  },
  (t) => [uniqueIndex("cell_datasheets_shop_cell_uq").on(t.shopId, t.cellId)],
);

export type CatalogCellRow = typeof catalogCells.$inferSelect;
export type NewCatalogCell = typeof catalogCells.$inferInsert;
export type CatalogComponentRow = typeof catalogComponents.$inferSelect;
export type NewCatalogComponent = typeof catalogComponents.$inferInsert;
