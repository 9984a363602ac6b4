import "server-only";
import { and, asc, count, eq, sql } from "drizzle-orm";
import { catalogCells, catalogComponents, cellDatasheets, quoteRevisions, quotes, type CatalogCellRow, type CatalogComponentRow } from "@/db/schema";
import { withShop, type Executor, type Tx } from "@/db/tx";
import type { CellValues } from "@/lib/catalog/cell-fields";
import type { ComponentValues } from "@/lib/catalog/component-fields";
import type { ComponentListQuery } from "@/lib/validation/lists";
import { containsText, readPage, sortedBy, type Page } from "./paging";

/**
 * Writes to the shop's catalog: cells and components created, changed and retired, with a version
 * each (an edit made from an older version is refused, never lost), and the cells' datasheets.
 * Everything runs in a transaction opened with withShop; the callers (lib/catalog/edit.ts) record
 * the audit entries in the same transaction.
 */

/** One cell of the shop by SKU; null when the shop has none. */
export async function getCellBySku(shopId: string, sku: string): Promise<CatalogCellRow | null> {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select()
      .from(catalogCells)
      .where(and(eq(catalogCells.shopId, shopId), eq(catalogCells.sku, sku)))
      .limit(1);
    return row ?? null;
  });
}

/** Every cell of the shop (active or not), by SKU: the CSV export and the import plan read these. */
export async function listAllCells(ex: Executor, shopId: string, opts: { lock?: boolean } = {}): Promise<CatalogCellRow[]> {
  const q = ex.select().from(catalogCells).where(eq(catalogCells.shopId, shopId)).orderBy(asc(catalogCells.sku));
  return opts.lock ? q.for("update") : q;
}

/** The cell by SKU, locked for the rest of the transaction. */
export async function lockCellBySku(tx: Tx, shopId: string, sku: string): Promise<CatalogCellRow | null> {
  const [row] = await tx
    .select()
    .from(catalogCells)
    .where(and(eq(catalogCells.shopId, shopId), eq(catalogCells.sku, sku)))
    .limit(1)
    .for("update");
  return row ?? null;
}

export async function insertCell(tx: Tx, shopId: string, values: CellValues): Promise<CatalogCellRow> {
  const [row] = await tx
    .insert(catalogCells)
    .values({ shopId, ...values })
    .returning();
  if (!row) throw new Error("cell insert returned no row");
  return row;
}

/** Writes the given fields of one cell and raises its version by one. */
export async function updateCellFields(tx: Tx, shopId: string, cellId: string, fields: Partial<CellValues>): Promise<CatalogCellRow> {
  const [row] = await tx
    .update(catalogCells)
    .set({ ...fields, version: sql`${catalogCells.version} + 1`, updatedAt: new Date() })
    .where(and(eq(catalogCells.shopId, shopId), eq(catalogCells.id, cellId)))
    .returning();
  if (!row) throw new Error("cell update returned no row");
  return row;
}

// ---- components ----

const COMPONENT_SORTS = {
  sku: catalogComponents.sku,
  kind: catalogComponents.kind,
  name: catalogComponents.name,
  cost: catalogComponents.unitCost,
  stock: catalogComponents.stock,
  lead: catalogComponents.leadTimeDays,
};

/** A page of the shop's components (active or not), filtered by kind and text, sorted; ties by SKU. */
export async function listCatalogComponents(shopId: string, q: ComponentListQuery): Promise<Page<CatalogComponentRow>> {
  return withShop(shopId, (tx) => {
    const where = and(
      eq(catalogComponents.shopId, shopId),
      q.kind === "all" ? undefined : eq(catalogComponents.kind, q.kind),
      containsText(q.q, catalogComponents.sku, catalogComponents.name),
    );
    return readPage(
      q,
      () => tx.select({ n: count() }).from(catalogComponents).where(where),
      (limit, offset) =>
        tx
          .select()
          .from(catalogComponents)
          .where(where)
          .orderBy(...sortedBy(COMPONENT_SORTS, q, asc(catalogComponents.sku), asc(catalogComponents.id)))
          .limit(limit)
          .offset(offset),
    );
  });
}

export async function getComponentBySku(shopId: string, sku: string): Promise<CatalogComponentRow | null> {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select()
      .from(catalogComponents)
      .where(and(eq(catalogComponents.shopId, shopId), eq(catalogComponents.sku, sku)))
      .limit(1);
    return row ?? null;
  });
}

export async function lockComponentBySku(tx: Tx, shopId: string, sku: string): Promise<CatalogComponentRow | null> {
  const [row] = await tx
    .select()
    .from(catalogComponents)
    .where(and(eq(catalogComponents.shopId, shopId), eq(catalogComponents.sku, sku)))
    .limit(1)
    .for("update");
  return row ?? null;
}

export async function insertComponent(tx: Tx, shopId: string, values: ComponentValues): Promise<CatalogComponentRow> {
  const [row] = await tx
    .insert(catalogComponents)
    .values({ shopId, ...values })
    .returning();
  if (!row) throw new Error("component insert returned no row");
  return row;
}

export async function updateComponentFields(tx: Tx, shopId: string, componentId: string, fields: Partial<ComponentValues>): Promise<CatalogComponentRow> {
  const [row] = await tx
    .update(catalogComponents)
    .set({ ...fields, version: sql`${catalogComponents.version} + 1`, updatedAt: new Date() })
    .where(and(eq(catalogComponents.shopId, shopId), eq(catalogComponents.id, componentId)))
    .returning();
  if (!row) throw new Error("component update returned no row");
  return row;
}

// ---- datasheets ----

export interface NewDatasheet {
  cellId: string;
  fileName: string;
  sizeBytes: number;
  sha256: string;
  storageKey: string;
  uploadedByUserId: string | null;
}

/** Sets a cell's datasheet (replacing the one it had); answers the storage key it replaced, if any. */
export async function putDatasheet(tx: Tx, shopId: string, d: NewDatasheet): Promise<string | null> {
  const [old] = await tx
    .select({ storageKey: cellDatasheets.storageKey })
    .from(cellDatasheets)
    .where(and(eq(cellDatasheets.shopId, shopId), eq(cellDatasheets.cellId, d.cellId)))
    .for("update");
  await tx
    .insert(cellDatasheets)
    .values({ shopId, ...d })
    .onConflictDoUpdate({
      target: [cellDatasheets.shopId, cellDatasheets.cellId],
      set: {
        fileName: d.fileName,
        sizeBytes: d.sizeBytes,
        sha256: d.sha256,
        storageKey: d.storageKey,
        uploadedByUserId: d.uploadedByUserId,
        createdAt: new Date(),
      },
    });
  return old?.storageKey ?? null;
}

/** Removes a cell's datasheet; answers the storage key it had, or null when it had none. */
export async function deleteDatasheet(tx: Tx, shopId: string, cellId: string): Promise<string | null> {
  const [row] = await tx
    .delete(cellDatasheets)
    .where(and(eq(cellDatasheets.shopId, shopId), eq(cellDatasheets.cellId, cellId)))
    .returning({ storageKey: cellDatasheets.storageKey });
  return row?.storageKey ?? null;
}

/** A cell's datasheet with the cell's SKU and whether it is offered; null when the cell has none. */
export async function getDatasheetBySku(shopId: string, sku: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({
        fileName: cellDatasheets.fileName,
        sizeBytes: cellDatasheets.sizeBytes,
        storageKey: cellDatasheets.storageKey,
        createdAt: cellDatasheets.createdAt,
        cellActive: catalogCells.isActive,
      })
      .from(cellDatasheets)
      .innerJoin(catalogCells, and(eq(catalogCells.shopId, cellDatasheets.shopId), eq(catalogCells.id, cellDatasheets.cellId)))
      .where(and(eq(cellDatasheets.shopId, shopId), eq(catalogCells.sku, sku)))
      .limit(1);
    return row ?? null;
  });
}

/** The SKUs of the shop's cells that have a datasheet (the storefront links them from the options). */
export async function listDatasheetSkus(shopId: string): Promise<string[]> {
  return withShop(shopId, async (tx) => {
    const rows = await tx
      .select({ sku: catalogCells.sku })
      .from(cellDatasheets)
      .innerJoin(catalogCells, and(eq(catalogCells.shopId, cellDatasheets.shopId), eq(catalogCells.id, cellDatasheets.cellId)))
      .where(eq(cellDatasheets.shopId, shopId));
    return rows.map((r) => r.sku);
  });
}

/** Whether the customer holds a quote of the shop whose frozen cell is this SKU (they may still read its datasheet). */
export async function customerQuotedCell(shopId: string, customerUserId: string, sku: string): Promise<boolean> {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({ n: count() })
      .from(quoteRevisions)
      .innerJoin(quotes, and(eq(quotes.shopId, quoteRevisions.shopId), eq(quotes.id, quoteRevisions.quoteId)))
      .where(and(eq(quoteRevisions.shopId, shopId), eq(quotes.customerUserId, customerUserId), sql`${quoteRevisions.cell}->>'sku' = ${sku}`));
    return (row?.n ?? 0) > 0;
  });
}
