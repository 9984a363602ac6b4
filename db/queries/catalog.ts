import "server-only";
import { and, asc, count, desc, eq, ilike, or, type SQL } from "drizzle-orm";
import { db } from "@/db";
import { catalogCells, catalogComponents } from "@/db/schema";

export async function listActiveCells(shopId: string) {
  return db
    .select()
    .from(catalogCells)
    .where(and(eq(catalogCells.shopId, shopId), eq(catalogCells.isActive, true)));
}

export async function listActiveComponents(shopId: string) {
  return db
    .select()
    .from(catalogComponents)
    .where(and(eq(catalogComponents.shopId, shopId), eq(catalogComponents.isActive, true)));
}

/** Active catalog lines per technology, for the storefront's "what we build from". */
export async function countActiveCellsByTechnology(shopId: string) {
  return db
    .select({ technology: catalogCells.technology, lines: count() })
    .from(catalogCells)
    .where(and(eq(catalogCells.shopId, shopId), eq(catalogCells.isActive, true)))
    .groupBy(catalogCells.technology)
    .orderBy(asc(catalogCells.technology));
}

export interface CatalogListQuery {
  q: string;
  technology: "all" | "edlc" | "hybrid" | "electrolytic" | "film";
  sort: "sku" | "capacitance" | "voltage" | "cost" | "stock";
  dir: "asc" | "desc";
  page: number;
  size: number;
}

export async function listCatalogCells(shopId: string, q: CatalogListQuery) {
  const where: SQL[] = [eq(catalogCells.shopId, shopId)];
  if (q.technology !== "all") where.push(eq(catalogCells.technology, q.technology));
  if (q.q) {
    const like = `%${q.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    where.push(or(ilike(catalogCells.sku, like), ilike(catalogCells.manufacturer, like), ilike(catalogCells.series, like))!);
  }
  const column = {
    sku: catalogCells.sku,
    capacitance: catalogCells.capacitanceF,
    voltage: catalogCells.ratedVoltageV,
    cost: catalogCells.unitCost,
    stock: catalogCells.stock,
  }[q.sort];
  const rows = await db
    .select()
    .from(catalogCells)
    .where(and(...where))
    .orderBy(q.dir === "asc" ? asc(column) : desc(column), asc(catalogCells.id))
    .limit(q.size)
    .offset((q.page - 1) * q.size);
  const [t] = await db.select({ n: count() }).from(catalogCells).where(and(...where));
  return { rows, total: t?.n ?? 0 };
}
