/**
 * The per-shop catalog cache (db/queries/catalog.ts) and its invalidation: the database moves a
 * shop's catalog_version on every change to what the search reads, whoever makes the change, and a
 * server keeps a loaded catalog only while the version it read with it is current. A change made
 * behind this process's back (another app server, an import, psql) is seen by the next request.
 */
import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { loadShopCatalog } from "@/db/queries/catalog";
import { catalogCells, catalogComponents, shops, shopSettings } from "@/db/schema";
import { createShop, KESTREL_REQUIREMENT, type TestShop } from "./fixtures";
import { postArrangements } from "./arrangements-call";
import { ownerDb } from "./owner-db";

const versionOf = async (shop: TestShop) => (await ownerDb.select({ v: shops.catalogVersion }).from(shops).where(eq(shops.id, shop.id)))[0]!.v;

async function cheapestPrice(shop: TestShop): Promise<string> {
  const res = await postArrangements(shop.slug, KESTREL_REQUIREMENT);
  const body = (await res.json()) as { options: { price: { amount: string } | null }[] };
  return body.options[0]!.price!.amount;
}

describe("the catalog a server keeps", () => {
  it("is read once while nothing changes, and is shared read-only", async () => {
    const shop = await createShop("kestrel");
    const first = await loadShopCatalog(shop.id);
    expect(await loadShopCatalog(shop.id)).toBe(first);
    expect(Object.isFrozen(first.cells)).toBe(true);
    expect(Object.isFrozen(first.cells[0])).toBe(true);
    expect(() => {
      (first.cells as unknown as unknown[]).push({});
    }).toThrow(TypeError);
  });

  it("is read again after a change made behind its back, and the search prices with the new figures", async () => {
    const shop = await createShop("kestrel");
    const before = await cheapestPrice(shop);
    const kept = await loadShopCatalog(shop.id);
    // another server (or psql) doubles every cell's cost
    await ownerDb
      .update(catalogCells)
      .set({ unitCost: sql`${catalogCells.unitCost} * 2` })
      .where(eq(catalogCells.shopId, shop.id));
    const fresh = await loadShopCatalog(shop.id);
    expect(fresh).not.toBe(kept);
    expect(fresh.cells.map((c) => Number(c.unitCost))).toEqual(kept.cells.map((c) => Number(c.unitCost) * 2));
    expect(Number(await cheapestPrice(shop))).toBeGreaterThan(Number(before));
  });

  it("moves its version once per statement for cells, components and settings, and only its own shop's", async () => {
    const shop = await createShop("kestrel");
    const other = await createShop("marlow");
    const [v0, o0] = [await versionOf(shop), await versionOf(other)];
    await ownerDb.update(catalogCells).set({ stock: 1 }).where(eq(catalogCells.shopId, shop.id)); // many rows, one statement
    expect(await versionOf(shop)).toBe(v0 + 1);
    await ownerDb.delete(catalogComponents).where(eq(catalogComponents.shopId, shop.id));
    expect(await versionOf(shop)).toBe(v0 + 2);
    await ownerDb.update(shopSettings).set({ tagline: "New words" }).where(eq(shopSettings.shopId, shop.id));
    expect(await versionOf(shop)).toBe(v0 + 3);
    const [cell] = await ownerDb.select().from(catalogCells).where(eq(catalogCells.shopId, shop.id)).limit(1);
    await ownerDb.insert(catalogCells).values({ ...cell!, id: undefined, sku: `${cell!.sku}-COPY` });
    expect(await versionOf(shop)).toBe(v0 + 4);
    expect(await versionOf(other)).toBe(o0);
  });
});
