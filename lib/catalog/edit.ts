import "server-only";
import { listAuditForSubject, recordAudit } from "@/db/queries/audit";
import { getShopSettings } from "@/db/queries/shops";
import type { CellResponse } from "@/lib/validation/catalog";
import { toCellResponse } from "./cell-api";
import {
  getCellBySku,
  listDatasheetSkus,
  insertCell,
  insertComponent,
  listAllCells,
  lockCellBySku,
  lockComponentBySku,
  updateCellFields,
  updateComponentFields,
} from "@/db/queries/catalog-edit";
import { recordShopEvent } from "@/db/queries/shop-events";
import type { CatalogCellRow, CatalogComponentRow } from "@/db/schema";
import { isUniqueViolation, withShop } from "@/db/tx";
import { actorOf, type ShopContext } from "@/lib/auth/context";
import { invalidFields, type ActionResult } from "@/lib/auth/guards";
import { cellsToCsv, planCellImport, type ImportPlan } from "./cell-csv";
import { diffCells, fromCellRecord, readCell, toCellRecord, type CellFieldName, type CellRecord, type CellValues, type FieldChange } from "./cell-fields";
import type { ComponentValues } from "./component-fields";

/**
 * Keeping the catalog: the one place the desk's forms, the CSV import and the cells API change
 * cells and components. Each change runs in one shop-scoped transaction with its audit entry (the
 * unit-cost history reads those), and a cell or component carries a version: a change made from an
 * older version than the stored one is refused with "conflict" (409), so two estimators editing the
 * same cell never overwrite each other silently; the API may leave the version out, and then its
 * change applies to whatever is stored (last write wins, by the API caller's choice).
 */

export const CELL_SUBJECT = "catalog-cell";
export const COMPONENT_SUBJECT = "catalog-component";

export function cellRecordOf(row: CatalogCellRow): CellRecord {
  return toCellRecord(row);
}

const changesOf = (list: FieldChange[]) => Object.fromEntries(list.map((c) => [c.field, { from: c.from, to: c.to }]));

function summaryOf(sku: string, changes: FieldChange[]): string {
  const cost = changes.find((c) => c.field === "unitCost");
  const others = changes.filter((c) => c.field !== "unitCost").map((c) => c.field);
  const parts = [cost ? `unit cost from ${cost.from} to ${cost.to}` : null, others.length > 0 ? `${others.join(", ")} changed` : null].filter(Boolean);
  return `${sku}: ${parts.join("; ")}`;
}

/** The fields of `next` that differ from `before`, as storable values (only those are written). */
function changedValues(next: CellRecord, changes: FieldChange[]): Partial<CellValues> {
  const all = fromCellRecord(next);
  const out: Partial<CellValues> = {};
  const columns: Record<CellFieldName, (keyof CellValues)[]> = {
    sku: ["sku"],
    manufacturer: ["manufacturer"],
    series: ["series"],
    technology: ["technology"],
    capacitance: ["capacitanceF"],
    toleranceMinus: ["toleranceMinusPct"],
    tolerancePlus: ["tolerancePlusPct"],
    ratedVoltage: ["ratedVoltageV"],
    surgeVoltage: ["surgeVoltageV"],
    esr: ["esrOhm"],
    leakageCurrent: ["leakageCurrentA"],
    continuousCurrent: ["continuousCurrentA"],
    peakCurrent: ["peakCurrentA"],
    mass: ["massKg"],
    shape: ["shape", "diameterMm", "lengthMm", "widthMm"],
    diameter: ["diameterMm"],
    length: ["lengthMm"],
    width: ["widthMm"],
    height: ["heightMm"],
    unitCost: ["unitCost"],
    stock: ["stock"],
    leadTimeDays: ["leadTimeDays"],
    active: ["isActive"],
  };
  for (const c of changes) for (const col of columns[c.field]) (out as Record<string, unknown>)[col] = all[col];
  return out;
}

export type CellWriteResult = ActionResult<{ record: CellRecord; version: number; changes: FieldChange[] }>;

/** Adds a cell; "conflict" when the shop already has the SKU. */
export async function createCell(ctx: ShopContext, record: CellRecord): Promise<CellWriteResult> {
  const shopId = ctx.shop.id;
  try {
    const row = await withShop(shopId, async (tx) => {
      const made = await insertCell(tx, shopId, fromCellRecord(record));
      await recordAudit(tx, shopId, {
        ...actorOf(ctx),
        action: `${CELL_SUBJECT}.create`,
        subjectType: CELL_SUBJECT,
        subjectId: made.id,
        summary: `${made.sku} added at a unit cost of ${record.unitCost}`,
        changes: { unitCost: { from: null, to: toCellRecord(made).unitCost } },
      });
      return made;
    });
    return { ok: true, data: { record: toCellRecord(row), version: row.version, changes: [] } };
  } catch (error) {
    if (!isUniqueViolation(error)) throw error;
    return { ok: false, code: "conflict", message: `The catalog already has a cell ${record.sku}.`, fieldErrors: { sku: ["This part number is taken"] } };
  }
}

/**
 * Changes a cell: `raw` names only the fields to change (as typed, or SI values from the API), read
 * over the stored cell. With `expectedVersion`, a cell changed since that version is a "conflict"
 * that names who changed it; nothing is written.
 */
export async function updateCell(
  ctx: ShopContext,
  sku: string,
  raw: Partial<Record<CellFieldName, unknown>>,
  expectedVersion: number | null,
): Promise<CellWriteResult> {
  const shopId = ctx.shop.id;
  try {
    return await withShop(shopId, async (tx): Promise<CellWriteResult> => {
      const row = await lockCellBySku(tx, shopId, sku);
      if (!row) return { ok: false, code: "not-found", message: `No cell ${sku} in this catalog.` };
      if (expectedVersion !== null && row.version !== expectedVersion) {
        const [last] = await listAuditForSubject(tx, shopId, CELL_SUBJECT, row.id, 1);
        const when = last ? ` on ${last.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC` : "";
        return {
          ok: false,
          code: "conflict",
          message: `${sku} was changed by someone else${when} (version ${row.version}, you edited version ${expectedVersion}). Reload it to see their change, then make yours again.`,
        };
      }
      const before = toCellRecord(row);
      const read = readCell(raw, before);
      if (!read.ok) return invalidFields(read.issues);
      const changes = diffCells(before, read.record);
      if (changes.length === 0) return { ok: true, data: { record: before, version: row.version, changes } };
      const updated = await updateCellFields(tx, shopId, row.id, changedValues(read.record, changes));
      await recordAudit(tx, shopId, {
        ...actorOf(ctx),
        action: `${CELL_SUBJECT}.update`,
        subjectType: CELL_SUBJECT,
        subjectId: row.id,
        summary: summaryOf(updated.sku, changes),
        changes: changesOf(changes),
      });
      return { ok: true, data: { record: toCellRecord(updated), version: updated.version, changes } };
    });
  } catch (error) {
    if (!isUniqueViolation(error)) throw error;
    return { ok: false, code: "conflict", message: "Another cell already has that part number.", fieldErrors: { sku: ["This part number is taken"] } };
  }
}

/** One entry of a cell's unit-cost history: who, when, old → new (null `from`: the cell was added). */
export interface CostChange {
  at: Date;
  actorUserId: string | null;
  actorKeyId: string | null;
  from: string | null;
  to: string;
}

/** A cell's unit-cost history, newest first, from its audit entries. */
export async function listCostHistory(shopId: string, cellId: string, limit = 100): Promise<CostChange[]> {
  const entries = await withShop(shopId, (tx) => listAuditForSubject(tx, shopId, CELL_SUBJECT, cellId, 500));
  return entries
    .filter((e) => e.changes?.unitCost)
    .slice(0, limit)
    .map((e) => {
      const c = e.changes?.unitCost as { from: unknown; to: unknown };
      return { at: e.createdAt, actorUserId: e.actorUserId, actorKeyId: e.actorKeyId, from: c.from === null ? null : String(c.from), to: String(c.to) };
    });
}

/** The shop's whole catalog of cells as CSV (the export, and what a dry-run import compares against). */
export async function exportCellsCsv(shopId: string): Promise<string> {
  const rows = await withShop(shopId, (tx) => listAllCells(tx, shopId));
  return cellsToCsv(rows.map(toCellRecord));
}

/** What an import would do, without changing anything. */
export async function previewCellImport(shopId: string, csv: string): Promise<ImportPlan> {
  const rows = await withShop(shopId, (tx) => listAllCells(tx, shopId));
  return planCellImport(csv, new Map(rows.map((r) => [r.sku, toCellRecord(r)])));
}

export interface ImportOutcome {
  plan: ImportPlan;
  /** whether anything was written */
  applied: boolean;
}

/**
 * Imports a CSV of cells in one transaction: the plan is made again inside it, against the cells as
 * they are now (locked), so what is applied is exactly what this plan says. With any error row
 * nothing is written, unless `applyValid` says to write the valid rows and skip the others. Records
 * an audit entry per cell, one for the import, and the `catalog.imported` shop event.
 */
export async function importCells(ctx: ShopContext, csv: string, opts: { applyValid: boolean }): Promise<ImportOutcome> {
  const shopId = ctx.shop.id;
  const actor = actorOf(ctx);
  return withShop(shopId, async (tx) => {
    const rows = await listAllCells(tx, shopId, { lock: true });
    const bySku = new Map(rows.map((r) => [r.sku, r]));
    const plan = planCellImport(csv, new Map(rows.map((r) => [r.sku, toCellRecord(r)])));
    const blocked = plan.errors.length > 0 && (!opts.applyValid || plan.rows.length === 0);
    if (blocked || plan.created + plan.updated === 0) return { plan, applied: false };
    for (const r of plan.rows) {
      if (!r.record) continue;
      if (r.status === "new") {
        const made = await insertCell(tx, shopId, fromCellRecord(r.record));
        await recordAudit(tx, shopId, {
          ...actor,
          action: `${CELL_SUBJECT}.create`,
          subjectType: CELL_SUBJECT,
          subjectId: made.id,
          summary: `${made.sku} added by import at a unit cost of ${r.record.unitCost}`,
          changes: { unitCost: { from: null, to: toCellRecord(made).unitCost } },
        });
      } else if (r.status === "changed") {
        const row = bySku.get(r.sku) as CatalogCellRow;
        await updateCellFields(tx, shopId, row.id, changedValues(r.record, r.changes));
        await recordAudit(tx, shopId, {
          ...actor,
          action: `${CELL_SUBJECT}.update`,
          subjectType: CELL_SUBJECT,
          subjectId: row.id,
          summary: `${summaryOf(r.sku, r.changes)} (import)`,
          changes: changesOf(r.changes),
        });
      }
    }
    const skipped = plan.rows.filter((r) => r.status === "error").length;
    const counts = { created: plan.created, updated: plan.updated, unchanged: plan.unchanged, skipped };
    await recordAudit(tx, shopId, {
      ...actor,
      action: "catalog.import",
      subjectType: "catalog",
      summary: `Imported cells: ${plan.created} new, ${plan.updated} changed, ${plan.unchanged} unchanged${skipped > 0 ? `, ${skipped} rows with errors skipped` : ""}`,
    });
    await recordShopEvent(tx, shopId, "catalog.imported", counts);
    return { plan, applied: true };
  });
}

// ---- components ----

export type ComponentWriteResult = ActionResult<{ sku: string; version: number }>;

function componentChanges(before: CatalogComponentRow, next: ComponentValues) {
  const out: Record<string, { from: unknown; to: unknown }> = {};
  for (const key of ["kind", "sku", "name", "unitCost", "specs", "stock", "leadTimeDays", "isActive"] as const) {
    const a = before[key];
    const b = next[key];
    const same = key === "unitCost" ? Number(a) === Number(b) : JSON.stringify(a) === JSON.stringify(b);
    if (!same) out[key] = { from: a, to: b };
  }
  return out;
}

export async function createComponent(ctx: ShopContext, values: ComponentValues): Promise<ComponentWriteResult> {
  const shopId = ctx.shop.id;
  try {
    const row = await withShop(shopId, async (tx) => {
      const made = await insertComponent(tx, shopId, values);
      await recordAudit(tx, shopId, {
        ...actorOf(ctx),
        action: `${COMPONENT_SUBJECT}.create`,
        subjectType: COMPONENT_SUBJECT,
        subjectId: made.id,
        summary: `${made.sku} (${made.kind}) added at a unit cost of ${values.unitCost}`,
        changes: { unitCost: { from: null, to: made.unitCost } },
      });
      return made;
    });
    return { ok: true, data: { sku: row.sku, version: row.version } };
  } catch (error) {
    if (!isUniqueViolation(error)) throw error;
    return { ok: false, code: "conflict", message: `The catalog already has a part ${values.sku}.`, fieldErrors: { sku: ["This part number is taken"] } };
  }
}

export async function updateComponent(ctx: ShopContext, sku: string, values: ComponentValues, expectedVersion: number): Promise<ComponentWriteResult> {
  const shopId = ctx.shop.id;
  try {
    return await withShop(shopId, async (tx): Promise<ComponentWriteResult> => {
      const row = await lockComponentBySku(tx, shopId, sku);
      if (!row) return { ok: false, code: "not-found", message: `No part ${sku} in this catalog.` };
      if (row.version !== expectedVersion)
        return {
          ok: false,
          code: "conflict",
          message: `${sku} was changed by someone else (version ${row.version}, you edited version ${expectedVersion}). Reload it, then make your change again.`,
        };
      const changes = componentChanges(row, values);
      if (Object.keys(changes).length === 0) return { ok: true, data: { sku: row.sku, version: row.version } };
      const updated = await updateComponentFields(tx, shopId, row.id, values);
      await recordAudit(tx, shopId, {
        ...actorOf(ctx),
        action: `${COMPONENT_SUBJECT}.update`,
        subjectType: COMPONENT_SUBJECT,
        subjectId: row.id,
        summary: `${updated.sku}: ${Object.keys(changes).join(", ")} changed`,
        changes,
      });
      return { ok: true, data: { sku: updated.sku, version: updated.version } };
    });
  } catch (error) {
    if (!isUniqueViolation(error)) throw error;
    return { ok: false, code: "conflict", message: "Another part already has that part number.", fieldErrors: { sku: ["This part number is taken"] } };
  }
}

// ---- for the cells API ----

/** The shop's currency (what unit costs are in). */
export async function shopCurrency(shopId: string): Promise<string> {
  return (await getShopSettings(shopId))?.currency ?? "EUR";
}

/** One cell as the API answers it, or null when the shop has no such SKU. */
export async function cellResponseFor(ctx: ShopContext, sku: string): Promise<CellResponse | null> {
  const [row, currency, datasheets] = await Promise.all([getCellBySku(ctx.shop.id, sku), shopCurrency(ctx.shop.id), listDatasheetSkus(ctx.shop.id)]);
  if (!row) return null;
  return toCellResponse(row, { currency, shopSlug: ctx.shop.slug, hasDatasheet: datasheets.includes(row.sku) });
}
